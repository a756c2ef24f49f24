/**
 * The result with the highest number in `column`; cells that are not numbers (empty, `none`) take no
 * part; on a tie the first in the order given (grid order). Null when no result has a number there.
 */
export function bestResult<T extends { readonly row: Readonly<Record<string, unknown>> }>(results: readonly T[], column: string): T | null {
  let best: T | null = null;
  let bestValue = Number.NEGATIVE_INFINITY;
  for (const result of results) {
    const value = result.row[column];
    if (typeof value === 'number' && (best === null || value > bestValue)) {
      best = result;
      bestValue = value;
    }
  }
  return best;
}
