import { describe, expect, it } from 'vitest';
import { dailyProfitStats } from '../../src/backtest/dailyProfitStats.js';
import { edgeTest, profitDifference } from '../../src/backtest/edgeTest.js';

describe('dailyProfitStats', () => {
  it('a five-day series worked by hand', () => {
    // Profits 10, -5, 20, -30, 5: mean 0; squares of deviations 100 + 25 + 400 + 900 + 25 = 1450, sample
    // variance 1450 / 4 = 362.5. Sorted -30, -5, 5, 10, 20; 5% quantile (Hyndman-Fan 7): h = 4 x 0.05 = 0.2,
    // -30 + 0.2 x (-5 - -30) = -25. Cumulative 10, 5, 25, -5, 0: peak 25, lowest after it -5: drawdown 30.
    const stats = dailyProfitStats(Object.freeze([10, -5, 20, -30, 5]));
    expect(stats.mean).toBeCloseTo(0, 12);
    expect(stats.standardDeviation).toBeCloseTo(Math.sqrt(362.5), 12);
    expect(stats.worstDay5Percent).toBeCloseTo(-25, 12);
    expect(stats.maxDrawdown).toBeCloseTo(30, 12);
  });

  it('the drawdown counts from zero before the first day; a rising series has none', () => {
    expect(dailyProfitStats([-7, 3]).maxDrawdown).toBe(7);
    expect(dailyProfitStats([1, 2, 3]).maxDrawdown).toBe(0);
  });

  it('limit cases: no days, one day', () => {
    expect(dailyProfitStats([])).toEqual({ mean: null, standardDeviation: null, worstDay5Percent: null, maxDrawdown: 0 });
    expect(dailyProfitStats([4])).toEqual({ mean: 4, standardDeviation: null, worstDay5Percent: 4, maxDrawdown: 0 });
  });
});

