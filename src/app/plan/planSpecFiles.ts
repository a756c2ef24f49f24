import { checkedBatterySpec } from '../../battery/batterySpecCheck.js';
import { readCheckedSpec } from '../../io/specFile.js';
import { checkedMarketSpec } from '../../market/marketSpecCheck.js';
import type { BatterySpec, MarketSpec } from '../../types.js';

/** A plan's market and battery spec files as the hand-written checks read them. */
export interface CheckedPlanSpecs {
  readonly market: { readonly path: string; readonly value: MarketSpec; readonly text: string };
  readonly battery: { readonly path: string; readonly value: BatterySpec };
}

/**
 * The market and battery spec files of a plan, when the hand-written checks accept both
 * (marketSpecCheck.ts, batterySpecCheck.ts: only what their schemas accept, returned as the schemas
 * return it); else undefined, and the schemas word the problem. Apart from planFastPath.ts, which
 * loads it with the planning code: the zone checks of the market need the zone library.
 */
export function checkedPlanSpecs(paths: { readonly market: string; readonly battery: string }): CheckedPlanSpecs | undefined {
  const market = readCheckedSpec(paths.market, checkedMarketSpec);
  const battery = readCheckedSpec(paths.battery, checkedBatterySpec);
  if (market === undefined || battery === undefined) return undefined;
  return { market: { path: paths.market, ...market }, battery: { path: paths.battery, value: battery.value } };
}
