import type { DayOutcome, DayProblem, Schedule } from '../../types.js';
import { branchOnArbitrage, type BranchOutcome } from './arbitrageBranching.js';
import { priceGap, scalarGap } from './coversDay.js';
import { CAP_UNREACHABLE } from './cycleCapDual.js';
import { DayContext, DpSolver, SweepSolver } from './dayContext.js';
import { LineSolution, SWEEP_START_UNREACHABLE } from './lineSweep.js';
import { toStoredDay, type StoredDay, type StoredDayArrays } from './storedDay.js';

/** Options of solveDayFast, merged over FAST_SOLVER_DEFAULTS. */
export interface FastSolverOptions {
  /** Branch-and-bound nodes on the chord sweep before the dynamic program takes over. */
  readonly sweepNodes: number;
  /** Runs of the dynamic program in its branch and bound (only a binding cycle cap needs more than one). */
  readonly programNodes: number;
  /** Most breakpoints of one value function in the dynamic program's first run. */
  readonly maxBreakpoints: number;
  /** Runs of the dynamic program in the last resort, after both methods spent their budgets. */
  readonly lastResortNodes: number;
  /** Most breakpoints of one value function in the last resort, before answering `not-covered`. */
  readonly lastResortBreakpoints: number;
}

/**
 * Budgets measured on seeded days (bench/daySolverCheck.js): about 0.5 % of days with a
 * negative-price stretch exceed the first two; the last resort has solved every one so far.
 */
export const FAST_SOLVER_DEFAULTS: FastSolverOptions = Object.freeze({ sweepNodes: 64, programNodes: 64, maxBreakpoints: 400, lastResortNodes: 20_000, lastResortBreakpoints: 200_000 });

/** A DayOutcome, or `not-covered` when the caller must fall back to the general LP path. */
export type FastDayOutcome = DayOutcome | { readonly status: 'not-covered'; readonly reason: string };

export const FAST_SOLVER_NAME = 'fast-warehouse-sweep';

/**
 * Exact special-purpose solver of the day problem of docs/design.md section 4, with no simultaneous
 * charge and discharge in any period.
 *
 * Method: the problem in stored-energy units is the warehouse problem (storedDay.ts); its concave
 * part is solved by a forward sweep over the slope sequence of the value function of stored
 * energy (lineSweep.ts), the cycle cap by a parametric step on its Lagrange multiplier
 * (cycleCapDual.ts), and complementarity in arbitrage periods by branch and bound over those
 * periods only (arbitrageBranching.ts). Outside arbitrage periods no branching is needed.
 *
 * Arbitrage periods get one mode each by one of two exact methods, the other one taking over
 * when the first spends its budget: branching on the chord sweep (fast when the chord relaxation
 * is tight: wide windows, or a cycle cap) or the dynamic program over general piecewise-linear
 * value functions (valueDp.ts; fast when the window is narrow against the power steps). The order
 * is chosen by programSuits. Scratch arrays are kept in a module-level cache between calls; the
 * result depends on the problem only.
 *
 * Returns `optimal` with the schedule in grid units (MW; socMwh by the recursion of section 4),
 * `infeasible` with a reason, or `not-covered` (fastSolverGap, or both budgets spent).
 */
