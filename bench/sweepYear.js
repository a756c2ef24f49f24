// A sweep of 24 alphas x 2 policies x 2 unaccepted rules (96 settings) over one year of the demo
// market at 15 minutes, through the CLI (whole processes, Node start-up included), on 1 thread and on
// 2 threads (this one and a worker), in interleaved rounds so that the machine's drift hits both alike:
// the median wall time of each, the median over the rounds of the speed-up within a round, and the
// CPU time of each (user + system of the process and its worker, from Linux's /proc), with the ceiling
// that CPU puts on the speed-up (the 2-thread run's CPU spread over all cores). Also checks that both
// give the same sweep.csv bytes.
//
//   npm run build && node bench/sweepYear.js [--year 2026] [--rounds 3] [--baseline DIR]
//
// --baseline DIR (another built checkout) runs its sweeps in the same rounds, for a before and after.
// The alphas are 0.05:0.28:0.01: the demo forecast's levels run from 0.05 to 0.95. The speed-up needs
// two idle cores: on a machine whose cores are busy with other work, a second thread gets little more
// CPU than the first (Linux shares the cores between sessions, not threads), which the CPU times show.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { median, option } from './lib/args.js';
import { timedNode } from './lib/processTime.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const YEAR = option('year', '2026');
const ROUNDS = Number(option('rounds', 3));
const BASELINE = option('baseline', null);

const folder = mkdtempSync(join(tmpdir(), 'quantbid-sweep-'));
try {
  const checkouts = [['', root], ...(BASELINE === null ? [] : [[' (baseline)', BASELINE]])];
  const runs = checkouts.flatMap(([suffix, checkout]) => [1, 2].map((threads) => ({ name: `${threads} thread${threads > 1 ? 's' : ' '}${suffix}`, checkout, threads })));
  const wall = Object.fromEntries(runs.map((r) => [r.name, []]));
  const cpu = Object.fromEntries(runs.map((r) => [r.name, []]));
  const csv = {};
  const loads = [];
  for (let round = 0; round < ROUNDS; round++) {
    for (const run of runs) {
      const out = join(folder, `${run.name.replace(/\W+/g, '-')}-${round}`);
      const argv = [
        join(run.checkout, 'bin', 'quantbid.js'), 'sweep', '--scenario', join(root, 'scenarios', 'halvorn', 'scenario.json'),
        '--from', `${YEAR}-01-01`, '--to', `${YEAR}-12-31`, '--alphas', '0.05:0.28:0.01', '--policies', 'quantile,median',
        '--unaccepted', 'follow-plan,follow-accepted', '--threads', String(run.threads), '--out', out, '--quiet',
      ];
      loads.push(loadavg()[0]);
      const timed = timedNode(argv);
      wall[run.name].push(timed.wall);
      cpu[run.name].push(timed.cpu);
      csv[run.name] = readFileSync(join(out, 'sweep.csv'));
    }
  }
  // The grid's rows have an alpha; the reference rows after them (point, price-taking, perfect foresight per rule) do not.
  const lines = csv[runs[0].name].toString('utf8').trimEnd().split('\n').slice(1);
  const settings = lines.filter((line) => !line.startsWith(',')).length;
  const references = lines.length - settings;
  const cpuKnown = Object.values(cpu).every((list) => list.every((ms) => ms !== null));
  console.log(`sweep of ${settings} settings (24 alphas x 2 policies x 2 unaccepted rules)${references > 0 ? ` and ${references} reference rows` : ''} over ${YEAR} at 15 minutes, through the CLI,`);
  console.log(`${ROUNDS} interleaved rounds; ${cpus().length} cores, load average ${median(loads).toFixed(1)} (median at the starts of the runs)`);
  for (const [suffix] of checkouts) {
    const one = `1 thread ${suffix}`;
    const two = `2 threads${suffix}`;
    const speedups = wall[one].map((ms, i) => ms / wall[two][i]);
    const cpuNote = (name) => (cpuKnown ? `, CPU ${(median(cpu[name]) / 1000).toFixed(1)} s` : '');
    console.log(`  ${one.padEnd(22)} median wall ${(median(wall[one]) / 1000).toFixed(1)} s${cpuNote(one)}`);
    console.log(`  ${two.padEnd(22)} median wall ${(median(wall[two]) / 1000).toFixed(1)} s${cpuNote(two)} (goal: under 60 s)`);
    console.log(`  ${`speed-up${suffix}`.padEnd(22)} ${median(speedups).toFixed(2)}x on 2 threads (rounds ${Math.min(...speedups).toFixed(2)} to ${Math.max(...speedups).toFixed(2)}; goal at least 1.7x)` +
      (cpuKnown ? `; CPU on 2 threads ${(median(cpu[two]) / median(cpu[one])).toFixed(2)}x that on 1` : ''));
    if (cpuKnown) {
      // A run that takes C of CPU cannot end sooner than C / cores on the machine's cores: whatever the
      // threads wait for, the speed-up is at most the 1-thread wall time over that. On busy cores the
      // wall times hold waits for the cores, and the ceiling says nothing.
      const cores = cpus().length;
      const label = `  ${`ceiling${suffix}`.padEnd(22)} `;
      if (median(loads) >= cores) {
        console.log(`${label}not shown: at a load average above ${cores} the wall times are mostly waits for the cores`);
      } else {
        const ceiling = median(wall[one]) / (median(cpu[two]) / cores);
        const cpuFor17 = (cores * median(wall[one])) / 1.7;
        console.log(`${label}at most ${ceiling.toFixed(2)}x from the CPU alone (1-thread wall / (2-thread CPU / ${cores} cores)); 1.7x needs the 2-thread run under ${(cpuFor17 / 1000).toFixed(1)} s of CPU`);
      }
    }
  }
  const same = runs.every((run) => csv[run.name].equals(csv[runs[0].name]));
  console.log(`  sweep.csv              ${same ? 'byte-identical on 1 and 2 threads' : 'DIFFERS between runs'}${BASELINE === null ? '' : ' (and with the baseline)'}`);
  if (!same) process.exitCode = 1;
} finally {
  rmSync(folder, { recursive: true, force: true });
}
