import { statSync } from 'node:fs';

/** What a path names on disk: a regular file, a folder, something else (device, pipe), or nothing. */
export type PathKind = 'file' | 'folder' | 'other' | 'absent';

export function pathKind(path: string): PathKind {
  try {
    const stat = statSync(path);
    return stat.isFile() ? 'file' : stat.isDirectory() ? 'folder' : 'other';
  } catch {
    return 'absent';
  }
}
