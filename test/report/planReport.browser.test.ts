import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { browserSuiteName, chromiumAvailable, expectReportRendersCleanly } from './browser.js';
import { clockChangeInputs, HALVORN_SCENARIO, PLAN_CHART_IDS, planWithReport } from './planFixtures.js';

describe.skipIf(!chromiumAvailable)(browserSuiteName('plan report.html'), () => {
  let demoOut = '';
  let clockChangeOut = '';

  beforeAll(async () => {
    demoOut = await planWithReport(['--scenario', HALVORN_SCENARIO, '--policy', 'quantile']);
    clockChangeOut = await planWithReport(clockChangeInputs('HLV <&> "test"').args);
  });

  it('the Halvorn demo day renders cleanly: no errors, no requests, every chart with data marks', async () => {
    const found = await expectReportRendersCleanly(join(demoOut, 'report.html'), PLAN_CHART_IDS, 'plan-report');
    expect(found.charts.map((c) => c.kind)).toEqual(['fan', 'bar', 'line']);
  });

  it('a 92-period clock-change day with an escaped currency label renders cleanly', async () => {
    const found = await expectReportRendersCleanly(join(clockChangeOut, 'report.html'), PLAN_CHART_IDS, 'plan-report-clock-change');
    expect(found.charts.every((c) => c.texts > 10)).toBe(true);
  });
});
