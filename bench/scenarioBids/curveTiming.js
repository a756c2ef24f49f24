// Curve planning of a 96-period day (the known-distribution market convex-hetero, 15-minute periods) on
// 100 planning paths, 4 steps per period, the bench battery, against the same two-stage program in its
// general-purpose extensive form, timed in the same run:
//  - quantbid: planCurves (price points, the stored-energy LP with lazy state-of-charge rows solved by
//    HiGHS's dual simplex, warm restarts, and the fallback to price-taking's flat bids);
//  - extensive form: one LP in grid units, the curve's net MW per step y_{t,k} (non-decreasing in k) and,
//    per path, charge, discharge and state of charge in every period, every row present from the start
//    (d - c = y of the path's step, the state-of-charge recursion, window, end floor, cycle cap), solved
//    by HiGHS with its default choice of method. It is the LP relaxation (no binaries), so it is the
//    faster of the two general formulations; it is built on the same price points, so both optima are
//    printed and must agree where the relaxation has no simultaneous flows;
//  - with --jls-paths N, javascript-lp-solver on the extensive form with N paths (it is far slower).
// CPU seconds of this thread (process.cpuUsage), median over the days; the machine is shared, so the
// ratio, measured within one run, is the figure to read.
//
//   npm run build && node bench/scenarioBids/curveTiming.js [--days 5] [--paths 100] [--jls-paths 5]
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { median, option } from '../lib/args.js';
import { benchBattery, loadKnownMarket } from './market.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const dist = (path) => import(pathToFileURL(join(root, 'dist', path)).href);
const { loadHighsSolver } = await dist('app/solver/highsSolver.js');
const { scenarioSet } = await dist('scenarios/scenarioSet.js');
const { planPolicyDay } = await dist('backtest/planPolicyDay.js');
const { planCurves } = await dist('curves/planCurves.js');
const { curvePricePoints } = await dist('curves/pricePoints.js');
const { default: loadHighs } = await import('highs');
const solverLib = createRequire(import.meta.url)('javascript-lp-solver');

const dayCount = Number(option('days', '5'));
const pathCount = Number(option('paths', '100'));
const jlsPaths = option('jls-paths', undefined);
const STEPS = 4;
const solver = await loadHighsSolver();
const highs = await loadHighs();
const battery = await benchBattery();
const known = await loadKnownMarket('convex-hetero');
const { market } = known;
const dt = market.periodMinutes / 60;
const cpu = (f) => {
  const t0 = process.cpuUsage();
  const value = f();
  const used = process.cpuUsage(t0);
  return { value, seconds: (used.user + used.system) / 1e6 };
};

/** The extensive form's columns and rows (see the head of this file); y first, then c, d, s per path. */
function extensiveForm(scenarios, points, start) {
  const S = scenarios.pathCount;
  const T = scenarios.periodCount;
  const yOffset = [];
  let n = 0;
  for (let t = 0; t < T; t++) {
    yOffset.push(n);
    n += points[t].breakpoints.length + 1;
  }
  const base = n;
  n += 3 * S * T;
  const col = (kind, w, t) => base + (w * 3 + kind) * T + t; // kind 0 c, 1 d, 2 s
  const cost = new Float64Array(n);
  const lower = new Float64Array(n);
  const upper = new Float64Array(n);
  for (let t = 0; t < T; t++) {
    for (let k = 0; k <= points[t].breakpoints.length; k++) {
      lower[yOffset[t] + k] = -battery.chargeMw;
      upper[yOffset[t] + k] = battery.dischargeMw;
    }
  }
  const rows = { lower: [], upper: [], starts: [0], indices: [], values: [] };
  const row = (cols, vals, lo, hi) => {
    rows.indices.push(...cols);
    rows.values.push(...vals);
    rows.starts.push(rows.indices.length);
    rows.lower.push(lo);
    rows.upper.push(hi);
  };
  for (let t = 0; t < T; t++) for (let k = 0; k < points[t].breakpoints.length; k++) row([yOffset[t] + k, yOffset[t] + k + 1], [1, -1], -Infinity, 0);
  const cap = battery.maxFromStoreMwhPerDay;
  for (let w = 0; w < S; w++) {
    for (let t = 0; t < T; t++) {
      const pi = scenarios.clearingPricePerMwh[t * S + w];
      const j = points[t].stepOfPath[w];
      upper[col(0, w, t)] = battery.chargeMw;
      upper[col(1, w, t)] = points[t].sellable[j] === 1 ? battery.dischargeMw : 0;
      lower[col(2, w, t)] = t === T - 1 ? Math.max(battery.socMinMwh, start) : battery.socMinMwh;
      upper[col(2, w, t)] = battery.socMaxMwh;
      cost[col(0, w, t)] = (-dt * pi) / S;
      cost[col(1, w, t)] = (dt * (pi - battery.degradationCostPerMwh)) / S;
      row([col(1, w, t), col(0, w, t), yOffset[t] + j], [1, -1, -1], 0, 0);
      if (t === 0) row([col(2, w, 0), col(0, w, 0), col(1, w, 0)], [1, -battery.chargeEfficiency * dt, dt / battery.dischargeEfficiency], start, start);
      else row([col(2, w, t), col(2, w, t - 1), col(0, w, t), col(1, w, t)], [1, -1, -battery.chargeEfficiency * dt, dt / battery.dischargeEfficiency], 0, 0);
    }
    if (cap !== undefined) row(Array.from({ length: T }, (_, t) => col(1, w, t)), new Array(T).fill(dt / battery.dischargeEfficiency), -Infinity, cap);
  }
  return { n, cost, lower, upper, rows };
}

