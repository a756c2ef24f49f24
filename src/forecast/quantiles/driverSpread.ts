import { choleskyLeastSquares } from '../linalg/choleskyLeastSquares.js';
import type { LinearModel } from '../linalg/linearModel.js';
import { standardisedGram } from '../linalg/standardisedGram.js';
import { ScratchBuffers } from '../scratchBuffers.js';
import { selectInPlace } from '../models/robustAsinh.js';
import type { PoolOrder } from './poolOrder.js';
import { sortedQuantile } from './sortedQuantile.js';
import { kernelQuantilesWithin, StateCells } from './kernelConditionalQuantiles.js';
import { AscendingRows } from './ascendingRows.js';

/** Calibration data of {@link driverSpreadQuantiles}: per calibration day, its errors and spread features. */
export interface SpreadCalibration {
  /** errors[d][s]: out-of-sample error of calibration day d in slot s, on the model's scale. */
  readonly errors: readonly ArrayLike<number>[];
  /** features[d]: the day's spread features, S x m row-major (see {@link spreadFeatures}). */
  readonly features: readonly Float64Array[];
  /**
   * The SpreadFeatureRows that handed out every array of `features`, if one did: the sums of their columns that
   * do not change between its calls are then kept per spread regression (speed only, the same quantiles).
   */
  readonly rows?: SpreadFeatureRows;
}

/**
 * How the standardised errors are pooled: per clock slot over the calibration days ('slot'), over every
 * slot ('all'), or over every slot weighted by how near each error's point forecast was to the
 * delivery period's ('level'; see {@link LEVEL_POOL}).
 */
export type SpreadPool = 'slot' | 'all' | 'level';

/**
 * The kernel of the 'level' pool: the bandwidth in standard deviations of the calibration days' point
 * forecasts (on the model's scale), and the fewest effective errors before it is widened
 * (kernelConditionalQuantiles.ts), and the grid the quantiles are computed on, in bandwidths: at the
 * states 0, +-gridStep h, +-2 gridStep h, ... and linearly interpolated between the two around each
 * delivery period's (a day's periods share a handful of grid states; one pass over every error per
 * grid state instead of per period). 500 effective errors put 25 beyond each 5% level; the bandwidth was
 * chosen among 0.25, 0.5 and 1 on two settings of the known-distribution bench and then checked on all
 * six settings of two draws (docs/forecast-quality.md, the fifth wave).
 */
export const LEVEL_POOL = Object.freeze({ bandwidthSd: 0.5, minEffective: 500, gridStep: 0.25 });

/**
 * The spread features of one day, S x m row-major: the time of day as two harmonics
 * (cos and sin of 2 pi s / S and 4 pi s / S), the drivers (the exogenous columns), the point
 * forecast on the model's scale, and, for errors on an asinh scale, log cosh of that point forecast
 * (else 0, a constant column the spread regression leaves out): m = 4 + (number of exogenous columns) + 2.
 *
 * Why log cosh: on the scale Z = asinh((P - a) / b), dZ/dP = 1 / (b cosh Z), so by the delta method a
 * price error of spread sigma_P near the level Z has the spread sigma_P / (b cosh Z) on Z, and
 * log sigma_Z = log sigma_P - log b - log cosh Z. With log cosh of the centre among the features the fitted
 * log spread can follow the transform itself (coefficient -1), so that a spread that is even in prices
 * is not pooled over levels whose spreads on Z differ by the factor cosh Z; the centre's own column
 * carries a spread that grows with the price level. Computed as |z| + log(1 + exp(-2|z|)) - log 2,
 * finite for any z.
 *
 * Reference: G. W. Oehlert (1992), A note on the delta method, Am. Stat. 46(1), 27-29,
 * doi:10.1080/00031305.1992.10475842.
 *
 * @param asinhScale whether `centre` (and the errors the features will explain) are on an asinh scale
 */
