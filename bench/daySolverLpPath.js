// The general LP path of solveDay (solver: 'lp': javascript-lp-solver and our branch and bound)
// against HiGHS's MIP on seeded days longer than its unit test takes (test/plan/solveDay.lpPath.vs-highs.test.ts
// runs 4 to 24 periods). Prints how many days agree with HiGHS (status, objective to 1e-6 relative,
// feasibility by test/reference/checkSchedule.ts), how many exceed the LP path's node budget
// (NodeLimitError: never a silent suboptimum), the worst gap, and median times of the LP path, the
// warehouse solver and HiGHS fresh from model text, measured in the same run, with their ratios.
//
//   npm run build && node bench/daySolverLpPath.js [--days 200] [--periods 24] [--negative yes|no|mixed]
import { median, option as arg } from './lib/args.js';
import { loadDist, loadReference } from './lib/reference.js';

const DAYS = Number(arg('days', 200));
const PERIODS = Number(arg('periods', 24));
const NEGATIVE = { yes: true, no: false, mixed: undefined }[arg('negative', 'mixed')];

const ref = await loadReference();
const { solveDay, NodeLimitError } = await loadDist('plan/solveDay.js');
const highs = await ref.loadHighsSolver();

const times = { lp: [], warehouse: [], highs: [] };
let agree = 0;
let nodeLimit = 0;
let worst = 0;
let nodes = 0;
const problems = [];
const timed = (list, fn) => {
  const t0 = performance.now();
  const out = fn();
  list.push((performance.now() - t0) * 1000);
  return out;
};
for (let i = 0; i < DAYS; i++) {
  const name = `lp-path-bench-${i}`;
  const day = ref.randomDay(name, { periods: PERIODS, negativePrices: NEGATIVE });
  const mip = timed(times.highs, () => ref.solveDayWithHighs(highs, day, true));
  timed(times.warehouse, () => solveDay(day, { solver: 'warehouse' }));
  let lp;
  try {
    lp = timed(times.lp, () => solveDay(day, { solver: 'lp' }));
  } catch (error) {
    if (!(error instanceof NodeLimitError)) throw error;
    nodeLimit++;
    continue;
  }
  if (mip.status !== 'optimal' || lp.status !== 'optimal') {
    if (mip.status === lp.status) agree++;
    else problems.push(`${name}: HiGHS ${mip.status}, LP path ${lp.status}`);
    continue;
  }
  nodes += lp.nodes;
  const gap = Math.abs(lp.objective - mip.objective) / Math.max(1, Math.abs(mip.objective));
  worst = Math.max(worst, gap);
  const violations = ref.checkSchedule(day, lp.schedule, 1e-7 * Math.max(1, day.battery.energyMwh));
  if (gap > 1e-6 || violations.length > 0) problems.push(`${name}: gap ${gap.toExponential(2)}${violations.length > 0 ? `, ${violations[0]}` : ''}`);
  else agree++;
}
const lpMedian = median(times.lp);
console.log(`${DAYS} seeded days of ${PERIODS} periods (negative prices: ${arg('negative', 'mixed')}); HiGHS npm ${ref.HIGHS_NPM_VERSION} MIP as the reference`);
console.log(`LP path agrees with HiGHS on ${agree} days; over its node budget (NodeLimitError) on ${nodeLimit}; worst relative gap ${worst.toExponential(2)}; ${(nodes / Math.max(1, agree)).toFixed(1)} branch-and-bound nodes per agreeing day`);
console.log('path                            median [us]   ratio to the LP path');
for (const [label, xs] of [['LP path (solver: lp)', times.lp], ['warehouse (solver: warehouse)', times.warehouse], ['HiGHS MIP from model text', times.highs]]) {
  console.log(`${label.padEnd(30)} ${median(xs).toFixed(1).padStart(12)} ${(median(xs) / lpMedian).toFixed(3).padStart(14)}`);
}
if (problems.length > 0) console.log(`${problems.length} disagreements:\n${problems.slice(0, 20).join('\n')}`);
process.exitCode = problems.length === 0 ? 0 : 1;
