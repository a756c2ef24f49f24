/**
 * The policies a backtest compares on the same days (docs/design.md sections 4 and 5):
 * - `quantile`: schedule and limits on the pessimistic side of the forecast, buys at q(1 - alpha), sells at q(alpha);
 * - `median`: schedule on the median, limits at q(1 - alpha) for buys and q(alpha) for sells;
 * - `point`: schedule and limits on the median;
 * - `price-taking`: schedule on the median, buy limits at the price cap and sell limits at the floor, so
 *   every order is accepted;
 * - `perfect-foresight`: schedule on the realised prices, every order accepted: the upper bound.
 */
export type BacktestPolicy = 'quantile' | 'median' | 'point' | 'price-taking' | 'perfect-foresight';

export const BACKTEST_POLICIES: readonly BacktestPolicy[] = Object.freeze(['quantile', 'median', 'point', 'price-taking', 'perfect-foresight']);
