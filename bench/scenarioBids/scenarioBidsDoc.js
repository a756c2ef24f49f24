// The tables of docs/scenario-bids.md from the JSON that yearAuto.js and dayTrials.js write:
//
//   node bench/scenarioBids/scenarioBidsDoc.js --year year.json [--trials trials.json]
import { readFileSync } from 'node:fs';
import { option } from '../lib/args.js';

const read = (file) => (file === undefined ? null : JSON.parse(readFileSync(file, 'utf8')));
const year = read(option('year', undefined));
const trials = read(option('trials', undefined));
const f0 = (x) => Math.round(x).toLocaleString('en-US');
const f2 = (x) => x.toFixed(2);
const f3 = (x) => x.toFixed(3);

if (year !== null) {
  console.log('| setting | rule | days | price-taking realised | auto realised | ratio | price-taking expected | auto expected | ratio | worst 5 % of days (price-taking / auto) | days auto left price-taking | submitted | curve below price-taking on fresh paths by > 1 se | CPU s |');
  console.log('|---|---|---|---|---|---|---|---|---|---|---|---|---|---|');
  for (const r of year) {
    const submitted = Object.entries(r.submitted).map(([k, v]) => `${k} ${v}`).join(', ');
    const expectedRatio = r.expectedPriceTaking > 0 ? f3(r.expectedRatio) : 'n/a (price-taking < 0)';
    console.log(
      `| ${r.setting} | ${r.rule} | ${r.days} | ${f0(r.priceTaking)} | ${f0(r.auto)} | ${f3(r.ratio)} | ${f0(r.expectedPriceTaking)} | ${f0(r.expectedAuto)} | ${expectedRatio} | ${f0(r.worst5PriceTaking)} / ${f0(r.worst5Auto)} | ${r.daysSwitched} | ${submitted} | ${r.curveFreshBelowOneSe} of ${r.curveDays} | ${r.cpuSeconds.toFixed(0)} |`,
    );
  }
}
if (trials !== null) {
  console.log('\n| setting | periods | paths | steps | program\'s curves: planned-on | fresh | days fresh < -1 se | validated: days curves kept | planned-on | fresh (se) | true (se over days) | days fresh < -1 se | CPU s per day |');
  console.log('|---|---|---|---|---|---|---|---|---|---|---|---|---|');
  for (const s of trials) {
    for (const r of s.plan) {
      console.log(`| ${s.setting} | ${s.periods} | ${r.paths} | ${r.steps} | ${f2(r.programPlanned)} | ${f2(r.programFresh)} | ${r.programFreshBelowOneSe} of ${s.days} | ${r.curvesKept} of ${s.days} | ${f2(r.planned)} | ${f2(r.fresh)} (${f2(r.freshSe)}) | ${f2(r.truth)} (${f2(r.truthSe)}) | ${r.freshBelowOneSe} of ${s.days} | ${f2(r.cpuSeconds)} |`);
    }
  }
  console.log('\n| setting | rule | true advantage of auto over price-taking per day, by z (days switched) |');
  console.log('|---|---|---|');
  for (const s of trials) {
    for (const [rule, rows] of Object.entries(s.z)) console.log(`| ${s.setting} | ${rule} | ${rows.map((r) => `z ${r.z}: ${f2(r.truth)} (${r.switched})`).join('; ')} |`);
  }
}
