/**
 * Reports of the backtest, sweep, size and score commands for tests, made through the real commands
 * with `--report` on a few days of the fictional Halvorn demo scenario. Backtest and score run in this
 * process (main with a captured CliIo); sweep and size run the compiled CLI in a child process with
 * one thread, because their settings run from compiled task modules (dist/, `npm run build` first).
 */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { checkBuild, quantbid } from '../cli/sweepScenario.js';
import { HALVORN_SCENARIO, runCli } from './planFixtures.js';

export { HALVORN_SCENARIO };

/** Days each command replays: a short span keeps every test under a few seconds. */
export const REPORT_SPANS = Object.freeze({
  backtest: ['2026-03-01', '2026-03-07'],
  sweep: ['2026-03-01', '2026-03-05'],
  size: ['2026-03-01', '2026-03-04'],
  score: ['2026-01-01', '2026-01-31'],
} as const);

export const SWEEP_ARGS = ['--alphas', '0.05:0.45:0.1', '--unaccepted', 'follow-plan,follow-accepted', '--threads', '1'] as const;
export const SIZE_ARGS = ['--energy-mwh', '5,10,20', '--power-mw', '2.5,5,10', '--capex-per-mwh', '180000', '--capex-per-mw', '60000', '--life-years', '15', '--discount-rate', '0.07', '--threads', '1'] as const;

export function freshOut(name: string): string {
  return join(mkdtempSync(join(tmpdir(), `quantbid-${name}-`)), 'out');
}

function span(kind: keyof typeof REPORT_SPANS): string[] {
  const [from, to] = REPORT_SPANS[kind];
  return ['--from', from, '--to', to];
}

/** `quantbid backtest --report` on the demo scenario (or other inputs); returns the output folder. */
export async function backtestWithReport(inputs: readonly string[] = ['--scenario', HALVORN_SCENARIO], extra: readonly string[] = []): Promise<string> {
  const out = freshOut('backtest-report');
  const run = await runCli(['backtest', ...inputs, ...span('backtest'), '--report', '--out', out, ...extra]);
  if (run.code !== 0) throw new Error(`backtest --report failed with ${run.code}: ${run.stderr}`);
  return out;
}

/** `quantbid score --report` on the demo scenario's vendor forecast. */
export async function scoreWithReport(): Promise<string> {
  const out = freshOut('score-report');
  const run = await runCli(['score', '--scenario', HALVORN_SCENARIO, ...span('score'), '--report', '--out', out]);
  if (run.code !== 0) throw new Error(`score --report failed with ${run.code}: ${run.stderr}`);
  return out;
}


/** `quantbid sweep --report` through the compiled CLI. */
export function sweepWithReport(): string {
  checkBuild();
  const out = freshOut('sweep-report');
  const run = quantbid(['sweep', '--scenario', HALVORN_SCENARIO, ...span('sweep'), ...SWEEP_ARGS, '--report', '--out', out]);
  if (run.code !== 0) throw new Error(`sweep --report failed with ${String(run.code)}: ${run.stderr}`);
  return out;
}

/** `quantbid size --report` through the compiled CLI. */
export function sizeWithReport(): string {
  checkBuild();
  const out = freshOut('size-report');
  const run = quantbid(['size', '--scenario', HALVORN_SCENARIO, ...span('size'), ...SIZE_ARGS, '--report', '--out', out]);
  if (run.code !== 0) throw new Error(`size --report failed with ${String(run.code)}: ${run.stderr}`);
  return out;
}

export function readOutput(outDir: string, name: string): string {
  return readFileSync(join(outDir, name), 'utf8');
}

/** The bytes of one chart's `<svg>` in a page. */
export function chartSource(html: string, id: string): string {
  const at = html.indexOf(`id="${id}"`);
  if (at < 0) throw new Error(`no chart ${id} in the page`);
  return html.slice(html.lastIndexOf('<svg', at), html.indexOf('</svg>', at) + '</svg>'.length);
}

/** Tooltip texts (`<title>`) of the data marks of a chart, in document order. */
export function markTitles(svg: string): string[] {
  return [...svg.matchAll(/class="mark[^"]*"[^>]*><title>([^<]*)<\/title>/g)].map((m) => m[1] as string);
}

/** A number as the charts print it (typographic minus, no thousands separator) back to a number. */
export function shownNumber(text: string): number {
  return Number(text.replace('\u2212', '-'));
}

/** The rows of a CSV file with a header, as objects of strings (our CSV never quotes). */
export function csvObjects(text: string): Record<string, string>[] {
  const [header, ...lines] = text.trimEnd().split('\n');
  const names = (header ?? '').split(',');
  return lines.map((line) => Object.fromEntries(line.split(',').map((cell, i) => [names[i] as string, cell])));
}

/** The table of a section of the page, as rows of cell texts (header row left out). */
export function tableRows(html: string, caption: string): string[][] {
  const at = html.indexOf(`<caption>${caption}`);
  if (at < 0) throw new Error(`no table with the caption ${caption}`);
  const table = html.slice(at, html.indexOf('</table>', at));
  return [...table.matchAll(/<tr><td[\s\S]*?<\/tr>/g)].map((row) => [...row[0].matchAll(/<td[^>]*>([^<]*)<\/td>/g)].map((c) => c[1] as string));
}

/**
 * Every chart of a page has one title, axis titles `label [unit]` for both axes (and the right axis
 * where drawn) and a caption. Returns the chart ids, in page order.
 */
export function labelledCharts(html: string): string[] {
  const ids = [...html.matchAll(/<svg xmlns="http:\/\/www.w3.org\/2000\/svg" id="([^"]+)" class="chart"/g)].map((m) => m[1] as string);
  for (const id of ids) {
    const svg = chartSource(html, id);
    const textsOf = (cls: string) => [...svg.matchAll(new RegExp(`<text\\b[^>]*class="${cls}"[^>]*>([^<]*)</text>`, 'g'))].map((m) => m[1] as string);
    if (textsOf('chart-title').length !== 1) throw new Error(`${id}: ${textsOf('chart-title').length} titles`);
    const axes = textsOf('axis-title');
    if (axes.length < 2 || axes.some((t) => !/ \[[^\]]+\]$/.test(t))) throw new Error(`${id}: axis titles without units: ${axes.join(' | ')}`);
    if (textsOf('caption').length === 0) throw new Error(`${id}: no caption`);
  }
  return ids;
}
