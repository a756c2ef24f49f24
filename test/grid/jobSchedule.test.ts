import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { JobSchedule } from '../../src/grid/jobSchedule.js';

/** Every position `thread` takes until it has none, in order. */
function drain(schedule: JobSchedule, thread: number, limit = Infinity): number[] {
  const taken: number[] = [];
  for (let p = schedule.take(thread, limit); p !== undefined; p = schedule.take(thread, limit)) taken.push(p);
  return taken;
}

/** Groups in the sweep's grid order: the rule is the last axis, so it alternates job by job. */
const alternating = (count: number) => Array.from({ length: count }, (_, i) => (i % 2 === 0 ? 'follow-plan' : 'follow-accepted'));

describe('JobSchedule', () => {
  it('two threads on two groups keep to one group each, taking its jobs in job order', () => {
    const groups = alternating(20);
    const schedule = new JobSchedule(groups, 2);
    const byThread: number[][] = [[], []];
    // The threads ask in turn, as two equally fast threads would.
    for (let turn = 0; turn < 40; turn++) {
      const thread = turn % 2;
      const p = schedule.take(thread, Infinity);
      if (p !== undefined) byThread[thread]?.push(p);
    }
    expect(byThread[0]).toEqual([0, 2, 4, 6, 8, 10, 12, 14, 16, 18]);
    expect(byThread[1]).toEqual([1, 3, 5, 7, 9, 11, 13, 15, 17, 19]);
    expect(schedule.left).toBe(0);
  });

  it('without groups, jobs start in job order whichever thread asks', () => {
    const schedule = new JobSchedule(new Array<undefined>(7).fill(undefined), 3);
    const order = [2, 0, 0, 1, 2, 1, 0].map((thread) => schedule.take(thread, Infinity));
    expect(order).toEqual([0, 1, 2, 3, 4, 5, 6]);
    expect(schedule.take(1, Infinity)).toBeUndefined();
  });

  it('a thread that has run nothing joins a group another thread is on', () => {
    const schedule = new JobSchedule(['a', 'a', 'a', 'a'], 2);
    expect(schedule.take(0, Infinity)).toBe(0);
    expect(schedule.take(1, Infinity)).toBe(1);
  });

  it('a thread whose group is done joins another group only while a quarter of its jobs are left', () => {
    const groups = [...new Array<string>(2).fill('a'), ...new Array<string>(12).fill('b')];
    const early = new JobSchedule(groups, 2);
    expect(early.take(0, Infinity)).toBe(0); // thread 0 on a
    expect(early.take(1, Infinity)).toBe(2); // thread 1 on b
    expect(drain(early, 0, Infinity).slice(0, 2)).toEqual([1, 3]); // a done, then 10 of 12 of b left: joins
    const late = new JobSchedule(groups, 2);
    expect(late.take(0, Infinity)).toBe(0);
    expect(late.take(1, Infinity)).toBe(2);
    for (let k = 0; k < 9; k++) late.take(1, Infinity); // thread 1 has taken 10 of b: 2 left
    expect(drain(late, 0, Infinity)).toEqual([1]); // a done; 2 of 12 left on b is too few to join
    expect(drain(late, 1, Infinity)).toEqual([12, 13]); // the thread on b finishes it
  });

  it('a free group goes to the thread whose own group is done before it joins a busy one', () => {
    const schedule = new JobSchedule(['a', 'b', 'c', 'b', 'c', 'a'], 2);
    expect(schedule.take(0, Infinity)).toBe(0); // a
    expect(schedule.take(1, Infinity)).toBe(1); // b
    expect(schedule.take(0, Infinity)).toBe(5); // a again
    expect(schedule.take(0, Infinity)).toBe(2); // a done: c is free
    expect(schedule.take(1, Infinity)).toBe(3);
  });

  it('under a limit only jobs before it start, on any group', () => {
    const schedule = new JobSchedule(alternating(10), 2);
    expect(schedule.take(0, Infinity)).toBe(0);
    expect(schedule.take(1, Infinity)).toBe(1);
    // A failure at position 5: thread 0 may still run 2 and 4, thread 1 only 3.
    expect(drain(schedule, 0, 5)).toEqual([2, 4]);
    expect(drain(schedule, 1, 5)).toEqual([3]);
    expect(schedule.anyBefore(5)).toBe(false);
    expect(schedule.anyBefore(10)).toBe(true);
  });

  // Laws of a work queue (common practice): every job starts once at most; in each group in job order;
  // and no job is stranded: when every thread in turn has nothing to take, every job before the limit
  // has started.
  it('property: each job at most once, groups in job order, none stranded (fixed seed)', () => {
    const arbitraryCase = fc.record({
      groups: fc.array(fc.constantFrom('a', 'b', 'c', 'd', undefined), { minLength: 1, maxLength: 40 }),
      threads: fc.integer({ min: 1, max: 4 }),
      asks: fc.array(fc.nat(), { minLength: 0, maxLength: 200 }),
      limitAt: fc.option(fc.nat(), { nil: undefined }),
    });
    fc.assert(
      fc.property(arbitraryCase, ({ groups, threads, asks, limitAt }) => {
        const limit = limitAt === undefined ? Infinity : limitAt % (groups.length + 1);
        const schedule = new JobSchedule(groups, threads);
        const taken: number[] = [];
        const take = (thread: number) => {
          const p = schedule.take(thread, limit);
          if (p !== undefined) taken.push(p);
          return p;
        };
        for (const ask of asks) take(ask % threads);
        // Then the threads ask in turn until a whole turn gives none.
        for (let turn = 0, idle = 0; idle < threads; turn++) idle = take(turn % threads) === undefined ? idle + 1 : 0;
        expect(new Set(taken).size).toBe(taken.length);
        expect(taken.every((p) => p < limit)).toBe(true);
        for (const group of new Set(groups)) {
          const mine = taken.filter((p) => groups[p] === group);
          expect(mine).toEqual([...mine].sort((x, y) => x - y));
        }
        const due = groups.map((_, p) => p).filter((p) => p < limit);
        expect([...taken].sort((x, y) => x - y)).toEqual(due);
        expect(schedule.anyBefore(limit)).toBe(false);
      }),
      { seed: 20261205, numRuns: 400 },
    );
  });
});
