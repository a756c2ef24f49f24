import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

/**
 * Runs the compiled CLI (`bin/quantbid.js`) with a module hook that lists every ES module the process
 * loads, for the tests of what a command loads (startupModules, backtestModules).
 */
export const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..', '..');

/** A temporary folder with the hook (outputs may go there too); remove it when done (`remove`). */
export function moduleListing(): { readonly folder: string; readonly run: (args: readonly string[]) => ListedRun; readonly remove: () => void } {
  const folder = mkdtempSync(join(tmpdir(), 'quantbid-modules-'));
  const hooks = join(folder, 'hooks.mjs');
  writeFileSync(hooks, "export async function load(url, context, next) { process.stderr.write(`loaded ${url}\\n`); return next(url, context); }\n");
  const register = join(folder, 'register.mjs');
  writeFileSync(register, `import { register } from 'node:module';\nregister(${JSON.stringify(pathToFileURL(hooks).href)});\n`);
  return {
    folder,
    run: (args) => {
      const result = spawnSync(process.execPath, ['--import', pathToFileURL(register).href, 'bin/quantbid.js', ...args], { cwd: ROOT, encoding: 'utf8', timeout: 120_000 });
      return { status: result.status, stderr: result.stderr, files: loadedLines(result.stderr) };
    },
    remove: () => rmSync(folder, { recursive: true, force: true }),
  };
}

/** A listed run: its exit code, its stderr, and the files it loaded, relative to the package root (or node: names). */
export interface ListedRun {
  readonly status: number | null;
  readonly stderr: string;
  readonly files: string[];
}

function loadedLines(stderr: string): string[] {
  const root = pathToFileURL(ROOT).href;
  return stderr
    .split('\n')
    .filter((line) => line.startsWith('loaded '))
    .map((line) => line.slice('loaded '.length).replace(`${root}/`, ''));
}

/**
 * The modules behind loaded files: a file of the bundle that `plan` and `backtest` start from
 * (dist/bundle/) stands for the compiled modules it joins, which the bundler names in a comment line
 * `// dist/...js` at the start of each (a bundle file that joins none is the bundler's own helper).
 */
export function bundledModules(files: readonly string[]): string[] {
  return files.flatMap((file) => {
    if (!file.startsWith('dist/bundle/')) return [file];
    const joined = [...readFileSync(join(ROOT, file), 'utf8').matchAll(/^\/\/ (dist\/\S+\.js)$/gm)].map((match) => match[1] as string);
    return joined.length > 0 ? joined : [file];
  });
}
