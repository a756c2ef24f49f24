import type { InputProblem } from './inputError.js';
import { shownText } from './shownText.js';

/** One CSV data row with its 1-based line number in the file. */
export interface CsvRow {
  readonly line: number;
  readonly cells: readonly string[];
}

export interface CsvTable {
  readonly header: readonly string[];
  /** 1-based line of the header (the first non-blank line). */
  readonly headerLine: number;
  readonly rows: readonly CsvRow[];
}

/**
 * Splits CSV text into a header and rows. Accepts a UTF-8 byte order mark and LF, CRLF or (old) CR line
 * endings; blank lines are skipped. Fields are comma separated and trimmed; a field in double quotes
 * may hold commas and doubled quotes (RFC 4180), but not line breaks. A semicolon- or tab-separated
 * file gets one clear problem instead of a cascade of column errors.
 */
export function splitCsv(text: string, file: string): { table: CsvTable } | { problems: InputProblem[] } {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const lines = body.includes('\n') || !body.includes('\r') ? body.split('\n') : body.split('\r');
  let headerIndex = -1;
  for (let i = 0; i < lines.length; i++) {
    if ((lines[i] as string).trim() !== '') {
      headerIndex = i;
      break;
    }
  }
  if (headerIndex < 0) {
    return { problems: [{ file, message: 'the file is empty', fix: 'give a CSV file with a header line and one row per delivery period' }] };
  }
  const headerLine = stripCr(lines[headerIndex] as string);
  const separator = separatorProblem(headerLine, file, headerIndex + 1);
  if (separator !== null) return { problems: [separator] };
  const header = splitCsvLine(headerLine);
  const rows: CsvRow[] = [];
  for (let i = headerIndex + 1; i < lines.length; i++) {
    const line = stripCr(lines[i] as string);
    if (line.trim() === '') continue;
    rows.push({ line: i + 1, cells: splitCsvLine(line) });
  }
  return { table: { header, headerLine: headerIndex + 1, rows } };
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
 * Rejects NaN, Infinity, empty cells and decimal commas by name.
 */
export function parseDecimal(cell: string): { value: number } | { error: string; fix: string } {
  if (cell === '') return { error: 'empty value', fix: 'fill in a number' };
  if (NUMBER_PATTERN.test(cell)) return { value: Number(cell) };
  if (/^[+-]?(nan|inf|infinity)$/i.test(cell)) {
    return { error: `${cell} is not a finite number`, fix: 'give a finite price; drop the row or the day if the value is unknown' };
  }
  if (/^[+-]?\d+,\d+$/.test(cell)) {
    return { error: `"${cell}" uses a decimal comma`, fix: 'use a dot as the decimal mark, e.g. 42.5' };
  }
  return { error: `"${shownText(cell)}" is not a number`, fix: 'give a decimal number with a dot, e.g. 42.5' };
}
