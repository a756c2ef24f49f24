import loadHighs, { type Highs } from 'highs';
import type { DayProblem, Schedule } from '../../src/types.js';

/**
 * The day problem of docs/design.md section 4 for the general-purpose solver HiGHS (npm `highs`
 * 1.15.3; Huangfu and Hall 2018, "Parallelizing the dual revised simplex method", Math. Prog.
 * Comp. 10, doi:10.1007/s12532-017-0130-5), built independently of src/plan.
 *
 * Columns, t = 0..T-1: c_t charge [MW] in [0, chargeMw], d_t discharge [MW] in [0, dischargeMw],
 * s_t state of charge at the end of period t [MWh] in [socMin, socMax] (last: >= max(socMin,
 * socEndMin)), and in the MIP a binary u_t (1 = the period may charge, 0 = it may discharge).
 * Rows: b_t: s_t - s_{t-1} - eta_c dt c_t + (dt / eta_d) d_t = 0 (s_{-1} = socStart on the right);
 * MIP only: cu_t: c_t - chargeMw u_t <= 0, du_t: d_t + dischargeMw u_t <= dischargeMw;
 * cap: sum_t (dt / eta_d) d_t <= maxFromStoreMwhPerDay, energy taken out of the store (+inf without a cap).
 * Objective, maximised: sum_t dt (sell_t - deg) d_t - dt buy_t c_t + terminal s_{T-1}.
 */

export const HIGHS_NPM_VERSION = '1.15.3';

/** Exact optimum: zero MIP gaps, tight feasibility tolerances, no log. */
export const HIGHS_EXACT_OPTIONS = Object.freeze({
  output_flag: false,
  mip_rel_gap: 0,
  mip_abs_gap: 0,
  primal_feasibility_tolerance: 1e-9,
  dual_feasibility_tolerance: 1e-9,
  mip_feasibility_tolerance: 1e-9,
});

export type HighsDayOutcome =
  | { readonly status: 'optimal'; readonly objective: number; readonly schedule: Schedule }
  | { readonly status: 'infeasible' }
  | { readonly status: 'other'; readonly detail: string };

export async function loadHighsSolver(): Promise<Highs> {
  return loadHighs();
}

/** Column j is c_t, d_t, s_t, u_t in blocks of T in that order. */
const col = (block: 0 | 1 | 2 | 3, t: number, periods: number): number => block * periods + t;
const colName = (j: number, periods: number): string => `${'cdsu'[Math.floor(j / periods)]}${j % periods}`;

/** Per-day column data: costs and bounds in column order (the part a kept model changes). */
export interface DayColumns {
  readonly colCost: Float64Array;
  readonly colLower: Float64Array;
  readonly colUpper: Float64Array;
}

export function dayColumns(problem: DayProblem, integer: boolean): DayColumns {
  const { battery: b, periodHours: dt } = problem;
  const periods = problem.buyPricePerMwh.length;
  const n = (integer ? 4 : 3) * periods;
  const colCost = new Float64Array(n);
  const colLower = new Float64Array(n);
  const colUpper = new Float64Array(n);
  for (let t = 0; t < periods; t++) {
    colCost[col(0, t, periods)] = -dt * (problem.buyPricePerMwh[t] as number);
    colUpper[col(0, t, periods)] = b.chargeMw;
    colCost[col(1, t, periods)] = dt * ((problem.sellPricePerMwh[t] as number) - b.degradationCostPerMwh);
    colUpper[col(1, t, periods)] = b.dischargeMw;
    colLower[col(2, t, periods)] = b.socMinMwh;
    colUpper[col(2, t, periods)] = b.socMaxMwh;
    if (integer) colUpper[col(3, t, periods)] = 1;
  }
  colCost[col(2, periods - 1, periods)] = problem.terminalValuePerMwh ?? 0;
  colLower[col(2, periods - 1, periods)] = Math.max(b.socMinMwh, problem.socEndMinMwh);
  return { colCost, colLower, colUpper };
}

export interface DayRow {
  readonly name: string;
  readonly lower: number;
  readonly upper: number;
  readonly cols: readonly number[];
  readonly values: readonly number[];
}

