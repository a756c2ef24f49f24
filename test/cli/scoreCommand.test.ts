import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { deliveryPeriods } from '../../src/market/calendar.js';
import { chiSquareSurvival } from '../../src/stats/chiSquare.js';
import { studentTCdf } from '../../src/stats/studentTCdf.js';
import { runCli } from '../report/planFixtures.js';

// `quantbid score` on a tiny case worked by hand. Hourly periods on a fixed UTC+1 clock; ten days,
// each with one price in all 24 periods: 5, 15, ..., 95 (day k: 5 + 10k), the midpoints of ten
// equal-probability bins of the uniform law U(0, 100). The forecast is that law's quantiles at
// 0.1, 0.5, 0.9: 10, 50, 90 in every period.
//
// Closed form: for Y ~ U(0, 100), E rho_tau(Y - q_tau) = 100 tau (1 - tau) / 2, i.e. 4.5, 12.5, 4.5.
// By hand on the ten prices (the midpoint rule is exact here, the loss being linear within each bin):
//   tau 0.1, q 10: 0.9 * 5 + 0.1 * (5 + 15 + ... + 85) = 4.5 + 40.5 = 45, / 10 = 4.5
//   tau 0.5, q 50: 0.5 * (45 + 35 + 25 + 15 + 5) * 2 = 125, / 10 = 12.5
//   tau 0.9, q 90: 0.1 * (85 + 75 + ... + 5) + 0.9 * 5 = 40.5 + 4.5 = 45, / 10 = 4.5
//   crps = (4.5 + 12.5 + 4.5) / 3 = 7.1666...
// coverage["0.8"] of [10, 90]: 15..85 inside, 5 and 95 outside: 8 / 10 = 0.8; calibration (share
// below q): 1/10, 5/10, 9/10. Failures in time order: day 0 and day 9 (24 periods each): overall
// n = 240, 48 failures, rate 0.2 = 1 - 0.8, so Kupiec's LR = 0 and p = 1; transitions n00 = 191
// (8 quiet days x 24 - 1), n01 = 1, n10 = 1, n11 = 46 (23 within each failing day). Per period of the
// day: 10 days, failures on days 0 and 9: n00 = 7, n01 = 1, n10 = 1, n11 = 0, Kupiec LR = 0.

const MARKET = { timeZone: 'Etc/GMT-1', periodMinutes: 60, priceFloor: -500, priceCap: 4000, currency: 'HLV', gateClosure: '12:00' };
const DAYS = Array.from({ length: 10 }, (_, k) => `2031-02-${String(k + 1).padStart(2, '0')}`);
const EXTRA_DAY = '2031-02-11'; // forecast, but not in the history

let dir = '';

function writeCsv(name: string, header: string, days: readonly string[], cells: (k: number) => readonly number[]): string {
  const lines = [header];
  days.forEach((day, k) => deliveryPeriods(day, MARKET.timeZone, 60).forEach((p) => lines.push([p.start, ...cells(k)].join(','))));
  const path = join(dir, name);
  writeFileSync(path, `${lines.join('\n')}\n`);
  return path;
}

const inputs = () => ['--market', join(dir, 'market.json'), '--history', join(dir, 'history.csv')];

interface ScoreJson {
  crps: number;
  pinball: Record<string, number>;
  coverage: Record<string, number>;
  calibration: Record<string, number>;
  kupiec: Record<string, { n: number; failures: number; lr: number; pValue: number }>;
  christoffersen: Record<string, { n00: number; n01: number; n10: number; n11: number; lrIndependence: number; pValueIndependence: number }>;
  days: { scored: number; unscoredDays: { day: string; reason: string }[] };
  byPeriod: { periodStart: string; periods: number; crps: number; kupiec: ScoreJson['kupiec']; christoffersen: ScoreJson['christoffersen'] }[];
  dieboldMariano: { days: number; crpsForecast: number; crpsAgainst: number; meanDifference: number; dm: number; hln: number; pValueTwoSided: number } | null;
  notes: string[];
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'quantbid-score-'));
  writeFileSync(join(dir, 'market.json'), JSON.stringify(MARKET));
  writeCsv('history.csv', 'period_start,price', DAYS, (k) => [5 + 10 * k]);
  writeCsv('uniform.csv', 'period_start,q0.1,q0.5,q0.9', [...DAYS, EXTRA_DAY], () => [10, 50, 90]);
  writeCsv('point.csv', 'period_start,q0.1,q0.5,q0.9', DAYS, () => [50, 50, 50]);
  writeCsv('fivelevels.csv', 'period_start,q0.05,q0.1,q0.5,q0.9,q0.95', DAYS, () => [5, 10, 50, 90, 95]);
  writeCsv('later.csv', 'period_start,q0.1,q0.5,q0.9', ['2031-03-01', '2031-03-02'], () => [10, 50, 90]);
});

