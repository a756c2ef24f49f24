import { describe, expect, it } from 'vitest';
import { bisectRoot, irr, npv, type IrrResult } from '../../src/economics/index.js';

/** Linear congruential generator x <- (1664525 x + 1013904223) mod 2^32 (Press et al. 2007, sec. 7.1), in [0, 1). */
function lcg(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(1664525, state) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
}

/** A conventional project: one investment at t = 0, then 1 to 30 positive yearly flows. */
function conventionalFlows(random: () => number): number[] {
  const years = 1 + Math.floor(random() * 30);
  const flows = [-(50 + 100 * random())];
  for (let t = 1; t <= years; t++) flows.push(5 + 55 * random());
  return flows;
}

function rateOf(result: IrrResult): number {
  if (result.status !== 'found') throw new Error(`expected an IRR, got: ${result.reason}`);
  return result.rate;
}

describe('irr', () => {
  it('gives irr([-100, 39, 59, 55, 20]) = 0.2809484211599611 (numpy-financial convention; numpy 2.4.6 roots, numpyReferenceValues.py)', () => {
    // numpy 2.4.6 np.roots([-100, 39, 59, 55, 20]) has the real root x = 1.280948421159962 = 1 + r
    // (test/economics/numpyReferenceValues.py prints it); from memory, the same value is numpy-financial's docstring example.
    const flows = Object.freeze([-100, 39, 59, 55, 20]);
    const rate = rateOf(irr(flows));
    expect(rate).toBeCloseTo(0.28095, 5);
    expect(rate).toBeCloseTo(0.2809484211599611, 12);
    expect(Math.abs(npv(rate, flows))).toBeLessThan(1e-9);
  });

  it('solves closed forms: 10% for [-100, 110] and [-100, 0, 121]', () => {
    expect(rateOf(irr([-100, 110]))).toBeCloseTo(0.1, 14);
    expect(rateOf(irr([-100, 0, 121]))).toBeCloseTo(0.1, 14);
  });

  it('finds both rates of [-100, 230, -132], roots of (1 + r)^2 - 2.3 (1 + r) + 1.32 = 0 at 10% and 20%', () => {
    const result = irr([-100, 230, -132]);
    expect(result.status).toBe('found');
    if (result.status === 'found') {
      expect(result.rates).toHaveLength(2);
      expect(result.rates[0]).toBeCloseTo(0.1, 12);
      expect(result.rates[1]).toBeCloseTo(0.2, 12);
      expect(result.rate).toBeCloseTo(0.1, 12);
    }
  });

  it("returns 'none' when the flows never change sign", () => {
    expect(irr([100, 20, 30])).toMatchObject({ status: 'none', reason: expect.stringMatching(/never change sign/) });
    expect(irr([-100, -20, 0]).status).toBe('none');
  });

  it("returns 'none' when the root lies outside the scanned range", () => {
    // [-100, 0.5] has IRR 0.5/100 - 1 = -0.995, below the default lower end -0.99.
    expect(irr([-100, 0.5])).toMatchObject({ status: 'none', reason: expect.stringMatching(/-0.99 to 10/) });
    expect(rateOf(irr([-100, 0.5], { minRate: -0.999 }))).toBeCloseTo(-0.995, 12);
  });

  it('makes NPV zero to 1e-9, and NPV falls as the rate rises, for 300 seeded conventional projects', () => {
    const random = lcg(20240611);
    for (let trial = 0; trial < 300; trial++) {
      const flows = conventionalFlows(random);
      const rate = rateOf(irr(flows));
      expect(Math.abs(npv(rate, flows))).toBeLessThan(1e-9);
      let previous = npv(-0.9, flows);
      for (let r = -0.85; r <= 3; r += 0.05) {
        const value = npv(r, flows);
        expect(value).toBeLessThan(previous);
        previous = value;
      }
    }
  });

  it('rejects malformed options and flows', () => {
    expect(() => irr([-1])).toThrow(/invalid argument 'cashFlows'/);
    expect(() => irr([-1, 2], { step: 0 })).toThrow(/invalid argument 'options.step'/);
    expect(() => irr([-1, 2], { minRate: -1 })).toThrow(/invalid argument 'options.minRate'/);
    expect(() => irr([-1, 2], { maxRate: -0.995 })).toThrow(/invalid argument 'options.maxRate'/);
  });
});

describe('bisectRoot', () => {
  it('finds sqrt(2) and cos(x) = x (Dottie number 0.7390851332151607, closed-form fixed point)', () => {
    expect(bisectRoot((x) => x * x - 2, 0, 2)).toBeCloseTo(Math.SQRT2, 14);
    const dottie = bisectRoot((x) => Math.cos(x) - x, 0, 1);
    expect(Math.cos(dottie)).toBeCloseTo(dottie, 14);
  });

  it('rejects a bracket without a sign change', () => {
    expect(() => bisectRoot((x) => x * x + 1, -1, 1)).toThrow(/a bracket where f changes sign/);
  });
});