/** The rows: balances b_t, the MIP's mode rows cu_t and du_t, and the cap row last. */
export function dayRows(problem: DayProblem, integer: boolean): DayRow[] {
  const { battery: b, periodHours: dt } = problem;
  const periods = problem.buyPricePerMwh.length;
  const rows: DayRow[] = [];
  for (let t = 0; t < periods; t++) {
    const cols = [col(2, t, periods), col(0, t, periods), col(1, t, periods)];
    const values = [1, -b.chargeEfficiency * dt, dt / b.dischargeEfficiency];
    if (t > 0) {
      cols.push(col(2, t - 1, periods));
      values.push(-1);
    }
    const rhs = t === 0 ? problem.socStartMwh : 0;
    rows.push({ name: `b${t}`, lower: rhs, upper: rhs, cols, values });
  }
  if (integer) {
    for (let t = 0; t < periods; t++) {
      rows.push({ name: `cu${t}`, lower: -Infinity, upper: 0, cols: [col(0, t, periods), col(3, t, periods)], values: [1, -b.chargeMw] });
      rows.push({ name: `du${t}`, lower: -Infinity, upper: b.dischargeMw, cols: [col(1, t, periods), col(3, t, periods)], values: [1, b.dischargeMw] });
    }
  }
  const capCols = Array.from({ length: periods }, (_, t) => col(1, t, periods));
  rows.push({ name: 'cap', lower: -Infinity, upper: b.maxFromStoreMwhPerDay ?? Infinity, cols: capCols, values: capCols.map(() => dt / b.dischargeEfficiency) });
  return rows;
}

/**
 * Bounds on the state of charge at the end of each period that replace the window's [socMin, socMax]
 * (the last period's lower bound stays at least the end-of-day floor), e.g. the time-varying bounds of
 * a start outside the window.
 */
export interface SocBounds {
  readonly lowerMwh: readonly number[];
  readonly upperMwh: readonly number[];
}

/** CPLEX LP text of the model (numbers printed in JavaScript's shortest round-trip form). */
export function dayModelText(problem: DayProblem, integer: boolean, socBounds?: SocBounds): string {
  const periods = problem.buyPricePerMwh.length;
  const { colCost, colLower, colUpper } = dayColumns(problem, integer);
  if (socBounds !== undefined) {
    for (let t = 0; t < periods; t++) {
      colLower[col(2, t, periods)] = t === periods - 1 ? Math.max(socBounds.lowerMwh[t] as number, problem.socEndMinMwh) : (socBounds.lowerMwh[t] as number);
      colUpper[col(2, t, periods)] = socBounds.upperMwh[t] as number;
    }
  }
  const sum = (cols: readonly number[], values: readonly number[]): string => {
    const terms = cols.map((j, k) => `${(values[k] as number) < 0 ? '-' : '+'} ${Math.abs(values[k] as number)} ${colName(j, periods)}`);
    const lines: string[] = [];
    for (let k = 0; k < terms.length; k += 8) lines.push(terms.slice(k, k + 8).join(' '));
    return lines.join('\n   ');
  };
  const all = Array.from(colCost, (_, j) => j);
  const out: string[] = ['Maximize', ` obj: ${sum(all, Array.from(colCost))}`, 'Subject To'];
  for (const row of dayRows(problem, integer)) {
    if (row.upper === Infinity) continue;
    const relation = row.lower === row.upper ? '=' : '<=';
    out.push(` ${row.name}: ${sum(row.cols, row.values)} ${relation} ${row.upper}`);
  }
  out.push('Bounds');
  for (const j of all) out.push(` ${colLower[j]} <= ${colName(j, periods)} <= ${colUpper[j]}`);
  if (integer) out.push('Binary', ` ${all.slice(3 * periods).map((j) => colName(j, periods)).join(' ')}`);
  out.push('End', '');
  return out.join('\n');
}

