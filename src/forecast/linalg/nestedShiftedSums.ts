/**
 * Shifted sums and upper-triangle cross-products of m columns over nested row counts (the first
 * counts[w] rows), in one pass: per count w, sums[w][j] = sum_i r_ij and products[w][j * m + l] =
 * sum_i r_ij r_il (l >= j) over rows i < counts[w], r_i the shifted row that `shiftedRow` writes.
 * The shifted-data algorithm of Chan, Golub and LeVeque (1983) leaves the shift to the caller.
 *
 * @param shiftedRow writes row i, minus the caller's shift, into `out` (length m)
 */
export function nestedShiftedSums(counts: readonly number[], m: number, shiftedRow: (i: number, out: Float64Array) => void): { sums: Float64Array[]; products: Float64Array[] } {
  const sums = new Float64Array(m);
  const products = new Float64Array(m * m);
  const row = new Float64Array(m);
  const out = { sums: [] as Float64Array[], products: [] as Float64Array[] };
  let i = 0;
  for (const count of counts) {
    for (; i < count; i++) {
      shiftedRow(i, row);
      for (let j = 0; j < m; j++) {
        const rj = row[j] as number;
        sums[j] = (sums[j] as number) + rj;
        for (let l = j; l < m; l++) products[j * m + l] = (products[j * m + l] as number) + rj * (row[l] as number);
      }
    }
    out.sums.push(Float64Array.from(sums));
    out.products.push(Float64Array.from(products));
  }
  return out;
}
