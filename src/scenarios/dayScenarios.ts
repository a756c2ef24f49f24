import type { DeliveryPeriod } from '../types.js';
import { spreadImbalancePaths, type ImbalanceSpreadModel } from './imbalanceSpread.js';
import { scenarioSet, type PricePaths, type ScenarioSet } from './scenarioSet.js';

/**
 * Where a path's imbalance prices come from: the market's rule (clearing + penalty to buy, clearing -
 * penalty to sell; docs/design.md section 5.4), or the spread model fitted on the history's imbalance
 * prices (imbalanceSpread.ts).
 */
export type ImbalancePathSource = { readonly kind: 'clearing-plus-penalty'; readonly penaltyPerMwh: number } | ImbalanceSpreadModel;

/**
 * The scenario set of a day from its clearing-price paths: each path's imbalance prices by the source.
 *
 * @param medianPricePerMwh the forecast's median per period, from which the spread model measures the surprise
 */
export function dayScenarios(clearing: PricePaths, periods: readonly DeliveryPeriod[], medianPricePerMwh: readonly number[], source: ImbalancePathSource): ScenarioSet {
  if (source.kind === 'clearing-plus-penalty') {
    const p = source.penaltyPerMwh;
    return scenarioSet(
      clearing,
      clearing.map((path) => path.map((c) => c + p)),
      clearing.map((path) => path.map((c) => c - p)),
    );
  }
  const imbalance = spreadImbalancePaths(source, clearing, medianPricePerMwh, periods);
  return scenarioSet(clearing, imbalance, imbalance);
}
