/**
 * The tests that run compiled code (the CLI in a child process, worker threads) need dist/ built from
 * the sources as they are: this fails with what to do when a compiled file is missing or older than
 * its source, for every file of src/ (a list per test would miss the files a change moves).
 */
import { readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = fileURLToPath(new URL('../', import.meta.url));

export function checkBuild(): void {
  const src = join(ROOT, 'src');
  const stale: string[] = [];
  for (const entry of readdirSync(src, { withFileTypes: true, recursive: true })) {
    if (!entry.isFile() || !entry.name.endsWith('.ts')) continue;
    const source = join(entry.parentPath, entry.name);
    const compiled = join(ROOT, 'dist', relative(src, source).replace(/\.ts$/, '.js'));
    try {
      if (statSync(compiled).mtimeMs < statSync(source).mtimeMs) stale.push(relative(ROOT, source));
    } catch {
      stale.push(relative(ROOT, source));
    }
  }
  // The launcher starts `quantbid plan` from the bundle of the compiled CLI (scripts/bundlePlanCli.mjs).
  const bundle = join(ROOT, 'dist', 'bundle', 'main.js');
  try {
    if (statSync(bundle).mtimeMs < statSync(join(ROOT, 'dist', 'cli', 'main.js')).mtimeMs) stale.push('dist/bundle (older than dist/cli)');
  } catch {
    stale.push('dist/bundle (missing)');
  }
  if (stale.length > 0) throw new Error(`dist/ is missing or older than ${stale.slice(0, 5).join(', ')}${stale.length > 5 ? ` and ${stale.length - 5} more` : ''}: run \`npm run build\` first`);
}
