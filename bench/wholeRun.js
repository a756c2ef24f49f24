// What a user waits for: whole quantbid processes, Node start-up included, each against a reference
// process measured in the same rounds (interleaved, so that the machine's drift hits both alike).
//
//   year backtest    `quantbid backtest` of one year of the demo market at 15 minutes (19 levels, five
//                    policies, one setting, ledger.csv, days.csv and summary.json written), against a
//                    bare Node script that reads the same two CSVs, splits every line and parses every
//                    number and timestamp (bench/lib/plainRead.js)                     goal: at most 2x
//   --version        `quantbid --version` against `node -e 0`                             goal: at most 2x
//   backtest --help  `quantbid backtest --help` against `node -e 0`                       goal: at most 2x
//   plan             `quantbid plan --policy quantile` of the demo day, cold (a new process), against
//                    `node -e 0`: the start-up of a plan with a schedule policy     goal: at most 3x
//   auto             `quantbid plan` of the demo day with the default policy, auto (HiGHS, 300 paths made
//                    from the quantile file and the history, every candidate scored), against
//                    `node -e 0`; no goal, timed only when --only names it
//
//   npm run build && node bench/wholeRun.js [--year 2026] [--rounds 7] [--baseline DIR] [--only plan,version,auto]
//
// Each figure is a median wall time over --rounds rounds; each ratio is the median over the rounds of
// the ratio within a round, with the lowest and highest round. Where Linux's /proc tells, the CPU time
// of each process (user + system, 10 ms ticks) is given too, with the ratio of the medians: on a busy
// machine wall times swing more than CPU times. --baseline DIR (another built checkout,
// e.g. a worktree of the previous commit) times the same quantbid commands of DIR in the same rounds,
// so that a change is measured before and after on the same machine at the same time. --only times
// some of the five (year, version, help, plan, auto) and their references, nothing else.
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { demoFolder, writeYearInputs } from './lib/yearData.js';
import { median, option } from './lib/args.js';
import { timedNode } from './lib/processTime.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const YEAR = option('year', '2026');
const ROUNDS = Number(option('rounds', 7));
const BASELINE = option('baseline', null);
const ONLY = option('only', 'year,version,help,plan').split(',');
const KEYS = { 'year backtest': 'year', '--version': 'version', 'backtest --help': 'help', plan: 'plan', 'plan (auto)': 'auto' };
for (const key of ONLY) if (!Object.values(KEYS).includes(key)) throw new Error(`--only: ${key} is none of ${Object.values(KEYS).join(', ')}`);
/** Whether the run `name` (a baseline's too) is timed. */
const wanted = (name) => ONLY.includes(KEYS[name.replace(' (baseline)', '')] ?? '');

/** Wall and CPU time of one process [ms] (CPU null where unknown); throws when it fails. */
function timed(args) {
  const { wall, cpu } = timedNode(args);
  return { wall, cpu };
}

