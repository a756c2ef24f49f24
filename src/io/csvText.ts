import type { InputProblem } from '../errors/inputError.js';
import { shownText } from '../errors/shownText.js';

/** One CSV data row with its 1-based line number in the file. */
export interface CsvRow {
  readonly line: number;
  readonly cells: readonly string[];
  /** Whether a quoted cell is still open at the end of the line (openQuoteProblem words it). */
  readonly openQuote?: boolean;
}

export interface CsvTable {
  readonly header: readonly string[];
  /** 1-based line of the header (the first non-blank line). */
  readonly headerLine: number;
  /**
   * The data rows, split one at a time while they are iterated (and again on each iteration): a long
   * file never holds every row's cells at once, only the text.
   */
  readonly rows: Iterable<CsvRow>;
  /** Whether there is at least one non-blank line after the header. */
  readonly hasRows: boolean;
  /**
   * The same data rows as a cursor over the text (byte order mark removed), without cutting a string
   * per line: for readers that read a row's cells in place (PlainRow).
   */
  lines(): CsvLineCursor;
}

/**
 * Splits CSV text into a header and rows. Accepts a UTF-8 byte order mark and LF, CRLF or (old) CR line
 * endings; blank lines are skipped. Fields are comma separated and trimmed; a field in double quotes
 * may hold commas and doubled quotes (RFC 4180), but not line breaks. A semicolon- or tab-separated
 * file gets one clear problem instead of a cascade of column errors.
 */
export function splitCsv(text: string, file: string): { table: CsvTable } | { problems: InputProblem[] } {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const lines = new TextLines(body, body.includes('\n') || !body.includes('\r') ? '\n' : '\r');
  const first = lines.nextNonBlank(0);
  if (first === null) {
    return { problems: [{ file, message: 'the file is empty', fix: 'give a CSV file with a header line and one row per delivery period' }] };
  }
  const headerText = stripCr(first.text);
  const separator = separatorProblem(headerText, file, first.line);
  if (separator !== null) return { problems: [separator] };
  const dataStart = first.end;
  const rows: Iterable<CsvRow> = {
    *[Symbol.iterator]() {
      for (let at = lines.nextNonBlank(dataStart, first.line); at !== null; at = lines.nextNonBlank(at.end, at.line)) {
        const text = stripCr(at.text);
        yield { line: at.line, cells: splitCsvLine(text), openQuote: hasOpenQuote(text) };
      }
    },
  };
  const cursor = (): CsvLineCursor => new CsvLineCursor(body, lines.breakChar, dataStart, first.line);
  return { table: { header: splitCsvLine(headerText), headerLine: first.line, rows, hasRows: lines.nextNonBlank(dataStart, first.line) !== null, lines: cursor } };
}

/**
 * The non-blank lines of a text after an offset, one at a time: `next()` moves to the next one and
 * sets `line` (1-based), `from` and `to` (the line's text without its line break and a carriage
 * return before it, as the rows of splitCsv have it).
 */
export class CsvLineCursor {
  line: number;
  from = 0;
  to = 0;
  private at: number;

  constructor(
    readonly text: string,
    private readonly breakChar: string,
    start: number,
    lineBefore: number,
  ) {
    this.at = start;
    this.line = lineBefore;
  }

  next(): boolean {
    const text = this.text;
    // As text.split(breakChar): a text ending in a line break has an empty last line.
    while (this.at <= text.length) {
      const found = text.indexOf(this.breakChar, this.at);
      const stop = found < 0 ? text.length : found;
      const start = this.at;
      this.line++;
      this.at = stop + 1;
      if (!isBlank(text, start, stop)) {
        this.from = start;
        this.to = stop > start && text.charCodeAt(stop - 1) === 0x0d ? stop - 1 : stop;
        return true;
      }
    }
    return false;
  }

  /** The current line's text (as a row of splitCsv has it). */
  lineText(): string {
    return this.text.slice(this.from, this.to);
  }
}

/** Whether text[from, to) is blank (String.prototype.trim leaves nothing); decided without a slice for the usual line. */
function isBlank(text: string, from: number, to: number): boolean {
  if (from === to) return true;
  const code = text.charCodeAt(from);
  if (code > 0x20 && code < 0x7f) return false;
  return text.slice(from, to).trim() === '';
}

/** Walks the lines of a text by offsets, without splitting it into an array of lines. */
class TextLines {
  constructor(
    private readonly text: string,
    readonly breakChar: string,
  ) {}