export function solveDayFast(problem: DayProblem, options: Partial<FastSolverOptions> = {}): FastDayOutcome {
  const settings: FastSolverOptions = { ...FAST_SOLVER_DEFAULTS, ...options };
  // fastSolverGap in two parts: the prices are checked through their sum as toStoredDay converts them.
  const gap = scalarGap(problem);
  if (gap !== null) return { status: 'not-covered', reason: gap };
  const engine = engineFor(problem.buyPricePerMwh.length, settings.maxBreakpoints);
  const day = toStoredDay(problem, engine.arrays);
  const badPrice = Number.isFinite(day.priceSum) ? null : priceGap(problem);
  if (badPrice !== null) return { status: 'not-covered', reason: badPrice };
  const b = problem.battery;
  if (b.socMinMwh > b.socMaxMwh) return { status: 'infeasible', reason: `the state-of-charge window [${fmt(b.socMinMwh)}, ${fmt(b.socMaxMwh)}] MWh is empty` };
  const { ctx, best } = engine;
  const programFirst = day.arbitrageCount > 0 && programSuits(day);
  const attempts = programFirst ? ([engine.program, engine.sweep] as const) : ([engine.sweep, engine.program] as const);
  const incumbent = { value: -Infinity, discharged: 0 };
  const keepIncumbent = (result: BranchOutcome): void => {
    if (result.status === 'gave-up' && result.incumbent && best.value > incumbent.value) {
      incumbent.value = best.value;
      incumbent.discharged = best.discharged;
    }
  };
  let nodes = 0;
  let outcome = branchOnArbitrage(ctx.load(day, attempts[0].load(day)), day.arbitrageCount === 0 ? Infinity : programFirst ? settings.programNodes : settings.sweepNodes, best);
  if (outcome.status === 'gave-up') {
    nodes = outcome.nodes;
    keepIncumbent(outcome);
    const second = attempts[1].load(day);
    if (second === engine.program && incumbent.value > -Infinity) engine.program.setIncumbent(incumbent.value, incumbent.discharged);
    outcome = branchOnArbitrage(ctx.load(day, second), programFirst ? settings.sweepNodes : settings.programNodes, best);
  }
  if (outcome.status === 'gave-up') {
    // The last resort: the exact program with budgets about a thousand times larger (seconds at worst).
    nodes += outcome.nodes;
    keepIncumbent(outcome);
    engine.program.load(day);
    if (incumbent.value > -Infinity) engine.program.setIncumbent(incumbent.value, incumbent.discharged);
    engine.program.maxBreakpoints = settings.lastResortBreakpoints;
    try {
      outcome = branchOnArbitrage(ctx.load(day, engine.program), settings.lastResortNodes, best);
    } finally {
      engine.program.maxBreakpoints = settings.maxBreakpoints;
    }
  }
  if (outcome.status === 'gave-up') {
    const budgets = `${settings.lastResortNodes} program runs of at most ${settings.lastResortBreakpoints} breakpoints`;
    return { status: 'not-covered', reason: `no proven optimum within the budgets (${budgets})` };
  }
  if (outcome.status === 'infeasible') {
    if (outcome.cause === SWEEP_START_UNREACHABLE) return { status: 'infeasible', reason: startReason(problem) };
    if (outcome.cause === CAP_UNREACHABLE) return { status: 'infeasible', reason: capReason(problem, ctx.below.discharged) };
    return { status: 'infeasible', reason: endReason(problem, day) };
  }
  const { schedule, objective } = toSchedule(problem, day, best);
  return { status: 'optimal', schedule, objective, solver: FAST_SOLVER_NAME, nodes: nodes + outcome.nodes };
}

/**
 * Measured rule of thumb for the order of the two exact methods: the dynamic program first when
 * more than half the periods are arbitrage periods (the chord branching then has too many periods
 * to split), or when the window is at most 2.5 power steps wide (its value functions then have few
 * breakpoints) and there is no cycle cap (which would multiply its runs); the chord branching first
 * otherwise.
 */
function programSuits(day: StoredDay): boolean {
  const step = Math.min(day.chargeStepMwh, day.dischargeStepMwh);
  if (2 * day.arbitrageCount > day.periods) return true;
  return day.dischargeCapMwh === Infinity && day.socMaxMwh - day.socMinMwh <= 2.5 * step;
}

/** Scratch space of the solver, kept between calls (the solver is synchronous, so never shared). */
interface Engine {
  readonly capacity: number;
  readonly maxBreakpoints: number;
  readonly sweep: SweepSolver;
  readonly program: DpSolver;
  readonly ctx: DayContext;
  readonly best: LineSolution;
  readonly arrays: StoredDayArrays;
}

let cached: Engine | null = null;

