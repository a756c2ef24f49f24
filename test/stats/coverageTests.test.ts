// SciPy 1.17.1 / NumPy 2.4.6 values below are printed by test/stats/scipyReferenceValues.py.
import { describe, expect, it } from 'vitest';
import {
  bernoulliLogLikelihood,
  christoffersenFromCounts,
  christoffersenFromHits,
  kupiecPof,
  transitionCounts,
} from '../../src/stats/index.js';

describe('kupiecPof', () => {
  it('matches the SciPy 1.17 check values', () => {
    // SciPy 1.17 (scipy.special.xlogy, scipy.stats.chi2.sf), computed for this check.
    const a = kupiecPof(100, 15, 0.1);
    expect(a.lr).toBeCloseTo(2.44702, 5);
    expect(a.pValue).toBeCloseTo(0.11775, 5);
    expect(a.observedRate).toBe(0.15);
    const b = kupiecPof(250, 20, 0.05);
    expect(b.lr).toBeCloseTo(4.03952, 5);
    expect(b.pValue).toBeCloseTo(0.04445, 5);
  });

  it('handles x = 0 and x = n with 0 log 0 = 0 (closed forms)', () => {
    // x = 0: LR = -2 n ln(1 - p) = -100 ln 0.95 = 5.12933; SciPy 1.17.1 chi2.sf gives p = 0.023524814497812255.
    const none = kupiecPof(50, 0, 0.05);
    expect(none.lr).toBeCloseTo(-100 * Math.log(0.95), 13);
    expect(none.pValue).toBeCloseTo(0.023524814497812255, 13);
    // x = n: LR = -2 n ln p = -40 ln 0.9 = 4.21442; SciPy 1.17.1 chi2.sf gives p = 0.04008175214527546.
    const all = kupiecPof(20, 20, 0.9);
    expect(all.lr).toBeCloseTo(-40 * Math.log(0.9), 13);
    expect(all.pValue).toBeCloseTo(0.04008175214527546, 13);
  });

  it('gives LR = 0 and p = 1 when the observed rate equals p', () => {
    const r = kupiecPof(200, 10, 0.05);
    expect(r.lr).toBe(0);
    expect(r.pValue).toBe(1);
  });

  it('rejects impossible counts and rates', () => {
    expect(() => kupiecPof(0, 0, 0.1)).toThrow(/invalid argument 'n'/);
    expect(() => kupiecPof(10, 11, 0.1)).toThrow(/invalid argument 'failures'/);
    expect(() => kupiecPof(10, 2.5, 0.1)).toThrow(/invalid argument 'failures'/);
    expect(() => kupiecPof(10, 2, 1)).toThrow(/invalid argument 'expectedRate'/);
  });
});

describe('bernoulliLogLikelihood', () => {
  it('is n0 ln(1 - pi) + n1 ln(pi) with 0 ln 0 = 0', () => {
    expect(bernoulliLogLikelihood(3, 2, 0.25)).toBeCloseTo(3 * Math.log(0.75) + 2 * Math.log(0.25), 14);
    expect(bernoulliLogLikelihood(10, 0, 0)).toBe(0);
    expect(bernoulliLogLikelihood(0, 4, 1)).toBe(0);
  });
});

describe('Christoffersen tests', () => {
  it('match the SciPy 1.17 check values from transition counts', () => {
    // SciPy 1.17, computed for this check: LR_ind = 12.0714, LR_cc = 12.0714, p_cc = 0.00239.
    // By hand: pi01 = 10/80, pi11 = 10/20, pi = 20/100 = p, so LR_uc = 0 and LR_cc = LR_ind =
    // -2 [80 ln 0.8 + 20 ln 0.2 - (70 ln(7/8) + 10 ln(1/8) + 20 ln(1/2))]; with 2 df the p-value is exp(-LR/2).
    const counts = Object.freeze({ n00: 70, n01: 10, n10: 10, n11: 10 });
    const r = christoffersenFromCounts(counts, 0.2);
    const byHand =
      -2 * (80 * Math.log(0.8) + 20 * Math.log(0.2) - (70 * Math.log(7 / 8) + 10 * Math.log(1 / 8) + 20 * Math.log(0.5)));
    expect(r.pi01).toBe(0.125);
    expect(r.pi11).toBe(0.5);
    expect(r.lrIndependence).toBeCloseTo(12.0714, 4);
    expect(r.lrIndependence).toBeCloseTo(byHand, 12);
    expect(r.lrUnconditional).toBe(0);
    expect(r.lrConditionalCoverage).toBeCloseTo(12.0714, 4);
    expect(r.pValueConditionalCoverage).toBeCloseTo(0.00239, 5);
    expect(r.pValueConditionalCoverage).toBeCloseTo(Math.exp(-byHand / 2), 14);
  });

  it('count transitions from a hit sequence and handle n11 = 0 (0 log 0 = 0)', () => {
    // Transitions of 0 0 0 1 0 0 1 0 0 0: 00 00 01 10 00 01 10 00 00 -> n00 = 5, n01 = 2, n10 = 2, n11 = 0.
    // SciPy 1.17.1 (special.xlogy, stats.chi2.sf) on these counts with p = 0.1:
    // LR_ind = 1.1589373428441796 (p 0.2816860352213063), LR_uc = 1.1506760081479683,
    // LR_cc = 2.309613350992148 (p 0.3151184511333603).
    const hits = Object.freeze([0, 0, 0, 1, 0, 0, 1, 0, 0, 0]);
    const r = christoffersenFromHits(hits, 0.1);
    expect(r.counts).toEqual({ n00: 5, n01: 2, n10: 2, n11: 0 });
    expect(r.lrIndependence).toBeCloseTo(1.1589373428441796, 13);
    expect(r.pValueIndependence).toBeCloseTo(0.2816860352213063, 13);
    expect(r.lrUnconditional).toBeCloseTo(1.1506760081479683, 13);
    expect(r.lrConditionalCoverage).toBeCloseTo(2.309613350992148, 13);
    expect(r.pValueConditionalCoverage).toBeCloseTo(0.3151184511333603, 13);
    // LR_uc is Kupiec's statistic on the T - 1 counted observations.
    expect(r.lrUnconditional).toBeCloseTo(kupiecPof(9, 2, 0.1).lr, 14);
  });

  it('accept booleans as hits and give LR_ind = 0 for a sequence without hits', () => {
    expect(transitionCounts([false, true, true, false])).toEqual({ n00: 0, n01: 1, n10: 1, n11: 1 });
    const r = christoffersenFromHits([0, 0, 0, 0, 0], 0.05);
    expect(r.lrIndependence).toBe(0);
    expect(r.lrUnconditional).toBeCloseTo(-8 * Math.log(0.95), 14);
  });

  it('reject malformed hits and counts', () => {
    expect(() => transitionCounts([1])).toThrow(/invalid argument 'hits'/);
    expect(() => transitionCounts([0, 2])).toThrow(/invalid argument 'hits\[1\]'/);
    expect(() => christoffersenFromCounts({ n00: 0, n01: 0, n10: 0, n11: 0 }, 0.1)).toThrow(/invalid argument 'counts'/);
    expect(() => christoffersenFromCounts({ n00: -1, n01: 0, n10: 0, n11: 3 }, 0.1)).toThrow(/'counts.n00'/);
    expect(() => christoffersenFromCounts({ n00: 1, n01: 0, n10: 0, n11: 3 }, 0)).toThrow(/'expectedRate'/);
  });
});
