import type { StoredDay } from './storedDay.js';

/**
 * Segments of the per-period value functions and their order by slope (marginal value of one
 * more MWh in store), for a Lagrange multiplier mu >= 0 on the cycle cap.
 *
 * Segment id 3t + kind, with the slope it adds to the value function of stored energy:
 *   DISCHARGE: length Y, slope -(q_t - mu)   (each MWh not sold forgoes q_t - mu)
 *   CHARGE:    length X, slope -p_t          (each MWh bought costs p_t)
 *   CHORD:     length X + Y, slope -(p_t X + (q_t - mu) Y) / (X + Y)   (arbitrage periods relaxed
 *              to the convex hull of their two modes, see storedDay.ts)
 * The orders within each kind do not depend on mu (X and Y are the same in every period), so each
 * kind is sorted once per day and the three lists are merged per mu in linear time.
 * Ties: a chord before a charge before a discharge segment, so that within one period the discharge
 * segment always ranks above the charge segment (this is what keeps the flows complementary).
 */
export const DISCHARGE = 0;
export const CHARGE = 1;
export const CHORD = 2;

export class SegmentOrder {
  /** Periods by discharge slope ascending (q_t descending). */
  private readonly discharge: Int32Array;
  /** Periods by charge slope ascending (p_t descending). */
  private readonly charge: Int32Array;
  /** Arbitrage periods by chord slope ascending. */
  private readonly chord: Int32Array;
  /** Chord slope at mu = 0 by period. */
  private readonly chordSlope0: Float64Array;
  private readonly scratch: Int32Array;
  private chords = 0;
  private chordShare = 0;
  private day: StoredDay | null = null;

  /** Room for days of up to `capacity` periods; load() a day before rank(). */
  constructor(capacity: number) {
    this.discharge = new Int32Array(capacity);
    this.charge = new Int32Array(capacity);
    this.chord = new Int32Array(capacity);
    this.chordSlope0 = new Float64Array(capacity);
    this.scratch = new Int32Array(capacity);
  }

  load(day: StoredDay): void {
    this.day = day;
    const n = day.periods;
    const X = day.chargeStepMwh;
    const Y = day.dischargeStepMwh;
    sortBy(day.dischargePrice, -1, fillIdentity(this.discharge, n), n, this.scratch);
    sortBy(day.chargePrice, -1, fillIdentity(this.charge, n), n, this.scratch);
    let k = 0;
    for (let t = 0; t < n; t++) {
      if (day.arbitrage[t] === 0) continue;
      this.chordSlope0[t] = -(day.chargePrice[t]! * X + day.dischargePrice[t]! * Y) / (X + Y);
      this.chord[k++] = t;
    }
    this.chords = k;
    sortBy(this.chordSlope0, 1, this.chord, k, this.scratch);
    this.chordShare = X + Y > 0 ? Y / (X + Y) : 0;
  }

  /** Fills `out` with the order of all candidate segments at multiplier mu. */
  rank(mu: number, out: SegmentRanking): void {
    const day = this.day!;
    const { chargePrice: p, dischargePrice: q } = day;
    const n = day.periods;
    const m = this.chords;
    const shift = mu * this.chordShare;
    let i = 0;
    let j = 0;
    let k = 0;
    let sc = n > 0 ? -p[this.charge[0]!]! : Infinity;
    let sd = n > 0 ? -(q[this.discharge[0]!]! - mu) : Infinity;
    let sh = m > 0 ? this.chordSlope0[this.chord[0]!]! + shift : Infinity;
    const total = 2 * n + m;
    for (let r = 0; r < total; r++) {
      let id: number;
      let slope: number;
      if (sh <= sc && sh <= sd) {
        const t = this.chord[k++]!;
        id = 3 * t + CHORD;
        slope = sh;
        sh = k < m ? this.chordSlope0[this.chord[k]!]! + shift : Infinity;
      } else if (sc <= sd) {
        const t = this.charge[i++]!;
        id = 3 * t + CHARGE;
        slope = sc;
        sc = i < n ? -p[this.charge[i]!]! : Infinity;
      } else {
        const t = this.discharge[j++]!;
        id = 3 * t + DISCHARGE;
        slope = sd;
        sd = j < n ? -(q[this.discharge[j]!]! - mu) : Infinity;
      }
      out.segmentAt[r] = id;
      out.rankOf[id] = r;
      out.slope[id] = slope;
    }
    out.mu = mu;
  }
}

/** The merged order at one mu: rank r holds segment segmentAt[r]; slope by segment id. */
export class SegmentRanking {
  readonly segmentAt: Int32Array;
  readonly rankOf: Int32Array;
  readonly slope: Float64Array;
  mu = NaN;

  constructor(capacity: number) {
    this.segmentAt = new Int32Array(3 * capacity);
    this.rankOf = new Int32Array(3 * capacity);
    this.slope = new Float64Array(3 * capacity);
  }
}

function fillIdentity(idx: Int32Array, n: number): Int32Array {
  for (let t = 0; t < n; t++) idx[t] = t;
  return idx;
}

/** Stable bottom-up merge sort of idx[0, n) by sign * key[idx] ascending, in place (scratch >= n). */
function sortBy(key: Float64Array, sign: 1 | -1, idx: Int32Array, n: number, scratch: Int32Array): void {
  let from = idx;
  let to = scratch;
  for (let width = 1; width < n; width *= 2) {
    for (let lo = 0; lo < n; lo += 2 * width) {
      const mid = Math.min(lo + width, n);
      const hi = Math.min(lo + 2 * width, n);
      let a = lo;
      let b = mid;
      let o = lo;
      while (a < mid && b < hi) {
        const ka = sign * key[from[a]!]!;
        const kb = sign * key[from[b]!]!;
        to[o++] = kb < ka ? from[b++]! : from[a++]!;
      }
      while (a < mid) to[o++] = from[a++]!;
      while (b < hi) to[o++] = from[b++]!;
    }
    const swap = from;
    from = to;
    to = swap;
  }
  if (from !== idx) idx.set(from.subarray(0, n));
}
