/**
 * The segments of the concave value function of stored energy that are still open during a sweep
 * (lineSweep.ts), kept sorted by slope in a double-ended array: the sweep inserts a period's
 * segments and removes segments only at the two ends (the steepest are taken, the flattest dropped).
 *
 * Segment id 3t + kind, with the slope it adds (stored units, multiplier mu on discharged energy):
 *   DISCHARGE: length Y, slope -(q_t - mu)   (each MWh not sold forgoes q_t - mu)
 *   CHARGE:    length X, slope -p_t          (each MWh bought costs p_t)
 *   CHORD:     length X + Y, slope -(p_t X + (q_t - mu) Y) / (X + Y)   (an arbitrage period relaxed
 *              to the convex hull of its two modes, see storedDay.ts)
 * Order: slope ascending; equal slopes put a chord before a charge before a discharge segment, then
 * the earlier period first. So within one period the discharge segment always ranks above the charge
 * segment, which is what keeps the sweep's flows complementary (lineSweep.ts).
 *
 * Why not a global order: the open segments hold at most the window's width of energy, so there are
 * few of them (a handful on narrow windows); sorting all 2T segments per day and merging them per
 * multiplier cost more than inserting into this short array.
 */
export const DISCHARGE = 0;
export const CHARGE = 1;
export const CHORD = 2;

export class LiveSegments {
  /** Segment ids and slopes in slots [head, tail), slope ascending. */
  private readonly ids: Int32Array;
  private readonly slopes: Float64Array;
  private readonly middle: number;
  head = 0;
  tail = 0;

  /** Room for every segment of a day of up to `capacity` periods, on either side of the middle. */
  constructor(capacity: number) {
    const size = 2 * (2 * capacity + 2);
    this.ids = new Int32Array(size);
    this.slopes = new Float64Array(size);
    this.middle = size >>> 1;
  }

  clear(): void {
    this.head = this.tail = this.middle;
  }

  get size(): number {
    return this.tail - this.head;
  }

  /** Inserts segment `id` of slope `slope` in order, shifting the shorter side. */
  insert(id: number, slope: number): void {
    const ids = this.ids;
    const slopes = this.slopes;
    let lo = this.head;
    let hi = this.tail;
    // First slot whose segment ranks above the new one.
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      const s = slopes[mid]!;
      if (s < slope || (s === slope && tieRank(ids[mid]!) < tieRank(id))) lo = mid + 1;
      else hi = mid;
    }
    if (lo - this.head < this.tail - lo) {
      for (let k = this.head; k < lo; k++) {
        ids[k - 1] = ids[k]!;
        slopes[k - 1] = slopes[k]!;
      }
      this.head--;
      lo--;
    } else {
      for (let k = this.tail; k > lo; k--) {
        ids[k] = ids[k - 1]!;
        slopes[k] = slopes[k - 1]!;
      }
      this.tail++;
    }
    ids[lo] = id;
    slopes[lo] = slope;
  }

  /** The steepest open segment (the caller checks size > 0). */
  steepest(): number {
    return this.ids[this.tail - 1]!;
  }

  steepestSlope(): number {
    return this.slopes[this.tail - 1]!;
  }

  /** The flattest open segment (the caller checks size > 0). */
  flattest(): number {
    return this.ids[this.head]!;
  }

  removeSteepest(): void {
    this.tail--;
  }

  removeFlattest(): void {
    this.head++;
  }
}

/** Order among equal slopes: chord, charge, discharge, then by period. */
function tieRank(id: number): number {
  const t = (id / 3) | 0;
  const kind = id - 3 * t;
  return (kind === CHORD ? 0 : kind === CHARGE ? 1 : 2) * 0x1000000 + t;
}
