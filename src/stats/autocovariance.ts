import { mean } from './mean.js';
import { requireFiniteArray, requireIntegerIn } from './validate.js';

/**
 * Sample autocovariance at lag k, with divisor n (the biased estimator, which keeps the sequence
 * of autocovariances positive semi-definite).
 *
 * Notes: gamma_k = (1/n) sum_{t=k+1}^{n} (x_t - xbar)(x_{t-k} - xbar), 0 <= k <= n - 1;
 * gamma_0 is the variance with divisor n.
 *
 * @param values x_1..x_n, finite, at least one
 * @param lag k, an integer in [0, n - 1]
 * @example
 * autocovariance([1, -1, 1, -1], 1); // -3/4
 *
 * Reference: G. E. P. Box and G. M. Jenkins (1970), Time Series Analysis: Forecasting and Control,
 * chapter 2 (the estimate c_k of the autocovariance function).
 */
export function autocovariance(values: readonly number[], lag: number): number {
  requireFiniteArray('values', values, 1);
  requireIntegerIn('lag', lag, 0, values.length - 1);
  const xbar = mean(values);
  let sum = 0;
  for (let t = lag; t < values.length; t++) {
    sum += ((values[t] as number) - xbar) * ((values[t - lag] as number) - xbar);
  }
  return sum / values.length;
}
