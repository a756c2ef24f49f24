import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { clockAxis, SCORE_CHART_IDS } from '../../src/report/index.js';
import { runCli } from './planFixtures.js';
import { chartSource, freshOut, HALVORN_SCENARIO, markTitles, readOutput, scoreWithReport, shownNumber, tableRows, labelledCharts } from './reportFixtures.js';

describe('clockAxis', () => {
  it('96 quarter-hours: bands 00:00-00:15 ... 23:45-24:00, ticks on whole hours and 24:00 at the end', () => {
    const slots = Array.from({ length: 96 }, (_, i) => `${String(Math.floor(i / 4)).padStart(2, '0')}:${String((i % 4) * 15).padStart(2, '0')}`);
    const axis = clockAxis(slots, 15, 'Europe/Berlin');
    expect(axis.bandLabels[0]).toBe('00:00\u201300:15');
    expect(axis.bandLabels[95]).toBe('23:45\u201324:00');
    // Every 6 hours: 00:00, 06:00, 12:00, 18:00 at bands 0, 24, 48, 72, and the end of the day.
    expect(axis.tickSets[4]).toEqual([
      { at: 0, label: '00:00' },
      { at: 24, label: '06:00' },
      { at: 48, label: '12:00' },
      { at: 72, label: '18:00' },
      { at: 96, label: '24:00' },
    ]);
    expect(axis.title.unit).toBe('local time, Europe/Berlin');
    expect(() => clockAxis(['7:00'], 60)).toThrow(/HH:MM/);
  });
});

describe('quantbid score --report', () => {
  let out = '';
  let html = '';
  let score: { levels: number[]; crps: number; pinball: Record<string, number>; calibration: Record<string, number>; coverage: Record<string, number>; byPeriod: { crps: number }[] };
  beforeAll(async () => {
    out = await scoreWithReport();
    html = readOutput(out, 'report.html');
    score = JSON.parse(readOutput(out, 'score.json'));
  });

  it('writes report.html beside score.json with the three charts; the same inputs give the same bytes', async () => {
    expect(labelledCharts(html)).toEqual([...SCORE_CHART_IDS]);
    for (const id of SCORE_CHART_IDS) expect(html).toContain(`id="${id}"`);
    expect(readOutput(await scoreWithReport(), 'report.html')).toBe(html);
  });

  it('each calibration dot is a level of score.json and its calibration share (prices below the quantile)', () => {
    const titles = markTitles(chartSource(html, 'score-calibration'));
    expect(titles).toHaveLength(score.levels.length);
    titles.forEach((t, k) => {
      const m = /level (\S+), observed (\S+)$/.exec(t);
      expect(Number(m?.[1])).toBe(score.levels[k]);
      expect(shownNumber(m?.[2] ?? 'NaN')).toBeCloseTo(score.calibration[String(score.levels[k])] as number, 4);
    });
  });

  it('each pinball bar is the pinball loss of its level in score.json; the guide is the crps', () => {
    const svg = chartSource(html, 'score-pinball-level');
    const titles = markTitles(svg);
    expect(titles).toHaveLength(score.levels.length);
    titles.forEach((t, k) => expect(shownNumber(/: (\S+) HLV\/MWh$/.exec(t)?.[1] ?? 'NaN')).toBeCloseTo(score.pinball[String(score.levels[k])] as number, 3));
    expect(svg).toContain(`mean over the levels (crps) ${score.crps.toFixed(3)}`);
  });

  it('the period-of-the-day line has one point per period of the day (96 quarter-hours)', () => {
    const svg = chartSource(html, 'score-pinball-period');
    const line = /data-series="mean over the levels \(crps\)"><path class="mark line" d="([^"]+)"/.exec(svg)?.[1] ?? '';
    expect(line.match(/[ML]/g)).toHaveLength(score.byPeriod.length);
    expect(score.byPeriod).toHaveLength(96);
  });

  it('the coverage table has one row per central interval of score.json, with its observed share', () => {
    const rows = tableRows(html, 'Central intervals');
    expect(rows.map((r) => Number(r[0]) / 100)).toEqual(Object.keys(score.coverage).map(Number));
    rows.forEach((r) => expect(shownNumber(r[2] as string) / 100).toBeCloseTo(score.coverage[String(Number(r[0]) / 100)] as number, 4));
  });

  it('escapes the currency label', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'quantbid-score-report-'));
    const scenario = JSON.parse(readFileSync(HALVORN_SCENARIO, 'utf8')) as Record<string, string>;
    const at = (name: string) => join(dirname(HALVORN_SCENARIO), scenario[name] as string);
    writeFileSync(join(dir, 'market.json'), JSON.stringify({ ...JSON.parse(readFileSync(at('market'), 'utf8')), currency: 'HLV <&> "x"' }));
    const target = freshOut('score-escape');
    const run = await runCli(['score', '--market', join(dir, 'market.json'), '--history', at('history'), '--forecast', at('forecast'), '--from', '2026-01-01', '--to', '2026-01-03', '--report', '--out', target]);
    expect(run.code).toBe(0);
    const page = readOutput(target, 'report.html');
    expect(page).toContain('HLV &lt;&amp;&gt; &quot;x&quot;/MWh');
    expect(page).not.toContain('HLV <&>');
  });
});
