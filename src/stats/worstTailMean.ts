import { ArgumentError } from './argumentError.js';

/**
 * Conditional value at risk of a profit sample: the mean of its worst beta share, counting a fraction
 * of the order statistic at the boundary (the fractional tail). With the n values sorted ascending,
 * X_(1) <= ... <= X_(n), and w = beta n:
 *
 *   CVaR_beta = ( sum_{i=1}^{floor(w)} X_(i) + (w - floor(w)) X_(floor(w)+1) ) / w
 *
 * (Acerbi and Tasche 2002, Proposition 4.1 / eq. 4.2, the sample expected shortfall, here of profits
 * rather than losses, so the sign is kept). It equals Rockafellar and Uryasev's formula with equally
 * weighted outcomes, CVaR_beta = max over eta of { eta - (1 / (beta n)) sum_i max(0, eta - X_i) }
 * (Rockafellar and Uryasev 2000, Theorem 1; 2002, Proposition 8), the maximum attained at eta = X_(ceil(w)),
 * which is the form the curve program optimises. It is never above the mean, and equals the minimum when
 * beta n <= 1.
 *
 * References: C. Acerbi and D. Tasche (2002), On the coherence of expected shortfall, J. Banking &
 * Finance 26(7), 1487-1503; R. T. Rockafellar and S. Uryasev (2000), Optimization of conditional
 * value-at-risk, J. Risk 2(3), 21-41; (2002), Conditional value-at-risk for general loss distributions,
 * J. Banking & Finance 26(7), 1443-1471.
 *
 * @param values the sample (any order; not changed), at least one finite value
 * @param beta the tail share in (0, 1], e.g. 0.05 for the worst 5 %
 */
export function worstTailMean(values: ArrayLike<number>, beta: number): number {
  const n = values.length;
  if (n === 0) throw new ArgumentError('values', 'at least one value', values);
  if (typeof beta !== 'number' || !(beta > 0 && beta <= 1)) throw new ArgumentError('beta', 'a share in (0, 1]', beta);
  const sorted = Float64Array.from(values);
  for (let i = 0; i < n; i++) if (!Number.isFinite(sorted[i] as number)) throw new ArgumentError('values', 'finite numbers', values);
  sorted.sort();
  const w = beta * n;
  const whole = Math.floor(w);
  let sum = 0;
  for (let i = 0; i < whole; i++) sum += sorted[i] as number;
  if (whole < n && w > whole) sum += (w - whole) * (sorted[whole] as number);
  return sum / w;
}
