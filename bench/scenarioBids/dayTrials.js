// Day by day on the known-distribution markets, each day from the same starting state of charge:
//  1. curves planned on S planning paths with K steps per period, for a grid of (S, K): their advantage
//     over price-taking on the planning paths ("planned"), on 1,000 fresh paths ("fresh", with the
//     paired standard error) and on 4,000 further test paths, the closest figure to the true expected
//     advantage ("truth"); this is the trade-off that sets the default S and K;
//  2. auto's candidates scored on the fresh paths, and for each switching threshold z the true
//     advantage over price-taking of what auto would submit (winner's-curse control): the choice of z.
// Every path is a draw from the day's true law (market.js); planning, fresh and test paths come from
// separate streams. Prints the tables and writes the results as JSON (--json FILE) for
// docs/scenario-bids.md (scenarioBidsDoc.js).
//
//   npm run build && node bench/scenarioBids/dayTrials.js [--settings a,b] [--days 24] [--json out.json]
import { writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { option } from '../lib/args.js';
import { benchBattery, loadKnownMarket, SETTING_NAMES } from './market.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const dist = (path) => import(pathToFileURL(join(root, 'dist', path)).href);
const { loadHighsSolver } = await dist('app/solver/highsSolver.js');
const { scenarioSet } = await dist('scenarios/scenarioSet.js');
const { evaluateBids } = await dist('scenarios/evaluateBids.js');
const { planPolicyDay } = await dist('backtest/planPolicyDay.js');
const { planCurves } = await dist('curves/planCurves.js');
const { pairedDifference } = await dist('stats/pairedDifference.js');
const { settleDay } = await dist('settle/settleDay.js');
const { SCENARIO_DEFAULTS } = await dist('backtest/scenarioPlanning.js');
const { onBothHalves } = await dist('backtest/autoChoice.js');

export const PLAN_GRID = Object.freeze([
  { paths: 50, steps: 4 },
  { paths: 100, steps: 2 },
  { paths: 100, steps: 4 },
  { paths: 100, steps: 8 },
  { paths: 200, steps: 4 },
  { paths: 400, steps: 4 },
]);
export const Z_GRID = Object.freeze([0, 0.5, 1, 1.5, 2, 3]);
const FRESH = 1000;
const TEST = 4000;
const RULES = ['follow-plan', 'follow-accepted'];

const settings = option('settings', SETTING_NAMES.join(',')).split(',');
const dayCount = Number(option('days', '24'));
const solver = await loadHighsSolver();
const battery = await benchBattery();
const mean = (xs) => xs.reduce((a, b) => a + b, 0) / xs.length;
const se = (xs) => Math.sqrt(xs.reduce((a, x) => a + (x - mean(xs)) ** 2, 0) / (xs.length - 1) / xs.length);

const results = [];
for (const name of settings) {
  const known = await loadKnownMarket(name);
  const { market } = known;
  const dt = market.periodMinutes / 60;
  const step = Math.floor(known.truthDays.length / dayCount);
  const days = known.truthDays.filter((_, i) => i % step === 0).slice(0, dayCount);
  const set = (p) => scenarioSet(p.clearing, p.imbalance, p.imbalance);
  const planRows = PLAN_GRID.map((g) => ({ ...g, planned: [], fresh: [], freshSe: [], truth: [], freshBelow: 0, kept: 0, seconds: [], programPlanned: [], programFresh: [], programBelow: 0 }));
  const zRows = Object.fromEntries(RULES.map((rule) => [rule, Z_GRID.map((z) => ({ z, truth: [], switched: 0 }))]));
  const start = battery.socInitialMwh;
  for (const day of days) {
    const forecast = known.forecastDays.get(day);
    const realised = known.history.days.find((d) => d.day === day);
    const fresh = set(known.paths(day, FRESH, 'fresh'));
    const test = set(known.paths(day, TEST, 'test'));
    const settleOn = (scenarios, bids, rule) => evaluateBids({ bids, scenarios, battery, periodHours: dt, socStartMwh: start, unaccepted: rule }).profit;
    const base = { forecast, realised, market, battery, alpha: 0.1, socStartMwh: start, solveOptions: {}, scenarioPlanning: null, scenarios: null };
    const flat = planPolicyDay({ ...base, policy: 'price-taking', unaccepted: 'follow-plan' });
    const flatFresh = settleOn(fresh, flat.orders, 'follow-accepted');
    const flatTest = settleOn(test, flat.orders, 'follow-accepted');
    for (const row of planRows) {
      const planning = set(known.paths(day, row.paths, `planning-${row.paths}`));
      const validation = set(known.paths(day, row.paths, `validation-${row.paths}`));
      const t0 = process.cpuUsage();
      const plan = planCurves({ planning, validation, switchStandardErrors: SCENARIO_DEFAULTS.switchStandardErrors, market, battery, socStartMwh: start, socEndMinMwh: start, steps: row.steps, riskWeight: 0, flatBids: flat.orders, solver });
      const cpu = process.cpuUsage(t0);
      row.seconds.push((cpu.user + cpu.system) / 1e6);
      if (plan.status !== 'optimal') throw new Error(`${name} ${day}: ${plan.reason}`);
      if (plan.chosen === 'curves') row.kept++;
      const bids = plan.chosen === 'curves' ? plan.curveBids : flat.orders;
      row.planned.push((plan.chosen === 'curves' ? plan.plannedCurves.mean : plan.plannedFlat.mean) - plan.plannedFlat.mean);
      // The program's own curves, before validation chose a penalty: planned-on and fresh.
      const programFresh = pairedDifference(settleOn(fresh, plan.programCurveBids, 'follow-accepted'), flatFresh);
      row.programPlanned.push(mean(Array.from(settleOn(planning, plan.programCurveBids, 'follow-accepted'))) - plan.plannedFlat.mean);
      row.programFresh.push(programFresh.mean);
      if (programFresh.mean < -programFresh.standardError) row.programBelow++;
      const diff = pairedDifference(settleOn(fresh, bids, 'follow-accepted'), flatFresh);
      row.fresh.push(diff.mean);
      row.freshSe.push(diff.standardError);
      if (diff.mean < -diff.standardError) row.freshBelow++;
      row.truth.push(pairedDifference(settleOn(test, bids, 'follow-accepted'), flatTest).mean);
    }
    for (const rule of RULES) {
      const planning = {
        scenarios: () => ({ planning: set(known.paths(day, 100, 'planning-100')), validation: set(known.paths(day, 100, 'validation-100')), fresh }),
        solver, curveSteps: 4, riskWeight: 0, alphas: [0.05, 0.1, 0.2, 0.3, 0.4], switchStandardErrors: 0,
      };
      const auto = planPolicyDay({ ...base, policy: 'auto', unaccepted: rule, scenarioPlanning: planning, scenarios: planning.scenarios });
      const scores = auto.scenarioReport.choice.scores;
      const truthOf = scores.map((s) => mean(settleOn(test, s.candidate.bids, s.candidate.kind === 'curves' ? 'follow-accepted' : rule)));
      let best = 0;
      scores.forEach((s, i) => { if (s.value > scores[best].value) best = i; });
      for (const zr of zRows[rule]) {
        const w = scores[best];
        // auto's rule (backtest/autoChoice.ts) at this z: more than z standard errors, and ahead on both halves.
        const chosen = best !== 0 && w.advantage.mean > zr.z * w.advantage.standardError && onBothHalves(w) ? best : 0;
        if (chosen !== 0) zr.switched++;
        zr.truth.push(truthOf[chosen] - truthOf[0]);
      }
    }
    process.stderr.write('.');
  }
  process.stderr.write('\n');
  const summary = {
    setting: name,
    days: days.length,
    periods: known.forecastDays.get(days[0]).periods.length,
    plan: planRows.map((r) => ({ paths: r.paths, steps: r.steps, planned: mean(r.planned), fresh: mean(r.fresh), freshSe: mean(r.freshSe), truth: mean(r.truth), truthSe: se(r.truth), freshBelowOneSe: r.freshBelow, curvesKept: r.kept, programPlanned: mean(r.programPlanned), programFresh: mean(r.programFresh), programFreshBelowOneSe: r.programBelow, cpuSeconds: mean(r.seconds) })),
    z: Object.fromEntries(RULES.map((rule) => [rule, zRows[rule].map((r) => ({ z: r.z, truth: mean(r.truth), truthSe: se(r.truth), switched: r.switched }))])),
  };
  results.push(summary);
  console.log(`\n${name} (${summary.days} days, ${summary.periods} periods): curve advantage over price-taking per day [KNW]`);
  console.log('  paths steps  program: planned  fresh  < -1 se | validated: planned     fresh (se)      truth (se over days)   fresh < -1 se   curves kept   cpu s');
  for (const r of summary.plan) console.log(`  ${String(r.paths).padStart(5)} ${String(r.steps).padStart(5)} ${r.programPlanned.toFixed(2).padStart(9)} ${r.programFresh.toFixed(2).padStart(9)} ${String(r.programFreshBelowOneSe).padStart(4)}  | ${r.planned.toFixed(2).padStart(9)} ${r.fresh.toFixed(2).padStart(9)} (${r.freshSe.toFixed(2)}) ${r.truth.toFixed(2).padStart(9)} (${r.truthSe.toFixed(2)})   ${String(r.freshBelowOneSe).padStart(6)}   ${String(r.curvesKept).padStart(6)}        ${r.cpuSeconds.toFixed(2)}`);
  for (const rule of RULES) console.log(`  auto, ${rule}: true advantage per day by z: ${summary.z[rule].map((r) => `z ${r.z}: ${r.truth.toFixed(2)} (${r.switched} switched)`).join('; ')}`);
}
const json = option('json', undefined);
if (json !== undefined) writeFileSync(json, `${JSON.stringify(results, null, 2)}\n`);
