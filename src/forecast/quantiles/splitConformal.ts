import { ArgumentError } from '../../stats/argumentError.js';

/**
 * Rank of the calibration score that bounds a split conformal interval: ceil((n + 1)(1 - alpha)).
 * With n exchangeable calibration scores, the interval built from the score of this rank covers a
 * new observation with probability >= 1 - alpha (Vovk, Gammerman and Shafer 2005; Lei et al. 2018,
 * Theorem 2.2). A rank above n means the interval is unbounded at this n and alpha.
 *
 * @example
 * conformalRank(19, 0.1); // 18: the 18th smallest of 19 scores
 * conformalRank(9, 0.05); // 10 > 9: unbounded
 *
 * References: V. Vovk, A. Gammerman and G. Shafer (2005), Algorithmic Learning in a Random World,
 * Springer; J. Lei, M. G'Sell, A. Rinaldo, R. J. Tibshirani and L. Wasserman (2018), Distribution-free
 * predictive inference for regression, JASA 113(523), 1094-1111, doi:10.1080/01621459.2017.1307116.
 */
export function conformalRank(n: number, alpha: number): number {
  if (!Number.isInteger(n) || n < 1) throw new ArgumentError('n', 'an integer >= 1', n);
  if (!(alpha > 0 && alpha < 1)) throw new ArgumentError('alpha', 'a number in (0, 1)', alpha);
  // The tiny offset keeps an exact integer product, e.g. 20 * 0.9 = 18.000000000000004, at 18.
  return Math.ceil((n + 1) * (1 - alpha) - 1e-9);
}

/**
 * Half-width of the split conformal interval from absolute calibration errors |P - P_hat|: the
 * conformalRank(n, alpha)-th smallest, or Infinity when that rank exceeds n.
 *
 * @param absoluteErrors |e_1|..|e_n|, any order (not changed)
 */
export function conformalHalfWidth(absoluteErrors: ArrayLike<number>, alpha: number): number {
  const rank = conformalRank(absoluteErrors.length, alpha);
  if (rank > absoluteErrors.length) return Infinity;
  const sorted = Float64Array.from(absoluteErrors as ArrayLike<number>).sort();
  return sorted[rank - 1] as number;
}

/**
 * Quantiles from split conformal intervals around a point forecast, per clock slot. A level tau < 1/2
 * is the lower end of the central interval with alpha = 2 tau, a level tau > 1/2 the upper end of
 * the one with alpha = 2 (1 - tau), and tau = 1/2 the point forecast:
 *   q_tau(s) = P_hat(s) - c_{2 tau}(s),   q_{1-tau}(s) = P_hat(s) + c_{2 tau}(s),
 * c_alpha(s) the conformal half-width of the slot's absolute calibration errors. Where the rank
 * exceeds n (too few calibration days for that alpha) the largest absolute error is used instead,
 * and the interval loses its finite-sample guarantee; the caller is told through `clamped`.
 *
 * @param point point forecast per slot [currency/MWh]
 * @param errors out-of-sample errors per calibration day and slot [currency/MWh]
 * @param levels strictly increasing levels in (0, 1)
 */
export function conformalQuantiles(
  point: ArrayLike<number>,
  errors: readonly ArrayLike<number>[],
  levels: readonly number[],
): { prices: number[][]; clamped: boolean } {
  let clamped = false;
  const n = errors.length;
  const prices = Array.from({ length: point.length }, (_, s) => {
    const sorted = Float64Array.from(errors, (e) => Math.abs(e[s] as number)).sort();
    return levels.map((tau) => {
      if (tau === 0.5) return point[s] as number;
      const alpha = 2 * Math.min(tau, 1 - tau);
      let rank = conformalRank(n, alpha);
      if (rank > n) {
        clamped = true;
        rank = n;
      }
      const c = sorted[rank - 1] as number;
      return (point[s] as number) + (tau < 0.5 ? -c : c);
    });
  });
  return { prices, clamped };
}
