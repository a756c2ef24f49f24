import { describe, expect, it } from 'vitest';
import { standardiseCentredSums, standardisedGram, type StandardisedGram } from '../../src/forecast/linalg/standardisedGram.js';
import { twoByFourProducts } from '../../src/forecast/linalg/twoByFourProducts.js';
import { seededNormal } from './seededRandom.js';

/**
 * The plain reference: means in a first pass, then the centred products added row by row, one row at a
 * time into every sum (Chan, Golub and LeVeque 1983's two-pass algorithm written out).
 */
function referenceGram(data: Float64Array, n: number, k: number, y: Float64Array): StandardisedGram {
  const means = new Float64Array(k);
  let yMean = 0;
  for (let i = 0; i < n; i++) {
    yMean += y[i] as number;
    for (let j = 0; j < k; j++) means[j] = (means[j] as number) + (data[i * k + j] as number);
  }
  yMean /= n;
  for (let j = 0; j < k; j++) means[j] = (means[j] as number) / n;
  const gram = new Float64Array(k * k);
  const cy = new Float64Array(k);
  let ySquares = 0;
  for (let i = 0; i < n; i++) {
    const dy = (y[i] as number) - yMean;
    ySquares += dy * dy;
    const row = Array.from({ length: k }, (_, j) => (data[i * k + j] as number) - (means[j] as number));
    for (let j = 0; j < k; j++) {
      cy[j] = (cy[j] as number) + (row[j] as number) * dy;
      for (let l = j; l < k; l++) gram[j * k + l] = (gram[j * k + l] as number) + (row[j] as number) * (row[l] as number);
    }
  }
  return standardiseCentredSums(n, means, yMean, gram, cy, ySquares);
}

const sameBits = (a: ArrayLike<number>, b: ArrayLike<number>) => a.length === b.length && Array.from(a).every((v, i) => Object.is(v, b[i]));

describe('standardisedGram', () => {
  // Odd and even column counts (two columns against four per pass), a constant column, wide spreads of scale.
  it.each([
    [1, 7],
    [2, 40],
    [5, 333],
    [7, 1000],
    [8, 64],
  ])('gives the plain row-by-row sums bit for bit, k = %i columns, n = %i rows', (k, n) => {
    const z = seededNormal(10 + k);
    const data = Float64Array.from({ length: n * k }, (_, c) => (c % k === 1 ? 4.25 : 100 * (c % k) + (1 + (c % k)) * z()));
    const y = Float64Array.from({ length: n }, () => 50 + 5 * z());
    const got = standardisedGram({ rows: n, cols: k, data }, y);
    const want = referenceGram(data, n, k, y);
    for (const field of ['means', 'scales', 'gram', 'zty'] as const) expect(sameBits(got[field], want[field]), field).toBe(true);
    expect(Object.is(got.yMean, want.yMean) && Object.is(got.yVariance, want.yVariance)).toBe(true);
  });
});

describe('twoByFourProducts', () => {
  it('gives every sum of products over the leading rows, added in row order (the plain sum), bit for bit at every count', () => {
    const z = seededNormal(77);
    const n = 301;
    const cols = Float64Array.from({ length: 7 * n }, (_, c) => 1e3 * Math.floor(c / n) + z());
    const offsets = { p: [0, 3 * n], q: [n, 2 * n, 5 * n, 6 * n] };
    const counts = [1, 150, 299, 301];
    const out = new Float64Array(8 * counts.length);
    twoByFourProducts(cols, offsets.p[0]!, offsets.p[1]!, offsets.q[0]!, offsets.q[1]!, offsets.q[2]!, offsets.q[3]!, counts, out);
    counts.forEach((count, w) => {
      for (let r = 0; r < 2; r++) {
        for (let t = 0; t < 4; t++) {
          let plain = 0;
          for (let i = 0; i < count; i++) plain += cols[offsets.p[r]! + i]! * cols[offsets.q[t]! + i]!;
          expect(Object.is(out[8 * w + 4 * r + t], plain), `window ${w}, row ${r}, column ${t}`).toBe(true);
        }
      }
    });
  });
});
