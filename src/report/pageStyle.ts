import { INK } from './palette.js';

/**
 * The page's one style sheet, inline: screen layout, then a print style sheet (A4, charts and
 * table rows kept whole, navigation hidden, colours printed as shown). No fonts are loaded: the
 * reader's own sans-serif face is used.
 */
export const PAGE_STYLE = `
:root { color-scheme: light; }
* { box-sizing: border-box; }
body { margin: 0 auto; max-width: 1000px; padding: 24px 20px 48px; font-family: system-ui, sans-serif; font-size: 15px; line-height: 1.45; color: ${INK.text}; background: ${INK.paper}; }
header h1 { font-size: 1.6rem; margin: 0 0 0.25rem; }
header p { margin: 0; color: ${INK.muted}; }
nav ol { margin: 0.75rem 0 0; padding: 0; list-style: none; display: flex; flex-wrap: wrap; gap: 0.25rem 1.25rem; }
nav a { color: #0b5394; }
section { margin-top: 2rem; }
h2 { font-size: 1.2rem; margin: 0 0 0.5rem; padding-bottom: 0.2rem; border-bottom: 1px solid ${INK.grid}; }
p { margin: 0.4rem 0 0.8rem; }
figure.chart-figure { margin: 0.5rem 0 1.25rem; }
figure.chart-figure svg { display: block; max-width: 100%; height: auto; }
table { border-collapse: collapse; margin: 0.5rem 0 1rem; font-variant-numeric: tabular-nums; }
caption { text-align: left; font-weight: 600; padding-bottom: 0.3rem; }
th, td { padding: 0.2rem 0.7rem; border-bottom: 1px solid ${INK.grid}; vertical-align: top; }
th { text-align: left; font-weight: 600; border-bottom: 2px solid ${INK.axis}; }
th .unit { font-weight: normal; color: ${INK.muted}; }
td.num, th.num { text-align: right; }
tbody tr:nth-child(even) { background: #f6f6f6; }
dl.facts { display: grid; grid-template-columns: max-content 1fr; gap: 0.2rem 1.25rem; margin: 0.5rem 0 1rem; }
dl.facts dt { color: ${INK.muted}; }
dl.facts dd { margin: 0; font-variant-numeric: tabular-nums; }
footer { margin-top: 2.5rem; padding-top: 0.5rem; border-top: 1px solid ${INK.grid}; color: ${INK.muted}; font-size: 0.85rem; }
@page { size: A4; margin: 14mm 12mm; }
@media print {
  body { max-width: none; padding: 0; font-size: 10pt; }
  nav { display: none; }
  a { color: inherit; text-decoration: none; }
  h2 { break-after: avoid; }
  figure.chart-figure, tr, dl.facts { break-inside: avoid; }
  thead { display: table-header-group; }
  tbody tr:nth-child(even) { background: none; }
  * { print-color-adjust: exact; -webkit-print-color-adjust: exact; }
}
`;
