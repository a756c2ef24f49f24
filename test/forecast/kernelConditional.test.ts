import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { driverSpreadQuantiles, spreadFeatures } from '../../src/forecast/quantiles/driverSpread.js';
import { kernelConditionalQuantiles } from '../../src/forecast/quantiles/kernelConditionalQuantiles.js';
import { sortedQuantile } from '../../src/forecast/quantiles/sortedQuantile.js';
import { seededNormal, seededRandom } from './seededRandom.js';

// Kernel conditional quantiles (Hall, Wolff and Yao 1999; Bhattacharya and Gangopadhyay 1990) and the
// 'level' pool of driver-fhs built on them.

/** The sample sorted by value (ties by index), with its states. */
function statedSample(values: readonly number[], states: readonly number[]) {
  const order = values.map((_, i) => i).sort((a, b) => values[a]! - values[b]! || a - b);
  return { sorted: Float64Array.from(order, (i) => values[i]!), states: Float64Array.from(order, (i) => states[i]!) };
}

describe('kernelConditionalQuantiles', () => {
  it('with a bandwidth wider than every distance it is Hyndman and Fan\'s definition 7: 1, 2, 3, 4 give 1.75 at 0.25 and 2.5 at 0.5 (R\'s quantile(1:4), Hyndman and Fan 1996)', () => {
    const q = kernelConditionalQuantiles({ sorted: [1, 2, 3, 4], states: [0, 1, 2, 3] }, 1.5, [0, 0.25, 0.5, 1], 1e9, 1, new Float64Array(4));
    [1, 1.75, 2.5, 4].forEach((want, k) => expect(q[k]).toBeCloseTo(want, 9));
  });

  it('unequal weights, worked by hand from the definition: Epanechnikov weights 1, 15/16, 3/4, 0 put 1, 2, 3 at the levels 0, 16/31, 1', () => {
    // target 0, h = 2: w = 1 - (x / 2)^2 for x = 0, 0.5, 1, 3 -> 1, 0.9375, 0.75, 0 (cut off).
    // span = C_last - w_last = 2.6875 - 0.75 = 1.9375; levels 0, 1 / 1.9375 = 16/31, 1.
    const q = kernelConditionalQuantiles({ sorted: [1, 2, 3, 4], states: [0, 0.5, 1, 3] }, 0, [0.25, 0.5, 16 / 31, 0.75, 1], 2, 1, new Float64Array(4));
    const at = (tau: number) => (tau <= 16 / 31 ? 1 + tau / (16 / 31) : 2 + (tau - 16 / 31) / (1 - 16 / 31));
    [0.25, 0.5, 16 / 31, 0.75, 1].forEach((tau, k) => expect(q[k]).toBeCloseTo(at(tau), 12));
    expect(q[4]).toBe(3); // the value of state 3 is outside the kernel's reach and never read
  });

  it('widens the bandwidth until the effective sample size (Kish 1965) is reached: a lone nearby value does not decide the quantiles', () => {
    const sample = statedSample([5, 1, 2, 3, 4], [0, 10, 10, 10, 10]);
    // h = 1 reaches only the value 5 (effective size 1); minEffective 3 makes the kernel take in the cluster at 10.
    expect(kernelConditionalQuantiles(sample, 0, [0.5], 1, 1, new Float64Array(5))).toEqual([5]);
    const wide = kernelConditionalQuantiles(sample, 0, [0.05, 0.5, 0.95], 1, 3, new Float64Array(5));
    expect(wide[0]).toBeLessThan(5);
    expect(wide[1]).toBeLessThan(5);
  });

  it('never crosses: non-decreasing in the level and within the values\' range (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.double({ min: -50, max: 50, noNaN: true }), fc.double({ min: -3, max: 3, noNaN: true })), { minLength: 1, maxLength: 60 }),
        fc.double({ min: -4, max: 4, noNaN: true }),
        fc.double({ min: 0.05, max: 3, noNaN: true }),
        fc.integer({ min: 1, max: 80 }),
        (pairs, target, h, minEffective) => {
          const sample = statedSample(pairs.map((p) => p[0]), pairs.map((p) => p[1]));
          const levels = [0, 0.05, 0.1, 0.3, 0.5, 0.7, 0.9, 0.95, 1];
          const q = kernelConditionalQuantiles(sample, target, levels, h, minEffective, new Float64Array(pairs.length));
          for (let k = 1; k < q.length; k++) expect(q[k]!).toBeGreaterThanOrEqual(q[k - 1]!);
          expect(q[0]!).toBeGreaterThanOrEqual(sample.sorted[0]!);
          expect(q[q.length - 1]!).toBeLessThanOrEqual(sample.sorted[sample.sorted.length - 1]!);
        },
      ),
      { seed: 15, numRuns: 300 },
    );
  });

  it('values independent of the state: at any target the quantiles are the pooled ones within sampling error, and near the normal quantiles (Phi^-1(0.05) = -1.6449, Phi^-1(0.75) = 0.6745; Abramowitz and Stegun 1964, table 26.1)', () => {
    const normal = seededNormal(7);
    const uniform = seededRandom(8);
    const n = 20000;
    const values = Array.from({ length: n }, () => normal());
    const states = Array.from({ length: n }, () => 4 * uniform() - 2);
    const sample = statedSample(values, states);
    const levels = [0.05, 0.25, 0.5, 0.75, 0.95];
    const pooled = levels.map((tau) => sortedQuantile(sample.sorted, tau));
    const weights = new Float64Array(n);
    for (const target of [-1.5, 0, 1.2]) {
      // About 5000 effective values: the sample quantile's standard error is below 0.04 at these levels.
      const q = kernelConditionalQuantiles(sample, target, levels, 0.5, 500, weights);
      q.forEach((v, k) => expect(Math.abs(v - pooled[k]!)).toBeLessThan(0.12));
      expect(q[0]).toBeCloseTo(-1.6449, 0);
      expect(q[3]).toBeCloseTo(0.6745, 0);
    }
  });

  it('values whose location and skew follow the state: the conditional median and quartiles follow them where the pooled ones cannot', () => {
    // u | x = x + E - 1, E standard exponential for x > 0 (median x + ln 2 - 1); u | x = x + N(0, 1) for x <= 0.
    const normal = seededNormal(9);
    const uniform = seededRandom(10);
    const n = 20000;
    const states = Array.from({ length: n }, () => 4 * uniform() - 2);
    const values = states.map((x) => (x > 0 ? x - Math.log(1 - uniform()) - 1 : x + normal()));
    const sample = statedSample(values, states);
    const weights = new Float64Array(n);
    const [lowQ1, lowMedian] = kernelConditionalQuantiles(sample, -1.5, [0.25, 0.5], 0.1, 200, weights);
    const [highQ1, highMedian] = kernelConditionalQuantiles(sample, 1.5, [0.25, 0.5], 0.1, 200, weights);
    // Closed forms: N(0, 1) quartile -0.6745; exponential quantile -ln(1 - tau): ln(4/3) = 0.2877, ln 2 = 0.6931.
    expect(lowMedian).toBeCloseTo(-1.5, 0);
    expect(lowQ1).toBeCloseTo(-1.5 - 0.6745, 0);
    expect(Math.abs(highMedian! - (1.5 + Math.LN2 - 1))).toBeLessThan(0.15);
    expect(Math.abs(highQ1! - (1.5 + Math.log(4 / 3) - 1))).toBeLessThan(0.15);
  });
});

