/**
 * Shared set-up of the sweep engine's tests: the compiled engine from dist/ (worker threads load
 * compiled JavaScript), the example task module, and a seeded price file in a fresh folder.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { checkBuild } from '../distBuild.js';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

export type GridModule = typeof import('../../src/grid/index.js');

export const ROOT = fileURLToPath(new URL('../../', import.meta.url));
export const EXAMPLE_TASK = fileURLToPath(new URL('./fixtures/exampleTask.mjs', import.meta.url));
export const DRIVER = fileURLToPath(new URL('./fixtures/gridDriver.mjs', import.meta.url));

/** The engine as compiled into dist/; fails with what to do when dist/ is older than src/. */
export async function importCompiledGrid(): Promise<GridModule> {
  checkBuild();
  return (await import(pathToFileURL(join(ROOT, 'dist/grid/index.js')).href)) as GridModule;
}

/** A fresh folder with `data.json`: 240 prices [currency/MWh] from a seeded Lehmer generator (seed from the name). */
export function priceFolder(name: string): { readonly dir: string; readonly dataFile: string } {
  const dir = mkdtempSync(join(tmpdir(), `quantbid-${name}-`));
  let state = [...name].reduce((h, c) => (h * 31 + c.charCodeAt(0)) % 2147483647, 7) || 1;
  const prices = Array.from({ length: 240 }, () => {
    state = (state * 48271) % 2147483647;
    return Math.round((state / 2147483647) * 3000 - 500) / 10;
  });
  const dataFile = join(dir, 'data.json');
  writeFileSync(dataFile, JSON.stringify({ prices }));
  return { dir, dataFile };
}

/** Lines of a text file that end in a line break (a torn last line is not counted). */
export function wholeLines(text: string): string[] {
  return text.split('\n').slice(0, -1);
}
