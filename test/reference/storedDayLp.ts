import type { Highs } from 'highs';
import { HIGHS_EXACT_OPTIONS } from './highsDayModel.js';

/**
 * The day problem in stored-energy units (docs/day-solver.md, "The day in stored energy") as linear
 * programs for HiGHS (npm `highs`, version in HIGHS_NPM_VERSION), written from the definitions and
 * independent of src/plan/warehouse: the brute force the tests of the warehouse solver's stages
 * compare with.
 *
 * Variables per period t = 0..T-1: x_t [MWh into the store], y_t [MWh out], s_t [MWh after t].
 * Rows: s_t - s_{t-1} - x_t + y_t = 0 (s_{-1} = socStart on the right); socMin <= s_t <= socMax;
 * s_{T-1} >= socEndFloor; optionally sum_t y_t <= dischargeCap. Objective, maximised:
 * sum_t ((q_t - mu) y_t - p_t x_t) + V s_{T-1}.
 * What each period may do (`sets[t]`):
 *   box        0 <= x_t <= X, 0 <= y_t <= Y (both flows)
 *   triangle   x_t, y_t >= 0 and x_t / X + y_t / Y <= 1 (the convex hull of charge-only and discharge-only)
 *   charge     0 <= x_t <= X, y_t = 0
 *   discharge  x_t = 0, 0 <= y_t <= Y
 */
export type PeriodSet = 'box' | 'triangle' | 'charge' | 'discharge';

export interface StoredLp {
  readonly chargeStepMwh: number;
  readonly dischargeStepMwh: number;
  readonly chargePrice: readonly number[];
  readonly dischargePrice: readonly number[];
  readonly socStartMwh: number;
  readonly socMinMwh: number;
  readonly socMaxMwh: number;
  readonly socEndFloorMwh: number;
  readonly terminalValuePerMwh: number;
  /** Cap on sum_t y_t; Infinity for none. */
  readonly dischargeCapMwh: number;
  /** Multiplier on discharged energy in the objective. */
  readonly mu: number;
  readonly sets: readonly PeriodSet[];
}

export type StoredLpOutcome =
  | { readonly status: 'optimal'; readonly objective: number; readonly x: number[]; readonly y: number[] }
  | { readonly status: 'infeasible' }
  | { readonly status: 'other'; readonly detail: string };

const num = (v: number): string => (v < 0 ? `- ${-v}` : `+ ${v}`);

/** Solves the stored-units LP from CPLEX LP text with a fresh HiGHS run. */
export function solveStoredLp(highs: Highs, lp: StoredLp): StoredLpOutcome {
  const periods = lp.sets.length;
  const lines: string[] = ['Maximize', ` obj: ${objectiveTerms(lp, '').join(' ')}`, 'Subject To'];
  for (let t = 0; t < periods; t++) {
    const previous = t === 0 ? '' : ` - s${t - 1}`;
    lines.push(` b${t}: s${t}${previous} - x${t} + y${t} = ${t === 0 ? lp.socStartMwh : 0}`);
    if (lp.sets[t] === 'triangle') lines.push(` tri${t}: ${lp.dischargeStepMwh} x${t} + ${lp.chargeStepMwh} y${t} <= ${lp.chargeStepMwh * lp.dischargeStepMwh}`);
  }
  if (Number.isFinite(lp.dischargeCapMwh)) lines.push(` cap: ${Array.from({ length: periods }, (_, t) => `+ y${t}`).join(' ')} <= ${lp.dischargeCapMwh}`);
  lines.push('Bounds');
  for (let t = 0; t < periods; t++) {
    const set = lp.sets[t];
    lines.push(` 0 <= x${t} <= ${set === 'discharge' ? 0 : lp.chargeStepMwh}`);
    lines.push(` 0 <= y${t} <= ${set === 'charge' ? 0 : lp.dischargeStepMwh}`);
    const low = t === periods - 1 ? Math.max(lp.socMinMwh, lp.socEndFloorMwh) : lp.socMinMwh;
    lines.push(` ${low} <= s${t} <= ${lp.socMaxMwh}`);
  }
  lines.push('End', '');
  return run(highs, lines.join('\n'), periods);
}

/**
 * The LP over the convex hull of the union of the stored-units sets in which each period of
 * `either` takes one mode (charge or discharge), the others keeping lp.sets: the disjunctive
 * formulation of Balas (1979, "Disjunctive programming", Ann. Discrete Math. 5) with one copy of
 * the variables per combination of modes m, scaled by its weight lambda_m (sum lambda_m = 1), and
 * the cap on the sum over the copies. Its
 * optimum is the best value over that hull: what the cap's Lagrangian dual reaches when the inner
 * problem keeps one mode per period exactly (Geoffrion 1974, "Lagrangean relaxation for integer
 * programming", Math. Prog. Study 2). Returns x, y summed over the copies.
 */
