// The EXPECTED pinball loss of quantile forecasts under each period's exact law (process.js), beside the
// realised loss the bench reports. A year's realised ratio to the truth moves with the prices the year
// happened to draw (one year of a persistent market is a small sample); the expected loss averages over
// every price the law allows, so what is left is the forecast's own error.
//
// For a price Y with CDF F, living in [floor, cap], and a quantile q at level tau:
//   E[rho_tau(Y - q)] = tau (E[Y] - q) + E[(q - Y)_+] = tau (mu - q) + integral_{floor}^{q} F(y) dy
// (rho_tau(u) = u (tau - 1{u < 0}); E[(q - Y)_+] = integral of F below q, by parts). The forecast's excess
// over the truth's quantile q* is then tau (q* - q) + integral_{q*}^{q} F(y) dy, an integral over the short
// stretch between the two (Gneiting and Raftery 2007, JASA 102(477), 359-378, section 3.3 and 9, for the
// pinball loss as a proper score and its expectation).
// The integrals are taken by adaptive Simpson quadrature (G. F. Kuncir 1962, Comm. ACM 5(6), 347;
// J. N. Lyness 1969, J. ACM 16(3), 483-495, the error estimate |S2 - S1| / 15 and Richardson's correction),
// split at the law's kinks (spike ranges' ends, the merit order's knee) so that each piece is smooth.
import { meritOrder, periodCdf } from './process.js';

// Absolute error per integral [currency/MWh x probability]: a year's mean loss is of order 1, so 1e-9 is far below
// any digit the bench prints.
const TOLERANCE = 1e-9;
const MAX_DEPTH = 40;

/**
 * integral_a^b f by adaptive Simpson, to an absolute error of about `tolerance`.
 * @param {(x: number) => number} f
 */
export function adaptiveSimpson(f, a, b, tolerance = TOLERANCE) {
  if (a === b) return 0;
  const fa = f(a);
  const fb = f(b);
  const m = 0.5 * (a + b);
  const fm = f(m);
  const whole = ((b - a) / 6) * (fa + 4 * fm + fb);
  return refine(f, a, b, fa, fm, fb, whole, tolerance, MAX_DEPTH);
}

function refine(f, a, b, fa, fm, fb, whole, tolerance, depth) {
  const m = 0.5 * (a + b);
  const lm = 0.5 * (a + m);
  const rm = 0.5 * (m + b);
  const flm = f(lm);
  const frm = f(rm);
  const left = ((m - a) / 6) * (fa + 4 * flm + fm);
  const right = ((b - m) / 6) * (fm + 4 * frm + fb);
  const delta = left + right - whole;
  if (depth <= 0 || Math.abs(delta) <= 15 * tolerance || !(lm > a && rm < b)) return left + right + delta / 15;
  return refine(f, a, m, fa, flm, fm, left, tolerance / 2, depth - 1) + refine(f, m, b, fm, frm, fb, right, tolerance / 2, depth - 1);
}

/** integral_a^b f (a > b allowed: the negative of integral_b^a), split at the points strictly inside. */
function piecewiseIntegral(f, a, b, kinks) {
  if (a > b) return -piecewiseIntegral(f, b, a, kinks);
  const cuts = [a, ...kinks.filter((k) => k > a && k < b).sort((p, q) => p - q), b];
  let sum = 0;
  for (let i = 1; i < cuts.length; i++) sum += adaptiveSimpson(f, cuts[i - 1], cuts[i]);
  return sum;
}

/**
 * One period's law as an integrable CDF: F, its kinks, and the lowest price it reaches with a probability
 * above about 1e-19 (nine standard deviations below the base price's centre, or the down-spikes' low end).
 */
export function periodLaw(law, setting, normalCdf) {
  const merit = meritOrder(setting.price);
  const { floor, cap } = setting.market;
  const widest = law.sd * Math.max(1, setting.noise.volatileFactor ?? 1);
  let start = law.c + merit.g(law.mu - 9 * widest);
  if (law.pDown > 0) start = Math.min(start, setting.spikes.down.low);
  start = Math.max(floor, start);
  const kinks = [law.c + merit.g(setting.price.knee)];
  if (law.pUp > 0) kinks.push(setting.spikes.up.low);
  if (law.pDown > 0) kinks.push(setting.spikes.down.low, setting.spikes.down.high);
  const cdf = (p) => (p < floor ? 0 : p >= cap ? 1 : periodCdf(law, setting, p, normalCdf, merit));
  return { cdf, kinks, start };
}

/**
 * The sum over a period's levels of E[rho_tau(Y - q_tau)] for its clamped price Y with mean `mean` (see the
 * header), the integral of F below each quantile taken
 * stretch by stretch from the one below it (the quantiles in ascending order), not from the start each time.
 */
