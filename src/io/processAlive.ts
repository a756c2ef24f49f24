/** Largest process id Linux hands out (2^22, /proc/sys/kernel/pid_max at most); others are not ours. */
const MAX_PID = 4194304;

/**
 * Whether a process with this id runs (signal 0 reaches it: kill(2), "If sig is 0, then no signal is
 * sent, but existence and permission checks are still performed"). An id that no process can have (0,
 * negative, not whole, beyond pid_max) is not running: kill(0) and kill(-1) would ask about a group.
 * This process's own id is running.
 */
export function isRunning(pid: number): boolean {
  if (!Number.isInteger(pid) || pid < 1 || pid > MAX_PID) return false;
  if (pid === process.pid) return true;
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    // EPERM: it runs, as another user; ESRCH: no such process.
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}
