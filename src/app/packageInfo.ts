import { readFileSync } from 'node:fs';

/** The package version, read from package.json beside dist/. */
export function packageVersion(): string {
  const text = readFileSync(new URL('../../package.json', import.meta.url), 'utf8');
  return (JSON.parse(text) as { version: string }).version;
}

/** The package root folder (holds scenarios/). */
export function packageRoot(): URL {
  return new URL('../../', import.meta.url);
}
