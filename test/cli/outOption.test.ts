import { existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runMain } from './runMain.js';

// `--out` is one shared option (cli/options.ts outOption, app/settingRules.ts outFolderProblem): for
// every command an empty path (an unset shell variable), the root folder and an existing file where
// the folder belongs end with exit code 2, a message naming --out, and nothing written anywhere.
// Before the shared option, `quantbid backtest --out ""` wrote its outputs into the working folder.

const S = 'scenarios/halvorn/scenario.json';
const DAYS = ['--from', '2026-03-01', '--to', '2026-03-02'];
const ECONOMICS = ['--capex-per-mwh', '180000', '--capex-per-mw', '60000', '--life-years', '15', '--discount-rate', '0.07'];

/** Each command with everything it needs but --out. */
const COMMANDS: Readonly<Record<string, readonly string[]>> = {
  plan: ['plan', '--scenario', S],
  demo: ['demo'],
  backtest: ['backtest', '--scenario', S, ...DAYS],
  sweep: ['sweep', '--scenario', S, ...DAYS, '--alphas', '0.1', '--threads', '1'],
  size: ['size', '--scenario', S, ...DAYS, '--energy-mwh', '10', '--power-mw', '5', ...ECONOMICS, '--threads', '1'],
  forecast: ['forecast', '--scenario', S, ...DAYS],
  score: ['score', '--scenario', S, ...DAYS],
};

/** stderr without the line the demo starts with (which scenario it plans). */
const errors = (stderr: string): string => stderr.replace(/^demo: fictional market .*\n/, '');

/** Output names any command writes, to look for where none may appear. */
const OUTPUT_NAMES = ['orders.csv', 'plan.json', 'ledger.csv', 'summary.json', 'sweep.csv', 'size.csv', 'quantiles.csv', 'forecast.json', 'score.json'];

describe('--out of every command', () => {
  const workingFolderBefore = readdirSync('.').sort();

  for (const [name, args] of Object.entries(COMMANDS)) {
    it(`${name} --out "": exit code 2, the empty path named, nothing written into the working folder`, async () => {
      const run = await runMain([...args, '--out', '']);
      expect(run.code).toBe(2);
      expect(errors(run.stderr)).toBe(`command line: --out: "" is not accepted: the path is empty; give a file or folder name (is a shell variable unset?); see quantbid ${name} --help\nnothing was written.\n`);
      expect(readdirSync('.').sort()).toEqual(workingFolderBefore);
    });

    it(`${name} --out /: exit code 2, the root folder refused, nothing written there`, async () => {
      const run = await runMain([...args, '--out', '/']);
      expect(run.code).toBe(2);
      expect(errors(run.stderr)).toBe(`command line: --out: "/" is not accepted: / is the root folder; give a folder for the outputs, e.g. runs/out; see quantbid ${name} --help\nnothing was written.\n`);
      expect(OUTPUT_NAMES.filter((file) => existsSync(join('/', file)))).toEqual([]);
    });

    it(`${name} --out FILE: exit code 2, the file named and left as it was`, async () => {
      const file = join(mkdtempSync(join(tmpdir(), `quantbid-out-${name}-`)), 'not-a-folder');
      writeFileSync(file, 'keep me\n');
      const run = await runMain([...args, '--out', file]);
      expect(run.code).toBe(2);
      expect(errors(run.stderr)).toBe(`${file}: --out: is a file, not a folder; give a folder for the outputs\nnothing was written.\n`);
      expect(readFileSync(file, 'utf8')).toBe('keep me\n');
    });
  }

  it('forecast --out /NAME.csv: the root folder refused as the folder of the quantile file too', async () => {
    const run = await runMain([...COMMANDS.forecast as string[], '--out', '/quantiles.csv']);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/^command line: --out: "\/quantiles.csv" is not accepted: \/quantiles.csv is the root folder/);
  });
});
