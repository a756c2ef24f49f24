/**
 * Which job a thread of the grid's pool (workerPool.ts) runs next, when jobs come in groups: the jobs
 * of one group share work that a thread does once and keeps (a sweep's reference runs of one
 * unaccepted rule), so a thread that stays on one group does that work once, and two threads on two
 * groups do it once each instead of twice each.
 *
 * A thread takes, in job order within each group:
 * 1. the next job of its own group;
 * 2. else the next job of a group no thread is on (the one whose next job comes first);
 * 3. else, for a thread that has run nothing yet, the next job of the group with the most jobs left
 *    (it has the shared work to do whatever it runs);
 * 4. else, for a thread whose group is done, the next job of the group with the most jobs left, when
 *    at least a quarter of that group's jobs are left: joining costs the shared work again, which pays
 *    only against much work left. Otherwise the thread has nothing to run; the threads on the other
 *    groups finish them.
 * Jobs without a group are one group: they run in job order, as without groups. Only jobs before
 * `limit` (a position in the job list) start: after a failure the pool lets the jobs before it run, so
 * that it reports the failure a single thread meets first.
 */
export class JobSchedule {
  private readonly groups: { readonly positions: number[]; next: number }[] = [];
  private readonly threadGroup: (number | undefined)[];
  private notStarted: number;

  /** @param groupOf the group of each job, in job order (undefined: the common group). */
  constructor(groupOf: readonly (string | undefined)[], threads: number) {
    const index = new Map<string | undefined, number>();
    groupOf.forEach((group, position) => {
      let g = index.get(group);
      if (g === undefined) {
        g = this.groups.length;
        index.set(group, g);
        this.groups.push({ positions: [], next: 0 });
      }
      this.groups[g]?.positions.push(position);
    });
    this.threadGroup = new Array<number | undefined>(threads).fill(undefined);
    this.notStarted = groupOf.length;
  }

  /** Jobs not started yet. */
  get left(): number {
    return this.notStarted;
  }

  /** The position of the job `thread` (0 .. threads - 1) runs next, marked started; undefined when it has none. */
  take(thread: number, limit: number): number | undefined {
    const own = this.threadGroup[thread];
    const g = own !== undefined && this.headBefore(own, limit) !== undefined ? own : this.otherGroup(thread, own, limit);
    if (g === undefined) return undefined;
    const group = this.groups[g] as { positions: number[]; next: number };
    this.threadGroup[thread] = g;
    this.notStarted--;
    return group.positions[group.next++] as number;
  }

  /** Whether some job before `limit` has not started. */
  anyBefore(limit: number): boolean {
    return this.groups.some((_, g) => this.headBefore(g, limit) !== undefined);
  }

  private otherGroup(thread: number, own: number | undefined, limit: number): number | undefined {
    let free: number | undefined;
    let freeHead = Infinity;
    let most: number | undefined;
    let mostLeft = 0;
    this.groups.forEach((group, g) => {
      const head = this.headBefore(g, limit);
      if (head === undefined) return;
      const taken = this.threadGroup.some((on, t) => t !== thread && on === g);
      if (!taken && head < freeHead) {
        free = g;
        freeHead = head;
      }
      const left = this.leftBefore(g, limit);
      if (left > mostLeft) {
        most = g;
        mostLeft = left;
      }
    });
    if (free !== undefined) return free;
    if (most === undefined) return undefined;
    if (own === undefined) return most;
    return mostLeft * 4 >= (this.groups[most] as { positions: number[] }).positions.length ? most : undefined;
  }

  private headBefore(g: number, limit: number): number | undefined {
    const group = this.groups[g] as { positions: number[]; next: number };
    const head = group.positions[group.next];
    return head !== undefined && head < limit ? head : undefined;
  }

  private leftBefore(g: number, limit: number): number {
    const { positions, next } = this.groups[g] as { positions: number[]; next: number };
    // positions ascend: count those before limit by bisection
    let low = next;
    let high = positions.length;
    while (low < high) {
      const mid = (low + high) >>> 1;
      if ((positions[mid] as number) < limit) low = mid + 1;
      else high = mid;
    }
    return low - next;
  }
}