// Invented inputs (formulas shared with test/forecast/kernelConditionalReference.py); the check values come
// from that script (NumPy 2.4.6: lstsq for Harvey's (1976) regression, argsort, cumsum and interp for the
// weighted quantiles).
const S = 24;
const DAYS = 30;
const LEVELS = [0.05, 0.25, 0.5, 0.75, 0.95];
const centre = (d: number, s: number) => Math.sin(0.7 * s + 0.3 * d) * 2 + 0.05 * d;
const exog = (d: number, s: number) => 20 + ((d * 5 + s * 2) % 9) * 1.5;
const error = (d: number, s: number) => {
  const base = (((d * 7 + s * 3) % 11) - 5) / 5;
  return base * (base < 0 && centre(d, s) < 0 ? 1.5 : 1) + 0.01 * s;
};
const slots = (f: (s: number) => number) => Float64Array.from({ length: S }, (_, s) => f(s));

const REFERENCE = [
  [-1.027781378862327, -0.45436169146571476, 0.08891487519647566, 0.6169811940748114, 1.0098531250185667],
  [0.5661203379218839, 1.0163414520204284, 1.4971635763635052, 1.9864859703717754, 2.4150579244974772],
  [1.3347088180764237, 1.7663654703402223, 2.2493413884115125, 2.711261153697576, 3.1258561334872983],
  [1.0174898488906132, 1.480660345483887, 1.9827484277955418, 2.508702582625679, 2.956012959916573],
  [-0.32886837951309256, 0.2421422367365358, 0.8346942430190674, 1.4195808635303626, 1.9263396658607777],
  [-2.0853006728908134, -1.3890450974152964, -0.6484115597506973, 0.04887682971457363, 0.6521845678733103],
  [-3.463589311355462, -2.634394174511484, -1.7748801441107358, -0.97085189058879, -0.3070931268636081],
  [-3.7777750856628973, -2.91025157642075, -2.0126538978456243, -1.1758589217481175, -0.5006384939431019],
  [-2.948379359320152, -2.1137408954153534, -1.2442693143558168, -0.4284868911898789, 0.2575244874210816],
  [-1.384022109313511, -0.5938136013963067, 0.16039151988894113, 0.8943685497635423, 1.4430260597425808],
  [0.27376168861162076, 0.8933321044073815, 1.5553959418586523, 2.2301105511590245, 2.8209394236203478],
  [1.048287770392726, 1.6313563571021041, 2.2838854034308294, 2.907995604002118, 3.4682129864679414],
  [0.7193591030617448, 1.3299940796103518, 1.9902085034059198, 2.6823143158121985, 3.2713817596071038],
  [-0.6599624925405122, 0.06983157827847253, 0.8268451381969982, 1.5735915610816549, 2.216708370853406],
  [-2.3995213307558356, -1.5544571757501853, -0.6568134471091893, 0.18816362949735532, 0.9192386470287768],
  [-3.5501615114747027, -2.684071098254927, -1.786430383928416, -0.9467552839919633, -0.25364492271679406],
  [-3.7705199746344578, -2.903043068604482, -2.0054437657508832, -1.1684771493103554, -0.49234435247498864],
  [-2.9698444513831754, -2.1083648444858563, -1.2106816026603946, -0.36820273097499545, 0.3423629813424036],
  [-1.4428780498743439, -0.6024750777990047, 0.20625640270736598, 0.9942533874844995, 1.588109239908829],
  [0.26410332795243185, 0.903263632870355, 1.5866592550041019, 2.2838197067741293, 2.8946483050418292],
  [1.0595945510728098, 1.6395337298013977, 2.2886862318252605, 2.909593102206994, 3.466978647905444],
  [0.7426813083895734, 1.3315966387643416, 1.9666217781261424, 2.6327710058632396, 3.199661316171901],
  [-0.613632547998014, 0.07264875744987798, 0.7841738553228397, 1.4856172457155385, 2.0893123025474587],
  [-2.3516458504325755, -1.5496321929010053, -0.698945707678101, 0.10170466501377307, 0.7939503480364037],
];