export function spreadFeatures(exogenous: readonly ArrayLike<number>[], centre: ArrayLike<number>, asinhScale: boolean): Float64Array {
  const S = centre.length;
  const m = 6 + exogenous.length;
  const out = new Float64Array(S * m);
  const harmonics = timeOfDayHarmonics(S);
  for (let s = 0; s < S; s++) {
    let c = s * m;
    for (let h = 0; h < 4; h++) out[c++] = harmonics[4 * s + h] as number;
    for (const column of exogenous) out[c++] = column[s] as number;
    const z = centre[s] as number;
    out[c++] = z;
    out[c] = asinhScale ? logCosh(z) : 0;
  }
  return out;
}

/** log cosh z without overflow: |z| + log(1 + exp(-2|z|)) - log 2. */
export function logCosh(z: number): number {
  const x = Math.abs(z);
  return x + Math.log1p(Math.exp(-2 * x)) - Math.LN2;
}

/**
 * The spread features of past days, kept per day (by the identity of its exogenous columns): the time
 * of day and the drivers do not change from one delivery day to the next, only the point forecast on
 * the delivery day's scale does, so a kept day's array has just that column (and its log cosh) written again. The array
 * handed out is overwritten by the next call for the same day: use it before asking again.
 */
export class SpreadFeatureRows {
  private readonly kept = new WeakMap<readonly ArrayLike<number>[], Float64Array>();

  /** spreadFeatures(exogenous, centre, asinhScale), the same numbers. */
  of(exogenous: readonly ArrayLike<number>[], centre: ArrayLike<number>, asinhScale: boolean): Float64Array {
    const S = centre.length;
    const m = 6 + exogenous.length;
    let out = this.kept.get(exogenous);
    if (out === undefined || out.length !== S * m) {
      out = spreadFeatures(exogenous, centre, asinhScale);
      this.kept.set(exogenous, out);
      return out;
    }
    for (let s = 0; s < S; s++) {
      const z = centre[s] as number;
      out[s * m + m - 2] = z;
      out[s * m + m - 1] = asinhScale ? logCosh(z) : 0;
    }
    return out;
  }

  private readonly sums = new WeakMap<LinearModel, WeakMap<Float64Array, Float64Array>>();

  /**
   * Per slot of an array `of` handed out (S x m), the intercept of `model` plus its terms of the columns
   * `of` never writes again (the time of day and the drivers, 0 .. m - 3), added in the order of
   * predictLinear: the first part of that sum, the same number whatever the centre column holds now. Kept
   * by model and array (a refit day's spread regression serves the days until the next refit).
   */
  fixedSums(model: LinearModel, features: Float64Array, m: number): Float64Array {
    let byFeatures = this.sums.get(model);
    if (byFeatures === undefined) {
      byFeatures = new WeakMap();
      this.sums.set(model, byFeatures);
    }
    let out = byFeatures.get(features);
    if (out === undefined) {
      out = this.place(features.length / m);
      for (let s = 0; s < out.length; s++) out[s] = rowSum(model, features, s * m, 0, m - 2, model.intercept);
      byFeatures.set(features, out);
    }
    return out;
  }

  /** A view of `length` values of a block shared by many (a typed array of its own per day costs an allocation outside the heap each). */
  private place(length: number): Float64Array {
    if (this.block.length - this.used < length) {
      this.block = new Float64Array(256 * length);
      this.used = 0;
    }
    return this.block.subarray(this.used, (this.used += length));
  }

  private block = new Float64Array(0);
  private used = 0;
}

/** Per S, cos and sin of 2 pi s / S and of twice that angle, 4 S values (computed once: the same for every day). */
const harmonicsBySlots = new Map<number, Float64Array>();