describe('quantbid score', () => {
  it('gives the hand-computed pinball, crps, coverage, calibration and test counts on the uniform case', async () => {
    const out = join(dir, 'uniform');
    const run = await runCli(['score', ...inputs(), '--forecast', join(dir, 'uniform.csv'), '--out', out]);
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
    const s = JSON.parse(readFileSync(join(out, 'score.json'), 'utf8')) as ScoreJson;
    expect(s.pinball).toEqual({ '0.1': 4.5, '0.5': 12.5, '0.9': 4.5 });
    expect(s.crps).toBeCloseTo(21.5 / 3, 10);
    expect(s.coverage).toEqual({ '0.8': 0.8 });
    expect(s.calibration).toEqual({ '0.1': 0.1, '0.5': 0.5, '0.9': 0.9 });
    expect(s.kupiec['0.8']).toMatchObject({ n: 240, failures: 48 });
    expect(s.kupiec['0.8']!.lr).toBeCloseTo(0, 10);
    expect(s.kupiec['0.8']!.pValue).toBeCloseTo(1, 5);
    expect(s.christoffersen['0.8']).toMatchObject({ n00: 191, n01: 1, n10: 1, n11: 46 });
    // LR_ind by hand: pi01 = 1/192, pi11 = 46/47, pi = 47/239 (Christoffersen 1998, eq. for LR_ind).
    const l = (n0: number, n1: number, p: number) => (n0 > 0 ? n0 * Math.log(1 - p) : 0) + (n1 > 0 ? n1 * Math.log(p) : 0);
    const lrInd = -2 * (l(192, 47, 47 / 239) - l(191, 1, 1 / 192) - l(1, 46, 46 / 47));
    expect(s.christoffersen['0.8']!.lrIndependence).toBeCloseTo(lrInd, 6);
    expect(s.christoffersen['0.8']!.pValueIndependence).toBeCloseTo(chiSquareSurvival(lrInd, 1), 10);
    expect(s.byPeriod).toHaveLength(24);
    for (const period of s.byPeriod) {
      expect(period.periods).toBe(10);
      expect(period.crps).toBeCloseTo(21.5 / 3, 10);
      expect(period.kupiec['0.8']).toMatchObject({ n: 10, failures: 2 });
      expect(period.kupiec['0.8']!.lr).toBeCloseTo(0, 10);
      expect(period.christoffersen['0.8']).toMatchObject({ n00: 7, n01: 1, n10: 1, n11: 0 });
    }
    expect(s.days.scored).toBe(10);
    expect(s.days.unscoredDays).toEqual([{ day: EXTRA_DAY, reason: 'not in the history: no realised prices' }]);
    expect(s.notes[0]).toMatch(/factor 2 is NOT included, so it approximates CRPS \/ 2/);
    expect(s.dieboldMariano).toBeNull();
  });

  it('--against: the Diebold-Mariano test with the HLN correction on the daily crps, as worked by hand', async () => {
    // The point forecast (every level at 50) loses L_B(y) = 0.5 |y - 50| a day: mean 12.5. Daily
    // differences d = L_A - L_B for y = 5, 15, ..., 95: -32/3, -9, -17/3, -7/3, 1, 1, -7/3, -17/3, -9,
    // -32/3 (e.g. y = 5: L_A = (4.5 + 22.5 + 8.5) / 3 = 35.5/3, L_B = 22.5); mean -16/3; gamma_0 =
    // (2/10)(256 + 121 + 1 + 81 + 361)/9 = 164/9; DM = (-16/3) / sqrt(164/90) = -3.950918...;
    // HLN = DM sqrt((n + 1 - 2h + h(h-1)/n)/n) = DM sqrt(0.9) = -3.748170... (n = 10, h = 1).
    const out = join(dir, 'against');
    const run = await runCli(['score', ...inputs(), '--forecast', join(dir, 'uniform.csv'), '--against', join(dir, 'point.csv'), '--out', out, '--json']);
    expect(run.code).toBe(0);
    const dm = (JSON.parse(run.stdout) as ScoreJson).dieboldMariano!;
    expect(dm.days).toBe(10);
    expect(dm.crpsForecast).toBeCloseTo(21.5 / 3, 10);
    expect(dm.crpsAgainst).toBeCloseTo(12.5, 10);
    expect(dm.meanDifference).toBeCloseTo(-16 / 3, 10);
    expect(dm.dm).toBeCloseTo((-16 / 3) / Math.sqrt(164 / 90), 9);
    expect(dm.dm).toBeCloseTo(-3.950918, 5);
    expect(dm.hln).toBeCloseTo(-3.748170, 5);
    expect(dm.pValueTwoSided).toBeCloseTo(2 * studentTCdf(-3.74817, 9), 5);
    expect(readFileSync(join(out, 'score.json'), 'utf8')).toBe(run.stdout);
    // This forecast's crps, 21.5 / 3 = 7.1667, is below the point forecast's 12.5: this forecast is better; one-sided p = two-sided / 2.
    expect((dm as unknown as { better: string }).better).toBe('forecast');
    // One crps per forecast: on the same days, the DM figure is score.json's crps.
    expect(dm.crpsForecast).toBeCloseTo((JSON.parse(run.stdout) as { crps: number }).crps, 12);
    const text = await runCli(['score', ...inputs(), '--forecast', join(dir, 'uniform.csv'), '--against', join(dir, 'point.csv'), '--out', join(dir, 'against-text')]);
    expect(text.stdout).toMatch(/--against: crps 12.5 HLV\/MWh, this forecast's 7.1667 HLV\/MWh, on 10 common days: this forecast is better \(lower crps\); Diebold-Mariano \(HLN\) -3.748, one-sided p = 0.0023 that it is/);
  });

  it('--paths: energy and variogram scores of whole-day paths, as worked by hand', async () => {
    // Two constant paths, y - 10 and y + 10, on each day whose 24 prices all equal y. Energy score with
    // ||v|| over the 24 periods (Gneiting and Raftery 2007): (1/2)(10 sqrt 24 + 10 sqrt 24)
    // - (1/8)(2 * 20 sqrt 24) = 5 sqrt 24 = 24.494897... Variogram score: every difference between two
    // periods is 0, for the paths and for y, so 0. Shuffled across the paths period by period, the two
    // paths still lie 10 from y and 20 apart in every period (energy score again 5 sqrt 24), but now differ
    // between periods where the shuffle swapped them: a variogram score above 0.
    const lines = ['period_start,path,price'];
    DAYS.forEach((day, k) => {
      for (const [path, shift] of [[1, -10], [2, 10]] as const) deliveryPeriods(day, MARKET.timeZone, 60).forEach((p) => lines.push(`${p.start},${path},${5 + 10 * k + shift}`));
    });
    writeFileSync(join(dir, 'paths.csv'), `${lines.join('\n')}\n`);
    const run = await runCli(['score', ...inputs(), '--forecast', join(dir, 'uniform.csv'), '--paths', join(dir, 'paths.csv'), '--out', join(dir, 'paths-score'), '--json']);
    expect(run.code).toBe(0);
    const paths = (JSON.parse(run.stdout) as { paths: { days: number; energyScore: number; variogramScore: number; periodsIndependent: { energyScore: number; variogramScore: number } } }).paths;
    expect(paths.days).toBe(10);
    expect(paths.energyScore).toBeCloseTo(5 * Math.sqrt(24), 10);
    expect(paths.variogramScore).toBe(0);
    expect(paths.periodsIndependent.energyScore).toBeCloseTo(5 * Math.sqrt(24), 10);
    expect(paths.periodsIndependent.variogramScore).toBeGreaterThan(0);
  });

  it.each([
    ['a forecast whose days all lie outside the history', ['--forecast', 'later.csv'], /no day to score: the forecast covers 2031-03-01 to 2031-03-02, the history .* 2031-02-01 to 2031-02-10/],
    ['--against with other levels', ['--forecast', 'uniform.csv', '--against', 'fivelevels.csv'], /its levels \(0.05, 0.1, 0.5, 0.9, 0.95\) differ from the forecast's \(0.1, 0.5, 0.9\)/],
    ['--to before --from', ['--forecast', 'uniform.csv', '--from', '2031-02-05', '--to', '2031-02-04'], /--to 2031-02-04 is before --from 2031-02-05/],
    ['no forecast file', [], /--forecast: no forecast file given/],
    ['a paths file with the wrong header', ['--forecast', 'uniform.csv', '--paths', 'uniform.csv'], /write the header period_start,path,price/],
  ])('exits 2 and writes nothing for %s', async (name, args, message) => {
    const out = join(dir, `bad-${name.replace(/\W+/g, '-')}`);
    const withPaths = args.map((a) => (a.endsWith('.csv') ? join(dir, a) : a));
    const run = await runCli(['score', ...inputs(), ...withPaths, '--out', out]);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(message);
    expect(existsSync(out)).toBe(false);
  });
});
