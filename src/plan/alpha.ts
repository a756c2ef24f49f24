import type { PlanPolicy } from '../types.js';

/** The planning policies (docs/design.md section 4), in the order the help lists them. */
export const PLAN_POLICIES: readonly PlanPolicy[] = Object.freeze(['quantile', 'median', 'point', 'price-taking']);

/**
 * Smallest alpha [-]: the central interval [q(0.001), q(0.999)]; a narrower tail lies beyond the levels
 * a forecast may have (LEVEL_RANGE, forecast/quantiles/levels.ts), and 1e-320 is no probability anyone means.
 */
export const ALPHA_MIN = 0.001;

/** The interval an alpha lies in, for messages: the rule of isAlpha. */
export const ALPHA_RANGE = `[${ALPHA_MIN}, 0.5)`;

/** What an alpha must be, for messages. */
export const ALPHA_RULE = `a number in ${ALPHA_RANGE}`;

/**
 * Whether `alpha` is a tail level (docs/design.md section 2): buys are limited at q(1 - alpha), sells
 * at q(alpha), and the central interval [q(alpha), q(1 - alpha)] covers 1 - 2 alpha. ALPHA_MIN <=
 * alpha < 0.5, so that q(alpha) lies below the median and q(1 - alpha) above it.
 */
export function isAlpha(alpha: number): boolean {
  return alpha >= ALPHA_MIN && alpha < 0.5;
}

/**
 * The upper level 1 - alpha, rounded to 12 decimals so that it reads as the level a forecast names
 * (1 - 0.1 is 0.9, not 0.9000000000000000222); levels closer than 1e-9 are one level everywhere.
 */
export function upperLevel(alpha: number): number {
  return Number((1 - alpha).toFixed(12));
}
