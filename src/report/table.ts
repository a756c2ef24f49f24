import { joinMarkup, markup, type Markup } from './markup.js';
import { numberText, tickLabel } from './tickLabel.js';

export interface TableColumn {
  /** Header text, e.g. `limit price`. */
  readonly header: string;
  /** Unit printed after the header in brackets, e.g. `HLV/MWh`. */
  readonly unit?: string;
  /** Decimals of numeric cells, fixed so that columns line up. Default: up to 3, trailing zeros dropped. */
  readonly decimals?: number;
}

export interface TableSpec {
  readonly caption?: string;
  readonly columns: readonly TableColumn[];
  /** One array per row, one cell per column; numbers are right-aligned, null prints as a dash. */
  readonly rows: readonly (readonly (string | number | null)[])[];
}

/** An escaped HTML table; numeric columns right-aligned with tabular figures. */
export function htmlTable(spec: TableSpec): Markup {
  const numeric = spec.columns.map((_, c) => spec.rows.some((row) => typeof row[c] === 'number'));
  const cls = (c: number) => (numeric[c] === true ? markup` class="num"` : '');
  const head = spec.columns.map((col, c) => markup`<th scope="col"${cls(c)}>${col.header}${col.unit !== undefined && markup` <span class="unit">[${col.unit}]</span>`}</th>`);
  const body = spec.rows.map(
    (row) =>
      markup`<tr>${spec.columns.map((col, c) => {
        const cell = row[c] ?? null;
        const text = cell === null ? '\u2013' : typeof cell === 'number' ? (col.decimals === undefined ? numberText(cell, 3) : tickLabel(cell, col.decimals)) : cell;
        return markup`<td${cls(c)}>${text}</td>`;
      })}</tr>`,
  );
  return markup`<table>${spec.caption !== undefined && markup`<caption>${spec.caption}</caption>`}
<thead><tr>${head}</tr></thead>
<tbody>
${joinMarkup(body)}
</tbody>
</table>`;
}

/** A list of named values (`dl`), e.g. a summary: [['orders', '12 buys, 10 sells'], ...]. */
export function factList(items: readonly (readonly [string, string])[]): Markup {
  return markup`<dl class="facts">${items.map(([term, value]) => markup`<dt>${term}</dt><dd>${value}</dd>`)}</dl>`;
}
