// Speed of the exact warehouse day solver against HiGHS on seeded 96-period days with negative prices,
// cycle cap on and off. Prints median and p95 per-day time of: the warehouse solver (src/plan/warehouse,
// compiled into dist/), HiGHS with a kept model (one persistent model per battery, only costs and
// bounds change), HiGHS fresh from LP text, for the LP and the MIP (binary mode per period), and the
// ratios to the warehouse solver. Both the warehouse solver and the kept model are warmed on each group's days
// before that group is measured; each day is then solved once per solver.
//
//   npm run build && node bench/daySolver.js [--days 1000] [--batteries 4] [--negative yes|no|mixed] [--mip]
//
// --mip adds the kept and fresh MIP (slow: tens to hundreds of ms per day) and the objective check
// against the kept MIP.
//
// --negative yes (default) forces a stretch of negative prices into every day (arbitrage periods,
// where complementarity binds); no keeps prices >= 0; mixed draws it per day.
//
// The days are invented inputs (test/reference/randomDays.ts); the models are the reference models
// of test/reference/highsDayModel.ts (HiGHS via the `highs` devDependency).
import { option as arg } from './lib/args.js';
import { loadDist, loadReference } from './lib/reference.js';

const DAYS = Number(arg('days', 1000));
const BATTERIES = Number(arg('batteries', 4));
const NEGATIVE = { yes: true, no: false, mixed: undefined }[arg('negative', 'yes')];
const MIP = process.argv.includes('--mip');
const WARM = 200;

const ref = await loadReference();
const { solveWarehouseDay } = await loadDist('plan/warehouse/index.js');
const highs = await ref.loadHighsSolver();

/** Groups of days sharing one battery (a kept model needs the same matrix), cap on and off. */
const groups = [];
for (const cycleCap of [false, true]) {
  for (let b = 0; b < BATTERIES; b++) {
    const battery = ref.randomDay(`bench-battery-${cycleCap}-${b}`, { periods: 96, cycleCap }).battery;
    const days = [];
    const perGroup = Math.ceil(DAYS / (2 * BATTERIES));
    for (let i = 0; i < perGroup; i++) {
      const d = ref.randomDay(`bench-day-${cycleCap}-${b}-${i}`, { periods: 96, negativePrices: NEGATIVE, cycleCap });
      const rng = ref.SeededRandom.fromName(`bench-start-${cycleCap}-${b}-${i}`);
      const socStartMwh = battery.socMinMwh + (battery.socMaxMwh - battery.socMinMwh) * rng.pick([0, 1, rng.next()]);
      days.push(Object.freeze({ ...d, periodHours: 0.25, battery, socStartMwh, socEndMinMwh: rng.chance(0.5) ? socStartMwh : battery.socMinMwh }));
    }
    groups.push({ cycleCap, days });
  }
}

const times = { warehouse: [], keptLp: [], keptMip: [], freshLp: [], freshMip: [] };
let notCovered = 0;
let worst = 0;
const timed = (list, fn) => {
  const t0 = performance.now();
  const out = fn();
  list.push((performance.now() - t0) * 1000);
  return out;
};

// Warm the warehouse solver's JIT on days outside the measured set (and on each group's days below).
for (let i = 0; i < WARM; i++) solveWarehouseDay(ref.randomDay(`bench-warm-${i}`, { periods: 96, negativePrices: true }));

// Each solver runs over a group's days in its own pass (steady state, as in a backtest that calls
// one solver day after day); interleaving them lets HiGHS's memory traffic slow the others down.
for (const group of groups) {
  const keptLp = new ref.KeptDayModel(highs, group.days[0], false);
  const keptMip = MIP ? new ref.KeptDayModel(highs, group.days[0], true) : null;
  // HiGHS's first solves of a kept model are slow: warm it on the group's days before measuring,
  // and the warehouse solver alike (its compiler tunes to the paths the group's days take).
  for (let i = 0; i < WARM; i++) keptLp.solve(group.days[i % group.days.length]);
  for (let i = 0; i < WARM; i++) solveWarehouseDay(group.days[i % group.days.length]);
  for (let i = 0; keptMip && i < 20; i++) keptMip.solve(group.days[i % group.days.length]);
  const warehouse = group.days.map((day) => timed(times.warehouse, () => solveWarehouseDay(day)));
  for (const day of group.days) timed(times.keptLp, () => keptLp.solve(day));
  const mip = keptMip ? group.days.map((day) => timed(times.keptMip, () => keptMip.solve(day))) : [];
  for (const day of group.days) timed(times.freshLp, () => ref.solveDayWithHighs(highs, day, false));
  if (MIP) for (const day of group.days) timed(times.freshMip, () => ref.solveDayWithHighs(highs, day, true));
  warehouse.forEach((f, i) => {
    const m = mip[i];
    if (f.status === 'not-covered') notCovered++;
    else if (m && f.status === 'optimal' && m.status === 'optimal') worst = Math.max(worst, Math.abs(f.objective - m.objective) / Math.max(1, Math.abs(m.objective)));
  });
  keptLp.dispose();
  keptMip?.dispose();
}

const quantile = (xs, q) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(q * xs.length))];
const median = (xs) => quantile(xs, 0.5);
const p95 = (xs) => quantile(xs, 0.95);
const warehouse = { median: median(times.warehouse), p95: p95(times.warehouse) };
const rows = [
  ['warehouse (src/plan/warehouse)', times.warehouse],
  ['HiGHS kept model, LP', times.keptLp],
  ['HiGHS kept model, MIP', times.keptMip],
  ['HiGHS fresh, LP', times.freshLp],
  ['HiGHS fresh, MIP', times.freshMip],
];
const prices = { true: 'a negative-price stretch in every day', false: 'prices >= 0', undefined: 'a negative-price stretch in about half the days' }[String(NEGATIVE)];
console.log(`${times.warehouse.length} days of 96 periods, ${prices}, cycle cap on and off, ${2 * BATTERIES} batteries; HiGHS npm ${ref.HIGHS_NPM_VERSION}`);
console.log('solver                          median [us]    p95 [us]   median ratio   p95 ratio');
for (const [label, xs] of rows) {
  if (xs.length === 0) continue;
  const m = median(xs);
  const p = p95(xs);
  console.log(`${label.padEnd(30)} ${m.toFixed(1).padStart(12)} ${p.toFixed(1).padStart(11)} ${(m / warehouse.median).toFixed(1).padStart(14)} ${(p / warehouse.p95).toFixed(1).padStart(11)}`);
}
for (const cycleCap of [false, true]) {
  const xs = times.warehouse.filter((_, i) => groups[Math.floor(i / groups[0].days.length)].cycleCap === cycleCap);
  console.log(`warehouse solver, cycle cap ${cycleCap ? 'on ' : 'off'}: median ${median(xs).toFixed(1)} us, p95 ${p95(xs).toFixed(1)} us`);
}
console.log(`warehouse solver not covered (answered "not-covered", left to the LP path; time included above): ${notCovered}`);
if (MIP) console.log(`worst relative objective gap warehouse vs HiGHS kept MIP on covered days: ${worst.toExponential(2)}`);