describe('edgeTest (Diebold-Mariano with the HLN correction, h = 1)', () => {
  it('three days with d = 1, 2, 3 against the closed form of Student t with 2 degrees of freedom', () => {
    // d = quantile - point = 1, 2, 3: mean 2, gamma_0 = (1 + 0 + 1) / 3 = 2/3, DM = 2 / sqrt((2/3) / 3) = 3 sqrt(2),
    // HLN = DM sqrt((n + 1 - 2h + h(h - 1)/n) / n) = 3 sqrt(2) sqrt(2/3) = 2 sqrt(3).
    // For t with 2 degrees of freedom the density is Gamma(3/2) / (sqrt(2 pi) Gamma(1)) (1 + t^2/2)^(-3/2)
    // = (2 + t^2)^(-3/2) (Student 1908), whose integral is F(t) = 1/2 + t / (2 sqrt(2 + t^2)) (derived
    // here: d/dt t / (2 sqrt(2 + t^2)) = (2 + t^2)^(-3/2), and F(0) = 1/2 by symmetry), so
    // P(T >= 2 sqrt(3)) = 1/2 - 2 sqrt(3) / (2 sqrt(14)) = 1/2 - sqrt(3/14).
    const edge = edgeTest({ name: 'quantile', dailyProfit: [11, 12, 13] }, { name: 'point', dailyProfit: [10, 10, 10] });
    expect(edge.status).toBe('ok');
    if (edge.status !== 'ok') return;
    expect(edge.meanDifference).toBeCloseTo(2, 12);
    expect(edge.dm).toBeCloseTo(3 * Math.SQRT2, 10);
    expect(edge.hln).toBeCloseTo(2 * Math.sqrt(3), 10);
    expect(edge.pValueOneSided).toBeCloseTo(0.5 - Math.sqrt(3 / 14), 8);
  });

  it('swapping the policies flips the sign: the one-sided p-values add up to 1', () => {
    const a = { name: 'a', dailyProfit: [5, -2, 7, 1, 3, 0] };
    const b = { name: 'b', dailyProfit: [1, 1, 2, 2, -1, 0] };
    const ab = edgeTest(a, b);
    const ba = edgeTest(b, a);
    if (ab.status !== 'ok' || ba.status !== 'ok') throw new Error('expected ok');
    expect(ab.hln).toBeCloseTo(-ba.hln, 12);
    expect(ab.pValueOneSided + ba.pValueOneSided).toBeCloseTo(1, 12);
  });

  it('the p-value that the reference earns more is P(T <= HLN), the swapped test\'s p that it earns more', () => {
    // d = 1, 2, 3, -2 (tested minus reference): HLN = sqrt(6/7) with 3 df, P(T_3 >= HLN) = 0.21141313088605126
    // (SciPy 1.17.1 t.sf, and Abramowitz and Stegun 26.7.3 by hand in test/stats/dieboldMariano.test.ts),
    // so P(T_3 <= HLN) = 1 - 0.21141313088605126 = 0.78858686911394874.
    const edge = edgeTest({ name: 'q', dailyProfit: [1, 2, 3, -2] }, { name: 'p', dailyProfit: [0, 0, 0, 0] });
    if (edge.status !== 'ok') throw new Error('expected ok');
    expect(edge.pValueTestedEarnsMore).toBeCloseTo(0.21141313088605126, 14);
    expect(edge.pValueReferenceEarnsMore).toBeCloseTo(0.78858686911394874, 14);
    // Far apart: the reference's p is tiny but never rounded to 0, and equals the swapped test's.
    const low = { name: 'low', dailyProfit: [1, 2, 1.5, 2.5, 1, 2, 1.2, 1.8, 1.4, 1.6] };
    const high = { name: 'high', dailyProfit: low.dailyProfit.map((x, i) => x + 1000 + (i % 3)) };
    const lowHigh = edgeTest(low, high);
    const highLow = edgeTest(high, low);
    if (lowHigh.status !== 'ok' || highLow.status !== 'ok') throw new Error('expected ok');
    expect(lowHigh.pValueReferenceEarnsMore).toBeGreaterThan(0);
    expect(lowHigh.pValueReferenceEarnsMore).toBeLessThan(1e-12);
    expect(lowHigh.pValueReferenceEarnsMore).toBe(highLow.pValueTestedEarnsMore);
  });

  it('says why when the test cannot be made', () => {
    expect(edgeTest({ name: 'q', dailyProfit: [3] }, { name: 'p', dailyProfit: [1] })).toMatchObject({ status: 'too-few-days', n: 1, meanDifference: 2 });
    expect(edgeTest({ name: 'q', dailyProfit: [3, 4] }, { name: 'p', dailyProfit: [1, 2] })).toMatchObject({ status: 'zero-variance' });
  });

  it('the same trades summed in another order tie: differences of floating-point rounding are not tested as an edge', () => {
    // In IEEE 754 binary64, 0.1 + 0.2 = 0.30000000000000004, not 0.3 (IEEE 754-2008; the classic
    // example, e.g. Goldberg 1991, "What every computer scientist should know about floating-point
    // arithmetic"): one day's cash summed in two orders differs by 5.6e-17.
    expect(0.1 + 0.2 - 0.3).not.toBe(0);
    const tested = { name: 'auto', dailyProfit: [0.1 + 0.2, 359.16, 405] };
    const reference = { name: 'price-taking', dailyProfit: [0.3, 359.16, 405] };
    expect(edgeTest(tested, reference)).toMatchObject({ status: 'zero-variance', meanDifference: 0 });
    expect(profitDifference(0.1 + 0.2, 0.3)).toBe(0);
    // A real difference, a millionth of the currency on a day of 405, is kept.
    expect(profitDifference(405.000001, 405)).toBeCloseTo(1e-6, 12);
    expect(edgeTest({ name: 'a', dailyProfit: [405.000001, 359.16, 405] }, { name: 'b', dailyProfit: [405, 359.16, 405] }).status).toBe('ok');
  });
});
