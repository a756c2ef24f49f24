import { InputError } from '../errors/inputError.js';
import type { MarketSpec } from '../types.js';
import { parseQuantileForecast, quantileHeaderCheck, type QuantileForecastFile } from './readQuantileForecast.js';
import type { ReadAhead } from './readAhead.js';
import { readInputBytes } from './readInputFile.js';

/** A forecast read for one delivery day, and which of its rows were parsed and checked. */
export interface QuantileForecastForDay extends QuantileForecastFile {
  /**
   * `day`: the header and the rows of the delivery day only (the day complete, every row of it
   * valid); `file`: every row of the file (the day's rows alone had a problem, or are not all there).
   */
  readonly rowsChecked: 'day' | 'file';
}

/**
 * Reads the header of a quantile forecast file and the rows of one delivery day, without parsing the
 * rows of other days: what `quantbid plan` needs of a file that may hold years of forecasts.
 *
 * The whole file is still read and checked as a file (size, gzip, UTF-8, its header from the first
 * bytes: readInputBytes). A row of `day` names a period start whose text begins with the day's date
 * (locatePeriod reads the delivery day from the timestamp's own local date), so every row of the day,
 * however it is spaced or quoted, and every row that repeats one of its periods, lies on a line that
 * holds the date's text; those lines, found by a byte search, are parsed under the header exactly as
 * parseQuantileForecast parses a file. When that finds the day complete and without a problem, it is
 * the answer. Otherwise the whole file is parsed as readQuantileForecast does, so that every problem
 * is reported with its line, and a missing or incomplete day is described against what the file
 * covers. `readAhead`: the file read ahead (readAhead.ts), taken when it is still the file's content.
 */
export function readQuantileForecastDay(path: string, market: MarketSpec, day: string, readAhead?: ReadAhead): QuantileForecastForDay {
  const read = readInputBytes(path, { firstLine: quantileHeaderCheck(path), ...(readAhead === undefined ? {} : { readAhead }) });
  const bytes = Buffer.from(read.buffer, read.byteOffset, read.byteLength);
  const dayRows = dayLinesText(bytes, day);
  if (dayRows !== null) {
    try {
      const read = parseQuantileForecast(dayRows, path, market);
      if (read.days.has(day)) return { ...onlyDay(read, day), rowsChecked: 'day' };
    } catch (err) {
      if (!(err instanceof InputError)) throw err;
    }
  }
  return { ...parseQuantileForecast(bytes.toString('utf8'), path, market), rowsChecked: 'file' };
}

/**
 * The file's header line and every later line that holds the text of `day`, one per line, as CSV text;
 * null when the file has no header line.
 */
function dayLinesText(bytes: Buffer, day: string): string | null {
  // The line break as splitCsv chooses it: LF when there is one, else an old Mac file's CR.
  const breakByte = bytes.includes(0x0a) || !bytes.includes(0x0d) ? 0x0a : 0x0d;
  const header = headerLine(bytes, breakByte);
  if (header === null) return null;
  const lines = [header.text];
  const date = Buffer.from(day, 'latin1');
  for (let hit = bytes.indexOf(date, header.end); hit >= 0; ) {
    const start = bytes.lastIndexOf(breakByte, hit) + 1;
    const found = bytes.indexOf(breakByte, hit);
    const end = found < 0 ? bytes.length : found;
    lines.push(bytes.toString('utf8', start, end));
    hit = end >= bytes.length ? -1 : bytes.indexOf(date, end + 1);
  }
  return lines.join('\n');
}

/** The first line that is not blank (byte order mark removed), and the offset after it. */
function headerLine(bytes: Buffer, breakByte: number): { text: string; end: number } | null {
  for (let start = 0; start < bytes.length; ) {
    const found = bytes.indexOf(breakByte, start);
    const end = found < 0 ? bytes.length : found;
    const text = bytes.toString('utf8', start, end);
    if (text.trim() !== '') return { text: start === 0 && text.charCodeAt(0) === 0xfeff ? text.slice(1) : text, end };
    start = end + 1;
  }
  return null;
}

/** The read restricted to `day`: its periods and its repairs, nothing of any other day. */
function onlyDay(read: QuantileForecastFile, day: string): QuantileForecastFile {
  const repairs = read.repairedByDay.get(day);
  return {
    file: read.file,
    levels: read.levels,
    days: new Map([[day, read.days.get(day) as NonNullable<ReturnType<typeof read.days.get>>]]),
    incompleteDays: [],
    repairedPeriods: repairs?.periods ?? 0,
    repairedExamples: read.repairedExamples.filter((start) => start.startsWith(day)),
    repairedByDay: repairs === undefined ? new Map() : new Map([[day, repairs]]),
  };
}
