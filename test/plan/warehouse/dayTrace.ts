import { PERIOD_MODE } from '../../../src/plan/periodMode.js';
import type { BranchNode, MultiplierStep, SolveObserver } from '../../../src/plan/warehouse/dayContext.js';
import { DayWorkspace, solveWarehouseDay, toStoredDay } from '../../../src/plan/warehouse/index.js';
import type { SweepWorkspace } from '../../../src/plan/warehouse/lineSweep.js';
import type { PwlSeries } from '../../../src/plan/warehouse/pwlSeries.js';
import type { DayProblem } from '../../../src/types.js';
import { testBattery } from '../testBattery.js';

/**
 * The day docs/day-solver.md traces through every stage of the warehouse solver, and the tracer
 * that turns the solver's own numbers into the document's blocks (daySolverDoc.test.ts checks the
 * document against them and rewrites it on request). Four hourly periods, one negative price, a
 * full store at the start, a cycle cap: the sweep, the multiplier search, the branching and the
 * dynamic program all have work to do.
 */
export const TRACED_DAY: DayProblem = Object.freeze({
  periodHours: 1,
  buyPricePerMwh: Object.freeze([-10, 20, 10, 40]),
  sellPricePerMwh: Object.freeze([-10, 20, 10, 40]),
  battery: testBattery({ energyMwh: 2, socMaxMwh: 2, chargeEfficiency: 0.8, dischargeEfficiency: 0.8, maxFromStoreMwhPerDay: 1.25 }),
  socStartMwh: 2,
  socEndMinMwh: 1,
});

/** Markdown blocks by name, in the order the document shows them. */
export type TraceBlocks = Record<string, string>;

/** What the trace shows, for the test that the day still exercises every stage. */
export interface TraceFacts {
  readonly arbitragePeriods: number;
  readonly firstMethod: 'sweep' | 'program' | undefined;
  readonly rootOutcome: BranchNode['outcome'];
  readonly nodes: number;
  readonly rootTrials: number;
  readonly dischargedMwh: number;
  readonly objective: number;
  readonly programJoin: number;
  readonly programObjective: number;
}

export interface Trace {
  readonly blocks: TraceBlocks;
  readonly facts: TraceFacts;
}

const KIND = ['discharge', 'charge', 'chord'] as const;

/** A number as the document prints it: at most four decimals, no trailing zeros, no -0. */
export function fmt(x: number): string {
  if (x === Infinity) return 'none';
  const r = Number(x.toFixed(4));
  return Object.is(r, -0) ? '0' : String(r);
}

const table = (header: readonly string[], rows: readonly (readonly string[])[]): string =>
  [`| ${header.join(' | ')} |`, `|${header.map(() => '---').join('|')}|`, ...rows.map((r) => `| ${r.join(' | ')} |`)].join('\n');

const modesText = (modes: Int8Array): string => {
  const fixed = Array.from(modes)
    .map((m, t) => (m === PERIOD_MODE.chargeOnly ? `t=${t} charge-only` : m === PERIOD_MODE.dischargeOnly ? `t=${t} discharge-only` : ''))
    .filter((s) => s !== '');
  return fixed.length === 0 ? 'all free (root)' : fixed.join(', ');
};

const pwlText = (series: PwlSeries, t: number): string => {
  const points: string[] = [];
  for (let i = 0; i < series.count[t]!; i++) points.push(`(${fmt(series.xs[series.start[t]! + i]!)}, ${fmt(series.vs[series.start[t]! + i]!)})`);
  return points.join(' ');
};

interface SweepSnapshot {
  readonly t: number;
  readonly lo: number;
  readonly hi: number;
  readonly open: string;
  readonly taken: string;
}

function snapshot(ws: SweepWorkspace, periods: number, t: number, lo: number, hi: number): SweepSnapshot {
  const open: string[] = [];
  for (let k = ws.live.head; k < ws.live.tail; k++) {
    const id = ws.live.ids[k]!;
    // A cut that meets a segment's end exactly can leave rounding residue of it open.
    if (ws.remaining[id]! < 1e-9) continue;
    open.push(`${KIND[id % 3]} t=${Math.floor(id / 3)}: slope ${fmt(ws.live.slopes[k]!)}, ${fmt(ws.remaining[id]!)} open`);
  }
  const taken: string[] = [];
  for (let id = 0; id < 3 * periods; id++) if (ws.taken[id]! > 0 && Math.floor(id / 3) <= t) taken.push(`${KIND[id % 3]} t=${Math.floor(id / 3)}: ${fmt(ws.taken[id]!)}`);
  return { t, lo, hi, open: open.join('; ') || '(none)', taken: taken.join('; ') || '(none)' };
}

