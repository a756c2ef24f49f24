import type { InputProblem } from '../errors/inputError.js';

/** How many bytes are looked at before a file is read whole [bytes]. */
export const SNIFF_BYTES = 64 * 1024;

/** Checks a CSV header line (1-based `line` in the file) and returns the problems found. */
export type FirstLineCheck = (header: string, line: number) => readonly InputProblem[];

/**
 * What the first bytes of an input say about it, before it is read whole: gzip data under a plain
 * name, a spreadsheet (ZIP) file, UTF-16 text, binary data, and, with `firstLine`, a header line that is
 * wrong or longer than the bytes looked at. Returns the problems found (none: read on).
 *
 * @param head the first bytes of the file (all of it when `more` is false)
 * @param more whether the file goes on after `head`; when it does and `head` is shorter than
 *   SNIFF_BYTES (the start of a compressed file), a first line that runs past `head` is not judged
 */
export function sniffText(file: string, head: Buffer, more: boolean, firstLine?: FirstLineCheck): InputProblem[] {
  const kind = binaryKind(head);
  if (kind !== null) return [{ file, message: kind.message, fix: kind.fix }];
  if (firstLine === undefined) return [];
  const text = head.toString('utf8');
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const lineBreak = /\r\n|\n|\r/g;
  let start = 0;
  for (let line = 1; ; line++) {
    const found = lineBreak.exec(body);
    if (found === null && more) {
      if (head.length < SNIFF_BYTES) return [];
      const columns = countCommas(body, start) + 1;
      if (columns > 100) {
        return [{ file, line, message: `the header line is longer than ${head.length} bytes (${columns} columns or more): more columns than any quantbid input has (a forecast has at most 99 levels)`, fix: 'give at most 99 quantile levels; check that this is the right file' }];
      }
      return [{ file, line, message: `line ${line} is longer than ${head.length} bytes: this is not a CSV file with a header line`, fix: 'check that this is the right file' }];
    }
    const content = body.slice(start, found === null ? body.length : found.index);
    if (content.trim() !== '') return [...firstLine(content, line)];
    if (found === null) return []; // blank or empty file: the reader says so
    start = lineBreak.lastIndex;
  }
}

function countCommas(text: string, from: number): number {
  let count = 0;
  for (let i = text.indexOf(',', from); i >= 0; i = text.indexOf(',', i + 1)) count++;
  return count;
}

function binaryKind(head: Buffer): { message: string; fix: string } | null {
  const startsWith = (...bytes: number[]) => bytes.every((b, k) => head[k] === b);
  if (startsWith(0x1f, 0x8b)) return { message: 'holds gzip-compressed data but its name does not end in .gz', fix: 'rename it to end in .gz, or decompress it' };
  if (startsWith(0x50, 0x4b, 0x03, 0x04)) return { message: 'is a ZIP archive or a spreadsheet, not text', fix: 'save the sheet as CSV (comma-separated, UTF-8) and give that file' };
  if (startsWith(0xff, 0xfe) || startsWith(0xfe, 0xff)) return { message: 'is UTF-16 text', fix: 'save it as UTF-8' };
  const nul = head.indexOf(0);
  if (nul >= 0) return { message: `holds binary data, not text (a zero byte at byte ${nul + 1})`, fix: 'give a UTF-8 text file (CSV or JSON); check that this is the right file' };
  return null;
}
