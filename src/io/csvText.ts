import type { InputProblem } from './inputError.js';

/** One CSV data row with its 1-based line number in the file. */
export interface CsvRow {
  readonly line: number;
  readonly cells: readonly string[];
}

export interface CsvTable {
  readonly header: readonly string[];
  readonly rows: readonly CsvRow[];
}

/**
 * Splits CSV text into a header and rows. Accepts a UTF-8 byte order mark and CRLF line endings; blank
 * lines are skipped. Fields are comma separated; double quotes around a field are removed (no embedded
 * commas are expected in our numeric files). A semicolon-separated file gets a clear problem instead of
 * a cascade of column errors.
 */
export function splitCsv(text: string, file: string): { table: CsvTable } | { problems: InputProblem[] } {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const lines = body.split('\n');
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
  if (!headerLine.includes(',') && headerLine.includes(';')) {
    return {
      problems: [
        {
          file,
          line: headerIndex + 1,
          message: 'the columns are separated by semicolons',
          fix: 'save the file as comma-separated CSV with a dot as the decimal mark (e.g. 42.5, not 42,5)',
        },
      ],
    };
  }
  const header = splitLine(headerLine);
  const rows: CsvRow[] = [];
  for (let i = headerIndex + 1; i < lines.length; i++) {
    const line = stripCr(lines[i] as string);
    if (line.trim() === '') continue;
    rows.push({ line: i + 1, cells: splitLine(line) });
  }
  return { table: { header, rows } };
}

function stripCr(line: string): string {
  return line.endsWith('\r') ? line.slice(0, -1) : line;
}

function splitLine(line: string): string[] {
  return line.split(',').map((cell) => {
    const trimmed = cell.trim();
    return trimmed.length >= 2 && trimmed.startsWith('"') && trimmed.endsWith('"') ? trimmed.slice(1, -1) : trimmed;
  });
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
  return { error: `"${cell}" is not a number`, fix: 'give a decimal number with a dot, e.g. 42.5' };
}