describe("driver spread quantiles with the 'level' pool", () => {
  const calibration = {
    errors: Array.from({ length: DAYS }, (_, d) => slots((s) => error(d, s))),
    features: Array.from({ length: DAYS }, (_, d) => spreadFeatures([slots((s) => exog(d, s))], slots((s) => centre(d, s)), false)),
  };
  const target = slots((s) => Math.sin(0.7 * s) * 2.2);
  const targetFeatures = spreadFeatures([slots((s) => 26 + s)], target, false);

  it('matches NumPy (kernelConditionalReference.py)', () => {
    const got = driverSpreadQuantiles(target, targetFeatures, calibration, LEVELS, 'level');
    got.forEach((row, s) => row.forEach((v, k) => expect(v).toBeCloseTo(REFERENCE[s]![k]!, 8)));
  });

  it("equals the 'all' pool when the calibration set is smaller than the effective sample asked for (every weight alike)", () => {
    const few = { errors: calibration.errors.slice(0, 10), features: calibration.features.slice(0, 10) };
    const level = driverSpreadQuantiles(target, targetFeatures, few, LEVELS, 'level');
    const all = driverSpreadQuantiles(target, targetFeatures, few, LEVELS, 'all');
    level.forEach((row, s) => row.forEach((v, k) => expect(v).toBeCloseTo(all[s]![k]!, 6)));
  });
});
