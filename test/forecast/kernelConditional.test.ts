import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { driverSpreadQuantiles, fitSpreadModel, spreadFeatures, type SpreadCalibration } from '../../src/forecast/quantiles/driverSpread.js';
import { predictLinear, type LinearModel } from '../../src/forecast/linalg/linearModel.js';
import { kernelConditionalQuantiles, StateCells } from '../../src/forecast/quantiles/kernelConditionalQuantiles.js';
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
// weighted quantiles and the grid's interpolation).
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
  [0.5661485529545703, 1.0160002146153264, 1.4971981977554634, 1.9861966416379833, 2.4158927639764185],
  [1.339737752162832, 1.7690698097856976, 2.2485495346132, 2.7199588502228162, 3.13374237565609],
  [1.0177176071837635, 1.4807279917466645, 1.9828639461338633, 2.509954474420345, 2.955520753437524],
  [-0.3290466076069126, 0.24214412753764414, 0.8346935128578602, 1.4195911090080826, 1.9265237805861708],
  [-2.0853371722336362, -1.3890450422524063, -0.6484119810299519, 0.04888075450808227, 0.6519207541680685],
  [-3.46359349262904, -2.6343945003730522, -1.7748816103592893, -0.9708545040882308, -0.30734267655270475],
  [-3.777780162446139, -2.9102520201084445, -2.012655567112773, -1.1759537808555303, -0.49607199555725123],
  [-2.9483838115055296, -2.1137409860683585, -1.244270466623021, -0.42849878943942654, 0.2576758564172337],
  [-1.3844006230656494, -0.5937719140989515, 0.16050167067081997, 0.8945054286593666, 1.4496792696708554],
  [0.27376229052660306, 0.8930720220844613, 1.5554261431363752, 2.2296940328666683, 2.8215737307219233],
  [1.054315958761389, 1.6345964567200706, 2.2829366840943948, 2.9184160190068624, 3.4776613761405284],
  [0.7195461989074503, 1.3300392367934322, 1.9903244337636445, 2.6833173263802297, 3.2706240647088562],
  [-0.662591991701102, 0.0698542663725239, 0.8268364238436513, 1.573743660764603, 2.2194714493573495],
  [-2.3995941383733683, -1.554457070593207, -0.6568142812013171, 0.18816687132736998, 0.9185685583821632],
  [-3.550166240007242, -2.684071468077845, -1.7864320380915315, -0.9467582364042049, -0.2539740804735262],
  [-3.7705253285977056, -2.903043535916508, -2.005445527133021, -1.1685801988699676, -0.4880109713400025],
  [-2.9698485681513898, -2.1083649258391675, -1.2106826771444992, -0.3682137851230177, 0.34242048250124224],
  [-1.4443666990576298, -0.6023892679911049, 0.20649184429071413, 0.9945444782052448, 1.6003305594993784],
  [0.2640588672816264, 0.9032067735840447, 1.58666595648083, 2.2836159743709294, 2.894778799784896],
  [1.0649069115501473, 1.64238781165996, 2.28785054830897, 2.9187717419277073, 3.4753012158202172],
  [0.7427456746331675, 1.3315737107572039, 1.966651912516181, 2.6330837298970207, 3.1993647514109655],
  [-0.618339065884393, 0.07267988527192848, 0.7841619636405031, 1.4858914887226613, 2.0910311428461554],
  [-2.3517214182327013, -1.5496320887079222, -0.6989465669379596, 0.10170653178650879, 0.7934485492089939],
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

  it('places many equal errors without searching (400 days x 96 slots of one error): every quantile is the centre plus that error', () => {
    // Closed form: every |e| = 0.5, so the log-spread regression fits its intercept log 0.5 exactly, every
    // standardised error is 1 and every quantile at every level is centre + 0.5.
    const days = 400;
    const slots96 = (f: (s: number) => number) => Float64Array.from({ length: 96 }, (_, s) => f(s));
    const tied = {
      errors: Array.from({ length: days }, () => slots96(() => 0.5)),
      features: Array.from({ length: days }, (_, d) => spreadFeatures([slots96((s) => exog(d, s))], slots96((s) => centre(d, s)), false)),
    };
    const centre96 = slots96((s) => Math.sin(0.1 * s));
    const got = driverSpreadQuantiles(centre96, spreadFeatures([slots96((s) => 26 + (s % 7))], centre96, false), tied, LEVELS, 'level');
    got.forEach((row, s) => row.forEach((v) => expect(v).toBeCloseTo((centre96[s] as number) + 0.5, 9)));
  });
});

/**
 * The 'level' pool as driverSpreadQuantiles' header states it, over the whole pool: every error divided by
 * exp of its fitted log spread (predictLinear on its features), sorted (ties by row), its state the centre
 * column over the centres' standard deviation (population), kernel quantiles at the grid states g / 8 around
 * each slot's centre interpolated linearly, scaled by the day's spread kept within the fitted range.
 */
