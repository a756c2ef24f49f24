import type { DayOutcome, DayProblem, Schedule } from '../../types.js';
import { branchOnArbitrage, type BranchOutcome } from './arbitrageBranching.js';
import { priceGap, scalarGap } from './coversDay.js';
import type { MultiplierSolver, SolveObserver } from './dayContext.js';
import { toStoredDay, type StoredDay } from './storedDay.js';
import type { StoredSchedule } from './storedSchedule.js';
import { DayWorkspace } from './workspace.js';

/** Options of solveWarehouseDay, merged over WAREHOUSE_SOLVER_DEFAULTS. */
export interface WarehouseSolverOptions {
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

/** What a call may bring besides budgets: its own workspace (day loops keep one), an observer (the traced day of docs/day-solver.md). */
export interface WarehouseSolveContext {
  readonly workspace?: DayWorkspace;
  readonly observer?: SolveObserver;
}

/**
 * Budgets measured on seeded days (bench/daySolverCheck.js): about 0.5 % of days with a
 * negative-price stretch exceed the first two; the last resort has solved every one so far.
 */
export const WAREHOUSE_SOLVER_DEFAULTS: WarehouseSolverOptions = Object.freeze({ sweepNodes: 64, programNodes: 64, maxBreakpoints: 400, lastResortNodes: 20_000, lastResortBreakpoints: 200_000 });

/** A DayOutcome, or `not-covered` when the caller must fall back to the general LP path. */
export type WarehouseDayOutcome = DayOutcome | { readonly status: 'not-covered'; readonly reason: string };

/** The method label of an optimal outcome (plan.json and the plan report print it). */
export const WAREHOUSE_SOLVER_NAME = 'fast-warehouse-sweep';

/**
 * Exact special-purpose solver of the day problem (docs/day-solver.md), with no simultaneous
 * charge and discharge in any period.
 *
 * Method: the problem in stored-energy units is the warehouse problem (storedDay.ts); its concave
 * part is solved by a forward sweep over the slope sequence of the value function of stored
 * energy (lineSweep.ts), the cycle cap by a parametric step on its Lagrange multiplier
 * (cycleCapMultiplier.ts), and complementarity in arbitrage periods by branch and bound over those
 * periods only (arbitrageBranching.ts). Outside arbitrage periods no branching is needed.
 *
 * Arbitrage periods get one mode each by one of two exact methods, the other one taking over
 * when the first spends its budget: branching on the chord sweep (fast when the chord relaxation
 * is tight: wide windows, or a cycle cap) or the dynamic program over general piecewise-linear
 * value functions (valueProgram.ts; fast when the window is narrow against the power steps). The order
 * is chosen by methodOrder; a last resort runs the program with far larger budgets.
 *
 * Scratch arrays live in a DayWorkspace: the caller's (context.workspace), else one shared by the
 * calls that bring none (see sharedWorkspace). The result depends on the problem only.
 *
 * Returns `optimal` with the schedule in grid units (MW; socMwh by the recursion s_t = s_{t-1} +
 * eta_c dt c_t - dt d_t / eta_d), `infeasible` with a reason, or `not-covered` (uncoveredReason, or
 * every budget spent).
 */
export function solveWarehouseDay(problem: DayProblem, options: Partial<WarehouseSolverOptions> = NO_OPTIONS, context: WarehouseSolveContext = NO_OPTIONS): WarehouseDayOutcome {
  const settings: WarehouseSolverOptions = options === NO_OPTIONS ? WAREHOUSE_SOLVER_DEFAULTS : { ...WAREHOUSE_SOLVER_DEFAULTS, ...options };
  // uncoveredReason in two parts: the prices are checked through their sum as toStoredDay converts them.
  const gap = scalarGap(problem);
  if (gap !== null) return { status: 'not-covered', reason: gap };
  const ws = workspaceFor(problem.buyPricePerMwh.length, context.workspace);
  const day = toStoredDay(problem, ws.prices);
  const badPrice = Number.isFinite(day.priceSum) ? null : priceGap(problem);
  if (badPrice !== null) return { status: 'not-covered', reason: badPrice };
  const b = problem.battery;
  if (b.socMinMwh > b.socMaxMwh) return { status: 'infeasible', reason: `the state-of-charge window [${fmt(b.socMinMwh)}, ${fmt(b.socMaxMwh)}] MWh is empty` };
  const { observer } = context;
  const attempts = settings === WAREHOUSE_SOLVER_DEFAULTS ? DEFAULT_ATTEMPTS : attemptsOf(settings);
  let incumbent: { value: number; discharged: number } | null = null;
  let nodes = 0;
  let outcome: BranchOutcome | null = null;
  for (const attempt of attempts[day.arbitrageCount > 0 ? methodOrder(day) : 'sweepFirst']) {
    const solver: MultiplierSolver = attempt.method === 'sweep' ? ws.sweep.load(day, observer?.sweep) : ws.program.load(day, { maxBreakpoints: attempt.maxBreakpoints, incumbent });
    outcome = branchOnArbitrage(ws.context.load(day, solver, observer), day.arbitrageCount === 0 ? Infinity : attempt.nodes, ws.best);
    nodes += outcome.nodes;
    if (outcome.status !== 'node-budget-spent' && outcome.status !== 'too-many-breakpoints') break;
    if (outcome.incumbent && (incumbent === null || ws.best.value > incumbent.value)) incumbent = { value: ws.best.value, discharged: ws.best.discharged };
  }
  switch (outcome!.status) {
    case 'ok': {
      const { schedule, objective } = toSchedule(problem, day, ws.best);
      return { status: 'optimal', schedule, objective, solver: WAREHOUSE_SOLVER_NAME, nodes };
    }
    case 'start-unreachable':
      return { status: 'infeasible', reason: startReason(problem) };
    case 'cap-unreachable':
      return { status: 'infeasible', reason: capReason(problem, ws.context.below.discharged) };
    case 'end-unreachable':
      return { status: 'infeasible', reason: endReason(problem, day) };
    default: {
      const budgets = `${settings.lastResortNodes} program runs of at most ${settings.lastResortBreakpoints} breakpoints`;
      return { status: 'not-covered', reason: `no proven optimum within the budgets (${budgets})` };
    }
  }
}

/** One pass of the branching: its inner method and budgets. */
interface Attempt {
  readonly method: MultiplierSolver['method'];
  readonly nodes: number;
  readonly maxBreakpoints: number;
}

/** The orders of the passes (methodOrder picks one). */
type MethodOrder = 'sweepFirst' | 'programFirst' | 'probeFirst';

/**
 * The passes in each order, each followed by the last resort: the exact program with budgets about a
 * thousand times larger (seconds at worst). `probeFirst` is `programFirst` after one node of the chord
 * sweep (its root; none when sweepNodes is 0): when the root is already complementary that is the
 * optimum; otherwise its netted schedule goes to the program as the incumbent.
 */
function attemptsOf(settings: WarehouseSolverOptions): Readonly<Record<MethodOrder, readonly Attempt[]>> {
  const probe: Attempt = { method: 'sweep', nodes: Math.min(1, settings.sweepNodes), maxBreakpoints: 0 };
  const sweep: Attempt = { method: 'sweep', nodes: settings.sweepNodes, maxBreakpoints: 0 };
  const program: Attempt = { method: 'program', nodes: settings.programNodes, maxBreakpoints: settings.maxBreakpoints };
  const lastResort: Attempt = { method: 'program', nodes: settings.lastResortNodes, maxBreakpoints: settings.lastResortBreakpoints };
  return { sweepFirst: [sweep, program, lastResort], programFirst: [program, sweep, lastResort], probeFirst: [probe, program, sweep, lastResort] };
}

const NO_OPTIONS = Object.freeze({});
const DEFAULT_ATTEMPTS = attemptsOf(WAREHOUSE_SOLVER_DEFAULTS);

/**
 * The workspace of calls that bring none. The solver is synchronous and every stage overwrites
 * what it reads, so sharing it changes no answer; it only saves allocating a workspace per call
 * (DayWorkspace). Replaced by a larger one when a longer day comes.
 */
let sharedWorkspace: DayWorkspace | null = null;

/** The caller's workspace when it fits the day, else the shared one (grown to fit). */
function workspaceFor(periods: number, own: DayWorkspace | undefined): DayWorkspace {
  if (own !== undefined && own.capacity >= periods) return own;
  if (sharedWorkspace === null || sharedWorkspace.capacity < periods) sharedWorkspace = new DayWorkspace(Math.max(periods, 100));
  return sharedWorkspace;
}

/**
 * Measured rule of thumb for the order of the two exact methods: the dynamic program first when
 * more than half the periods are arbitrage periods (the chord branching then has too many periods
 * to split), or when the window is at most 2.5 power steps wide (its value functions then have few
 * breakpoints) and there is no cycle cap (which would multiply its runs); the chord branching first
 * otherwise. With a cycle cap, a day of mostly arbitrage periods first tries the chord sweep's root
 * alone (`probeFirst`): the cap's mix is often complementary already there, in microseconds, where
 * the program takes milliseconds (docs/day-solver.md section 7 has the figures).
 */
function methodOrder(day: StoredDay): MethodOrder {
  if (2 * day.arbitrageCount > day.periods) return day.dischargeCapMwh === Infinity ? 'programFirst' : 'probeFirst';
  const step = Math.min(day.chargeStepMwh, day.dischargeStepMwh);
  return day.dischargeCapMwh === Infinity && day.socMaxMwh - day.socMinMwh <= 2.5 * step ? 'programFirst' : 'sweepFirst';
}

/**
 * Grid units: c_t = x_t / (eta_c dt), d_t = eta_d y_t / dt (exactly the limit at x = X, y = Y), and
 * the objective sum_t dt ((sell_t - deg) d_t - buy_t c_t) + terminal s_T [currency] in the same pass.
 */
function toSchedule(problem: DayProblem, day: StoredDay, sol: StoredSchedule): { schedule: Schedule; objective: number } {
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
