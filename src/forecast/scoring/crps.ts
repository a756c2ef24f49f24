import { normalCdf } from '../../stats/normalCdf.js';
import { pinballLoss } from './pinball.js';

/**
 * quantbid's `crps` of a quantile forecast: the mean pinball loss over its levels,
 *   crps = (1/K) sum_k rho_{tau_k}(y - q_{tau_k}).
 * Convention, stated once for every report: the factor 2 is NOT included. Because
 * CRPS(F, y) = 2 int_0^1 rho_tau(y - F^-1(tau)) d tau (Laio and Tamea 2007; Gneiting and Ranjan 2011),
 * this mean over evenly spread levels approximates CRPS / 2 (e.g. the 99 levels 0.01..0.99 of
 * N(0, 1) at y = 0 give 0.117956 against CRPS / 2 = 0.116848). Multiply by 2 to compare with a CRPS.
 * Unit: that of y [currency/MWh]; lower is better.
 *
 * References: F. Laio and S. Tamea (2007), Verification tools for probabilistic forecasts of
 * continuous hydrological variables, Hydrol. Earth Syst. Sci. 11, 1267-1277,
 * doi:10.5194/hess-11-1267-2007; T. Gneiting and R. Ranjan (2011), Comparing density forecasts using
 * threshold- and quantile-weighted scoring rules, J. Bus. Econ. Stat. 29(3), 411-422,
 * doi:10.1198/jbes.2010.08110.
 *
 * @param quantiles q at each level, same length as levels
 */
export function crpsFromQuantiles(y: number, quantiles: readonly number[], levels: readonly number[]): number {
  let sum = 0;
  levels.forEach((tau, k) => (sum += pinballLoss(y, quantiles[k] as number, tau)));
  return sum / levels.length;
}

/**
 * Closed-form CRPS of a normal forecast N(mu, sigma^2) for the realised y (Gneiting, Raftery,
 * Westveld and Goldman 2005), with z = (y - mu) / sigma:
 *   CRPS = sigma (z (2 Phi(z) - 1) + 2 phi(z) - 1 / sqrt(pi)).
 * This is the full CRPS (not halved). A reference for the quantile-based score above.
 *
 * @example
 * crpsNormal(0, 1, 0); // 0.2336950 (= (sqrt 2 - 1) / sqrt pi)
 *
 * Reference: T. Gneiting, A. E. Raftery, A. H. Westveld and T. Goldman (2005), Calibrated probabilistic
 * forecasting using ensemble model output statistics and minimum CRPS estimation, Mon. Weather Rev.
 * 133(5), 1098-1118, doi:10.1175/MWR2904.1.
 *
 * @param sigma standard deviation, > 0
 */
export function crpsNormal(mu: number, sigma: number, y: number): number {
  const z = (y - mu) / sigma;
  const density = Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);
  return sigma * (z * (2 * normalCdf(z) - 1) + 2 * density - 1 / Math.sqrt(Math.PI));
}