function timeOfDayHarmonics(S: number): Float64Array {
  let out = harmonicsBySlots.get(S);
  if (out === undefined) {
    out = new Float64Array(4 * S);
    for (let s = 0; s < S; s++) {
      const angle = (2 * Math.PI * s) / S;
      out.set([Math.cos(angle), Math.sin(angle), Math.cos(2 * angle), Math.sin(2 * angle)], 4 * s);
    }
    harmonicsBySlots.set(S, out);
  }
  return out;
}

/**
 * Quantiles by filtered historical simulation with a fitted model of the error spread: the errors are
 * divided by a spread that follows the drivers, and the quantiles of the standardised errors are scaled
 * back by the delivery day's own spread,
 *   log |e(d', s)| = g0 + g' f(d', s) + v(d', s)   (least squares over every calibration day and slot),
 *   sigma(d, s) = exp(g0 + g' f(d, s)),   u(d', s) = e(d', s) / sigma(d', s),
 *   q_tau(d, s) = centre(s) + sigma(d, s) Q_tau({u}),
 * with f the spread features (time of day, drivers, the point forecast's level and, on an asinh scale, its
 * log cosh) and Q_tau the sample
 * quantile (Hyndman and Fan's definition 7) of the standardised errors of the same slot ('slot') or of
 * every slot ('all'). With 'level', Q_tau is the kernel conditional quantile of every slot's standardised
 * errors given the point forecast's level (kernelConditionalQuantiles.ts): an error counts the more, the
 * nearer its own point forecast was to centre(s). The spread model moves the errors' scale with the
 * drivers, but one pool gives every state the same shape; where the skew or the spike mass changes with
 * the price level (a convex merit order, down-spikes at low prices), the level-weighted pool lets the
 * shape and the median's offset follow it. The regression of log |e| is Harvey's (1976) estimator of a multiplicative
 * heteroscedasticity sigma^2 = exp(2 g' f): E log |e| = log sigma + E log |u|, so its intercept also
 * absorbs the constant E log |u|, which scales u and sigma in opposite ways and cancels in q. Scaling
 * past errors by their own spread before historical simulation is the filtered historical simulation
 * of Barone-Adesi, Giannopoulos and Vosper (1999), here with the spread explained by the drivers
 * instead of by a volatility recursion. The delivery day's log spread is kept within the range fitted
 * on the calibration days (no extrapolation of the spread beyond what was seen). A zero error is
 * counted at 1/1000 of the median absolute error (log 0 is not finite). Non-decreasing in tau.
 *
 * References: A. C. Harvey (1976), Estimating regression models with multiplicative heteroscedasticity,
 * Econometrica 44(3), 461-465, doi:10.2307/1913974; G. Barone-Adesi, K. Giannopoulos and L. Vosper
 * (1999), VaR without correlations for portfolios of derivative securities, J. Futures Markets 19(5),
 * 583-602; R. J. Hyndman and Y. Fan (1996), Am. Stat. 50(4), 361-365.
 *
 * @param centre the delivery day's point forecast per slot, on the model's scale
 * @param targetFeatures the delivery day's spread features (S x m)
 * @param calibration errors and features of the calibration days (at least two)
 * @param levels strictly increasing levels in (0, 1)
 * @param kept with pool 'slot': the pools' order from the last call and the day ids of the calibration
 *   days (ascending), to sort each slot's standardised errors from that order (poolOrder.ts; the same
 *   quantiles, faster for a window that moved a day)
 * @param spreadModel the spread regression to use instead of fitting it on `calibration` (a fit of an
 *   earlier day, fitSpreadModel); default: fitted here
 * @returns values[s][k] on the model's scale
 */
