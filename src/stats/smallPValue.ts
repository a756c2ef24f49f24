/** p-values below this are written in scientific notation [-]. */
export const SMALL_P_VALUE = 1e-4;

/**
 * A p-value below SMALL_P_VALUE as text with two significant digits in scientific notation (`3.2e-7`),
 * `<1e-300` for one that underflowed to 0; null from SMALL_P_VALUE up (written with 4 decimals
 * elsewhere). Six fixed decimals would print a p of 3e-7 as `0`, which reads as impossible.
 */
export function smallPValueText(p: number): string | null {
  if (p >= SMALL_P_VALUE) return null;
  return p > 0 ? p.toExponential(1) : '<1e-300';
}
