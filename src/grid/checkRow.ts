import type { GridAxis } from './gridAxis.js';
import type { RowCell, GridRow } from './taskModule.js';

const COLUMN = /^[a-z][a-z0-9_]*$/;
/**
 * A string cell: no comma, quote or line break (a CSV holds it without quoting), and no first
 * character that a spreadsheet reads as the start of a formula (=, +, -, @, tab, carriage return:
 * "CSV injection", OWASP; common practice).
 */
const PLAIN = /^(?![=+\-@\t\r])[^,"\r\n]*$/;

/**
 * Checks a task's row against the contract (workerPool.ts): column names in lower snake case and
 * apart from the axis names, the same columns in the same order as `columns` when given, cells that
 * a CSV holds without quoting and that survive the journal's JSON unchanged. Throws an Error naming
 * the setting and the column: a task that breaks the contract is a fault, not bad input.
 */
export function checkRow(row: unknown, key: string, axes: readonly GridAxis[], columns?: readonly string[]): GridRow {
  const fault = (what: string) => new Error(`the sweep task returned ${what} for setting ${key}`);
  if (typeof row !== 'object' || row === null || Array.isArray(row)) throw fault('something that is not a row object');
  const names = Object.keys(row);
  for (const name of names) {
    if (!COLUMN.test(name)) throw fault(`a column "${name}" whose name is not lower snake case`);
    if (axes.some((axis) => axis.name === name)) throw fault(`a column "${name}" that is also an axis`);
    const cell: unknown = (row as Record<string, unknown>)[name];
    if (!isCell(cell)) throw fault(`column ${name} = ${String(cell)}, which is not a finite number, a plain string, a boolean or null`);
  }
  if (columns !== undefined && names.join(',') !== columns.join(',')) {
    throw fault(`columns ${names.join(',')} where other settings have ${columns.join(',')}`);
  }
  return row as GridRow;
}

function isCell(cell: unknown): cell is RowCell {
  if (typeof cell === 'number') return Number.isFinite(cell);
  if (typeof cell === 'string') return PLAIN.test(cell);
  return cell === null || typeof cell === 'boolean';
}
