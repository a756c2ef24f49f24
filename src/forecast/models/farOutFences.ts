import { sortedQuantile } from '../quantiles/sortedQuantile.js';

/** A closed interval of prices [currency/MWh] outside which a value counts as far out. */
export interface Fences {
  readonly low: number;
  readonly high: number;
}

/**
 * Tukey's far-out fences of a sample, [Q1 - 3 IQR, Q3 + 3 IQR] with its quartiles (Hyndman and Fan's
 * definition 7, sortedQuantile): clipped at them, a few spike periods cannot move a mean or a lag far,
 * while ordinary values are left as they are (J. W. Tukey 1977, Exploratory Data Analysis,
 * Addison-Wesley, section 2H).
 *
 * @param values at least one finite value (not changed)
 */
export function farOutFences(values: ArrayLike<number>): Fences {
  return sortedFarOutFences(Float64Array.from(values).sort());
}

/** {@link farOutFences} of a sample already in ascending order (at least one value). */
export function sortedFarOutFences(sorted: ArrayLike<number>): Fences {
  return fencesOfQuartiles(sortedQuantile(sorted, 0.25), sortedQuantile(sorted, 0.75));
}

/** The far-out fences [Q1 - 3 IQR, Q3 + 3 IQR] of a sample with quartiles q1 <= q3 (Tukey 1977, as above). */
export function fencesOfQuartiles(q1: number, q3: number): Fences {
  return { low: q1 - 3 * (q3 - q1), high: q3 + 3 * (q3 - q1) };
}

/** A sample's far-out fences, the quartiles they are made of, and its extremes. */
export interface SampleBounds {
  readonly fences: Fences;
  /** The first and third quartile (definition 7). */
  readonly quartiles: { readonly q1: number; readonly q3: number };
  readonly lowest: number;
  readonly highest: number;
}

/** {@link sortedFarOutFences} and the first and last value of a sample in ascending order (at least one value). */
export function sortedSampleBounds(sorted: ArrayLike<number>): SampleBounds {
  const q1 = sortedQuantile(sorted, 0.25);
  const q3 = sortedQuantile(sorted, 0.75);
  return { fences: fencesOfQuartiles(q1, q3), quartiles: { q1, q3 }, lowest: sorted[0] as number, highest: sorted[sorted.length - 1] as number };
}
