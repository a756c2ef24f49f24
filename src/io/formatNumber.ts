/**
 * Deterministic decimal text for output files: at most `digits` decimals, trailing zeros dropped,
 * no negative zero, no exponent for ordinary magnitudes. The same value always gives the same text.
 */
export function formatNumber(value: number, digits = 6): string {
  if (!Number.isFinite(value)) return String(value);
  const text = value.toFixed(digits);
  const trimmed = text.includes('.') ? text.replace(/0+$/, '').replace(/\.$/, '') : text;
  return trimmed === '-0' ? '0' : trimmed;
}

/** A CSV line from cells; cells are plain (no commas or quotes) by construction of our writers. */
export function csvLine(cells: readonly (string | number)[]): string {
  return cells.map((cell) => (typeof cell === 'number' ? formatNumber(cell) : cell)).join(',');
}
