/**
 * Per clock slot, the values of a set of days in ascending order, kept from one set to the next: for
 * the daily forecasts of a run, whose training windows move (or grow) by a day, each slot's sorted
 * values are updated by removing the values of the days that left and inserting those of the days that
 * came (binary search and one shift each, O(n) per changed day and slot) instead of selected or sorted
 * afresh. Order statistics do not depend on how the sample was ordered, so the quantiles read off are
 * those of the sorted sample, bit for bit.
 *
 * Days are recognised by the identity of their arrays, which must not change while kept.
 *
 * Reference: D. E. Knuth (1998), The Art of Computer Programming vol. 3, 2nd ed., section 5.2.1
 * (binary insertion).
 */
export class SlotSortedValues {
  private members = new Set<Float64Array>();
  /** Per slot, its values (the first `length` of the array) ascending. */
  private sorted: Float64Array[] = [];
  private length = 0;

  /**
   * Makes the kept values those of `days` (each with one value per slot, all of the same length), and
   * returns per slot the values ascending (views, valid until the next call).
   */
  of(days: readonly Float64Array[]): readonly Float64Array[] {
    const S = days[0]?.length ?? 0;
    const next = new Set(days);
    const left: Float64Array[] = [];
    for (const day of this.members) if (!next.has(day)) left.push(day);
    const came = days.filter((day) => !this.members.has(day));
    const changed = left.length + came.length;
    if (next.size !== days.length || this.sorted.length !== S || 2 * changed > days.length || !this.update(left, came, S)) this.rebuild(days, S);
    this.length = days.length;
    this.members = next.size === days.length ? next : new Set();
    return this.sorted.map((values) => values.subarray(0, this.length));
  }

  /** Removes the values of the days that left and inserts those that came, slot by slot; false when a value to remove is missing. */
  private update(left: readonly Float64Array[], came: readonly Float64Array[], S: number): boolean {
    for (let s = 0; s < S; s++) {
      let values = this.sorted[s] as Float64Array;
      let n = this.length;
      for (const day of left) {
        n = remove(values, n, day[s] as number);
        if (n < 0) return false;
      }
      if (values.length < n + came.length) {
        values = grow(values, n, n + came.length);
        this.sorted[s] = values;
      }
      for (const day of came) n = insert(values, n, day[s] as number);
    }
    return true;
  }

  private rebuild(days: readonly Float64Array[], S: number): void {
    const n = days.length;
    this.sorted = Array.from({ length: S }, (_, s) => {
      const values = new Float64Array(Math.ceil(n * 1.25) + 8);
      for (let r = 0; r < n; r++) values[r] = (days[r] as Float64Array)[s] as number;
      values.subarray(0, n).sort();
      return values;
    });
  }
}

/** The first position in values[0..n-1] (ascending) whose value is not below v. */
function lowerBound(values: Float64Array, n: number, v: number): number {
  let lo = 0;
  let hi = n;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((values[mid] as number) < v) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Removes one value equal to v from values[0..n-1]; returns the new length, or -1 when v is not there. */
function remove(values: Float64Array, n: number, v: number): number {
  const at = lowerBound(values, n, v);
  if (at >= n || (values[at] as number) !== v) return -1;
  values.copyWithin(at, at + 1, n);
  return n - 1;
}

/** Inserts v into values[0..n-1] (room for one more), keeping them ascending; returns the new length. */
function insert(values: Float64Array, n: number, v: number): number {
  const at = lowerBound(values, n, v);
  values.copyWithin(at + 1, at, n);
  values[at] = v;
  return n + 1;
}

function grow(values: Float64Array, n: number, needed: number): Float64Array {
  const out = new Float64Array(Math.ceil(needed * 1.25) + 8);
  out.set(values.subarray(0, n));
  return out;
}
