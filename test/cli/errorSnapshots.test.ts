import { existsSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runMain } from './runMain.js';

// Representative bad usage and bad input of every command: the exit code (2, docs/design.md section 7)
// and the exact text on stderr, compared with the stored snapshots in __snapshots__/. Paths are
// relative to the repository root (vitest runs there), so the messages are the same on every machine.
// After an intended change of a message, regenerate with
//   npx vitest run test/cli/errorSnapshots.test.ts -u
// and read the diff.

const S = 'scenarios/halvorn/scenario.json';
const OUT = 'test-artifacts/never-written';
const BAD = 'test/fixtures/malformed';
const DAYS = ['--from', '2026-03-01', '--to', '2026-03-02'];
const ECONOMICS = ['--capex-per-mwh', '180000', '--capex-per-mw', '60000', '--life-years', '15', '--discount-rate', '0.07'];

const CASES: Readonly<Record<string, readonly (readonly string[])[]>> = {
  quantbid: [['frobnicate'], [], ['--bogus']],
  plan: [
    ['plan', '--scenario', S, '--day', '2027-02-30'],
    ['plan', '--scenario', S, '--policy', 'greedy'],
    ['plan', '--scenario', S, '--day', '2031-01-01'],
    ['plan', '--scenario', S, '--report'],
    ['plan', '--market', 'nope/market.json', '--battery', 'nope/battery.json', '--forecast', 'nope/q.csv', '--day', '2027-01-01'],
    ['plan', '--market', `${BAD}/base/market.json`, '--battery', `${BAD}/battery/physics.json`, '--forecast', `${BAD}/base/quantilesWide.csv`, '--day', '2027-06-15'],
  ],
  backtest: [
    ['backtest', '--scenario', S],
    ['backtest', '--scenario', S, '--from', '2026-03-05', '--to', '2026-03-01', '--out', OUT],
    ['backtest', '--scenario', S, ...DAYS, '--policies', 'quantile,bogus', '--out', OUT],
    ['backtest', '--scenario', S, ...DAYS, '--alpha', '0.02', '--out', OUT],
  ],
  sweep: [
    ['sweep', '--scenario', S, ...DAYS],
    ['sweep', '--scenario', S, ...DAYS, '--alphas', '0.1,0.6', '--out', OUT],
    ['sweep', '--scenario', S, ...DAYS, '--threads', '0', '--out', OUT],
    ['sweep', '--scenario', S, ...DAYS, '--policies', 'quantile,point', '--out', OUT],
  ],
  size: [
    ['size', '--scenario', S, ...DAYS, '--out', OUT],
    ['size', '--scenario', S, '--from', '2026-03-01', '--to', '2026-03-01', '--energy-mwh', '10', '--power-mw', '5', '--alpha', 'best', ...ECONOMICS, '--out', OUT],
    ['size', '--scenario', S, ...DAYS, '--energy-mwh', '10', '--power-mw', '5', ...ECONOMICS, '--life-years', '1.5', '--out', OUT],
    ['size', '--scenario', S, ...DAYS, '--energy-mwh', '0:10:5', '--power-mw', '5', ...ECONOMICS, '--out', OUT],
  ],
  forecast: [
    ['forecast', '--scenario', S],
    ['forecast', '--scenario', S, ...DAYS, '--levels', '0.5,1.2', '--out', OUT],
    ['forecast', '--scenario', S, ...DAYS, '--method', 'crystal-ball', '--out', OUT],
    ['forecast', '--scenario', S, '--from', '2026-03-05', '--to', '2026-03-01', '--out', `${OUT}/quantiles.csv`],
  ],
  score: [
    ['score', '--scenario', S],
    ['score', '--scenario', S, '--from', '2026-02-01', '--to', '2026-01-01', '--out', OUT],
    ['score', '--scenario', S, '--against', 'nope/other.csv', '--out', OUT],
    ['score', '--market', `${BAD}/base/market.json`, '--history', `${BAD}/history/badCells.csv`, '--forecast', `${BAD}/base/quantilesWide.csv`, '--out', OUT],
  ],
  demo: [['demo', '--bogus']],
};

const run = (argv: readonly string[]) => runMain(argv);

describe('error messages', () => {
  for (const [command, cases] of Object.entries(CASES)) {
    describe(command, () => {
      for (const argv of cases) {
        it(`quantbid ${argv.join(' ')}`, async () => {
          const r = await run(argv);
          // Bad usage and bad input: exit code 2, nothing on stdout (a bare `quantbid` shows its help on stderr).
          expect(r.code).toBe(2);
          expect(r.stdout).toBe('');
          expect(r.stderr).toMatchSnapshot();
          // One shape for usage errors and bad input alike: every problem as `file[:line]: [field:] what is wrong; what to do`.
          const lines = r.stderr.trimEnd().split('\n');
          if (argv.length > 0) {
            expect(lines.at(-1)).toBe('nothing was written.');
            for (const line of lines.slice(0, -1)) expect(line).toMatch(/^[^:]+(?::\d+)?: .+; .+$/);
          }
          expect(existsSync(OUT), 'nothing was written').toBe(false);
        });
      }
    });
  }

});
