import { csvLine } from '../io/formatNumber.js';
import { axisValueText, type AxisValue, type GridAxis } from './gridAxis.js';
import type { GridPoint } from './expandGrid.js';
import type { GridRow } from './taskModule.js';

/** A line of the table after the grid's settings, e.g. a reference policy of a sweep: axis cells (null: empty) and its row. */
export interface TableRow {
  readonly setting: Readonly<Record<string, AxisValue | null>>;
  readonly row: GridRow;
}

/**
 * The grid's table (sweep.csv, size.csv): one line per setting in grid order, then the `more` lines; the axis columns (values as in the keys), then
 * the task's columns (numbers by formatNumber, booleans as true/false, null as an empty cell).
 */
export function gridCsv(axes: readonly GridAxis[], points: readonly GridPoint[], rows: readonly GridRow[], more: readonly TableRow[] = []): string {
  const columns = Object.keys(rows[0] ?? {});
  const lines = [[...axes.map((axis) => axis.name), ...columns].join(',')];
  points.forEach((point, i) => {
    const row = rows[i] as GridRow;
    const cells = columns.map((name) => {
      const cell = row[name];
      return cell === null || cell === undefined ? '' : typeof cell === 'boolean' ? String(cell) : cell;
    });
    lines.push(csvLine([...axes.map((axis) => axisValueText(point.setting[axis.name] as AxisValue)), ...cells]));
  });
  for (const extra of more) {
    const cells = columns.map((name) => {
      const cell = extra.row[name];
      return cell === null || cell === undefined ? '' : typeof cell === 'boolean' ? String(cell) : cell;
    });
    lines.push(csvLine([...axes.map((axis) => {
      const value = extra.setting[axis.name];
      return value === null || value === undefined ? '' : axisValueText(value);
    }), ...cells]));
  }
  return `${lines.join('\n')}\n`;
}
