// The known-markets bench's expected pinball loss (bench/knownMarkets/expectedPinball.js) against closed
// forms. For Y ~ N(m, s^2) and z = (q - m) / s, the expected pinball loss of q at level tau is
//   E[rho_tau(Y - q)] = tau (m - q) + E[(q - Y)_+] = s (phi(z) + z (Phi(z) - tau)),
// using the normal's first lower partial moment E[(q - Y)_+] = s (z Phi(z) + phi(z)) (a textbook closed
// form: integrate (q - y) phi((y - m) / s) / s over y < q). For Y uniform on [a, b] and a <= q <= b,
// E[(q - Y)_+] = (q - a)^2 / (2 (b - a)) and E[Y] = (a + b) / 2. For a mixture both are the mixture of
// the parts'. The pinball loss's expectation as tau (mu - q) + integral of F below q: Gneiting and
// Raftery (2007), JASA 102(477), 359-378, section 9 (by parts).
import { describe, expect, it } from 'vitest';
import { normalCdf } from '../../src/stats/normalCdf.js';
// @ts-expect-error the bench is plain JavaScript without declarations
import { adaptiveSimpson, expectedPinballExcess, expectedPinballRow, periodLaw } from '../../bench/knownMarkets/expectedPinball.js';

const phi = (z: number): number => Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);
const normalLoss = (m: number, s: number, tau: number, q: number): number => {
  const z = (q - m) / s;
  return s * (phi(z) + z * (normalCdf(z) - tau));
};

/** A setting with a linear merit order (gamma 0): the base price is N(c + beta (mu - y0), (beta sd)^2). */
const linearSetting = (spikesDown: { p0: number; low: number; high: number }) => ({
  price: { beta: 10, y0: 1, gamma: 0, knee: 100 },
  market: { floor: -500, cap: 3000 },
  noise: {},
  spikes: { up: { p0: 0, p1: 0, low: 1000, shape: 2 }, down: spikesDown },
});

describe('expected pinball loss under a known law', () => {
  it('adaptive Simpson integrates a normal density to its CDF (Phi(1) = 0.8413447461, Abramowitz and Stegun 1964, table 26.1; the value from memory)', () => {
    expect(adaptiveSimpson(phi, -12, 1)).toBeCloseTo(0.8413447461, 9);
  });

  it('matches the normal closed form at every level, in the tails and beyond', () => {
    const setting = linearSetting({ p0: 0, low: -100, high: 0 });
    const law = { c: 30, mu: 4, sd: 0.5, pUp: 0, pDown: 0 };
    const m = 30 + 10 * (4 - 1);
    const s = 10 * 0.5;
    const integrable = periodLaw(law, setting, normalCdf);
    for (const tau of [0.05, 0.3, 0.5, 0.9]) {
      for (const q of [m - 20, m - 3, m, m + 1.7, m + 25]) {
        expect(expectedPinballRow(integrable, m, [tau], [q])).toBeCloseTo(normalLoss(m, s, tau, q), 9);
      }
    }
  });

  it('matches the closed form of a normal and uniform mixture across the uniform part\'s ends', () => {
    const pDown = 0.3;
    const setting = linearSetting({ p0: 1, low: -100, high: 20 });
    const law = { c: 30, mu: 4, sd: 0.5, pUp: 0, pDown };
    const m = 60;
    const s = 5;
    const integrable = periodLaw(law, setting, normalCdf);
    const uniformBelow = (q: number): number => (q <= -100 ? 0 : q >= 20 ? q - -40 : (q + 100) ** 2 / (2 * 120));
    const mean = (1 - pDown) * m + pDown * -40;
    for (const tau of [0.1, 0.5, 0.95]) {
      for (const q of [-150, -60, 10, 55, 62, 80]) {
        const normalBelow = s * (((q - m) / s) * normalCdf((q - m) / s) + phi((q - m) / s));
        const exact = tau * (mean - q) + (1 - pDown) * normalBelow + pDown * uniformBelow(q);
        expect(expectedPinballRow(integrable, mean, [tau], [q])).toBeCloseTo(exact, 8);
      }
    }
  });

  it('sums a period\'s levels stretch by stretch to the normal closed forms, quantiles in any order', () => {
    const setting = linearSetting({ p0: 0, low: -100, high: 0 });
    const law = { c: 30, mu: 4, sd: 0.5, pUp: 0, pDown: 0 };
    const integrable = periodLaw(law, setting, normalCdf);
    const levels = [0.1, 0.5, 0.9, 0.3];
    const quantiles = [52, 61, 58, 40];
    const exact = levels.reduce((sum, tau, k) => sum + normalLoss(60, 5, tau, quantiles[k] as number), 0);
    expect(expectedPinballRow(integrable, 60, levels, quantiles)).toBeCloseTo(exact, 8);
  });

  it('gives the excess over a reference quantile as the difference of the two losses, and none at the true quantile', () => {
    const setting = linearSetting({ p0: 0, low: -100, high: 0 });
    const law = { c: 30, mu: 4, sd: 0.5, pUp: 0, pDown: 0 };
    const integrable = periodLaw(law, setting, normalCdf);
    const m = 60;
    const trueQ = m + 5 * 1.2815515655446004; // the 0.9-quantile of N(60, 25); z_0.9 = 1.2815515655446004 (Abramowitz and Stegun 1964, table 26.5; from memory).
    expect(expectedPinballExcess(integrable, 0.9, trueQ, trueQ)).toBe(0);
    for (const q of [trueQ - 4, trueQ + 2.5]) {
      const excess = expectedPinballExcess(integrable, 0.9, q, trueQ);
      expect(excess).toBeGreaterThan(0);
      expect(excess).toBeCloseTo(normalLoss(m, 5, 0.9, q) - normalLoss(m, 5, 0.9, trueQ), 10);
    }
  });
});