  /**
   * The first line that is not blank at or after offset `from`, which starts line `lineBefore + 1`:
   * its text, 1-based number, and the offset after its line break.
   */
  nextNonBlank(from: number, lineBefore = 0): { text: string; line: number; end: number } | null {
    let line = lineBefore;
    // As text.split(breakChar): a text ending in a line break has an empty last line.
    for (let start = from; start <= this.text.length; ) {
      const found = this.text.indexOf(this.breakChar, start);
      const stop = found < 0 ? this.text.length : found;
      line++;
      const text = this.text.slice(start, stop);
      if (text.trim() !== '') return { text, line, end: stop + 1 };
      start = stop + 1;
    }
    return null;
  }
}

/** The problem with a header line separated by semicolons or tabs instead of commas, or null. */
export function separatorProblem(headerLine: string, file: string, line: number): InputProblem | null {
  if (headerLine.includes(',')) return null;
  const by = headerLine.includes(';') ? 'semicolons' : headerLine.includes('\t') ? 'tabs' : null;
  if (by === null) return null;
  return {
    file,
    line,
    message: `the columns are separated by ${by}`,
    fix: 'save the file as comma-separated CSV with a dot as the decimal mark (e.g. 42.5, not 42,5)',
  };
}

/**
 * A row whose field count does not match the header, naming the first missing column (or the first
 * extra one), with the usual cause when there are more fields.
 */
export function fieldCountProblem(row: CsvRow, header: readonly string[], file: string, fix: string): InputProblem {
  const more = row.cells.length > header.length;
  return {
    file,
    line: row.line,
    field: more ? `column ${header.length + 1}` : (header[row.cells.length] ?? ''),
    message: `${row.cells.length} fields, the header has ${header.length}`,
    fix: more ? `${fix}; a decimal comma (42,5) splits a number in two: use a dot (42.5)` : fix,
  };
}

function stripCr(line: string): string {
  return line.endsWith('\r') ? line.slice(0, -1) : line;
}

/**
 * Whether a cell of the line opens a quote that the line does not close: a line break inside a quoted
 * cell (RFC 4180 allows it; quantbid's files have one row per line and do not), or a quote missing.
 */
export function hasOpenQuote(line: string): boolean {
  if (!line.includes('"')) return false;
  let quoted = false;
  let cellStart = true;
  for (let i = 0; i < line.length; i++) {
    const c = line[i] as string;
    if (quoted) {
      if (c === '"') {
        if (line[i + 1] === '"') i++;
        else quoted = false;
      }
    } else if (c === '"' && cellStart) quoted = true;
    else if (c === ',') cellStart = true;
    else if (c !== ' ' && c !== '\t') cellStart = false;
  }
  return quoted;
}

/** The problem of a line whose quoted cell is not closed on it (hasOpenQuote). */
export function openQuoteProblem(lineNumber: number, file: string): InputProblem {
  return {
    file,
    line: lineNumber,
    message: 'a quoted cell is not closed on this line: a line break inside quotes is not supported (each row is one line), or a closing quote is missing',
    fix: 'keep every row on one line and close each quote on it; cells in these files need no quotes',
  };
}

/** The fields of one CSV line, trimmed, quotes removed. */
export function splitCsvLine(line: string): string[] {
  if (!line.includes('"')) return line.split(',').map((cell) => cell.trim());
  const cells: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i] as string;
    if (quoted) {
      if (c !== '"') cell += c;
      else if (line[i + 1] === '"') {
        cell += '"';
        i++;
      } else quoted = false;
    } else if (c === '"' && cell.trim() === '') {
      quoted = true;
      cell = '';
    } else if (c === ',') {
      cells.push(cell.trim());
      cell = '';
    } else cell += c;
  }
  cells.push(cell.trim());
  return cells;
}

const NUMBER_PATTERN = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * A finite decimal number with a dot as the decimal mark, or a problem that says why not.
 * Rejects NaN, Infinity, numbers beyond the doubles (1e999), empty cells and decimal commas by name.
 */
export function parseDecimal(cell: string): { value: number } | { error: string; fix: string } {
  if (cell === '') return { error: 'empty value', fix: 'fill in a number' };
  if (NUMBER_PATTERN.test(cell)) {
    const value = Number(cell);
    // 1e999 is a well-formed number whose value is beyond every double (about 1.8e308).
    if (!Number.isFinite(value)) return { error: `${shownText(cell)} is out of range: larger than any number a file may hold (about 1.8e308)`, fix: 'check the unit and the decimal point of this value' };
    return { value };
  }
  if (/^[+-]?(nan|inf|infinity)$/i.test(cell)) {
    return { error: `${cell} is not a finite number`, fix: 'give a finite price; drop the row or the day if the value is unknown' };
  }
  if (/^[+-]?\d+,\d+$/.test(cell)) {
    return { error: `"${cell}" uses a decimal comma`, fix: 'use a dot as the decimal mark, e.g. 42.5' };
  }
  return { error: `"${shownText(cell)}" is not a number`, fix: 'give a decimal number with a dot, e.g. 42.5' };
}
