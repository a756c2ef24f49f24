import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { backtestChartIds } from '../../src/report/index.js';
import { browserSuiteName, chromiumAvailable, expectReportRendersCleanly } from './browser.js';
import { backtestWithReport } from './reportFixtures.js';

describe.skipIf(!chromiumAvailable)(browserSuiteName('backtest report.html'), () => {
  let out = '';
  beforeAll(async () => {
    out = await backtestWithReport();
  });

  it('a week of the Halvorn demo renders cleanly: no errors, no requests, every chart with data marks', async () => {
    const ids = backtestChartIds(['quantile', 'median', 'point', 'price-taking', 'perfect-foresight']);
    const found = await expectReportRendersCleanly(join(out, 'report.html'), ids, 'backtest-report');
    expect(found.charts.map((c) => c.kind)).toEqual(['line', 'histogram', 'histogram', 'histogram', 'histogram', 'histogram', 'bar', 'bar', 'bar']);
  });
});