export function expectedPinballRow(periodLawOf, mean, levels, quantiles) {
  const order = quantiles.map((_, k) => k).sort((i, j) => quantiles[i] - quantiles[j]);
  let sum = 0;
  let at = periodLawOf.start;
  let below = 0;
  for (const k of order) {
    const q = quantiles[k];
    if (q > at) {
      below += piecewiseIntegral(periodLawOf.cdf, at, q, periodLawOf.kinks);
      at = q;
    }
    sum += levels[k] * (mean - q) + (q <= periodLawOf.start ? 0 : below);
  }
  return sum;
}

/** E[rho_tau(Y - q)] - E[rho_tau(Y - reference)]: tau (reference - q) + integral_reference^q F. */
export function expectedPinballExcess(periodLawOf, tau, q, reference) {
  return tau * (reference - q) + piecewiseIntegral(periodLawOf.cdf, reference, q, periodLawOf.kinks);
}

/**
 * The expected pinball loss (mean over levels and periods) of the truth's quantiles and of each forecast,
 * over the days both have; and the forecast's expected coverage of its central 80% and 90% intervals and
 * share below its q0.5 (means over periods of F(q0.9) - F(q0.1), F(q0.95) - F(q0.05), F(q0.5)), which the
 * year's draw does not move either (the truth's own are 0.8, 0.9 and 0.5 up to its file's rounding).
 * @param {Map<string, object[]>} lawsByDay per day, the periods' laws (process.js)
 * @param {Map<string, number[]>} meansByDay per day, the periods' true mean prices
 * @param {Map<string, { levels: number[], prices: number[][] }>} truthDays the true quantiles per day
 * The forecasts must be at the truth's levels (every level of the truth, as the bench makes them).
 * @returns {(days: { day: string, levels: number[], prices: number[][] }[]) => { forecast: number, truth: number,
 *   ratio: number, coverage80: number, coverage90: number, belowMedian: number }}
 */
export function expectedPinballScorer(lawsByDay, meansByDay, truthDays, setting, normalCdf) {
  const lawCache = new Map();
  const truthLoss = new Map();
  const lawsOf = (day) => {
    let laws = lawCache.get(day);
    if (laws === undefined) {
      laws = lawsByDay.get(day).map((law) => periodLaw(law, setting, normalCdf));
      lawCache.set(day, laws);
    }
    return laws;
  };
  const truthLossOf = (day) => {
    let loss = truthLoss.get(day);
    if (loss === undefined) {
      const truth = truthDays.get(day);
      const laws = lawsOf(day);
      const means = meansByDay.get(day);
      loss = 0;
      truth.prices.forEach((row, t) => (loss += expectedPinballRow(laws[t], means[t], truth.levels, row)));
      truthLoss.set(day, loss);
    }
    return loss;
  };
  return (days) => {
    let truth = 0;
    let excess = 0;
    let count = 0;
    // Expected coverage of the central 80% and 90% intervals and share below q0.5: F(upper) - F(lower), F(q0.5).
    const levelsOf = days[0]?.levels ?? [];
    const [q05, q10, q50, q90, q95] = [0.05, 0.1, 0.5, 0.9, 0.95].map((level) => indexOfLevel(levelsOf, level));
    // Each forecast level's column in the truth's rows (the same levels every day).
    const truthLevels = days.length === 0 ? [] : truthDays.get(days[0].day).levels;
    const truthColumn = levelsOf.map((level) => indexOfLevel(truthLevels, level));
    if (truthColumn.includes(-1) || truthColumn.length !== truthLevels.length) throw new Error('expectedPinballScorer: the forecasts must be at the truth\'s levels');
    let cover80 = 0;
    let cover90 = 0;
    let below = 0;
    let periods = 0;
    for (const forecast of days) {
      const reference = truthDays.get(forecast.day);
      const laws = lawsOf(forecast.day);
      truth += truthLossOf(forecast.day);
      forecast.prices.forEach((row, t) => {
        const F = laws[t].cdf;
        cover80 += F(row[q90]) - F(row[q10]);
        cover90 += F(row[q95]) - F(row[q05]);
        below += F(row[q50]);
        periods++;
        row.forEach((q, k) => {
          excess += expectedPinballExcess(laws[t], levelsOf[k], q, reference.prices[t][truthColumn[k]]);
          count++;
        });
      });
    }
    return {
      forecast: (truth + excess) / count,
      truth: truth / count,
      ratio: (truth + excess) / truth,
      coverage80: cover80 / periods,
      coverage90: cover90 / periods,
      belowMedian: below / periods,
    };
  };
}

/** The index of `level` among `levels` (equal to 1e-9), or -1. */
function indexOfLevel(levels, level) {
  return levels.findIndex((l) => Math.abs(l - level) < 1e-9);
}