export function driverSpreadQuantiles(
  centre: ArrayLike<number>,
  targetFeatures: Float64Array,
  calibration: SpreadCalibration,
  levels: readonly number[],
  pool: SpreadPool,
  kept?: { readonly order: PoolOrder; readonly dayIds: ArrayLike<number> },
  spreadModel?: LinearModel,
): number[][] {
  const S = centre.length;
  const days = calibration.errors.length;
  const m = targetFeatures.length / S;
  const n = days * S;
  const model = spreadModel ?? fitOnDesign(calibration, calibrationDesign(calibration, S, m), S, m);
  // Scratch space reused from call to call (every value read is written first): the fitted log spreads and the
  // calibration days' point forecasts (the features' centre column, m - 2), read from each day's features.
  const fitted = scratchBuffers.get(7, n);
  const centres = scratchBuffers.get(2, n);
  let low = Infinity;
  let high = -Infinity;
  for (let d = 0; d < days; d++) {
    const features = calibration.features[d] as Float64Array;
    const fixed = calibration.rows?.fixedSums(model, features, m);
    for (let s = 0; s < S; s++) {
      const v = fixed === undefined ? predictRow(model, features, s * m, m) : rowSum(model, features, s * m, m - 2, m, fixed[s] as number);
      low = Math.min(low, v);
      high = Math.max(high, v);
      fitted[d * S + s] = v;
      centres[d * S + s] = features[s * m + m - 2] as number;
    }
  }
  const spread = Float64Array.from({ length: S }, (_, s) => Math.exp(Math.min(high, Math.max(low, predictRow(model, targetFeatures, s * m, m)))));
  if (pool === 'level') return levelPoolGrid(centre, spread, calibration.errors, fitted, centres, levels);
  const standardised = scratchBuffers.get(3, n);
  for (let d = 0; d < days; d++) {
    const e = calibration.errors[d] as ArrayLike<number>;
    for (let s = 0; s < S; s++) standardised[d * S + s] = (e[s] as number) / Math.exp(fitted[d * S + s] as number);
  }
  const quantilesOf = (sorted: Float64Array): number[] => levels.map((tau) => sortedQuantile(sorted, tau));
  const pooled = pool === 'all' ? quantilesOf(Float64Array.from(standardised).sort()) : null;
  const slotSample = new Float64Array(days);
  const byDay = kept === undefined || pooled !== null ? [] : Array.from({ length: days }, (_, d) => standardised.subarray(d * S, (d + 1) * S));
  if (byDay.length > 0) kept?.order.begin(kept.dayIds);
  return Array.from({ length: S }, (_, s) => {
    let q = pooled;
    if (q === null) {
      if (kept === undefined) {
        for (let d = 0; d < days; d++) slotSample[d] = standardised[d * S + s] as number;
        slotSample.sort();
      } else {
        kept.order.sortSlot(byDay, s, slotSample);
      }
      q = quantilesOf(slotSample);
    }
    return q.map((v) => (centre[s] as number) + (spread[s] as number) * v);
  });
}

/**
 * The regression of log |e| on the spread features of the calibration days (see driverSpreadQuantiles),
 * for a later day's driverSpreadQuantiles to use instead of fitting its own.
 *
 * @param slots S, clock slots per day
 */
export function fitSpreadModel(calibration: SpreadCalibration, slots: number): LinearModel {
  const m = (calibration.features[0] as Float64Array).length / slots;
  return fitOnDesign(calibration, calibrationDesign(calibration, slots, m), slots, m);
}

/** The calibration days' spread features one after the other (n S x m, in scratch space). */
function calibrationDesign(calibration: SpreadCalibration, S: number, m: number): Float64Array {
  const days = calibration.errors.length;
  const design = scratchBuffers.get(0, days * S * m);
  for (let d = 0; d < days; d++) design.set(calibration.features[d] as Float64Array, d * S * m);
  return design;
}

/**
 * Least squares of log |e| on the design (Harvey 1976), a zero error counted at 1/1000 of the median
 * absolute error (log 0 is not finite).
 */