/** Runs the warehouse solver on `problem` with an observer and renders every stage's numbers. */
export function traceDay(problem: DayProblem): Trace {
  const periods = problem.buyPricePerMwh.length;
  const b = problem.battery;
  const day = toStoredDay(problem);
  const blocks: TraceBlocks = {};

  blocks.day = [
    table(
      ['t', 'buy [/MWh]', 'sell [/MWh]'],
      problem.buyPricePerMwh.map((p, t) => [String(t), fmt(p), fmt(problem.sellPricePerMwh[t]!)]),
    ),
    '',
    `Battery: charge and discharge ${fmt(b.chargeMw)} MW, eta_c = ${fmt(b.chargeEfficiency)}, eta_d = ${fmt(b.dischargeEfficiency)} (round trip ${fmt(b.chargeEfficiency * b.dischargeEfficiency)}), window [${fmt(b.socMinMwh)}, ${fmt(b.socMaxMwh)}] MWh, wear ${fmt(b.degradationCostPerMwh)}/MWh, cycle cap ${fmt(b.maxFromStoreMwhPerDay ?? Infinity)} MWh taken out of the store per day (${fmt((b.maxFromStoreMwhPerDay ?? Infinity) * b.dischargeEfficiency)} MWh at the grid); dt = ${fmt(problem.periodHours)} h; start ${fmt(problem.socStartMwh)} MWh, end floor ${fmt(problem.socEndMinMwh)} MWh, terminal value ${fmt(problem.terminalValuePerMwh ?? 0)}.`,
  ].join('\n');

  // The sweep method: record the first sweep (root, mu = 0), the root's multiplier steps, every node.
  const sweeps: SweepSnapshot[][] = [];
  let currentSweep: SweepSnapshot[] | null = null;
  const steps: MultiplierStep[] = [];
  const nodes: BranchNode[] = [];
  let atRoot = true;
  let rootSchedule: { x: number[]; y: number[] } | null = null;
  let firstMethod: 'sweep' | 'program' | undefined;
  const observer: SolveObserver = {
    sweep: {
      afterPeriod: (t, ws, lo, hi) => {
        if (t === 0) {
          currentSweep = [];
          sweeps.push(currentSweep);
        }
        currentSweep!.push(snapshot(ws, periods, t, lo, hi));
      },
      atEnd: (ws) => currentSweep!.push(snapshot(ws, periods, periods, Number.NaN, Number.NaN)),
    },
    multiplierStep: (step) => {
      firstMethod ??= sweeps.length > 0 ? 'sweep' : 'program';
      if (atRoot) steps.push(step);
    },
    branchNode: (node) => {
      if (atRoot) rootSchedule = { x: Array.from(node.schedule.x.subarray(0, periods)), y: Array.from(node.schedule.y.subarray(0, periods)) };
      atRoot = false;
      nodes.push(node);
    },
  };
  const workspace = new DayWorkspace(8);
  const outcome = solveWarehouseDay(problem, {}, { workspace, observer });
  if (outcome.status !== 'optimal') throw new Error(`the traced day must be optimal, got ${outcome.status}`);

  blocks.stored = [
    table(
      ['t', 'p_t = buy / eta_c', 'q_t = (sell - wear) eta_d', 'arbitrage (q_t > p_t)'],
      Array.from({ length: periods }, (_, t) => [String(t), fmt(day.chargePrice[t]!), fmt(day.dischargePrice[t]!), day.arbitrage[t] === 1 ? 'yes' : 'no']),
    ),
    '',
    `X = ${fmt(day.chargeStepMwh)} MWh (eta_c dt chargeMw), Y = ${fmt(day.dischargeStepMwh)} MWh (dt dischargeMw / eta_d), window [${fmt(day.socMinMwh)}, ${fmt(day.socMaxMwh)}] MWh, end floor ${fmt(day.socEndFloorMwh)} MWh, V = ${fmt(day.terminalValuePerMwh)}, C = cap = ${fmt(day.dischargeCapMwh)} MWh stored. ${day.arbitrageCount} of ${periods} periods are arbitrage periods; by methodOrder the ${firstMethod === 'sweep' ? 'branching on the chord sweep' : 'dynamic program'} runs first.`,
  ].join('\n');

  const first = sweeps[0]!;
  blocks.sweep = [
    table(
      ['after', 'reachable [lo, hi] MWh', 'open segments, flattest first (slope per MWh stored, open MWh)', 'taken so far (MWh)'],
      first.map((s) => [s.t < periods ? `t=${s.t}` : 'end', s.t < periods ? `[${fmt(s.lo)}, ${fmt(s.hi)}]` : '', s.open, s.taken]),
    ),
  ].join('\n');

  const C = day.dischargeCapMwh;
  blocks.multiplier = table(
    ['solve', 'mu', 'value', 'sum y [MWh]', 'value - mu (sum y - C)'],
    steps.map((s, k) => [`${k + 1} (${s.kind})`, fmt(s.mu), fmt(s.value), fmt(s.discharged), fmt(s.value - s.mu * (s.discharged - C))]),
  );

  const root = rootSchedule!;
  blocks.root = table(
    ['t', 'x_t [MWh]', 'y_t [MWh]', 'share min(x_t / X, y_t / Y)'],
    root.x.map((x, t) => [String(t), fmt(x), fmt(root.y[t]!), fmt(Math.min(x / day.chargeStepMwh, root.y[t]! / day.dischargeStepMwh))]),
  );

  blocks.branching = table(
    ['node', 'modes', 'bound (value)', 'outcome'],
    nodes.map((n, k) => [String(k + 1), modesText(n.modes), Number.isNaN(n.bound) ? n.status : fmt(n.bound), n.outcome === 'split' ? `split on t=${n.split}` : n.outcome]),
  );

  const { schedule, objective } = outcome;
  blocks.schedule = [
    table(
      ['t', 'charge [MW]', 'discharge [MW]', 'state of charge after [MWh]'],
      schedule.chargeMw.map((c, t) => [String(t), fmt(c), fmt(schedule.dischargeMw[t]!), fmt(schedule.socMwh[t]!)]),
    ),
    '',
    `Objective ${fmt(objective)}; ${outcome.nodes} branch-and-bound nodes; discharged ${fmt(schedule.dischargeMw.reduce((a, d) => a + d * problem.periodHours, 0))} MWh at the grid, ${fmt(schedule.dischargeMw.reduce((a, d) => a + (d * problem.periodHours) / b.dischargeEfficiency, 0))} MWh out of the store, of the ${fmt(b.maxFromStoreMwhPerDay ?? Infinity)} MWh cap.`,
  ].join('\n');

  // The dynamic program on the same day (sweepNodes: 0 sends it there): its first run, at mu = 0.
  const programWorkspace = new DayWorkspace(8);
  let run: { join: number; forward: string[]; tail: string[] } | null = null;
  const programNodes: BranchNode[] = [];
  const programSteps: MultiplierStep[] = [];
  let programAtRoot = true;
  const programOutcome = solveWarehouseDay(
    problem,
    { sweepNodes: 0 },
    {
      workspace: programWorkspace,
      observer: {
        multiplierStep: (step) => {
          if (programAtRoot) programSteps.push(step);
          if (run !== null) return;
          const p = programWorkspace.program;
          run = {
            join: p.join,
            forward: Array.from({ length: p.join + 1 }, (_, t) => pwlText(p.forward, t)),
            tail: Array.from({ length: periods - p.join + 1 }, (_, k) => pwlText(p.tail, p.join + k)),
          };
        },
        branchNode: (node) => {
          programAtRoot = false;
          programNodes.push(node);
        },
      },
    },
  );
  if (programOutcome.status !== 'optimal') throw new Error(`the program must solve the traced day, got ${programOutcome.status}`);
  const dp = run as unknown as { join: number; forward: string[]; tail: string[] };
  blocks.program = [
    `The last convex period at mu = 0 is t=${dp.join - 1}, so the forward program runs to stage ${dp.join} and the concave tail covers stages ${dp.join}..${periods}.`,
    '',
    table(
      ['stage', 'function', 'breakpoints (state MWh, value)'],
      [
        ...dp.forward.map((text, t) => [String(t), `F_${t}`, text]),
        ...dp.tail.map((text, k) => [String(dp.join + k), `J_${dp.join + k}`, text]),
      ],
    ),
    '',
    table(
      ['solve', 'mu', 'value', 'sum y [MWh]', 'value - mu (sum y - C)'],
      programSteps.map((s, k) => [`${k + 1} (${s.kind})`, fmt(s.mu), fmt(s.value), fmt(s.discharged), fmt(s.value - s.mu * (s.discharged - C))]),
    ),
    '',
    table(
      ['node', 'modes', 'bound (value)', 'outcome'],
      programNodes.map((n, k) => [String(k + 1), modesText(n.modes), Number.isNaN(n.bound) ? n.status : fmt(n.bound), n.outcome === 'split' ? `split on t=${n.split}` : n.outcome]),
    ),
    '',
    `Objective ${fmt(programOutcome.objective)} in ${programOutcome.nodes} program run(s) of the branching.`,
  ].join('\n');
  const facts: TraceFacts = {
    arbitragePeriods: day.arbitrageCount,
    firstMethod,
    rootOutcome: nodes[0]!.outcome,
    nodes: outcome.nodes,
    rootTrials: steps.filter((s) => s.kind === 'trial').length,
    dischargedMwh: schedule.dischargeMw.reduce((a, d) => a + d * problem.periodHours, 0),
    objective,
    programJoin: dp.join,
    programObjective: programOutcome.objective,
  };
  return { blocks, facts };
}
