import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { browserSuiteName, chromiumAvailable, expectReportRendersCleanly } from './browser.js';
import { GALLERY_CHART_IDS, galleryPage } from './gallery.js';

describe.skipIf(!chromiumAvailable)(browserSuiteName('every chart kind'), () => {
  it('renders cleanly: no errors, no requests, valid SVG, marks in every chart, no overlapping text', async () => {
    const path = join(mkdtempSync(join(tmpdir(), 'quantbid-gallery-')), 'gallery.html');
    writeFileSync(path, galleryPage());
    const found = await expectReportRendersCleanly(path, GALLERY_CHART_IDS, 'chart-gallery');
    expect(found.charts.map((c) => c.kind)).toEqual(['line', 'line', 'bar', 'fan', 'histogram', 'heat-map', 'calibration']);
  });
});