function solveExtensiveHighs(form) {
  const inf = highs.infinity;
  const bound = (xs) => Array.from(xs, (v) => (v === Infinity ? inf : v === -Infinity ? -inf : v));
  const model = highs.createModel({
    numCols: form.n,
    numRows: form.rows.lower.length,
    sense: highs.constants.objectiveSense.maximize,
    colCost: form.cost,
    colLower: form.lower,
    colUpper: form.upper,
    rowLower: bound(form.rows.lower),
    rowUpper: bound(form.rows.upper),
    matrix: { format: 'csr', numRows: form.rows.lower.length, numCols: form.n, ...form.rows },
  });
  try {
    model.options.set({ output_flag: false });
    const status = model.run().modelStatus;
    if (status !== highs.constants.modelStatus.optimal) throw new Error(`extensive form: HiGHS status ${status}`);
    return model.getObjectiveValue();
  } finally {
    model.dispose();
  }
}

function solveExtensiveJls(form) {
  // javascript-lp-solver's variables are >= 0: a column that may be negative (the curve's y) is split
  // into x+ - x-; its bounds become rows.
  const variables = {};
  const constraints = {};
  const parts = (i) => (form.lower[i] < 0 ? [[`x${i}`, 1], [`m${i}`, -1]] : [[`x${i}`, 1]]);
  for (let i = 0; i < form.n; i++) {
    constraints[`b${i}`] = { ...(form.lower[i] > 0 ? { min: form.lower[i] } : form.lower[i] < 0 ? { min: form.lower[i] } : {}), max: form.upper[i] };
    for (const [name, sign] of parts(i)) variables[name] = { objective: sign * form.cost[i], [`b${i}`]: sign };
  }
  for (let r = 0; r < form.rows.lower.length; r++) {
    const c = {};
    if (form.rows.lower[r] !== -Infinity) c.min = form.rows.lower[r];
    if (form.rows.upper[r] !== Infinity) c.max = form.rows.upper[r];
    constraints[`r${r}`] = c;
    for (let k = form.rows.starts[r]; k < form.rows.starts[r + 1]; k++) {
      const i = form.rows.indices[k];
      for (const [name, sign] of parts(i)) variables[name][`r${r}`] = sign * form.rows.values[k];
    }
  }
  const result = solverLib.Solve({ optimize: 'objective', opType: 'max', constraints, variables });
  return result.feasible ? result.result : Number.NaN;
}

const step = Math.floor(known.truthDays.length / dayCount);
const days = known.truthDays.filter((_, i) => i % step === 0).slice(0, dayCount);
const set = (p) => scenarioSet(p.clearing, p.imbalance, p.imbalance);
const start = battery.socInitialMwh;
const lazy = [];
const extensive = [];
const ratios = [];
console.log(`curve planning, ${known.setting.name}: ${days.length} days of ${known.forecastDays.get(days[0]).periods.length} periods, ${pathCount} planning paths, ${STEPS} steps`);
console.log('  day          lazy-row s   extensive s   ratio   program optimum (lazy / extensive, per path mean)');
for (const day of days) {
  const forecast = known.forecastDays.get(day);
  const planning = set(known.paths(day, pathCount, `planning-${pathCount}`));
  const flat = planPolicyDay({ forecast, realised: null, market, battery, alpha: 0.1, socStartMwh: start, solveOptions: {}, scenarioPlanning: null, scenarios: null, policy: 'price-taking', unaccepted: 'follow-plan' });
  const validation = set(known.paths(day, pathCount, `validation-${pathCount}`));
  const mine = cpu(() => planCurves({ planning, validation, switchStandardErrors: 2, market, battery, socStartMwh: start, socEndMinMwh: start, steps: STEPS, riskWeight: 0, flatBids: flat.orders, solver }));
  if (mine.value.status !== 'optimal') throw new Error(`${day}: ${mine.value.reason}`);
  const points = curvePricePoints(planning, STEPS);
  const other = cpu(() => solveExtensiveHighs(extensiveForm(planning, points, start)));
  lazy.push(mine.seconds);
  extensive.push(other.seconds);
  ratios.push(other.seconds / mine.seconds);
  console.log(`  ${day}   ${mine.seconds.toFixed(2).padStart(9)}   ${other.seconds.toFixed(2).padStart(10)}   ${(other.seconds / mine.seconds).toFixed(1).padStart(5)}x   ${mine.value.program.objective.toFixed(3)} / ${other.value.toFixed(3)} (${mine.value.program.rounds} solves, ${mine.value.program.lazyRows} lazy rows)`);
}
console.log(`  median       ${median(lazy).toFixed(2).padStart(9)}   ${median(extensive).toFixed(2).padStart(10)}   ${median(ratios).toFixed(1).padStart(5)}x   (goal: lazy-row at most 1.5 s, under a tenth of 13.7 s)`);
if (jlsPaths !== undefined) {
  const S = Number(jlsPaths);
  const day = days[0];
  const planning = set(known.paths(day, S, `planning-${S}`));
  const points = curvePricePoints(planning, STEPS);
  const form = extensiveForm(planning, points, start);
  const h = cpu(() => solveExtensiveHighs(form));
  const j = cpu(() => solveExtensiveJls(form));
  console.log(`  javascript-lp-solver on the extensive form, ${S} paths, ${day}: ${j.seconds.toFixed(2)} s (optimum ${j.value.toFixed(3)}) against HiGHS ${h.seconds.toFixed(2)} s (${h.value.toFixed(3)}): ${(j.seconds / h.seconds).toFixed(0)}x`);
}