function fitOnDesign(calibration: SpreadCalibration, design: Float64Array, S: number, m: number): LinearModel {
  const days = calibration.errors.length;
  const n = days * S;
  // Scratch space reused from call to call (every value read is written first): log |e|, |e| and its copy.
  const logAbs = scratchBuffers.get(1, n);
  const absolute = scratchBuffers.get(2, n);
  const work = scratchBuffers.get(3, n);
  for (let d = 0; d < days; d++) {
    const e = calibration.errors[d] as ArrayLike<number>;
    for (let s = 0; s < S; s++) absolute[d * S + s] = Math.abs(e[s] as number);
  }
  work.set(absolute);
  const floor = 1e-3 * medianBySelection(work);
  for (let i = 0; i < n; i++) logAbs[i] = Math.log(Math.max(absolute[i] as number, floor, Number.MIN_VALUE));
  return choleskyLeastSquares(standardisedGram({ rows: n, cols: m, data: design }, logAbs));
}

const scratchBuffers = new ScratchBuffers();
const ascendingRows = new AscendingRows();
const stateCells = new StateCells();

/**
 * The grid of the 'level' pool: every standardised error e / exp(fitted) in ascending order (ties by row), with its
 * point forecast (`centres`, the features' centre column m - 2) in standard deviations of those forecasts; per slot,
 * the kernel conditional quantiles at the slot's own centre (interpolated on the grid of LEVEL_POOL),
 * scaled by its spread. A convex combination of two non-decreasing rows does not decrease.
 *
 * Errors whose state no grid state of the day reaches at the first bandwidth get no weight from any kernel
 * unless one widens it: the grid is first made from the errors within that reach alone (their order and
 * sums those of the whole pool without the terms of weight 0, so the same quantiles), and from every error
 * when a grid state would widen. The reach is taken 2^-20 of a bandwidth wider against rounding.
 */
function levelPoolGrid(
  centre: ArrayLike<number>,
  spread: Float64Array,
  errors: readonly ArrayLike<number>[],
  fitted: Float64Array,
  centres: Float64Array,
  levels: readonly number[],
): number[][] {
  const n = fitted.length;
  const S = centre.length;
  let sum = 0;
  let squares = 0;
  for (let i = 0; i < n; i++) {
    const x = centres[i] as number;
    sum += x;
    squares += x * x;
  }
  const mean = sum / n;
  const sd = Math.sqrt(Math.max(squares / n - mean * mean, 0));
  const perSd = sd > 0 ? 1 / sd : 1;
  // The grid states g * step, each computed once, interpolated linearly in between: per slot, the two around its centre.
  const { bandwidthSd: h, minEffective, gridStep } = LEVEL_POOL;
  const step = h * gridStep;
  const cells = Array.from({ length: S }, (_, s) => {
    const t = ((centre[s] as number) * perSd) / step;
    const g = Math.floor(t);
    return { g, lambda: t - g };
  });
  let first = Infinity;
  let last = -Infinity;
  for (const { g, lambda } of cells) {
    first = Math.min(first, g);
    last = Math.max(last, lambda > 0 ? g + 1 : g);
  }
  const reach = h * (1 + 2 ** -20);
  const atGrid = gridWithin(errors, fitted, centres, perSd, cells, first * step - reach, last * step + reach, Math.min(minEffective, n), levels) ??
    (gridWithin(errors, fitted, centres, perSd, cells, -Infinity, Infinity, Math.min(minEffective, n), levels) as Map<number, number[]>);
  return cells.map(({ g, lambda }, s) => {
    const below = atGrid.get(g) as number[];
    const above = lambda > 0 ? (atGrid.get(g + 1) as number[]) : below;
    return below.map((v, k) => (centre[s] as number) + (spread[s] as number) * ((1 - lambda) * v + lambda * (above[k] as number)));
  });
}

/**
 * The kernel conditional quantiles at the grid states of `cells` (g and, where lambda > 0, g + 1), from the
 * standardised errors whose state (centre / sd) lies in [from, to] (every error: -Infinity, Infinity); null when
 * they are too few or a grid state would widen the bandwidth (then only the whole pool gives its quantiles).
 */
