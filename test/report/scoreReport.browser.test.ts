import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { SCORE_CHART_IDS } from '../../src/report/index.js';
import { browserSuiteName, chromiumAvailable, expectReportRendersCleanly } from './browser.js';
import { scoreWithReport } from './reportFixtures.js';

describe.skipIf(!chromiumAvailable)(browserSuiteName('score report.html'), () => {
  let out = '';
  beforeAll(async () => {
    out = await scoreWithReport();
  });

  it('a month of the Halvorn vendor forecast renders cleanly: calibration, pinball by level and by period', async () => {
    const found = await expectReportRendersCleanly(join(out, 'report.html'), SCORE_CHART_IDS, 'score-report');
    expect(found.charts.map((c) => c.kind)).toEqual(['calibration', 'bar', 'line']);
    // 19 levels of the demo forecast: one dot and one bar each.
    expect(found.charts.slice(0, 2).map((c) => c.visibleMarks)).toEqual([19, 19]);
  });
});
