import { requirePaths } from './energyScore.js';

/**
 * Variogram score of order p of an ensemble of whole-day paths x_1..x_n for the realised vector y
 * (Scheuerer and Hamill 2015, eq. 2 with the ensemble estimate of the expectation):
 *   VS_p = sum_{i, j} w_ij ( |y_i - y_j|^p - (1/n) sum_m |x_mi - x_mj|^p )^2,
 * over all ordered pairs of periods i, j (each unordered pair counts twice, i = j adds 0), with weights
 * w_ij = 1. It compares the forecast's and the outcome's differences between periods, so it rewards
 * paths whose periods move together the way prices do and is less dominated by the marginals than the
 * energy score; p = 0.5 is the order Scheuerer and Hamill recommend. Lower is better. Unit:
 * (currency/MWh)^(2p).
 *
 * @example
 * // one path (0, 2), y = (0, 1), p = 1: pairs (1,2) and (2,1) each (1 - 2)^2 = 1, so VS = 2
 * variogramScore([[0, 2]], [0, 1], 1); // 2
 *
 * Reference: M. Scheuerer and T. M. Hamill (2015), Variogram-based proper scoring rules for
 * probabilistic forecasts of multivariate quantities, Mon. Weather Rev. 143(4), 1321-1334,
 * doi:10.1175/MWR-D-14-00269.1.
 *
 * @param paths n >= 1 paths, each as long as y
 * @param p order > 0, default 0.5
 */
export function variogramScore(paths: readonly ArrayLike<number>[], y: ArrayLike<number>, p = 0.5): number {
  requirePaths(paths, y);
  const n = paths.length;
  const T = y.length;
  let score = 0;
  for (let i = 0; i < T; i++) {
    for (let j = i + 1; j < T; j++) {
      let expected = 0;
      for (let m = 0; m < n; m++) {
        const x = paths[m] as ArrayLike<number>;
        expected += Math.abs((x[i] as number) - (x[j] as number)) ** p;
      }
      const d = Math.abs((y[i] as number) - (y[j] as number)) ** p - expected / n;
      score += 2 * d * d;
    }
  }
  return score;
}
