/**
 * The order of each clock slot's error pool at the last sort, kept to sort the next day's pools fast:
 * from one delivery day to the next the calibration window moves by a day and the errors are measured
 * on a scale that moves a little, so the days' errors keep nearly the order they had. Each pool is laid
 * out in the last order (days that left dropped, days that came appended) and finished by insertion
 * sort, which costs O(n + inversions) (Knuth 1998, section 5.2.1) instead of O(n log n).
 *
 * The order only speeds the sort up: the pool comes out in ascending order, -0 before +0 as
 * Float64Array.prototype.sort puts them, the same values bit for bit whatever order was kept.
 *
 * Reference: D. E. Knuth (1998), The Art of Computer Programming vol. 3, 2nd ed., section 5.2.1
 * (straight insertion, its running time in terms of the inversions of the input).
 */
export class PoolOrder {
  /** Per slot: the day ids of the last sorted pool, ascending by error. */
  private orders: Int32Array[] = [];
  /** Per day id - firstId: the day's position among the errors of the current call, or -1. */
  private positions = new Int32Array(0);
  private firstId = 0;
  /** Per position of the current call: the slot it was last placed in (+1), to find the days that came. */
  private placed = new Int32Array(0);
  private ids = new Int32Array(0);

  /** Starts a call: the day ids of errors[0..n-1], ascending. */
  begin(dayIds: ArrayLike<number>): void {
    const n = dayIds.length;
    this.firstId = n === 0 ? 0 : (dayIds[0] as number);
    const span = n === 0 ? 0 : (dayIds[n - 1] as number) - this.firstId + 1;
    if (this.positions.length < span) this.positions = new Int32Array(span);
    this.positions.fill(-1, 0, span);
    for (let p = 0; p < n; p++) this.positions[(dayIds[p] as number) - this.firstId] = p;
    if (this.placed.length < n) {
      this.placed = new Int32Array(n);
      this.ids = new Int32Array(n);
    }
    this.placed.fill(0, 0, n);
    this.span = span;
    this.dayIds = dayIds;
  }

  private span = 0;
  private dayIds: ArrayLike<number> = [];

  /**
   * Writes errors[d][s] of every day d into `out`, ascending (as Float64Array.prototype.sort would),
   * starting from the order slot s had at the last call.
   */
  sortSlot(errors: readonly ArrayLike<number>[], s: number, out: Float64Array): void {
    const n = errors.length;
    const { positions, placed, ids, firstId, span, dayIds } = this;
    const last = this.orders[s];
    let count = 0;
    if (last !== undefined) {
      for (let r = 0; r < last.length; r++) {
        const id = last[r] as number;
        const at = id - firstId;
        if (at < 0 || at >= span) continue;
        const p = positions[at] as number;
        if (p < 0 || placed[p] === s + 1) continue;
        placed[p] = s + 1;
        out[count] = (errors[p] as ArrayLike<number>)[s] as number;
        ids[count++] = id;
      }
    }
    for (let p = 0; p < n; p++) {
      if (placed[p] === s + 1) continue;
      out[count] = (errors[p] as ArrayLike<number>)[s] as number;
      ids[count++] = dayIds[p] as number;
    }
    insertionSort(out, ids, n);
    const order = last !== undefined && last.length === n ? last : new Int32Array(n);
    order.set(ids.subarray(0, n));
    this.orders[s] = order;
  }
}

/** Sorts values[0..n-1] ascending (-0 before +0), moving ids alongside; O(n + inversions). */
function insertionSort(values: Float64Array, ids: Int32Array, n: number): void {
  for (let i = 1; i < n; i++) {
    const v = values[i] as number;
    if (!after(values[i - 1] as number, v)) continue;
    const id = ids[i] as number;
    let j = i - 1;
    while (j >= 0 && after(values[j] as number, v)) {
      values[j + 1] = values[j] as number;
      ids[j + 1] = ids[j] as number;
      j--;
    }
    values[j + 1] = v;
    ids[j + 1] = id;
  }
}

/** x comes after y in the order of Float64Array.prototype.sort (finite values; -0 before +0). */
function after(x: number, y: number): boolean {
  return x > y || (x === 0 && y === 0 && 1 / x > 1 / y);
}