export function solveStoredHull(highs: Highs, lp: StoredLp, either: readonly number[]): StoredLpOutcome {
  const periods = lp.sets.length;
  const copies = 1 << either.length;
  const objective: string[] = [];
  const rows: string[] = [];
  const bounds: string[] = [];
  for (let m = 0; m < copies; m++) {
    const c = `_${m}`;
    const lambda = `l${c}`;
    objective.push(...objectiveTerms(lp, c));
    for (let t = 0; t < periods; t++) {
      const k = either.indexOf(t);
      const set = k < 0 ? lp.sets[t] : (m >> k) & 1 ? 'charge' : 'discharge';
      const previous = t === 0 ? ` ${num(-lp.socStartMwh)} ${lambda}` : ` - s${t - 1}${c}`;
      rows.push(` b${t}${c}: s${t}${c}${previous} - x${t}${c} + y${t}${c} = 0`);
      rows.push(` xu${t}${c}: x${t}${c} ${num(-(set === 'discharge' ? 0 : lp.chargeStepMwh))} ${lambda} <= 0`);
      rows.push(` yu${t}${c}: y${t}${c} ${num(-(set === 'charge' ? 0 : lp.dischargeStepMwh))} ${lambda} <= 0`);
      if (set === 'triangle') rows.push(` tri${t}${c}: ${lp.dischargeStepMwh} x${t}${c} + ${lp.chargeStepMwh} y${t}${c} ${num(-lp.chargeStepMwh * lp.dischargeStepMwh)} ${lambda} <= 0`);
      const low = t === periods - 1 ? Math.max(lp.socMinMwh, lp.socEndFloorMwh) : lp.socMinMwh;
      rows.push(` sl${t}${c}: s${t}${c} ${num(-low)} ${lambda} >= 0`);
      rows.push(` sh${t}${c}: s${t}${c} ${num(-lp.socMaxMwh)} ${lambda} <= 0`);
      bounds.push(` x${t}${c} >= 0`, ` y${t}${c} >= 0`, ` s${t}${c} free`);
    }
    bounds.push(` 0 <= ${lambda} <= 1`);
  }
  rows.push(` weights: ${Array.from({ length: copies }, (_, m) => `+ l_${m}`).join(' ')} = 1`);
  if (Number.isFinite(lp.dischargeCapMwh)) {
    const terms: string[] = [];
    for (let m = 0; m < copies; m++) for (let t = 0; t < periods; t++) terms.push(`+ y${t}_${m}`);
    rows.push(` cap: ${terms.join(' ')} <= ${lp.dischargeCapMwh}`);
  }
  const text = ['Maximize', ` obj: ${objective.join(' ')}`, 'Subject To', ...rows, 'Bounds', ...bounds, 'End', ''].join('\n');
  return run(highs, text, periods, copies);
}

function objectiveTerms(lp: StoredLp, suffix: string): string[] {
  const periods = lp.sets.length;
  const terms: string[] = [];
  for (let t = 0; t < periods; t++) {
    terms.push(`${num(lp.dischargePrice[t]! - lp.mu)} y${t}${suffix}`, `${num(-lp.chargePrice[t]!)} x${t}${suffix}`);
  }
  terms.push(`${num(lp.terminalValuePerMwh)} s${periods - 1}${suffix}`);
  return terms;
}

/** Runs the LP text; x and y per period, summed over the copies when there are `copies` of them. */
function run(highs: Highs, text: string, periods: number, copies = 0): StoredLpOutcome {
  const result = highs.solve(text, HIGHS_EXACT_OPTIONS);
  if (result.Status === 'Infeasible') return { status: 'infeasible' };
  if (result.Status !== 'Optimal') return { status: 'other', detail: result.Status };
  const value = (n: string): number => (result.Columns[n] as { Primal: number } | undefined)?.Primal ?? 0;
  const sum = (prefix: string, t: number): number => {
    if (copies === 0) return value(`${prefix}${t}`);
    let total = 0;
    for (let m = 0; m < copies; m++) total += value(`${prefix}${t}_${m}`);
    return total;
  };
  return {
    status: 'optimal',
    objective: result.ObjectiveValue,
    x: Array.from({ length: periods }, (_, t) => sum('x', t)),
    y: Array.from({ length: periods }, (_, t) => sum('y', t)),
  };
}
