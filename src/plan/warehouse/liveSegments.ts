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
 * multiplier cost more than inserting into this short array. The sweep inserts in place, keeping
 * the two ends in locals (measured about 13 % faster than a method that reads and writes them here).
 */
export const SEGMENT_KIND = { discharge: 0, charge: 1, chord: 2 } as const;

export type SegmentKind = (typeof SEGMENT_KIND)[keyof typeof SEGMENT_KIND];

export class LiveSegments {
  /** Segment ids and slopes in slots [head, tail), slope ascending: the flattest at head, the steepest at tail - 1. */
  readonly ids: Int32Array;
  readonly slopes: Float64Array;
  /** The slot both ends start from (an empty array), with room on either side. */
  readonly middle: number;
  /** The sweep removes segments by moving these two ends (head++ drops the flattest, tail-- takes the steepest). */
  head = 0;
  tail = 0;

  /** Room for every segment of a day of up to `capacity` periods, on either side of the middle. */
  constructor(capacity: number) {
    const size = 2 * (2 * capacity + 2);
    this.ids = new Int32Array(size);
    this.slopes = new Float64Array(size);
    this.middle = size >>> 1;
  }
}

/** The id of period t's segment of a kind. */
export function segmentId(t: number, kind: SegmentKind): number {
  return 3 * t + kind;
}

/** Among segments of equal slope: whether segment a ranks below segment b. */
export function ranksBelow(a: number, b: number): boolean {
  return tieRank(a) < tieRank(b);
}

/** Order among equal slopes: chord, charge, discharge, then by period. */
function tieRank(id: number): number {
  const t = (id / 3) | 0;
  const kind = id - 3 * t;
  return (kind === SEGMENT_KIND.chord ? 0 : kind === SEGMENT_KIND.charge ? 1 : 2) * 0x1000000 + t;
}
