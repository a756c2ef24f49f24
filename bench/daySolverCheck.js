// Long correctness run of the exact warehouse day solver: seeded random days (24, 92, 96, 100 periods,
// negative prices, tight and loose windows, cycle cap on and off, wear cost, terminal value) solved
// by src/plan/warehouse (compiled into dist/) and by HiGHS as a MIP with a binary mode per period and zero
// MIP gaps (test/reference/highsDayModel.ts). Prints the worst relative objective gap, feasibility
// violations (test/reference/checkSchedule.ts), simultaneous flows and the days not covered.
//
//   npm run build && node bench/daySolverCheck.js [--days 10000] [--prefix check]
import { option as arg } from './lib/args.js';
import { loadDist, loadReference } from './lib/reference.js';

const DAYS = Number(arg('days', 10000));
const PREFIX = arg('prefix', 'check');

const ref = await loadReference();
const { solveWarehouseDay } = await loadDist('plan/warehouse/index.js');
const highs = await ref.loadHighsSolver();

let worst = 0;
let worstDay = '';
let optimal = 0;
let infeasible = 0;
let notCovered = 0;
const problems = [];
const started = performance.now();
for (let i = 0; i < DAYS; i++) {
  const name = `${PREFIX}-${i}`;
  const day = ref.randomDay(name);
  const warehouse = solveWarehouseDay(day);
  if (warehouse.status === 'not-covered') {
    notCovered++;
    continue;
  }
  const mip = ref.solveDayWithHighs(highs, day, true);
  if (mip.status !== 'optimal' || warehouse.status !== 'optimal') {
    if (mip.status !== warehouse.status) problems.push(`${name}: HiGHS ${mip.status}, warehouse ${warehouse.status}`);
    else infeasible++;
    continue;
  }
  optimal++;
  const gap = Math.abs(warehouse.objective - mip.objective) / Math.max(1, Math.abs(mip.objective));
  if (gap > worst) {
    worst = gap;
    worstDay = name;
  }
  if (gap > 1e-9) problems.push(`${name}: objective ${warehouse.objective}, HiGHS ${mip.objective} (gap ${gap.toExponential(2)})`);
  for (const v of ref.checkSchedule(day, warehouse.schedule)) problems.push(`${name}: ${v}`);
  warehouse.schedule.chargeMw.forEach((c, t) => {
    if (c > 0 && warehouse.schedule.dischargeMw[t] > 0) problems.push(`${name}: period ${t} charges and discharges`);
  });
  if ((i + 1) % 1000 === 0) console.log(`${i + 1} days, worst gap so far ${worst.toExponential(2)}, ${((performance.now() - started) / 1000).toFixed(0)} s`);
}
console.log(`days ${DAYS}: optimal ${optimal}, infeasible (agreeing) ${infeasible}, not covered ${notCovered} (${((100 * notCovered) / DAYS).toFixed(2)} %)`);
console.log(`worst relative objective gap against HiGHS ${ref.HIGHS_NPM_VERSION} MIP: ${worst.toExponential(3)} (${worstDay})`);
console.log(problems.length === 0 ? 'no violations, no simultaneous flows, statuses agree' : `${problems.length} problems:\n${problems.slice(0, 50).join('\n')}`);
process.exitCode = problems.length === 0 ? 0 : 1;
