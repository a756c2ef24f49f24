/**
 * The policies a backtest compares on the same days (docs/design.md sections 4 and 5):
 * - `quantile`: schedule and limits on the pessimistic side of the forecast, buys at q(1 - alpha), sells at q(alpha);
 * - `median`: schedule on the median, limits at q(1 - alpha) for buys and q(alpha) for sells;
 * - `point`: schedule and limits on the median;
 * - `price-taking`: schedule on the median, buy limits at the price cap and sell limits at the floor, so
 *   every order is accepted;
 * - `perfect-foresight`: schedule on the realised prices, every order accepted: the upper bound;
 * - `curve`: per period a monotone bid curve chosen on whole-day scenarios by the two-stage program
 *   (curves/planCurves.ts), or price-taking's flat bids where the curves do not do better on them;
 * - `auto`: each day, every candidate (price-taking, point, quantile and median over an alpha grid,
 *   curve) scored on fresh scenarios, the best submitted (autoChoice.ts).
 */
export type BacktestPolicy = 'quantile' | 'median' | 'point' | 'price-taking' | 'perfect-foresight' | 'curve' | 'auto';

/** Every policy, in the order outputs list them. */
export const BACKTEST_POLICIES: readonly BacktestPolicy[] = Object.freeze(['quantile', 'median', 'point', 'price-taking', 'perfect-foresight', 'curve', 'auto']);

/** The policies a backtest runs when none are named: those that need no scenarios. */
export const DEFAULT_BACKTEST_POLICIES: readonly BacktestPolicy[] = Object.freeze(['quantile', 'median', 'point', 'price-taking', 'perfect-foresight']);

/** Policies a sweep varies alpha for: the two whose orders depend on it. */
export const SWEEP_POLICIES = Object.freeze(['quantile', 'median', 'curve', 'auto'] as const);
export type SweepPolicy = (typeof SWEEP_POLICIES)[number];

/**
 * The reference policies whose rows sweep.csv carries after the grid, once per rule: they do not
 * depend on alpha, and every setting is read against them.
 */
export const SWEEP_REFERENCE_POLICIES = Object.freeze(['point', 'price-taking', 'perfect-foresight'] as const);
export type SweepReferencePolicy = (typeof SWEEP_REFERENCE_POLICIES)[number];

/**
 * Whether a policy reads the forecast at alpha and 1 - alpha: quantile and median do (their limits,
 * and for quantile the schedule, come from q(alpha) and q(1 - alpha)); the others ignore alpha.
 */
export function readsAlpha(policy: BacktestPolicy): policy is 'quantile' | 'median' {
  return policy === 'quantile' || policy === 'median';
}

/** Whether a policy reads the forecast's median: median, point, price-taking, curve and auto do. */
export function readsMedian(policy: BacktestPolicy): boolean {
  return policy === 'median' || policy === 'point' || policy === 'price-taking' || usesScenarios(policy);
}

/** Whether a policy plans on whole-day scenarios (and so needs paths and the LP solver). */
export function usesScenarios(policy: BacktestPolicy): policy is 'curve' | 'auto' {
  return policy === 'curve' || policy === 'auto';
}