function wholeLevelPool(centre: Float64Array, targetFeatures: Float64Array, calibration: SpreadCalibration, levels: readonly number[], model: LinearModel): number[][] {
  const slotsPerDay = centre.length;
  const m = targetFeatures.length / slotsPerDay;
  const u: number[] = [];
  const x: number[] = [];
  let low = Infinity;
  let high = -Infinity;
  calibration.features.forEach((f, d) => {
    for (let s = 0; s < slotsPerDay; s++) {
      const v = predictLinear(model, f.subarray(s * m, (s + 1) * m));
      low = Math.min(low, v);
      high = Math.max(high, v);
      u.push((calibration.errors[d]![s] as number) / Math.exp(v));
      x.push(f[s * m + m - 2]!);
    }
  });
  const mean = x.reduce((a, b) => a + b, 0) / x.length;
  const sd = Math.sqrt(Math.max(x.reduce((a, b) => a + b * b, 0) / x.length - mean * mean, 0));
  const perSd = sd > 0 ? 1 / sd : 1;
  const sample = statedSample(u, x.map((v) => v * perSd));
  const weights = new Float64Array(u.length);
  const at = (g: number) => kernelConditionalQuantiles(sample, g * 0.125, levels, 0.5, 500, weights);
  return Array.from(centre, (c, s) => {
    const spread = Math.exp(Math.min(high, Math.max(low, predictLinear(model, targetFeatures.subarray(s * m, (s + 1) * m)))));
    const t = (c * perSd) / 0.125;
    const g = Math.floor(t);
    const lambda = t - g;
    const below = at(g);
    const above = lambda > 0 ? at(g + 1) : below;
    return below.map((v, k) => c + spread * ((1 - lambda) * v + lambda * above[k]!));
  });
}

describe("the 'level' pool from the errors within the day's reach", () => {
  it('gives the quantiles of the whole pool bit for bit: a day over part of the states, and one with a slot so far out that its kernel widens', () => {
    const normal = seededNormal(23);
    const days = 80;
    const slots48 = (f: (s: number) => number) => Float64Array.from({ length: 48 }, (_, s) => f(s));
    const level = (d: number, s: number) => 1.5 * Math.sin((2 * Math.PI * d) / 40) + 0.5 * Math.sin((2 * Math.PI * s) / 48);
    const calibration = {
      errors: Array.from({ length: days }, (_, d) => slots48((s) => normal() * (1 + 0.4 * Math.abs(level(d, s))))),
      features: Array.from({ length: days }, (_, d) => spreadFeatures([slots48((s) => 20 + level(d, s) + 0.3 * normal())], slots48((s) => level(d, s)), true)),
    };
    const model = fitSpreadModel(calibration, 48);
    // Centres over a quarter of the pool's span; then the same with one slot beyond every centre seen.
    const narrow = slots48((s) => 0.6 + 0.2 * Math.sin((2 * Math.PI * s) / 48));
    const far = narrow.map((v, s) => (s === 10 ? 4.5 : v));
    for (const centre of [narrow, far]) {
      const features = spreadFeatures([slots48(() => 21)], centre, true);
      const got = driverSpreadQuantiles(centre, features, calibration, LEVELS, 'level', undefined, model);
      const want = wholeLevelPool(centre, features, calibration, LEVELS, model);
      expect(got.every((row, s) => row.every((v, k) => Object.is(v, want[s]![k])))).toBe(true);
    }
  });
});

/**
 * The weighted definition 7 as the module's header states it (Hyndman and Fan 1996, carried over to
 * weights), written out plainly: every value of positive weight at the level p_j = (C_j - w_j) / (C_(n-1) -
 * w_(n-1)), each tau read between the two levels around it. No widening: the target state is among the
 * states, so minEffective 1 is met at once.
 */
function definitionSeven(sample: { sorted: Float64Array; states: Float64Array }, target: number, levels: readonly number[], h: number): number[] {
  const values: number[] = [];
  const cumulative: number[] = [];
  const weights: number[] = [];
  let total = 0;
  sample.states.forEach((x, i) => {
    const w = 1 - (x - target) * (x - target) * (1 / (h * h));
    if (!(w > 0)) return;
    values.push(sample.sorted[i]!);
    weights.push(w);
    cumulative.push(total);
    total += w;
  });
  const span = total - weights[weights.length - 1]!;
  const last = values[values.length - 1]!;
  if (span <= 0) return levels.map(() => last);
  return levels.map((tau) => {
    const j = cumulative.findIndex((c) => tau <= c / span);
    if (j < 0) return last;
    if (j === 0) return values[0]!;
    const p = cumulative[j - 1]! / span;
    const q = cumulative[j]! / span;
    return Math.min(values[j]!, values[j - 1]! + ((tau - p) / (q - p)) * (values[j]! - values[j - 1]!));
  });
}