const folder = mkdtempSync(join(tmpdir(), 'quantbid-whole-'));
try {
  // The year's inputs are written only when the year backtest is timed.
  const inputs = ONLY.includes('year') ? writeYearInputs(folder, YEAR) : null;
  const out = join(folder, 'out');
  /** The quantbid processes of the checkout at `checkout`, named with `suffix`, writing into folders named with `tag`. */
  const quantbidRuns = (checkout, suffix, tag) => {
    const quantbid = join(checkout, 'bin', 'quantbid.js');
    const all = {
      [`year backtest${suffix}`]: inputs === null ? null : [quantbid, 'backtest', '--scenario', inputs.scenarioPath, '--from', `${YEAR}-01-01`, '--to', `${YEAR}-12-31`, '--out', `${out}${tag}`, '--force', '--quiet'],
      [`--version${suffix}`]: [quantbid, '--version'],
      [`backtest --help${suffix}`]: [quantbid, 'backtest', '--help'],
      [`plan${suffix}`]: [quantbid, 'plan', '--scenario', join(demoFolder, 'scenario.json'), '--policy', 'quantile', '--out', join(folder, `plan${tag}`), '--force'],
      [`plan (auto)${suffix}`]: [quantbid, 'plan', '--scenario', join(demoFolder, 'scenario.json'), '--out', join(folder, `plan-auto${tag}`), '--force'],
    };
    return Object.fromEntries(Object.entries(all).filter(([name]) => wanted(name)));
  };
  const runs = {
    'node -e 0': ['-e', '0'],
    ...(ONLY.includes('year') ? { 'plain read': [join(root, 'bench', 'lib', 'plainRead.js'), inputs.historyPath, inputs.forecastPath] } : {}),
    ...quantbidRuns(root, '', ''),
    ...(BASELINE === null ? {} : quantbidRuns(BASELINE, ' (baseline)', '-baseline')),
  };
  const times = Object.fromEntries(Object.keys(runs).map((name) => [name, []]));
  const cpu = Object.fromEntries(Object.keys(runs).map((name) => [name, []]));
  for (const args of Object.values(runs)) timed(args); // warm the file cache
  for (let round = 0; round < ROUNDS; round++) {
    for (const [name, args] of Object.entries(runs)) {
      const { wall, cpu: cpuMs } = timed(args);
      times[name].push(wall);
      cpu[name].push(cpuMs);
    }
  }
  const cpuKnown = Object.values(cpu).every((list) => list.every((ms) => ms !== null));
  /** ` (CPU ...)`: the median CPU time, and the ratio of medians against `reference` when given. */
  const cpuNote = (name, reference) => {
    if (!cpuKnown) return '';
    const ratio = reference === undefined ? '' : ` = ${(median(cpu[name]) / median(cpu[reference])).toFixed(2)}x`;
    return `; CPU ${median(cpu[name]).toFixed(0)} ms${ratio}`;
  };
  const comparisons = [
    ['year backtest', 'plain read', 2],
    ['--version', 'node -e 0', 2],
    ['backtest --help', 'node -e 0', 2],
    ['plan', 'node -e 0', 3],
    ['plan (auto)', 'node -e 0', null],
  ].filter(([name]) => wanted(name)).flatMap(([name, reference, goal]) => [[name, reference, goal], ...(BASELINE === null ? [] : [[`${name} (baseline)`, reference, goal]])]);
  const mib = (path) => (statSync(path).size / 1048576).toFixed(1);
  console.log(`whole processes, Node start-up included, ${ROUNDS} interleaved rounds; year ${YEAR} of the demo market at 15 minutes,`);
  if (ONLY.includes('year')) console.log(`history ${mib(inputs.historyPath)} MiB, forecast ${mib(inputs.forecastPath)} MiB (19 levels); ledger.csv ${mib(join(out, 'ledger.csv'))} MiB written`);
  if (BASELINE !== null) console.log(`baseline: the same commands of ${BASELINE}`);
  for (const name of ['node -e 0', 'plain read'].filter((n) => n in runs)) console.log(`  ${name.padEnd(BASELINE === null ? 16 : 27)} median ${median(times[name]).toFixed(0).padStart(6)} ms wall (reference${cpuNote(name)})`);
  for (const [name, reference, goal] of comparisons) {
    const ratios = times[name].map((ms, i) => ms / times[reference][i]);
    const ratio = median(ratios);
    const verdict = goal === null ? 'no goal' : `goal at most ${goal}x: ${ratio <= goal ? 'met' : 'not met'}`;
    console.log(
      `  ${name.padEnd(BASELINE === null ? 16 : 27)} median ${median(times[name]).toFixed(0).padStart(6)} ms wall = ${ratio.toFixed(2)}x ${reference} ` +
        `(rounds ${Math.min(...ratios).toFixed(2)} to ${Math.max(...ratios).toFixed(2)}; ${verdict}${cpuNote(name, reference)})`,
    );
  }
} finally {
  rmSync(folder, { recursive: true, force: true });
}
