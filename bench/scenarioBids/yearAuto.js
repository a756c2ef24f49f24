// A year of `auto` against `price-taking` on the known-distribution markets, under both rules for
// unaccepted orders: each policy carries its own state of charge day to day (runBacktest), price-taking
// bids the median schedule of the TRUE quantiles, auto scores its candidates on 1,000 fresh TRUE paths
// and plans curves on 100 (market.js), settles against the realised prices. Prints per setting and rule
// the year's profit of both, their ratio, the mean of the worst 5 % of days (CVaR 5 % of daily profit),
// what auto submitted, and, per day, the curves against price-taking on the fresh paths (how often the
// curves' fresh mean is below price-taking's by more than one standard error); writes JSON (--json).
// Beside the realised profit (one draw of each day, where a single price spike can decide a year) it
// prints the EXPECTED profit: each day's submitted bids settled, from the state of charge the policy
// was in, on 2,000 further true paths of the day (the mean over the true law, up to its sampling error).
//
//   npm run build && node bench/scenarioBids/yearAuto.js [--settings a,b] [--rules follow-plan,follow-accepted] [--json out.json] [--days N] [--draw N]
//
// --draw N (N > 0) runs on an independent draw of every setting (the same laws, other data: history,
// realised year and paths), so that one realised year, where a few spikes can decide the profit, is not
// the only sample of "over a year".
import { writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { option } from '../lib/args.js';
import { benchBattery, loadKnownMarket, SETTING_NAMES, trueScenarioSource } from './market.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const dist = (path) => import(pathToFileURL(join(root, 'dist', path)).href);
const { loadHighsSolver } = await dist('app/solver/highsSolver.js');
const { runBacktest } = await dist('backtest/runBacktest.js');
const { SCENARIO_DEFAULTS } = await dist('backtest/scenarioPlanning.js');
const { worstTailMean } = await dist('stats/worstTailMean.js');
const { evaluateBids } = await dist('scenarios/evaluateBids.js');
const { scenarioSet } = await dist('scenarios/scenarioSet.js');
const TEST_PATHS = 2000;

const settings = option('settings', SETTING_NAMES.join(',')).split(',');
const dayLimit = option('days', undefined);
const solver = await loadHighsSolver();
const battery = await benchBattery();
const RULES = option('rules', 'follow-plan,follow-accepted').split(',');
const json = option('json', undefined);
const draw = Number(option('draw', 0));
const results = [];
for (const name of settings) {
  const known = await loadKnownMarket(name, draw);
  const days = dayLimit === undefined ? known.truthDays : known.truthDays.slice(0, Number(dayLimit));
  const source = await trueScenarioSource(known, SCENARIO_DEFAULTS.planningPaths, SCENARIO_DEFAULTS.freshPaths);
  for (const rule of RULES) {
    const cpu0 = process.cpuUsage();
    const wall0 = performance.now();
    const expected = [[], []];
    const onLedgerDay = (day) => {
      const p = known.paths(day.day, TEST_PATHS, 'test');
      const test = scenarioSet(p.clearing, p.imbalance, p.imbalance);
      day.runs.forEach((run, i) => {
        const profit = evaluateBids({ bids: run.ledger.orders, scenarios: test, battery, periodHours: known.market.periodMinutes / 60, socStartMwh: run.socStartMwh, unaccepted: run.bidKind === 'curves' ? 'follow-accepted' : rule }).profit;
        expected[i].push(profit.reduce((a, b) => a + b, 0) / profit.length);
      });
    };
    const result = runBacktest(
      { market: known.market, battery, history: known.history, forecast: { days: known.forecastDays, incompleteDays: [] }, from: days[0], to: days[days.length - 1] },
      {
        policies: ['price-taking', 'auto'],
        unaccepted: rule,
        keepLedger: false,
        onLedgerDay,
        scenarioPlanning: {
          scenarios: source, solver, curveSteps: SCENARIO_DEFAULTS.curveSteps, riskWeight: SCENARIO_DEFAULTS.riskWeight,
          alphas: SCENARIO_DEFAULTS.alphas, switchStandardErrors: SCENARIO_DEFAULTS.switchStandardErrors,
        },
      },
    );
    const cpu = process.cpuUsage(cpu0);
    const daily = (i) => result.days.map((d) => d.runs[i].totals.profit);
    const taking = daily(0);
    const auto = daily(1);
    const sum = (xs) => xs.reduce((a, b) => a + b, 0);
    const submitted = {};
    let curveBelow = 0;
    let curveDays = 0;
    for (const d of result.days) {
      const report = d.runs[1].scenarioReport;
      if (report === null) continue;
      const { choice } = report;
      const name = choice.scores[choice.chosen].candidate.name;
      submitted[name] = (submitted[name] ?? 0) + 1;
      const curve = choice.scores.find((s) => s.candidate.name === 'curve');
      if (curve !== undefined) {
        curveDays++;
        if (curve.advantage.mean < -curve.advantage.standardError) curveBelow++;
      }
    }
    const row = {
      setting: name,
      draw,
      rule,
      days: result.days.length,
      priceTaking: sum(taking),
      auto: sum(auto),
      ratio: sum(auto) / sum(taking),
      expectedPriceTaking: sum(expected[0]),
      expectedAuto: sum(expected[1]),
      expectedRatio: sum(expected[1]) / sum(expected[0]),
      worst5PriceTaking: worstTailMean(taking, 0.05),
      worst5Auto: worstTailMean(auto, 0.05),
      daysSwitched: result.days.length - (submitted['price-taking'] ?? 0),
      submitted,
      curveFreshBelowOneSe: curveBelow,
      curveDays,
      cpuSeconds: (cpu.user + cpu.system) / 1e6,
      wallSeconds: (performance.now() - wall0) / 1000,
    };
    results.push(row);
    console.log(
      `${name.padEnd(20)} ${rule.padEnd(16)} days ${row.days}  realised: price-taking ${row.priceTaking.toFixed(0).padStart(9)}  auto ${row.auto.toFixed(0).padStart(9)}  ratio ${row.ratio.toFixed(3)}  expected: ${row.expectedPriceTaking.toFixed(0)} / ${row.expectedAuto.toFixed(0)} ratio ${row.expectedRatio.toFixed(3)}  worst 5% ${row.worst5PriceTaking.toFixed(0)} / ${row.worst5Auto.toFixed(0)}  switched ${row.daysSwitched}  curve fresh < -1 se on ${curveBelow}/${curveDays} days  cpu ${row.cpuSeconds.toFixed(0)} s`,
    );
    console.log(`    submitted: ${Object.entries(submitted).map(([k, v]) => `${k} ${v}`).join(', ')}`);
    // Written after every setting and rule, so that a long run that is stopped keeps what it finished.
    if (json !== undefined) writeFileSync(json, `${JSON.stringify(results, null, 2)}\n`);
  }
}
