import { annualiseProfit, DAYS_PER_YEAR } from '../economics/annualiseProfit.js';
import { irr, type IrrOptions } from '../economics/irr.js';
import { npv } from '../economics/npv.js';
import { discountedPayback, simplePayback, type PaybackResult } from '../economics/payback.js';
import { projectCashFlows } from '../economics/projectCashFlows.js';

/** Costs and finance of a battery project, the same for every size of a sizing grid. */
export interface SizeCosts {
  /** Capital cost of the energy part [currency/MWh], >= 0. */
  readonly capexPerMwh: number;
  /** Capital cost of the power part [currency/MW], >= 0. */
  readonly capexPerMw: number;
  /** Fixed operation and maintenance [currency/(MW year)], >= 0. */
  readonly fixedOmPerMwYear: number;
  /** Project life [year], integer >= 1. */
  readonly lifeYears: number;
  /** Throughput one set of cells lasts [equivalent full cycles], > 0; null for no limit (no replacement). */
  readonly lifeCycles: number | null;
  /** Discount rate per year [-], > -1 (0.07 is 7%). */
  readonly discountRate: number;
}

/**
 * Where the IRR of a size is looked for: -99% to 10,000% a year in steps of 1% (irr.ts). Wider than
 * irr's default (up to 1,000%) so that a cheap battery on a volatile market still gets a rate, not
 * `none`; two roots closer than 1% apart are not told apart.
 */
export const SIZE_IRR_SCAN: IrrOptions = Object.freeze({ minRate: -0.99, maxRate: 100, step: 0.01 });

/** What a backtest of one size gave, over the days it covered. */
export interface SizeBacktestTotals {
  /** Covered days n [day], > 0. */
  readonly days: number;
  /** Profit: trading cash - wear cost [currency]. */
  readonly profit: number;
  /** Trading cash: auction cash + imbalance cash, before the wear cost [currency]. */
  readonly tradingCash: number;
  /** Energy discharged at the grid [MWh]. */
  readonly dischargedMwh: number;
  /** Equivalent full cycles: MWh taken out of the store / usable window (equivalentFullCycles.ts) [-]. */
  readonly equivalentFullCycles: number;
}

export interface SizeEconomics {
  /** Profit x 365.25 / n [currency/year]. */
  readonly profitPerYear: number;
  /** Trading cash x 365.25 / n [currency/year]. */
  readonly revenuePerYear: number;
  /** Equivalent full cycles x 365.25 / n [1/year]. */
  readonly cyclesPerYear: number;
  /** Discharged MWh x 365.25 / n [MWh/year]. */
  readonly throughputMwhPerYear: number;
  /** Trading cash / discharged MWh [currency/MWh]; null when nothing was discharged. */
  readonly spreadPerMwhDischarged: number | null;
  /** capexPerMwh x energy + capexPerMw x power [currency]. */
  readonly capex: number;
  /** fixedOmPerMwYear x power [currency/year]. */
  readonly annualFixedOm: number;
  /** Cell replacements over the life [-]. */
  readonly replacements: number;
  /** Residual value of the last replacement set at the end of life, in CF_L (projectCashFlows) [currency]. */
  readonly residualValue: number;
  /** CF_0..CF_L [currency] (projectCashFlows). */
  readonly cashFlows: readonly number[];
  /** NPV at the discount rate [currency]. */
  readonly npv: number;
  /** Internal rate of return [-], the root nearest 0; null when NPV has no root in SIZE_IRR_SCAN (e.g. no sign change). */
  readonly irr: number | null;
  /** Years until the cumulative cash flow reaches 0; null when it never does within the life. */
  readonly simplePaybackYears: number | null;
  readonly discountedPaybackYears: number | null;
}

/**
 * The economics of one battery size from its backtest, step by step:
 * 1. annualise by the days covered (the Julian year): profitPerYear = profit x 365.25 / n, likewise
 *    the trading cash (revenue), the cycles and the throughput (annualiseProfit.ts);
 * 2. capital cost from energy and power: capex = capexPerMwh x E + capexPerMw x P;
 * 3. yearly flows, end-of-year convention (projectCashFlows.ts): CF_0 = -capex,
 *    CF_y = profitPerYear - fixedOmPerMwYear x P - replacements in year y, where the cells (the energy
 *    capital cost) are bought again each time their life in cycles, at cyclesPerYear, runs out before
 *    the end of the project life, and the last replacement set's residual value (straight-line over its
 *    own life) is credited in the last year; no other residual value, no tax, no inflation, profit the
 *    same every year;
 * 4. NPV(r) = sum_y CF_y / (1 + r)^y (npv.ts);
 * 5. IRR: the root of NPV nearest 0 (irr.ts) within SIZE_IRR_SCAN, none when the flows never change
 *    sign or NPV has no root there;
 * 6. simple and discounted payback: when the (discounted) cumulative flow first reaches 0, linear
 *    within the year (payback.ts).
 *
 * Profit is net of the wear cost already (degradationCostPerMwh in the backtest); the wear cost and
 * the replacement both charge for cell wear, so give a wear cost of 0 when --life-cycles is given
 * unless the wear cost stands for something else.
 *
 * Reference: R. A. Brealey, S. C. Myers and F. Allen, Principles of Corporate Finance (any recent
 * edition), NPV, IRR and payback; W. Short, D. J. Packey and T. Holt (1995), A Manual for the
 * Economic Evaluation of Energy Efficiency and Renewable Energy Technologies, yearly cash flows.
 */
export function sizeEconomics(size: { readonly energyMwh: number; readonly powerMw: number }, totals: SizeBacktestTotals, costs: SizeCosts): SizeEconomics {
  const perYear = (x: number): number => (x * DAYS_PER_YEAR) / totals.days;
  const profitPerYear = annualiseProfit(totals.profit, totals.days);
  const cyclesPerYear = perYear(totals.equivalentFullCycles);
  const project = projectCashFlows({
    energyMwh: size.energyMwh,
    powerMw: size.powerMw,
    capexPerMwh: costs.capexPerMwh,
    capexPerMw: costs.capexPerMw,
    fixedOmPerMwYear: costs.fixedOmPerMwYear,
    annualProfit: profitPerYear,
    lifeYears: costs.lifeYears,
    lifeCycles: costs.lifeCycles ?? Number.POSITIVE_INFINITY,
    cyclesPerYear,
  });
  const rate = irr(project.cashFlows, SIZE_IRR_SCAN);
  return {
    profitPerYear,
    revenuePerYear: perYear(totals.tradingCash),
    cyclesPerYear,
    throughputMwhPerYear: perYear(totals.dischargedMwh),
    spreadPerMwhDischarged: totals.dischargedMwh > 0 ? totals.tradingCash / totals.dischargedMwh : null,
    capex: project.capex,
    annualFixedOm: project.annualFixedOm,
    replacements: project.replacementYears.length,
    residualValue: project.residualValue,
    cashFlows: project.cashFlows,
    npv: npv(costs.discountRate, project.cashFlows),
    irr: rate.status === 'found' ? rate.rate : null,
    simplePaybackYears: years(simplePayback(project.cashFlows)),
    discountedPaybackYears: years(discountedPayback(costs.discountRate, project.cashFlows)),
  };
}

function years(result: PaybackResult): number | null {
  return result.status === 'reached' ? result.years : null;
}