function gridWithin(
  errors: readonly ArrayLike<number>[],
  fitted: Float64Array,
  centres: Float64Array,
  perSd: number,
  cells: readonly { readonly g: number; readonly lambda: number }[],
  from: number,
  to: number,
  enough: number,
  levels: readonly number[],
): Map<number, number[]> | null {
  const n = fitted.length;
  const S = cells.length;
  const whole = from === -Infinity && to === Infinity;
  // The errors kept, in row order: their standardised values and states.
  const values = scratchBuffers.get(3, n);
  const rowStates = scratchBuffers.get(8, n);
  let kept = 0;
  for (let d = 0; d < errors.length; d++) {
    const e = errors[d] as ArrayLike<number>;
    for (let s = 0; s < S; s++) {
      const i = d * S + s;
      const x = (centres[i] as number) * perSd;
      if (!whole && !(x >= from && x <= to)) continue;
      values[kept] = (e[s] as number) / Math.exp(fitted[i] as number);
      rowStates[kept++] = x;
    }
  }
  if (kept < enough) return null;
  // The rows in ascending order of their standardised errors, ties by row (a radix sort: linear in the rows).
  const order = ascendingRows.of(values.subarray(0, kept));
  const sorted = scratchBuffers.get(4, kept);
  const states = scratchBuffers.get(5, kept);
  for (let j = 0; j < kept; j++) {
    const row = order[j] as number;
    sorted[j] = values[row] as number;
    states[j] = rowStates[row] as number;
  }
  const weights = scratchBuffers.get(6, kept);
  // The positions grouped by their states in cells a quarter of a step wide, for the kernel to visit only those within
  // its reach (narrower cells visit fewer values beyond it: 0.97x the CPU of a step's width over driver-fhs's year).
  const { bandwidthSd: h, gridStep } = LEVEL_POOL;
  const step = h * gridStep;
  const byState = stateCells.build(states, step / 4);
  const atGrid = new Map<number, number[]>();
  for (const { g, lambda } of cells) {
    for (const at of lambda > 0 ? [g, g + 1] : [g]) {
      if (atGrid.has(at)) continue;
      const q = kernelQuantilesWithin(whole ? Infinity : h, { sorted, states }, at * step, levels, h, enough, weights, byState);
      if (q === null) return null;
      atGrid.set(at, q);
    }
  }
  return atGrid;
}

/** predictLinear(model, data[at .. at + m - 1]), the same sum in the same order, without a view of the row. */
function predictRow(model: LinearModel, data: Float64Array, at: number, m: number): number {
  return rowSum(model, data, at, 0, m, model.intercept);
}

/** `start` plus the terms from..to - 1 of predictLinear's sum over the row at `at`, added in its order. */
function rowSum(model: LinearModel, data: Float64Array, at: number, from: number, to: number, start: number): number {
  let s = start;
  const b = model.coefficients;
  for (let j = from; j < to; j++) s += (b[j] as number) * (data[at + j] as number);
  return s;
}

/**
 * sortedQuantile(sorted values, 0.5) without sorting: the order statistics floor(h) and the next one
 * (h = (n - 1) / 2) by selection (Hoare 1961), the same two numbers whatever their order, combined
 * as sortedQuantile does. `work` (at least one value) is reordered.
 *
 * Reference: C. A. R. Hoare (1961), Algorithm 65: Find, Commun. ACM 4(7), 321-322.
 */
export function medianBySelection(work: Float64Array): number {
  const n = work.length;
  const h = (n - 1) * 0.5;
  const j = Math.floor(h);
  const lower = selectInPlace(work, j);
  // After selection every value right of position j is at least the j-th: the next order statistic is their least.
  let upper = lower;
  if (j + 1 < n) {
    upper = Infinity;
    for (let i = j + 1; i < n; i++) upper = Math.min(upper, work[i] as number);
  }
  return lower + (h - j) * (upper - lower);
}
