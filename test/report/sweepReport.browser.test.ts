import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { browserSuiteName, chromiumAvailable, expectReportRendersCleanly } from './browser.js';
import { sweepWithReport } from './reportFixtures.js';

describe.skipIf(!chromiumAvailable)(browserSuiteName('sweep report.html'), () => {
  let out = '';
  beforeAll(() => {
    out = sweepWithReport();
  });

  it('5 alphas x 2 policies x 2 rules on the Halvorn demo render cleanly, every chart with data marks', async () => {
    const ids = ['sweep-profit', ...['quantile', 'median'].flatMap((p) => ['follow-plan', 'follow-accepted'].map((u) => `sweep-acceptance-${p}-${u}`))];
    const found = await expectReportRendersCleanly(join(out, 'report.html'), ids, 'sweep-report');
    expect(found.charts.every((c) => c.kind === 'line')).toBe(true);
  });
});