/** Solves the day with a fresh HiGHS instance from LP text: the MIP (`integer`) or its LP relaxation. */
export function solveDayWithHighs(highs: Highs, problem: DayProblem, integer: boolean, socBounds?: SocBounds): HighsDayOutcome {
  const periods = problem.buyPricePerMwh.length;
  const result = highs.solve(dayModelText(problem, integer, socBounds), HIGHS_EXACT_OPTIONS);
  if (result.Status === 'Infeasible') return { status: 'infeasible' };
  if (result.Status !== 'Optimal') return { status: 'other', detail: result.Status };
  const value = (n: string): number => (result.Columns[n] as { Primal: number }).Primal;
  const pick = (prefix: string): number[] => Array.from({ length: periods }, (_, t) => value(`${prefix}${t}`));
  return { status: 'optimal', objective: result.ObjectiveValue, schedule: { chargeMw: pick('c'), dischargeMw: pick('d'), socMwh: pick('s') } };
}

/**
 * A HiGHS model kept in memory across days of one battery and one day length: per day only the
 * costs, column bounds and row bounds change (the matrix holds dt, the efficiencies and, in the
 * MIP, the power limits). Call dispose() when done.
 */
export class KeptDayModel {
  private readonly model: ReturnType<Highs['createModel']>;
  private readonly template: DayProblem;
  private readonly capRow: number;

  constructor(
    private readonly highs: Highs,
    template: DayProblem,
    readonly integer: boolean,
  ) {
    this.template = template;
    const periods = template.buyPricePerMwh.length;
    const columns = dayColumns(template, integer);
    const rows = dayRows(template, integer);
    this.capRow = rows.length - 1;
    const starts: number[] = [0];
    const indices: number[] = [];
    const values: number[] = [];
    for (const row of rows) {
      indices.push(...row.cols);
      values.push(...row.values);
      starts.push(indices.length);
    }
    const bound = (x: number): number => (x === Infinity ? highs.infinity : x === -Infinity ? -highs.infinity : x);
    const numCols = columns.colCost.length;
    const { variableType } = highs.constants;
    this.model = highs.createModel({
      numCols,
      numRows: rows.length,
      sense: highs.constants.objectiveSense.maximize,
      ...columns,
      rowLower: rows.map((r) => bound(r.lower)),
      rowUpper: rows.map((r) => bound(r.upper)),
      matrix: { format: 'csr', numRows: rows.length, numCols, starts, indices, values },
      ...(integer ? { integrality: Array.from(columns.colCost, (_, j) => (j >= 3 * periods ? variableType.integer : variableType.continuous)) } : {}),
    });
    this.model.options.set(HIGHS_EXACT_OPTIONS);
  }

  /** Solves one day of the same battery and length: changes costs and bounds, then runs. */
  solve(problem: DayProblem): HighsDayOutcome {
    const t0 = this.template;
    const b = problem.battery;
    const same = problem.buyPricePerMwh.length === t0.buyPricePerMwh.length && problem.periodHours === t0.periodHours &&
      b.chargeEfficiency === t0.battery.chargeEfficiency && b.dischargeEfficiency === t0.battery.dischargeEfficiency &&
      (!this.integer || (b.chargeMw === t0.battery.chargeMw && b.dischargeMw === t0.battery.dischargeMw));
    if (!same) throw new Error('KeptDayModel: the day differs from the template in a matrix coefficient');
    const columns = dayColumns(problem, this.integer);
    const all = { kind: 'range', from: 0, to: columns.colCost.length - 1 } as const;
    this.model.changeColsCost(all, columns.colCost);
    this.model.changeColsBounds(all, columns.colLower, columns.colUpper);
    this.model.changeRowBounds(0, problem.socStartMwh, problem.socStartMwh);
    this.model.changeRowBounds(this.capRow, -this.highs.infinity, b.maxFromStoreMwhPerDay ?? this.highs.infinity);
    const run = this.model.run();
    const codes = this.highs.constants.modelStatus;
    if (run.modelStatus === codes.infeasible) return { status: 'infeasible' };
    if (run.modelStatus !== codes.optimal) return { status: 'other', detail: String(run.modelStatus) };
    const x = this.model.getSolution().colValue;
    const periods = problem.buyPricePerMwh.length;
    const slice = (block: number): number[] => Array.from(x.subarray(block * periods, (block + 1) * periods));
    return { status: 'optimal', objective: this.model.getObjectiveValue(), schedule: { chargeMw: slice(0), dischargeMw: slice(1), socMwh: slice(2) } };
  }

  dispose(): void {
    this.model.dispose();
  }
}
