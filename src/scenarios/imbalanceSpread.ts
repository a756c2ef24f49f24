import type { DeliveryPeriod } from '../types.js';
import { leastSquaresQr } from '../forecast/linalg/leastSquaresQr.js';
import { slotLayout, toSlotGrid, fromSlotGrid } from '../forecast/models/slotGrid.js';

/** One past day the spread model learns from: its realised prices and the median forecast made for it. */
export interface SpreadDay {
  readonly periods: readonly DeliveryPeriod[];
  /** Realised clearing price per period [currency/MWh]. */
  readonly clearingPricePerMwh: readonly number[];
  /** Realised imbalance price per period [currency/MWh]. */
  readonly imbalancePricePerMwh: readonly number[];
  /** The forecast's median for the day, per period [currency/MWh]. */
  readonly medianPricePerMwh: readonly number[];
}

/**
 * The imbalance price of a path as the clearing price plus a spread that depends on the surprise
 * u = clearing - median forecast (a day whose price came out high tends to have a high imbalance
 * price too, so the spread is not independent of the surprise):
 *
 *   spread = imbalance - clearing = a + b_up max(u, 0) + b_down min(u, 0) + e,
 *
 * a hinged linear regression fitted by least squares on every period of the past days (pooled), with
 * separate slopes for surprises up and down. Path w takes the residual e of one whole past day (the
 * w-th latest, cycling), so that residuals keep their dependence between the periods of a day: the
 * residual bootstrap over whole days (Efron and Tibshirani 1993, sections 9.5 and 8.6 for blocks).
 * Residual days are kept on the clock-slot grid (forecast/models/slotGrid.ts), so any day's periods can
 * take them.
 *
 * Reference: B. Efron and R. J. Tibshirani (1993), An Introduction to the Bootstrap, Chapman & Hall.
 */
export interface ImbalanceSpreadModel {
  readonly kind: 'spread-on-surprise';
  /** a [currency/MWh]. */
  readonly intercept: number;
  /** b_up, b_down [-]. */
  readonly slopeUp: number;
  readonly slopeDown: number;
  /** Residuals e of each past day on the clock-slot grid, the latest day last [currency/MWh]. */
  readonly residualDays: readonly Float64Array[];
}

/** Fewest past days the spread model is fitted on [days]. */
export const MIN_SPREAD_DAYS = 28;

/**
 * Fits the spread model on past days (any order; the residual days are kept in the given order, the
 * latest last), or null with fewer than MIN_SPREAD_DAYS days.
 */
export function fitImbalanceSpread(days: readonly SpreadDay[]): ImbalanceSpreadModel | null {
  if (days.length < MIN_SPREAD_DAYS) return null;
  const rows: number[] = [];
  const spread: number[] = [];
  for (const day of days) {
    day.clearingPricePerMwh.forEach((clearing, t) => {
      const u = clearing - (day.medianPricePerMwh[t] as number);
      rows.push(1, Math.max(u, 0), Math.min(u, 0));
      spread.push((day.imbalancePricePerMwh[t] as number) - clearing);
    });
  }
  const fit = leastSquaresQr({ rows: spread.length, cols: 3, data: Float64Array.from(rows) }, spread);
  const [intercept, slopeUp, slopeDown] = Array.from(fit.coefficients) as [number, number, number];
  let at = 0;
  const residualDays = days.map((day) => {
    const values = day.clearingPricePerMwh.map(() => fit.residuals[at++] as number);
    return toSlotGrid(values, slotLayout(day.periods, 'imbalance spread day'));
  });
  return { kind: 'spread-on-surprise', intercept, slopeUp, slopeDown, residualDays };
}

/**
 * Imbalance prices of clearing-price paths under the spread model: path w, period t gets
 * clearing + a + b_up max(u, 0) + b_down min(u, 0) + e(d_w, slot t), u = clearing - median_t, d_w the
 * w-th latest residual day (cycling). One price for buying and selling, like a history's single
 * imbalance price column.
 */
export function spreadImbalancePaths(model: ImbalanceSpreadModel, clearing: readonly (readonly number[])[], medianPricePerMwh: readonly number[], periods: readonly DeliveryPeriod[]): number[][] {
  const layout = slotLayout(periods, 'scenario day');
  const m = model.residualDays.length;
  return clearing.map((path, w) => {
    const residual = fromSlotGrid(model.residualDays[m - 1 - (w % m)] as Float64Array, layout);
    return path.map((price, t) => {
      const u = price - (medianPricePerMwh[t] as number);
      return price + model.intercept + model.slopeUp * Math.max(u, 0) + model.slopeDown * Math.min(u, 0) + (residual[t] as number);
    });
  });
}