function engineFor(periods: number, maxBreakpoints: number): Engine {
  if (cached === null || cached.capacity < periods || cached.maxBreakpoints !== maxBreakpoints) {
    const capacity = Math.max(periods, 100);
    cached = {
      capacity,
      maxBreakpoints,
      sweep: new SweepSolver(capacity),
      program: new DpSolver(capacity, maxBreakpoints),
      ctx: new DayContext(capacity),
      best: new LineSolution(capacity),
      arrays: { chargePrice: new Float64Array(capacity), dischargePrice: new Float64Array(capacity), arbitrage: new Uint8Array(capacity) },
    };
  }
  return cached;
}

/**
 * Grid units: c_t = x_t / (eta_c dt), d_t = eta_d y_t / dt (exactly the limit at x = X, y = Y), and
 * the objective sum_t dt ((sell_t - deg) d_t - buy_t c_t) + terminal s_T [currency] in the same pass.
 */
function toSchedule(problem: DayProblem, day: StoredDay, sol: LineSolution): { schedule: Schedule; objective: number } {
  const { battery: b, periodHours: dt } = problem;
  const deg = b.degradationCostPerMwh;
  const chargeMw: number[] = new Array<number>(day.periods);
  const dischargeMw: number[] = new Array<number>(day.periods);
  const socMwh: number[] = new Array<number>(day.periods);
  let soc = problem.socStartMwh;
  let value = 0;
  for (let t = 0; t < day.periods; t++) {
    const x = sol.x[t]!;
    const y = sol.y[t]!;
    const c = x >= day.chargeFullMwh ? b.chargeMw : x / (b.chargeEfficiency * dt);
    const d = y >= day.dischargeFullMwh ? b.dischargeMw : (y * b.dischargeEfficiency) / dt;
    chargeMw[t] = c;
    dischargeMw[t] = d;
    soc += b.chargeEfficiency * dt * c - (dt * d) / b.dischargeEfficiency;
    socMwh[t] = soc;
    value += dt * ((problem.sellPricePerMwh[t]! - deg) * d - problem.buyPricePerMwh[t]! * c);
  }
  const objective = value + (problem.terminalValuePerMwh ?? 0) * (day.periods > 0 ? soc : problem.socStartMwh);
  return { schedule: { chargeMw, dischargeMw, socMwh }, objective };
}

function startReason(problem: DayProblem): string {
  const b = problem.battery;
  return `the starting state of charge ${fmt(problem.socStartMwh)} MWh is outside the window [${fmt(b.socMinMwh)}, ${fmt(b.socMaxMwh)}] MWh and the first period cannot bring it inside at ${fmt(b.chargeMw)} MW charge / ${fmt(b.dischargeMw)} MW discharge; start inside the window`;
}

function endReason(problem: DayProblem, day: StoredDay): string {
  if (day.socEndFloorMwh > day.socMaxMwh) {
    return `the end-of-day floor ${fmt(day.socEndFloorMwh)} MWh is above the highest allowed state of charge ${fmt(day.socMaxMwh)} MWh; lower the floor`;
  }
  let reachable = day.socStartMwh;
  for (let t = 0; t < day.periods; t++) reachable = Math.min(day.socMaxMwh, reachable + day.chargeStepMwh);
  return `the end-of-day floor ${fmt(day.socEndFloorMwh)} MWh cannot be reached from ${fmt(day.socStartMwh)} MWh: at most ${fmt(reachable)} MWh can be stored by the end of the day at ${fmt(problem.battery.chargeMw)} MW; lower the floor or start fuller`;
}

function capReason(problem: DayProblem, neededMwh: number): string {
  return `the cycle cap of ${fmt(problem.battery.maxFromStoreMwhPerDay ?? Infinity)} MWh taken out of the store per day is below the ${fmt(neededMwh)} MWh the day must take out to stay inside the window; raise the cap`;
}

function fmt(x: number): string {
  return Number(x.toFixed(6)).toString();
}
