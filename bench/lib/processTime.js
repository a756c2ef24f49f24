// Wall and CPU time of whole child processes, for the benches that time what a user waits for.
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';

/**
 * CPU time of this process's finished children [ms], user and system (Linux: /proc/self/stat, fields
 * cutime and cstime, in ticks of 10 ms); null where there is no /proc.
 */
export function childrenCpuMs() {
  try {
    const fields = readFileSync('/proc/self/stat', 'utf8').split(') ')[1].split(' ');
    return (Number(fields[13]) + Number(fields[14])) * 10;
  } catch {
    return null;
  }
}

/**
 * Runs `node ...args` to its end: wall and CPU time [ms] (CPU null where unknown) and its stdout;
 * throws when it fails.
 */
export function timedNode(args) {
  const cpuBefore = childrenCpuMs();
  const started = performance.now();
  const result = spawnSync(process.execPath, args, { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'], maxBuffer: 64 * 1024 * 1024 });
  const wall = performance.now() - started;
  const cpuAfter = childrenCpuMs();
  if (result.status !== 0) throw new Error(`node ${args.join(' ')} failed (${result.status}): ${result.stderr}`);
  return { wall, cpu: cpuBefore === null || cpuAfter === null ? null : cpuAfter - cpuBefore, stdout: result.stdout };
}
