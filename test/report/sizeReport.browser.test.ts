import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { browserSuiteName, chromiumAvailable, expectReportRendersCleanly } from './browser.js';
import { sizeWithReport } from './reportFixtures.js';

describe.skipIf(!chromiumAvailable)(browserSuiteName('size report.html'), () => {
  let out = '';
  beforeAll(() => {
    out = sizeWithReport();
  });

  it('a 3 x 3 grid of sizes on the Halvorn demo renders cleanly: two heat maps with 9 cells each for quantile and for the price-taking baseline', async () => {
    const found = await expectReportRendersCleanly(join(out, 'report.html'), ['size-npv-quantile', 'size-profit-quantile', 'size-npv-price-taking', 'size-profit-price-taking'], 'size-report');
    expect(found.charts.map((c) => [c.kind, c.visibleMarks])).toEqual([
      ['heat-map', 9],
      ['heat-map', 9],
      ['heat-map', 9],
      ['heat-map', 9],
    ]);
  });
});
