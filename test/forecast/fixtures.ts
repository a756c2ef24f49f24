import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

/** Reads a numeric CSV from test/fixtures (first line a header, quoted names allowed). */
export function readFixtureCsv(name: string): { header: string[]; rows: number[][] } {
  const path = fileURLToPath(new URL(`../fixtures/${name}`, import.meta.url));
  const lines = readFileSync(path, 'utf8').trim().split(/\r?\n/);
  const header = (lines[0] ?? '').split(',').map((h) => h.replace(/"/g, ''));
  const rows = lines.slice(1).map((line) => line.split(',').map(Number));
  return { header, rows };
}
