/**
 * Whole-day scenarios of one delivery day: S equally likely paths, each a clearing price and the
 * imbalance prices (buy and sell) in every one of the day's T periods. The paths keep the dependence
 * between the periods of a day, so a day's profit can be valued path by path (docs/design.md
 * section 4.7).
 *
 * Layout: period-major typed arrays, value of path w in period t at index t x S + w, so that the
 * settlement of a period runs over all paths in one contiguous loop (scenarios/evaluateBids.ts).
 */
export interface ScenarioSet {
  /** Number of paths S [-], >= 1; every path has weight 1 / S. */
  readonly pathCount: number;
  /** Number of delivery periods T [-]. */
  readonly periodCount: number;
  /** Clearing price of path w in period t at [t x S + w] [currency/MWh]. */
  readonly clearingPricePerMwh: Float64Array;
  /** Price paid per MWh bought at the imbalance price, same layout [currency/MWh]. */
  readonly imbalanceBuyPerMwh: Float64Array;
  /** Price received per MWh sold at the imbalance price, same layout [currency/MWh]. */
  readonly imbalanceSellPerMwh: Float64Array;
}

/** Whole-day price paths as the path makers give them: paths[w][t] [currency/MWh]. */
export type PricePaths = readonly (readonly number[])[];

/**
 * A scenario set from paths[w][t] of clearing prices and of the imbalance buy and sell prices.
 *
 * @throws RangeError for no path, paths of different lengths, or a value that is not finite
 */
export function scenarioSet(clearing: PricePaths, imbalanceBuy: PricePaths, imbalanceSell: PricePaths): ScenarioSet {
  const pathCount = clearing.length;
  if (pathCount === 0) throw new RangeError('scenarioSet: no path');
  const periodCount = (clearing[0] as readonly number[]).length;
  const pack = (paths: PricePaths, name: string): Float64Array => {
    if (paths.length !== pathCount) throw new RangeError(`scenarioSet: ${paths.length} ${name} paths for ${pathCount} clearing paths`);
    const out = new Float64Array(pathCount * periodCount);
    paths.forEach((path, w) => {
      if (path.length !== periodCount) throw new RangeError(`scenarioSet: ${name} path ${w} has ${path.length} periods, not ${periodCount}`);
      for (let t = 0; t < periodCount; t++) {
        const value = path[t] as number;
        if (!Number.isFinite(value)) throw new RangeError(`scenarioSet: ${name} path ${w} period ${t} is ${value}`);
        out[t * pathCount + w] = value;
      }
    });
    return out;
  };
  return {
    pathCount,
    periodCount,
    clearingPricePerMwh: pack(clearing, 'clearing'),
    imbalanceBuyPerMwh: pack(imbalanceBuy, 'imbalance buy'),
    imbalanceSellPerMwh: pack(imbalanceSell, 'imbalance sell'),
  };
}

/** Path w of a scenario set as plain series (for settleDay and for tests). */
export function scenarioPath(set: ScenarioSet, w: number): { clearing: number[]; imbalanceBuy: number[]; imbalanceSell: number[] } {
  if (!(Number.isInteger(w) && w >= 0 && w < set.pathCount)) throw new RangeError(`scenarioPath: no path ${w} of ${set.pathCount}`);
  const pick = (values: Float64Array): number[] => Array.from({ length: set.periodCount }, (_, t) => values[t * set.pathCount + w] as number);
  return { clearing: pick(set.clearingPricePerMwh), imbalanceBuy: pick(set.imbalanceBuyPerMwh), imbalanceSell: pick(set.imbalanceSellPerMwh) };
}
