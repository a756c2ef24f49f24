// A sweep of 24 alphas x 2 policies x 2 unaccepted rules (96 settings) over one year of the demo
// market at 15 minutes, through the CLI, once on 1 thread and once on 2 worker threads: wall time of
// each (median over --runs) and the speed-up. Also checks that both give the same sweep.csv bytes.
//
//   npm run build && node bench/sweepYear.js [--year 2026] [--runs 1]
//
// The alphas are 0.05:0.28:0.01: the demo forecast's levels run from 0.05 to 0.95.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const arg = (name, fallback) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : fallback;
};
const YEAR = arg('year', '2026');
const RUNS = Number(arg('runs', 1));
const median = (xs) => [...xs].sort((a, b) => a - b)[xs.length >> 1];

const folder = mkdtempSync(join(tmpdir(), 'quantbid-sweep-'));
try {
  const wall = {};
  const csv = {};
  for (const threads of [1, 2]) {
    const times = [];
    for (let run = 0; run < RUNS; run++) {
      const out = join(folder, `t${threads}-r${run}`);
      const argv = [
        join(root, 'bin', 'quantbid.js'), 'sweep', '--scenario', join(root, 'scenarios', 'halvorn', 'scenario.json'),
        '--from', `${YEAR}-01-01`, '--to', `${YEAR}-12-31`, '--alphas', '0.05:0.28:0.01', '--policies', 'quantile,median',
        '--unaccepted', 'follow-plan,follow-accepted', '--threads', String(threads), '--out', out, '--quiet',
      ];
      const started = performance.now();
      const result = spawnSync(process.execPath, argv, { encoding: 'utf8' });
      times.push(performance.now() - started);
      if (result.status !== 0) throw new Error(`sweep on ${threads} thread(s) failed (${result.status}): ${result.stderr}`);
      csv[threads] = readFileSync(join(out, 'sweep.csv'));
    }
    wall[threads] = median(times);
  }
  // The grid's rows have an alpha; the reference rows after them (point, price-taking, perfect foresight per rule) do not.
  const lines = csv[1].toString('utf8').trimEnd().split('\n').slice(1);
  const settings = lines.filter((line) => !line.startsWith(',')).length;
  const references = lines.length - settings;
  console.log(`sweep of ${settings} settings (24 alphas x 2 policies x 2 unaccepted rules)${references > 0 ? ` and ${references} reference rows` : ''} over ${YEAR} at 15 minutes, through the CLI`);
  console.log(`1 thread    median wall ${(wall[1] / 1000).toFixed(1)} s over ${RUNS} run(s)`);
  console.log(`2 threads   median wall ${(wall[2] / 1000).toFixed(1)} s (goal: under 60 s)`);
  console.log(`speed-up    ${(wall[1] / wall[2]).toFixed(2)}x on 2 threads`);
  console.log(`sweep.csv   ${csv[1].equals(csv[2]) ? 'byte-identical on 1 and 2 threads' : 'DIFFERS between 1 and 2 threads'}`);
  if (!csv[1].equals(csv[2])) process.exitCode = 1;
} finally {
  rmSync(folder, { recursive: true, force: true });
}
