/** Pixel positions of a band axis: band i spans [at(i), at(i + 1)]. */
export interface BandScale {
  readonly count: number;
  /** Width of one band [px]. */
  readonly bandwidth: number;
  /** Pixel position of a band position (0 = start of band 0, count = end of the last band). */
  at(position: number): number;
}

export function bandScale(count: number, range: readonly [number, number]): BandScale {
  const [r0, r1] = range;
  const n = Math.max(1, count);
  const bandwidth = (r1 - r0) / n;
  return { count, bandwidth, at: (position: number) => r0 + position * bandwidth };
}
