/**
 * Opens a report in headless Chromium and records what a reader's browser would see, for the
 * browser tests of every report page (plan, backtest, sweep, size and score: *Report.browser.test.ts).
 *
 * Use:
 *   describe.skipIf(!chromiumAvailable)(browserSuiteName('plan report'), () => {
 *     it('renders', async () => { await expectReportRendersCleanly(htmlPath, ['plan-prices'], 'plan-report'); });
 *   });
 *
 * What is checked (expectReportRendersCleanly):
 * - no console error and no uncaught page error while loading;
 * - no network request other than the report file itself (every request is routed, recorded and,
 *   unless it is the file, aborted);
 * - no `<script>` element; standards mode (the doctype is right) and UTF-8;
 * - every expected chart id is an `<svg>` with at least one visible data mark (`.mark`, a
 *   rendered box larger than zero), and there is no chart that was not expected;
 * - every chart's own bytes, cut from the file, parse as SVG (XML) in the browser's XML parser and
 *   give as many elements as the HTML parser made of them (the SVG is valid as the browser sees it);
 * - no two `<text>` boxes of one chart overlap and no text sticks out of its chart;
 * - the page has no horizontal scroll at a 1100 px wide window, and every chart still has a box
 *   when printed (print media).
 * A full-page screenshot goes to test-artifacts/<name>.png and one per chart to
 * test-artifacts/<name>/<chart id>.png (gitignored), to look at.
 */
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import { delimiter, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { chromium } from 'playwright-core';
import { expect } from 'vitest';

/**
 * The Chromium to run, looked up once: the first `chromium` or `chromium-browser` on PATH (CI finds
 * Debian's there), else Debian's /usr/bin/chromium; null when there is none.
 */
function findChromium(): string | null {
  const folders = (process.env.PATH ?? '').split(delimiter).filter((folder) => folder !== '');
  for (const folder of [...folders, '/usr/bin']) {
    for (const name of ['chromium', 'chromium-browser']) {
      const path = join(folder, name);
      if (existsSync(path)) return path;
    }
  }
  return null;
}

const FOUND_CHROMIUM = findChromium();
export const CHROMIUM_PATH = FOUND_CHROMIUM ?? 'chromium';

/** Flags for a quiet, offline, sandbox-free headless run (containers have no user namespaces). */
export const CHROMIUM_ARGS: readonly string[] = Object.freeze([
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
]);

export const chromiumAvailable = FOUND_CHROMIUM !== null;

/** Why browser tests are skipped, printed once per test file that imports this helper. */
export const SKIP_REASON = "browser tests skipped: no chromium on PATH or in /usr/bin (CI installs Debian's chromium through .ci/run; locally: apt-get install chromium)";
// Under CI (.ci/run installs chromium) a missing browser is a failure, never a silent skip.
if (!chromiumAvailable && process.env.CI !== undefined && process.env.CI !== '') throw new Error("no chromium on PATH under CI: .ci/run must install Debian's chromium before the tests");
if (!chromiumAvailable) console.warn(SKIP_REASON);

/** Suite name that says why it was skipped when Chromium is missing (vitest prints skipped names). */
export function browserSuiteName(name: string): string {
  return chromiumAvailable ? `${name} (headless Chromium)` : `${name}: ${SKIP_REASON}`;
}

/** Folder of screenshots, at the repository root, gitignored. */
export const ARTIFACT_DIR = fileURLToPath(new URL('../../test-artifacts/', import.meta.url));

export interface ChartFinding {
  readonly id: string;
  /** The element with that id is an `<svg>`. */
  readonly isSvg: boolean;
  /** Its data-chart attribute (line, bar, fan, ...). */
  readonly kind: string | null;
  /** Data marks with a visible box. */
  readonly visibleMarks: number;
  readonly texts: number;
  /** Problem from parsing the chart's bytes as SVG, or null. */
  readonly xmlError: string | null;
  /** Elements made by the HTML parser vs by the XML parser from the same bytes. */
  readonly htmlElements: number;
  readonly xmlElements: number;
  /** Box of the chart when printed [px]. */
  readonly printWidth: number;
}

export interface ReportFindings {
  readonly consoleErrors: readonly string[];
  readonly pageErrors: readonly string[];
  /** Requests other than the report file. */
  readonly foreignRequests: readonly string[];
  readonly scripts: number;
  /** `CSS1Compat` when the doctype put the page in standards mode (not quirks mode). */
  readonly compatMode: string;
  /** Encoding the browser read the file in. */
  readonly characterSet: string;
  readonly charts: readonly ChartFinding[];
  /** Ids of `svg.chart` elements that were not in the expected list. */
  readonly unexpectedCharts: readonly string[];
  /** Pairs of overlapping text boxes: `chart: "a" / "b"`. */
  readonly overlappingTexts: readonly string[];
  /** Texts sticking out of their chart: `chart: "text"`. */
  readonly clippedTexts: readonly string[];
  /** Page width beyond the window [px]; 0 when nothing scrolls sideways. */
  readonly horizontalOverflow: number;
  readonly screenshot: string;
}

const VIEWPORT = { width: 1100, height: 900 };

/*
 * The few DOM shapes the in-page checks use. The project compiles without the DOM library (domain
 * code must not reach for a browser), so the page's globals are typed here, locally.
 */
interface Box {
  readonly left: number;
  readonly right: number;
  readonly top: number;
  readonly bottom: number;
  readonly width: number;
  readonly height: number;
}
interface DomElement {
  readonly id: string;
  readonly localName: string;
  readonly namespaceURI: string | null;
  readonly textContent: string | null;
  getAttribute(name: string): string | null;
  getBoundingClientRect(): Box;
  querySelector(selector: string): DomElement | null;
  querySelectorAll(selector: string): Iterable<DomElement> & { readonly length: number };
  getElementsByTagName(name: string): { readonly length: number };
}
interface PageGlobals {
  readonly document: DomElement & {
    readonly documentElement: { readonly scrollWidth: number };
    readonly compatMode: string;
    readonly characterSet: string;
    getElementById(id: string): DomElement | null;
  };
  readonly innerWidth: number;
  readonly DOMParser: new () => { parseFromString(text: string, type: 'image/svg+xml'): DomElement };
}

/**
 * Opens `htmlPath` by file:// URL in a freshly launched headless Chromium and collects the findings
 * above. Each launch runs on a fresh user-data dir: Playwright's `chromium.launch` makes a new
 * temporary profile folder for every launch and deletes it at close. The screenshot is written to
 * ARTIFACT_DIR/<artefactName>.png.
 */
export async function inspectReport(htmlPath: string, chartIds: readonly string[], artefactName: string): Promise<ReportFindings> {
  const source = readFileSync(htmlPath, 'utf8');
  const fileUrl = pathToFileURL(resolve(htmlPath)).href;
  const browser = await chromium.launch({ executablePath: CHROMIUM_PATH, args: [...CHROMIUM_ARGS] });
  try {
    const context = await browser.newContext({ viewport: VIEWPORT });
    const consoleErrors: string[] = [];
    const pageErrors: string[] = [];
    const foreignRequests: string[] = [];
    context.on('request', (request) => {
      if (request.url() !== fileUrl) foreignRequests.push(request.url());
    });
    await context.route('**/*', async (route) => {
      if (route.request().url() === fileUrl) await route.continue();
      else await route.abort('blockedbyclient');
    });
    const page = await context.newPage();
    page.on('console', (message) => {
      if (message.type() === 'error') consoleErrors.push(message.text());
    });
    page.on('pageerror', (error) => pageErrors.push(error.message));
    await page.goto(fileUrl, { waitUntil: 'load' });

    const chartSources = Object.fromEntries(chartIds.map((id) => [id, svgSource(source, id)]));
    const screen = await page.evaluate(
      ({ ids, sources }) => {
        const { document, DOMParser, innerWidth } = globalThis as unknown as PageGlobals;
        const boxOf = (e: DomElement) => e.getBoundingClientRect();
        const textOf = (e: DomElement) => (e.textContent ?? '').trim();
        const charts = ids.map((id) => {
          const el = document.getElementById(id);
          const isSvg = el !== null && el.namespaceURI === 'http://www.w3.org/2000/svg' && el.localName === 'svg';
          const marks = el === null ? [] : [...el.querySelectorAll('.mark')];
          const visibleMarks = marks.filter((m) => {
            const b = boxOf(m);
            return b.width > 0 || b.height > 0;
          }).length;
          const text = sources[id];
          let xmlError: string | null = text === null || text === undefined ? 'no <svg> with this id in the file' : null;
          let xmlElements = 0;
          if (xmlError === null && typeof text === 'string') {
            const doc = new DOMParser().parseFromString(text, 'image/svg+xml');
            const error = doc.querySelector('parsererror');
            if (error !== null) xmlError = textOf(error);
            else xmlElements = doc.getElementsByTagName('*').length;
          }
          return {
            id,
            isSvg,
            kind: el?.getAttribute('data-chart') ?? null,
            visibleMarks,
            texts: el === null ? 0 : el.querySelectorAll('text').length,
            xmlError,
            htmlElements: el === null ? 0 : el.getElementsByTagName('*').length + 1,
            xmlElements,
            printWidth: 0,
          };
        });
        const overlappingTexts: string[] = [];
        const clippedTexts: string[] = [];
        for (const svg of document.querySelectorAll('svg')) {
          const frame = boxOf(svg);
          const texts = [...svg.querySelectorAll('text')].map((t) => ({ text: textOf(t), box: boxOf(t) }));
          texts.forEach((a, i) => {
            const b0 = a.box;
            if (b0.left < frame.left - 1 || b0.right > frame.right + 1 || b0.top < frame.top - 1 || b0.bottom > frame.bottom + 1) clippedTexts.push(`${svg.id}: "${a.text}"`);
            for (const b of texts.slice(i + 1)) {
              const dx = Math.min(b0.right, b.box.right) - Math.max(b0.left, b.box.left);
              const dy = Math.min(b0.bottom, b.box.bottom) - Math.max(b0.top, b.box.top);
              if (dx > 1 && dy > 1) overlappingTexts.push(`${svg.id}: "${a.text}" / "${b.text}"`);
            }
          });
        }
        const unexpectedCharts = [...document.querySelectorAll('svg.chart')].map((s) => s.id).filter((id) => !ids.includes(id));
        return {
          charts,
          overlappingTexts,
          clippedTexts,
          unexpectedCharts,
          scripts: document.querySelectorAll('script').length,
          compatMode: document.compatMode,
          characterSet: document.characterSet,
          horizontalOverflow: Math.max(0, document.documentElement.scrollWidth - innerWidth),
        };
      },
      { ids: [...chartIds], sources: chartSources },
    );

    mkdirSync(ARTIFACT_DIR, { recursive: true });
    const screenshot = join(ARTIFACT_DIR, `${artefactName}.png`);
    await page.screenshot({ path: screenshot, fullPage: true });
    mkdirSync(join(ARTIFACT_DIR, artefactName), { recursive: true });
    for (const chart of screen.charts) {
      if (chart.isSvg) await page.locator(`[id="${chart.id}"]`).screenshot({ path: join(ARTIFACT_DIR, artefactName, `${chart.id}.png`) });
    }

    await page.emulateMedia({ media: 'print' });
    const printWidths = await page.evaluate((ids) => {
      const { document } = globalThis as unknown as PageGlobals;
      return ids.map((id) => document.getElementById(id)?.getBoundingClientRect().width ?? 0);
    }, [...chartIds]);
    const charts = screen.charts.map((c, i) => ({ ...c, printWidth: printWidths[i] ?? 0 }));
    return { consoleErrors, pageErrors, foreignRequests, ...screen, charts, screenshot };
  } finally {
    await browser.close();
  }
}

/** inspectReport, then asserts every check listed at the top of this file. */
export async function expectReportRendersCleanly(htmlPath: string, chartIds: readonly string[], artefactName: string): Promise<ReportFindings> {
  const found = await inspectReport(htmlPath, chartIds, artefactName);
  expect(found.consoleErrors, 'console errors').toEqual([]);
  expect(found.pageErrors, 'page errors').toEqual([]);
  expect(found.foreignRequests, 'requests other than the report file').toEqual([]);
  expect(found.scripts, 'script elements').toBe(0);
  expect(found.compatMode, 'standards mode (doctype)').toBe('CSS1Compat');
  expect(found.characterSet, 'encoding').toBe('UTF-8');
  expect(found.unexpectedCharts, 'charts not in the expected list').toEqual([]);
  for (const chart of found.charts) {
    expect(chart.isSvg, `${chart.id} is an <svg>`).toBe(true);
    expect(chart.visibleMarks, `${chart.id} visible data marks`).toBeGreaterThan(0);
    expect(chart.xmlError, `${chart.id} parses as SVG`).toBeNull();
    expect(chart.xmlElements, `${chart.id}: XML and HTML parsers see the same elements`).toBe(chart.htmlElements);
    expect(chart.printWidth, `${chart.id} printed`).toBeGreaterThan(0);
  }
  expect(found.overlappingTexts, 'overlapping texts').toEqual([]);
  expect(found.clippedTexts, 'texts outside their chart').toEqual([]);
  expect(found.horizontalOverflow, 'sideways scroll [px]').toBe(0);
  return found;
}

/** The bytes of `<svg ... id="ID" ...>...</svg>` as written in the file (charts do not nest svg), or null. */
export function svgSource(html: string, id: string): string | null {
  const open = html.search(new RegExp(`<svg\\b[^>]*\\sid="${id.replace(/[^a-z0-9-]/g, '')}"`));
  if (open < 0) return null;
  const close = html.indexOf('</svg>', open);
  return close < 0 ? null : html.slice(open, close + '</svg>'.length);
}
