import { describe, expect, it } from 'vitest';
import { huberClipLimit } from '../../src/forecast/models/driverRegression.js';

describe("Huber's clipping point of the driver regression's one-step Huber estimate (Bickel 1975)", () => {
  it('matches SciPy: 1.345 x median_abs_deviation(r, scale="normal") (huberReference.py, SciPy 1.17.1)', () => {
    const r = Float64Array.of(0.3, -1.2, 0.8, 5.0, -0.1, 0.4, -0.6, 2.2, -7.5, 0.05, 1.1);
    expect(huberClipLimit(r)).toBeCloseTo(1.5952799871120278, 12);
  });

  it('hand-worked, even count: r = 1, 2, 3, 10 takes the upper middle value 3, then MAD 2, limit 1.345 x 2 / 0.674490 = 3.9882', () => {
    // Phi^-1(3/4) = 0.6744897501960817 (standard normal table).
    expect(huberClipLimit(Float64Array.of(10, 1, 3, 2))).toBeCloseTo((1.345 * 2) / 0.6744897501960817, 12);
  });

  it('ignores how far an outlier lies: moving the largest residual from 5 to 500 leaves the limit unchanged (a law of the MAD)', () => {
    const r = Float64Array.of(0.3, -1.2, 0.8, 5.0, -0.1, 0.4, -0.6, 2.2, -7.5, 0.05, 1.1);
    const far = Float64Array.from(r, (v) => (v === 5 ? 500 : v));
    expect(huberClipLimit(far)).toBe(huberClipLimit(r));
  });
});