describe('kernelConditionalQuantiles against the definition', () => {
  it('gives the numbers of the weighted definition 7 written out, bit for bit, also at levels that are exactly a value\'s level (fast-check: ties, equal weights)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.oneof(fc.double({ min: -50, max: 50, noNaN: true }), fc.constantFrom(0, 1, 2)), fc.oneof(fc.double({ min: -2, max: 2, noNaN: true }), fc.constant(0))), { minLength: 1, maxLength: 60 }),
        fc.double({ min: 0.05, max: 3, noNaN: true }),
        fc.boolean(),
        (pairs, h, equalWeights) => {
          // Equal weights (every state at the target): the levels j / (n - 1) are hit exactly, and it is definition 7 itself.
          const states = equalWeights ? pairs.map(() => 0) : [0, ...pairs.slice(1).map((p) => p[1])];
          const sample = statedSample(pairs.map((p) => p[0]), states);
          const n = pairs.length;
          const onValues = Array.from({ length: n }, (_, j) => (n > 1 ? j / (n - 1) : 0));
          const levels = [...new Set([0, 0.05, 0.25, 0.5, 0.75, 0.95, 1, ...onValues])].sort((a, b) => a - b);
          const got = kernelConditionalQuantiles(sample, 0, levels, h, 1, new Float64Array(n));
          expect(got).toEqual(definitionSeven(sample, 0, levels, h));
          if (equalWeights) levels.forEach((tau, k) => expect(got[k]).toBeCloseTo(sortedQuantile(sample.sorted, tau), 9));
        },
      ),
      { seed: 17, numRuns: 400 },
    );
  });
});

describe('kernelConditionalQuantiles over the cells of the states (StateCells)', () => {
  it('gives the same numbers, bit for bit, as the pass over every value (fast-check: states far beyond the cells, equal states, any bandwidth)', () => {
    const cells = new StateCells();
    fc.assert(
      fc.property(
        fc.array(
          fc.tuple(
            fc.double({ min: -50, max: 50, noNaN: true }),
            fc.oneof(fc.double({ min: -4, max: 4, noNaN: true }), fc.constantFrom(0, -0, 0.125, -0.125, 1e4, -1e4, Infinity, -Infinity, NaN)),
          ),
          { minLength: 1, maxLength: 80 },
        ),
        fc.integer({ min: -40, max: 40 }),
        fc.double({ min: 0.01, max: 3, noNaN: true }),
        fc.double({ min: 0.01, max: 1, noNaN: true }),
        fc.integer({ min: 1, max: 100 }),
        (pairs, g, h, width, minEffective) => {
          const sample = statedSample(pairs.map((p) => p[0]), pairs.map((p) => p[1]));
          const levels = [0, 0.05, 0.25, 0.5, 0.75, 0.95, 1];
          const target = g * 0.125;
          const plain = kernelConditionalQuantiles(sample, target, levels, h, minEffective, new Float64Array(pairs.length));
          const byCells = kernelConditionalQuantiles(sample, target, levels, h, minEffective, new Float64Array(pairs.length), cells.build(sample.states, width));
          expect(byCells).toEqual(plain);
        },
      ),
      { seed: 16, numRuns: 400 },
    );
  });

  it('gives the same numbers for target after target on one StateCells, the reach moving by any number of cells (fast-check)', () => {
    const cells = new StateCells();
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.double({ min: -50, max: 50, noNaN: true }), fc.oneof(fc.double({ min: -4, max: 4, noNaN: true }), fc.constantFrom(0, 1e4, NaN))), { minLength: 1, maxLength: 80 }),
        fc.array(fc.integer({ min: -60, max: 60 }), { minLength: 1, maxLength: 12 }),
        fc.double({ min: 0.01, max: 3, noNaN: true }),
        fc.integer({ min: 1, max: 100 }),
        (pairs, grid, h, minEffective) => {
          const sample = statedSample(pairs.map((p) => p[0]), pairs.map((p) => p[1]));
          const levels = [0.05, 0.5, 0.95];
          cells.build(sample.states, 0.03125);
          for (const g of grid) {
            const plain = kernelConditionalQuantiles(sample, g * 0.125, levels, h, minEffective, new Float64Array(pairs.length));
            expect(kernelConditionalQuantiles(sample, g * 0.125, levels, h, minEffective, new Float64Array(pairs.length), cells)).toEqual(plain);
          }
        },
      ),
      { seed: 18, numRuns: 300 },
    );
  });

  it('groups the positions by cell: states 0.3, -0.1, 0.2, NaN, 5 in cells 0.25 wide', () => {
    // floor(x / 0.25): 1, -1, 0, none, 20; so by cell: position 1 (cell -1), 2 (cell 0), 0 (cell 1), 4 (cell 20).
    const cells = new StateCells().build([0.3, -0.1, 0.2, NaN, 5], 0.25);
    const at = (x: number) => cells.starts[cells.cellOf(x)]!;
    expect(Array.from(cells.positions.subarray(0, 4))).toEqual([1, 2, 0, 4]);
    expect([at(-0.1), at(0.1), at(0.3), at(5)]).toEqual([0, 1, 2, 3]);
  });
});
