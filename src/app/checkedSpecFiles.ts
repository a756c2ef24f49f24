import { checkedBatterySpec } from '../battery/batterySpecCheck.js';
import { readCheckedSpec } from '../io/specFile.js';
import { checkedMarketSpec } from '../market/marketSpecCheck.js';
import type { CheckedFiles } from './checkedInputPaths.js';

/**
 * A run's market and battery spec files, when the hand-written checks accept both (marketSpecCheck.ts,
 * batterySpecCheck.ts: only what their schemas accept, returned as the schemas return it); else
 * undefined, and the schemas word the problem. Apart from checkedInputPaths.ts, so that the plan's fast
 * path loads it with the planning code: the market's zone checks need the zone library.
 */
export function checkedSpecFiles(paths: { readonly market: string; readonly battery: string }): Pick<CheckedFiles, 'market' | 'battery'> | undefined {
  const market = readCheckedSpec(paths.market, checkedMarketSpec);
  const battery = readCheckedSpec(paths.battery, checkedBatterySpec);
  if (market === undefined || battery === undefined) return undefined;
  return { market: { path: paths.market, ...market }, battery: { path: paths.battery, value: battery.value } };
}
