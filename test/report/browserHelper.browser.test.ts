/**
 * The browser checks must be able to fail: a page with every fault they look for is inspected and
 * each fault must be reported. (A check that passes on a broken page would pass anything.)
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { REPORT_CSP } from '../../src/report/htmlPage.js';
import { browserSuiteName, chromiumAvailable, inspectReport, svgSource } from './browser.js';

const BROKEN_PAGE = `<html lang="en"><head><title>broken</title></head>
<body>
<img src="http://192.0.2.1/pixel.png" alt="">
<script>console.error('a console error'); throw new Error('an uncaught error');</script>
<svg xmlns="http://www.w3.org/2000/svg" id="empty" class="chart" viewBox="0 0 200 100" width="200" height="100"><text x="10" y="20">no marks here</text></svg>
<svg xmlns="http://www.w3.org/2000/svg" id="crowded" class="chart" viewBox="0 0 200 100" width="200" height="100">
<rect class="mark" x="10" y="10" width="20" height="20"/>
<text x="10" y="50" font-size="12">first label</text><text x="14" y="52" font-size="12">second label</text>
<text x="180" y="90" font-size="12">sticks out</text></svg>
<svg xmlns="http://www.w3.org/2000/svg" id="malformed" class="chart" viewBox="0 0 200 100" width="200" height="100"><rect class="mark" x="1" y="1" width="5" height="5"/><text x="10" y="50">a<br>b</text></svg>
<svg xmlns="http://www.w3.org/2000/svg" id="extra" class="chart" viewBox="0 0 10 10" width="10" height="10"><rect class="mark" width="5" height="5"/></svg>
<div style="width: 3000px">wide</div>
</body></html>
`;

const CSP_PAGE = `<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><meta http-equiv="Content-Security-Policy" content="${REPORT_CSP}"><title>csp</title></head>
<body><img src="http://192.0.2.1/pixel.png" alt=""><svg xmlns="http://www.w3.org/2000/svg" id="ok" class="chart" viewBox="0 0 10 10" width="10" height="10"><rect class="mark" width="5" height="5"/></svg></body></html>
`;

describe.skipIf(!chromiumAvailable)(browserSuiteName('browser checks catch broken pages'), () => {
  let dir = '';
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'quantbid-broken-'));
    writeFileSync(join(dir, 'broken.html'), BROKEN_PAGE);
    writeFileSync(join(dir, 'csp.html'), CSP_PAGE);
  });

  it('reports errors, requests, scripts, quirks mode, encoding, empty, crowded, malformed, missing and unexpected charts, sideways scroll', async () => {
    const found = await inspectReport(join(dir, 'broken.html'), ['empty', 'crowded', 'malformed', 'absent'], 'browser-check-broken');
    expect(found.consoleErrors.join('\n')).toContain('a console error');
    expect(found.pageErrors.join('\n')).toContain('an uncaught error');
    expect(found.foreignRequests).toEqual(['http://192.0.2.1/pixel.png']);
    expect(found.scripts).toBe(1);
    expect(found.compatMode).toBe('BackCompat'); // no doctype: quirks mode
    expect(found.characterSet).not.toBe('UTF-8'); // no charset declared in a file:// page
    const chart = (id: string) => found.charts.find((c) => c.id === id);
    expect(chart('empty')?.visibleMarks).toBe(0);
    expect(chart('crowded')?.visibleMarks).toBe(1);
    expect(found.overlappingTexts).toEqual(['crowded: "first label" / "second label"']);
    expect(found.clippedTexts).toEqual(['crowded: "sticks out"']);
    expect(chart('malformed')?.xmlError).not.toBeNull();
    expect(chart('absent')?.isSvg).toBe(false);
    expect(chart('absent')?.xmlError).toBe('no <svg> with this id in the file');
    expect(found.unexpectedCharts).toEqual(['extra']);
    expect(found.horizontalOverflow).toBeGreaterThan(0);
  });

  it("under a report's Content-Security-Policy a stray fetch is refused, and the refusal fails the checks as a console error", async () => {
    const found = await inspectReport(join(dir, 'csp.html'), ['ok'], 'browser-check-csp');
    expect(found.consoleErrors.join('\n')).toMatch(/Content Security Policy/);
  });
});

describe('svgSource', () => {
  it('cuts one chart out of the page text, exactly as written', () => {
    const html = '<p>x</p><svg id="a" class="chart"><rect/></svg><svg xmlns="http://www.w3.org/2000/svg" id="b"><text>t</text></svg>';
    expect(svgSource(html, 'b')).toBe('<svg xmlns="http://www.w3.org/2000/svg" id="b"><text>t</text></svg>');
    expect(svgSource(html, 'c')).toBeNull();
  });
});
