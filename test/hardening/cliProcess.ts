/**
 * Runs the compiled CLI (`node bin/quantbid.js ...`, as a user would) in a child process, for the
 * tests that kill it or compare the bytes of two runs. Also a seeded random generator and a reader of
 * whole output folders.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url));
export const BIN = join(ROOT, 'bin/quantbid.js');
/** The fictional demo scenario (scenarios/halvorn), 2025-2026 at 15 minutes. */
export const DEMO_SCENARIO = join(ROOT, 'scenarios/halvorn/scenario.json');

export interface CliExit {
  readonly code: number | null;
  readonly signal: NodeJS.Signals | null;
  readonly stdout: string;
  readonly stderr: string;
  /** Wall time from spawn to exit [ms]. */
  readonly ms: number;
}

export interface CliProcess {
  readonly child: ChildProcess;
  readonly exit: Promise<CliExit>;
}

/**
 * Starts `node [nodeArgs] bin/quantbid.js args`. `onStderr` sees stderr as it arrives (a pipe is
 * written synchronously by Node on Linux, so a line arrives when the child has written it).
 */
export function startCli(args: readonly string[], options: { readonly nodeArgs?: readonly string[]; readonly env?: NodeJS.ProcessEnv; readonly onStderr?: (text: string) => void } = {}): CliProcess {
  const started = performance.now();
  const child = spawn(process.execPath, [...(options.nodeArgs ?? []), BIN, ...args], { cwd: ROOT, env: { ...process.env, ...options.env }, stdio: ['ignore', 'pipe', 'pipe'] });
  let stdout = '';
  let stderr = '';
  child.stdout?.on('data', (chunk: Buffer) => (stdout += chunk.toString()));
  child.stderr?.on('data', (chunk: Buffer) => {
    stderr += chunk.toString();
    options.onStderr?.(stderr);
  });
  const exit = new Promise<CliExit>((resolve) => {
    child.on('close', (code, signal) => resolve({ code, signal, stdout, stderr, ms: performance.now() - started }));
  });
  return { child, exit };
}

export function runCliProcess(args: readonly string[]): Promise<CliExit> {
  return startCli(args).exit;
}

/** Every file of a folder (not recursing) with its bytes, names sorted. */
export function folderFiles(dir: string): Map<string, Buffer> {
  return new Map(readdirSync(dir).sort().map((name) => [name, readFileSync(join(dir, name))]));
}

/** Lehmer (Park-Miller) generator, uniform in (0, 1), from a whole-number seed. */
export function seededUniform(seed: number): () => number {
  let state = seed % 2147483647 || 1;
  return () => {
    state = (state * 48271) % 2147483647;
    return state / 2147483647;
  };
}

/**
 * Node arguments that preload a module pausing `pauseMs` before and after every rename in the file
 * system, saying `test-rename NAME` on stderr first: a run's output renames become windows long enough
 * to kill it in, or to start a second run in. Timing only: the outputs are the plain CLI's.
 */
export function slowRenamePreload(pauseMs: number): string[] {
  const source = [
    `import fs from 'node:fs';`,
    `import { basename } from 'node:path';`,
    `import { syncBuiltinESMExports } from 'node:module';`,
    `const rename = fs.renameSync;`,
    `const pause = () => Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ${pauseMs});`,
    `fs.renameSync = (from, to) => { process.stderr.write('test-rename ' + basename(String(to)) + '\\n'); pause(); rename(from, to); pause(); };`,
    `syncBuiltinESMExports();`,
  ].join('\n');
  return ['--import', `data:text/javascript,${encodeURIComponent(source)}`];
}

/**
 * Node arguments that preload a module making the disk look full (ENOSPC, as write(2) reports it):
 * after `journalAppends` whole appends to a grid's journal, or (`stagedWrites`) on every write into an
 * output stage (`.quantbid-partial-*`). The rest of the file system works as usual.
 */
export function diskFullPreload(fault: { readonly journalAppends?: number; readonly stagedWrites?: boolean }): string[] {
  const source = [
    `import fs from 'node:fs';`,
    `import { syncBuiltinESMExports } from 'node:module';`,
    `const full = () => Object.assign(new Error('ENOSPC: no space left on device, write'), { code: 'ENOSPC', errno: -28, syscall: 'write' });`,
    `const journals = new Set();`,
    `let appends = 0;`,
    `const open = fs.openSync, write = fs.writeSync, writeFile = fs.writeFileSync;`,
    `fs.openSync = (path, ...rest) => { const fd = open(path, ...rest); if (/-journal\\.jsonl$/.test(String(path))) journals.add(fd); return fd; };`,
    `fs.writeSync = (fd, ...rest) => { if (journals.has(fd) && ${fault.journalAppends ?? -1} >= 0 && appends++ >= ${fault.journalAppends ?? -1}) throw full(); return write(fd, ...rest); };`,
    `fs.writeFileSync = (path, ...rest) => { if (${fault.stagedWrites === true} && String(path).includes('.quantbid-partial-')) throw full(); return writeFile(path, ...rest); };`,
    `syncBuiltinESMExports();`,
  ].join('\n');
  return ['--import', `data:text/javascript,${encodeURIComponent(source)}`];
}
