import { ArgumentError } from '../stats/argumentError.js';
import { requireFinite, requireIntegerIn, requireNonNegative } from '../stats/validate.js';

/** Inputs of a battery project's yearly cash flows. */
export interface ProjectInput {
  /** Energy capacity [MWh], >= 0. */
  readonly energyMwh: number;
  /** Power rating [MW], >= 0. */
  readonly powerMw: number;
  /** Capital cost of the energy part (cells, racks) [currency/MWh], >= 0. */
  readonly capexPerMwh: number;
  /** Capital cost of the power part (inverters, grid connection) [currency/MW], >= 0. */
  readonly capexPerMw: number;
  /** Fixed operation and maintenance cost [currency/(MW year)], >= 0. */
  readonly fixedOmPerMwYear: number;
  /** Annualised trading profit, degradation cost already deducted [currency/year], finite. */
  readonly annualProfit: number;
  /** Project life [year], integer >= 1. */
  readonly lifeYears: number;
  /** Warranted throughput of one set of cells [equivalent full cycles], > 0; Infinity for no limit. */
  readonly lifeCycles: number;
  /** Throughput used per year [equivalent full cycles/year], >= 0 (from the backtest). */
  readonly cyclesPerYear: number;
  /** Share of the energy capital cost paid at each replacement [-], >= 0. Default 1. */
  readonly replacementFraction?: number;
}

export const DEFAULT_PROJECT_OPTIONS = Object.freeze({ replacementFraction: 1 });

/** Yearly cash flows of a project and the parts they are made of. */
export interface ProjectCashFlows {
  /** CF_0..CF_lifeYears [currency]: CF_0 = -capex, CF_y = profit - O&M - replacements in year y (+ the residual value in the last year). */
  readonly cashFlows: readonly number[];
  /** capexPerMwh * energyMwh + capexPerMw * powerMw [currency]. */
  readonly capex: number;
  /** fixedOmPerMwYear * powerMw [currency/year]. */
  readonly annualFixedOm: number;
  /** replacementFraction * capexPerMwh * energyMwh [currency] per replacement. */
  readonly replacementCost: number;
  /** End-of-year index of each replacement, ascending (repeated when two fall in one year). */
  readonly replacementYears: readonly number[];
  /**
   * Residual value of the last replacement set at the end of life, credited in CF_L [currency]:
   * straight-line over that set's life, R x (m + 1 - L x cyclesPerYear / lifeCycles) with m replacements;
   * 0 without a replacement.
   */
  readonly residualValue: number;
}

/**
 * Yearly cash flows of a battery project, end-of-year convention, year 0 = investment.
 *
 * Notes:
 *   CF_0 = -(capexPerMwh * energyMwh + capexPerMw * powerMw),
 *   CF_y = annualProfit - fixedOmPerMwYear * powerMw - k_y * R,   y = 1..L (L = lifeYears),
 *   R    = replacementFraction * capexPerMwh * energyMwh.
 * Replacement convention: throughput accumulates evenly at cyclesPerYear; the m-th set of cells runs
 * out at time m * lifeCycles / cyclesPerYear years, and its replacement is paid at the end of the year
 * in which that happens (year ceil(m * lifeCycles / cyclesPerYear)), the new cells taking over at once.
 * A set that runs out exactly at or after the end of life is not replaced, so with
 * K(y) = floor(y * cyclesPerYear / lifeCycles) sets used up by the end of year y,
 *   k_y = K(y) - K(y - 1) for y < L and k_L = ceil(L * cyclesPerYear / lifeCycles) - 1 - K(L - 1).
 * Residual value: the set in use at the end of life (the m-th replacement, m = sum_y k_y >= 1) was
 * bought for R and started at m * lifeCycles / cyclesPerYear years; it is written off straight-line over
 * its own life of lifeCycles / cyclesPerYear years, so at the end of life it is still worth
 *   RV = R * (m + 1 - L * cyclesPerYear / lifeCycles)   (in [0, 1) x R),
 * credited in CF_L. A replacement bought shortly before the end of life thus costs only the part of it
 * the project uses. The initial plant, cells included, carries no residual value (conservative, as
 * before); no inflation, no tax.
 *
 * @param input sizes, costs, profit, life and throughput (see ProjectInput)
 * @example
 * projectCashFlows({ energyMwh: 20, powerMw: 10, capexPerMwh: 300, capexPerMw: 100,
 *   fixedOmPerMwYear: 5, annualProfit: 1000, lifeYears: 3, lifeCycles: 500, cyclesPerYear: 300 });
 * // capex 7000, O&M 50/year, cells run out at 1.67 years -> replacement 6000 at the end of year 2;
 * // by the end of year 3 the replacement has run 3 - 1.67 = 1.33 of its 1.67 years: RV = 6000 x (2 - 1.8) = 1200:
 * // { cashFlows: [-7000, 950, -5050, 2150], replacementYears: [2], residualValue: 1200, ... }
 *
 * Reference: the year-by-year cash-flow model of W. Short, D. J. Packey and T. Holt (1995),
 * A Manual for the Economic Evaluation of Energy Efficiency and Renewable Energy Technologies,
 * with replacement costs in the year they are incurred.
 */
export function projectCashFlows(input: ProjectInput): ProjectCashFlows {
  const replacementFraction = input.replacementFraction ?? DEFAULT_PROJECT_OPTIONS.replacementFraction;
  for (const name of ['energyMwh', 'powerMw', 'capexPerMwh', 'capexPerMw', 'fixedOmPerMwYear', 'cyclesPerYear'] as const) {
    requireNonNegative(`input.${name}`, input[name]);
  }
  requireNonNegative('input.replacementFraction', replacementFraction);
  requireFinite('input.annualProfit', input.annualProfit);
  requireIntegerIn('input.lifeYears', input.lifeYears, 1);
  if (!(input.lifeCycles > 0)) {
    throw new ArgumentError('input.lifeCycles', 'a number of equivalent full cycles > 0 (Infinity for no limit)', input.lifeCycles);
  }

  const energyCapex = input.capexPerMwh * input.energyMwh;
  const capex = energyCapex + input.capexPerMw * input.powerMw;
  const annualFixedOm = input.fixedOmPerMwYear * input.powerMw;
  const replacementCost = replacementFraction * energyCapex;
  const usedUp = (years: number): number => Math.floor((years * input.cyclesPerYear) / input.lifeCycles);
  const replacedByEnd = Math.max(0, Math.ceil((input.lifeYears * input.cyclesPerYear) / input.lifeCycles) - 1);

  const cashFlows = [-capex];
  const replacementYears: number[] = [];
  for (let y = 1; y <= input.lifeYears; y++) {
    const byEndOfYear = y < input.lifeYears ? usedUp(y) : replacedByEnd;
    const count = Math.max(0, byEndOfYear - usedUp(y - 1));
    for (let i = 0; i < count; i++) replacementYears.push(y);
    cashFlows.push(input.annualProfit - annualFixedOm - count * replacementCost);
  }
  const m = replacementYears.length;
  const setsUsed = (input.lifeYears * input.cyclesPerYear) / input.lifeCycles;
  const residualValue = m === 0 ? 0 : replacementCost * Math.min(1, Math.max(0, m + 1 - setsUsed));
  cashFlows[input.lifeYears] = (cashFlows[input.lifeYears] as number) + residualValue;
  return { cashFlows, capex, annualFixedOm, replacementCost, replacementYears, residualValue };
}
