import { sortedQuantile } from '../quantiles/sortedQuantile.js';
import { KeptFits } from '../keptFits.js';
import { farOutFences, fencesOfQuartiles, sortedSampleBounds, type Fences, type SampleBounds } from './farOutFences.js';
import { choleskyLeastSquares } from '../linalg/choleskyLeastSquares.js';
import type { LinearModel } from '../linalg/linearModel.js';
import { SlotDayGramBuilder } from './slotDayGram.js';
import { SlotSortedValues } from './slotSortedValues.js';
import { ScratchBuffers } from '../scratchBuffers.js';
import type { FitStopwatch } from '../fitStopwatch.js';
import { timedFits } from '../fitStopwatch.js';
import type { GriddedDay, HistoryView } from './historyView.js';
import type { PointForecast } from './pointForecast.js';
import { averageMembers } from './pointForecast.js';
import { residualLoad, residualLoadColumns, type ResidualLoadColumns } from './residualLoad.js';
import { clipToFences, dayOffset, monotoneHingeCurve, offsetFences, type MonotoneCurve } from './residualLoadShift.js';
import { fromAsinhScale, selectInPlace, toAsinhScale, toAsinhScales, type RobustScale } from './robustAsinh.js';

/** Settings of the driver regression; see {@link driverForecast}. */
export interface DriverSettings {
  /** Calibration window lengths [calendar days before the delivery day]; one fit per window, averaged. */
  readonly windowsDays: readonly number[];
  /** Fewest usable training days in every window for a forecast to be made [days]. */
  readonly minTrainingDays: number;
  /** Hinge knots of the residual load [-], >= 0: per slot at its 1/(J+1), ..., J/(J+1) quantiles over the longest window's days. */
  readonly knots: number;
  /** Scale the model is fitted on: asinh-transformed prices, or prices. */
  readonly scale: 'asinh' | 'price';
  /**
   * Refit cadence [days], >= 1. Default 1: the models are fitted afresh for every delivery day. With k > 1
   * they are fitted on the refit days only, the day numbers that are multiples of k, each on the days
   * before it; a delivery day takes the fit of the latest refit day on or before it, with its own
   * regressors (its residual load, the day before's and the week before's prices, its weekday) on that
   * fit's scale. Nothing on or after the refit day is read by the fit, so nothing after gate closure
   * either. When the days before the refit day are too few, the delivery day's own fit is used.
   */
  readonly refitDays?: number;
  /**
   * How the day before's price level enters: 'mean' (default), as the linear columns mean_t Z(d'-1,t) and
   * mean_t x(d'-1,t) only; 'shift', also as a shift of the residual load: x(d',s) + lambda D(d'-1) in the
   * linear and hinge terms (see {@link ResidualLoadShift}).
   */
  readonly level?: 'mean' | 'shift';
  /** lambda's grid for level 'shift' [-], each >= 0; default LAMBDAS (0, 0.5, 1). */
  readonly shiftLambdas?: readonly number[];
  /** Where fits are kept between delivery days (by the day they were fitted for); default none (each forecast fits). */
  readonly fits?: DriverFits;
  /** Adds the time spent fitting (Grams and solves, per slot and window) to this counter. Default none. */
  readonly stopwatch?: FitStopwatch;
}

/** The driver regression fitted for a day: every window's model of every slot, and what its regressors need. */
export interface DriverFit {
  /** The robust scale of the asinh transform (null on the price scale). */
  readonly scale: RobustScale | null;
  /** Quartiles of all prices of the longest window's training days [currency/MWh]: the price regressors are also clipped at their far-out fences on the model's scale. */
  readonly quartiles: SampleBounds['quartiles'];
  /** S, clock slots per day. */
  readonly slots: number;
  /** J, hinge knots per slot. */
  readonly knots: number;
  /** k, coefficients per model (without the intercept). */
  readonly coefficients: number;
  /** Knots per slot, knotValues[s J + j]. */
  readonly knotValues: Float64Array;
  /** The windows' distinct training-day counts, ascending (one model per count). */
  readonly counts: readonly number[];
  /** Per window of windowsDays, the index of its count in `counts`. */
  readonly windowCount: readonly number[];
  /** Per count w and slot s, the intercept then the k coefficients at models[(w S + s)(k + 1)]. */
  readonly models: Float64Array;
  /** The residual-load shift of the fit (settings.level 'shift' with lambda > 0), else null. */
  readonly shift: ResidualLoadShift | null;
}

/**
 * The day before's level read as a shift of the residual load (settings.level 'shift'). A supply-side
 * shift (plants out, imports) moves the merit order sideways, so a persistent level acts on tomorrow's price
 * through the curve's shape: inverse prediction (Osborne 1991; Brown 1993, residualLoadShift.ts) reads the
 * day d's prices through each slot's fitted curve f_s (the longest window's least-squares fit with the
 * level read as today, its other columns at their training means, slopes floored to be increasing) as
 * the residual load that would have set them, D(d) = median_t (f_s^{-1}(Z(d,t)) - x(d,t)) [GW], clipped at
 * the far-out fences of the training days' D. The model is then refitted with x(d',s) + lambda D(d'-1) in
 * place of x(d',s) (knots on the shifted values), the linear columns as before; lambda in LAMBDAS by
 * rolling-origin validation (shiftLambdaFor), kept for SHIFT_CHOICE_EVERY_DAYS days.
 */
export interface ResidualLoadShift {
  /** lambda [-], > 0. */
  readonly lambda: number;
  /** Per slot, the curve that reads a day's prices as a residual-load offset. */
  readonly curves: readonly MonotoneCurve[];
  /** The training days' far-out fences of D [GW]. */
  readonly fences: { readonly low: number; readonly high: number };
}

/** The grid of lambda (residual-load shift per GW of the day before's offset) tried per choice. */
const LAMBDAS = [0, 0.5, 1] as const;
/** Days held out at the end of the longest window to choose lambda on (rolling-origin validation). */
export const SHIFT_HOLDOUT_DAYS = 28;
/** lambda is chosen on the day numbers that are multiples of this and kept until the next such day. */
export const SHIFT_CHOICE_EVERY_DAYS = 28;

/** Fits of the driver regression by the day they were fitted for (null: too few days), for one history and one set of settings. */
export class DriverFits extends KeptFits<number, DriverFit | null> {
  /** lambda of level 'shift' by the day it was chosen on (see shiftLambdaFor). */
  readonly shiftLambdas = new KeptFits<number, number>();
}

/** The refit day of a delivery day under a cadence of `every` days: the latest day number on or before it that is a multiple of `every`. */
export function refitDayOf(dayNumber: number, every: number): number {
  return dayNumber - (((dayNumber % every) + every) % every);
}

const LAGS = [1, 7] as const;

/**
 * Per-slot regression of the price on its drivers, averaged over calibration windows.
 *
 * Model, one per clock slot s and window, fitted on the days d' of the window:
 *   Z(d',s) = b0 + c0 x(d',s) + sum_j c_j max(0, x(d',s) - k_j)
 *             + a1 mean_t Z(d'-1,t) + a2 mean_t x(d'-1,t) + a3 Z(d'-1,s) + a4 Z(d'-7,s)
 *             + sum_{w = Mon..Sat} g_w D_w(d') + e(d',s),
 * with x the residual load (load minus renewables, from the exogenous columns known before gate closure;
 * residualLoad.ts), Z the price on the model's scale, D_w weekday dummies (Sunday the reference).
 * - The residual load enters through a linear spline in the truncated power basis, hinges at the knots
 *   k_j = the j/(J+1) quantiles of the slot's x over the longest window's days (Hastie, Tibshirani
 *   and Friedman 2009, section 5.2; the hinge functions of Friedman 1991): the merit order is convex
 *   near scarcity and flat in surplus, which one slope cannot follow. A hinge that fewer than 20 days
 *   (or 10% of a window's days) reach is left out of that window's fit: its slope would rest on a few
 *   days and the delivery day might extrapolate it far.
 * - One model per slot lets every coefficient vary with the period of the day, so the effect of
 *   residual load interacts fully with the time of day.
 * - Yesterday's mean price is the persistent day-level component: with yesterday's mean residual load
 *   beside it, the regression can tell the part of yesterday's level that yesterday's drivers explain
 *   from the part that persists (as the LEAR model of Lago et al. 2021 reads the exogenous columns of
 *   the day before). The same slot yesterday and a week ago carry the slot's own persistence and the
 *   weekly profile with the dummies. The prices these regressors read are clipped at the day's far-out
 *   fences (farOutFences), so that a spike hour does not move tomorrow's level, then at the far-out
 *   fences of the training days' prices on the model's scale, so that a day spiked in most of its
 *   periods (whose own fences hold its spikes) does not either.
 * - With settings.level 'shift' (an option; see ResidualLoadShift) the day before's level also shifts the
 *   residual load, x(d',s) + lambda D(d'-1) in place of x(d',s) in the linear and hinge terms, D read off
 *   the day before's prices through the slots' inverted curves (inverse prediction).
 * - Estimation: least squares (standardised normal equations, Cholesky), then once more on Huber's
 *   pseudo-observations y* = y_hat + psi(y - y_hat) of the longest window's fit (psi clips residuals
 *   at 1.345 robust standard deviations): Bickel's (1975) one-step Huber estimate. Spike periods in the
 *   response then count no more than a residual of 1.345 sigma, so the fit follows the bulk of the
 *   prices, where a plan's median schedule lives, rather than the mean that spikes pull.
 * On the 'asinh' scale Z = asinh((P - a) / b) with a, b the median and normalised MAD of the prices of
 * the longest window's days (Uniejewski, Weron and Ziel 2018), mapped back by P = a + b sinh(Z); on the
 * 'price' scale Z = P. Windows and averaging as for the ARX (Hubicka, Marcjasz and Weron 2019). A
 * training day is used when its days d'-1 and d'-7 are in the history; for the delivery day a missing
 * lag day is replaced by the latest earlier day.
 *
 * References: P. J. Bickel (1975), One-step Huber estimates in the linear model, JASA 70(350), 428-434,
 * doi:10.1080/01621459.1975.10479884; P. J. Huber (1964), Robust estimation of a location parameter,
 * Ann. Math. Stat. 35(1), 73-101; P. W. Holland and R. E. Welsch (1977), Robust regression using
 * iteratively reweighted least-squares, Commun. Stat. Theory Methods 6(9), 813-827 (c = 1.345);
 * J. H. Friedman (1991), Multivariate adaptive regression splines, Ann. Stat. 19(1), 1-67,
 * doi:10.1214/aos/1176347963; T. Hastie, R. Tibshirani and J. Friedman (2009), The Elements of
 * Statistical Learning, 2nd ed., Springer, section 5.2; J. Lago, G. Marcjasz, B. De Schutter and
 * R. Weron (2021), Applied Energy 293, 116983, doi:10.1016/j.apenergy.2021.116983; B. Uniejewski,
 * R. Weron and F. Ziel (2018), IEEE Trans. Power Syst. 33(2), 2219-2229, doi:10.1109/TPWRS.2017.2734563;
 * K. Hubicka, G. Marcjasz and R. Weron (2019), IEEE Trans. Sustain. Energy 10(1), 321-323,
 * doi:10.1109/TSTE.2018.2869557.
 *
 * @returns the forecast (members = one per window, in the order of windowsDays), or null when the
 *   history has no residual-load column, a window has fewer than minTrainingDays usable days, or no
 *   past day lies 7 days before the delivery day or earlier
 */
export function driverForecast(view: HistoryView, settings: DriverSettings): PointForecast | null {
  const columns = residualLoadColumns(view.exogenousNames);
  if (columns === null) return null;
  const targetLags = LAGS.map((lag) => view.indexAtOrBefore(view.target.dayNumber - lag));
  if (targetLags.some((i) => i < 0)) return null;
  const day = view.target.dayNumber;
  const every = settings.refitDays ?? 1;
  // The refit day: the latest day number on or before the delivery day that is a multiple of refitDays.
  const refitDay = refitDayOf(day, every);
  let fit = fitOnDay(view, columns, settings, refitDay);
  // Too few days before the refit day (the history's first days): the delivery day's own fit.
  if (fit === null && refitDay < day) fit = fitOnDay(view, columns, settings, day);
  if (fit === null) return null;
  return predict(view, columns, fit, targetLags[0] as number, targetLags[1] as number);
}

/**
 * The driver regression fitted on the days before `fitDay` (on or before the delivery day of `view`),
 * kept in settings.fits when given: the fit of a day depends only on the days before it.
 */
function fitOnDay(view: HistoryView, columns: ResidualLoadColumns, settings: DriverSettings, fitDay: number): DriverFit | null {
  const kept = settings.fits?.get(fitDay);
  if (kept !== undefined) return kept;
  const fit = fitDriverModel(view, columns, settings, fitDay);
  settings.fits?.set(fitDay, fit);
  return fit;
}

/**
 * The day's forecast from a fit: its regressors (residual load and hinges at the fit's knots, the day
 * before's and the week before's prices on the fit's scale, its weekday) through each window's model
 * of each slot, mapped back to prices. With the delivery day's own fit, the same numbers as predicting
 * from the Grams directly (predictLinear adds the same terms in the same order as choleskyPrediction).
 */
function predict(view: HistoryView, columns: ResidualLoadColumns, fit: DriverFit, lag1: number, lag7: number): PointForecast {
  const days = new DriverDays(view, columns, fit.scale, fit.quartiles);
  const targetDay = days.regressors(lag1, lag7, view.target.weekday);
  let targetX = residualLoad(view.target, columns);
  const { slots: S, knots: J, coefficients: k } = fit;
  if (fit.shift !== null) {
    // The delivery day's residual load shifted by lambda D(d - 1), D read through the fit's own curves.
    const before = days.of(lag1);
    const offset = clipToFences(dayOffset(fit.shift.curves, before.clipped, before.x, new Float64Array(S)), fit.shift.fences);
    targetX = Float64Array.from(targetX, (x) => x + fit.shift!.lambda * offset);
  }
  const a = J + 4;
  const row = new Float64Array(k);
  const forecasts = fit.counts.map(() => new Float64Array(S));
  for (let s = 0; s < S; s++) {
    const xt = targetX[s] as number;
    row[0] = xt;
    for (let j = 0; j < J; j++) {
      const knot = fit.knotValues[s * J + j] as number;
      row[1 + j] = xt > knot ? xt - knot : 0;
    }
    row[J + 1] = targetDay.lag1[s] as number;
    row[J + 2] = targetDay.lag7[s] as number;
    row[a - 1] = targetDay.meanZ;
    row[a] = targetDay.meanX;
    for (let w = 1; w <= 6; w++) row[a + w] = targetDay.weekday === w ? 1 : 0;
    fit.counts.forEach((_, w) => {
      const at = (w * S + s) * (k + 1);
      let z = fit.models[at] as number;
      for (let j = 0; j < k; j++) z += (fit.models[at + 1 + j] as number) * (row[j] as number);
      (forecasts[w] as Float64Array)[s] = days.toPrice(z);
    });
  }
  const members = fit.windowCount.map((w) => forecasts[w] as Float64Array);
  return { mean: averageMembers(members), members };
}

/**
 * The per-slot models of every window, fitted on the days before `fitDay`: least squares on the
 * longest window, then on Huber's pseudo-observations of that fit in every window (see driverForecast).
 * Null when a window has fewer than minTrainingDays usable days.
 */
function fitDriverModel(view: HistoryView, columns: ResidualLoadColumns, settings: DriverSettings, fitDay: number): DriverFit | null {
  const longest = Math.max(...settings.windowsDays);
  const first = fitDay - longest;
  const training: number[] = [];
  for (let i = view.indexAtOrBefore(fitDay - 1); i >= 0 && view.dayNumber(i) >= first; i--) {
    const dn = view.dayNumber(i);
    if (LAGS.every((lag) => view.indexOf(dn - lag) >= 0)) training.push(i);
  }
  const sizes = settings.windowsDays.map((w) => {
    let count = 0;
    while (count < training.length && view.dayNumber(training[count] as number) >= fitDay - w) count++;
    return count;
  });
  if (sizes.some((size) => size < settings.minTrainingDays)) return null;
  const counts = [...new Set(sizes)].sort((p, q) => p - q);
  const n = counts[counts.length - 1] as number;
  const rows = training.slice(0, n);
  // lambda before this fit's DriverDays: the choice's own DriverDays takes the same blocks.
  const lambda = settings.level === 'shift' ? shiftLambdaFor(view, columns, settings, fitDay) : 0;
  // The robust scale and the quartiles of all prices of the training days (one sorted sample).
  const { scale, quartiles } = scaleAndQuartiles(view, rows, longest, settings.scale);
  const days = new DriverDays(view, columns, scale, quartiles);
  const S = view.slotsPerDay;
  const J = settings.knots;
  // Slot columns x, hinges, lag 1, lag 7 and the response; day-level columns mean price and mean
  // residual load of the day before, and the weekday dummies (Sunday, category 7, the reference).
  const a = J + 4;
  const k = a - 1 + 2 + 6;
  const slotValues = new Float64Array(n * a);
  const models = new Float64Array(counts.length * S * (k + 1));
  const knotValues = new Float64Array(S * J);
  const trainingDays = rows.map((i) => {
    const dn = view.dayNumber(i);
    return { own: days.of(i), before: view.indexOf(dn - 1), regressors: days.regressors(view.indexOf(dn - 1), view.indexOf(dn - 7), view.past(i).weekday) };
  });
  const meanZ = Float64Array.from(trainingDays, (d) => d.regressors.meanZ);
  const meanX = Float64Array.from(trainingDays, (d) => d.regressors.meanX);
  const weekdays = Int8Array.from(trainingDays, (d) => d.regressors.weekday);
  const builder = timedFits(settings.stopwatch, 0, () => new SlotDayGramBuilder(
    {
      continuous: Float64Array.from(trainingDays.flatMap((d) => [d.regressors.meanZ, d.regressors.meanX])),
      width: 2,
      categories: weekdays,
      dummies: 6,
    },
    counts,
  ));
  // The days' slot values slot by slot (bySlot[s n + r]), laid out once for all slots.
  const xBySlot = bySlot(trainingDays.map((d) => d.own.x), S, scratchBuffers.get(0, S * n));
  const zBySlot = bySlot(trainingDays.map((d) => d.own.z), S, scratchBuffers.get(1, S * n));
  const lag1BySlot = bySlot(trainingDays.map((d) => d.regressors.lag1), S, scratchBuffers.get(2, S * n));
  const lag7BySlot = bySlot(trainingDays.map((d) => d.regressors.lag7), S, scratchBuffers.get(3, S * n));
  const fitted = new Float64Array(n);
  // The longest window's fit of each slot, read only by its Huber step: one array for all slots.
  const longestCoefficients = new Float64Array(k);
  // Per slot, the residual loads of the longest window's days in ascending order, kept from the last fit's.
  const sortedX = keptResidualLoads.of(trainingDays.map((d) => d.own.x));
  const dayColumns = { meanZ, meanX, weekdays };
  /** The slot columns of slot s (slotValues[q n + r]: x, the hinges, lag 1, lag 7, the response) at residual loads slotX, knots from sorted. */
  const fillSlot = (s: number, slotX: Float64Array, sorted: Float64Array): number[][] => {
    const knots = knotValues.subarray(s * J, (s + 1) * J);
    for (let j = 0; j < J; j++) knots[j] = sortedQuantile(sorted, (j + 1) / (J + 1));
    slotValues.set(slotX, 0);
    for (let j = 0; j < J; j++) {
      const knot = knots[j] as number;
      const base = (1 + j) * n;
      for (let r = 0; r < n; r++) {
        const xv = slotX[r] as number;
        // max(0, x - k): the same number as x > k ? x - k : 0 (+0 when x <= k), without a branch.
        slotValues[base + r] = Math.max(xv - knot, 0);
      }
    }
    slotValues.set(lag1BySlot.subarray(s * n, (s + 1) * n), (J + 1) * n);
    slotValues.set(lag7BySlot.subarray(s * n, (s + 1) * n), (J + 2) * n);
    slotValues.set(zBySlot.subarray(s * n, (s + 1) * n), (a - 1) * n);
    return thinHinges(slotValues, n, J, counts);
  };
  /** Least squares of slot s's columns on the longest window (thin hinges left out), into longestCoefficients. */
  const fitLongest = (thin: number[][]): LinearModel => {
    let longest: LinearModel | undefined;
    builder.forEachGram(
      slotValues,
      a,
      (gram, w) => {
        for (const j of thin[w] as number[]) gram.scales[j] = 0;
        longest = choleskyLeastSquares(gram, undefined, longestCoefficients);
      },
      { longestOnly: true },
    );
    return longest as LinearModel;
  };
  const chosen = lambda > 0 ? readShift(lambda) : null;
  const shift = chosen?.shift ?? null;
  /** The fit's residual-load shift at the chosen lambda and each training row's clipped D(d' - 1): one longest-window fit per slot. */
  function readShift(lambda: number): { shift: ResidualLoadShift; offsets: Float64Array } {
    return timedFits(settings.stopwatch, S, () => {
      // The curves: each slot's longest-window fit with the level read as today, its other columns at their means.
      const curves: MonotoneCurve[] = [];
      for (let s = 0; s < S; s++) {
        const model = fitLongest(fillSlot(s, xBySlot.subarray(s * n, (s + 1) * n), sortedX[s] as Float64Array));
        curves.push(slotCurve(model, slotValues, n, J, dayColumns, knotValues.subarray(s * J, (s + 1) * J)));
      }
      // Each training row's D(d' - 1), clipped at the rows' far-out fences.
      const work = new Float64Array(S);
      const raw = Float64Array.from(trainingDays, (d) => {
        const before = days.of(d.before);
        return dayOffset(curves, before.clipped, before.x, work);
      });
      const fences = offsetFences(raw);
      const offsets = Float64Array.from(raw, (v) => clipToFences(v, fences));
      return { shift: { lambda, curves, fences }, offsets };
    });
  }
  const shiftedX = new Float64Array(n);
  for (let s = 0; s < S; s++) {
    let slotX = xBySlot.subarray(s * n, (s + 1) * n);
    let sortedSlotX = sortedX[s] as Float64Array;
    if (shift !== null) {
      slotX = shiftedLoads(slotX, (chosen as { offsets: Float64Array }).offsets, shift.lambda, shiftedX);
      sortedSlotX = Float64Array.from(slotX).sort();
    }
    const thin = fillSlot(s, slotX, sortedSlotX);
    timedFits(settings.stopwatch, counts.length + 1, () => {
      // Least squares on the longest window, then on Huber's pseudo-observations of that fit in every window.
      let longest: LinearModel | undefined;
      builder.forEachGram(
        slotValues,
        a,
        (gram, w) => {
          for (const j of thin[w] as number[]) gram.scales[j] = 0;
          longest = choleskyLeastSquares(gram, undefined, longestCoefficients);
        },
        { longestOnly: true },
      );
      pseudoObservations(slotValues, n, a, { meanZ, meanX, weekdays }, longest as LinearModel, fitted);
      builder.forEachGram(
        slotValues,
        a,
        (gram, w) => {
          for (const j of thin[w] as number[]) gram.scales[j] = 0;
          const at = (w * S + s) * (k + 1);
          const model = choleskyLeastSquares(gram, undefined, models.subarray(at + 1, at + 1 + k));
          models[at] = model.intercept;
        },
        { newResponseOnly: true },
      );
    });
  }
  return { scale, quartiles, slots: S, knots: J, coefficients: k, knotValues, counts, windowCount: sizes.map((size) => counts.indexOf(size)), models, shift };
}

/**
 * The slot's fitted curve with the level read as today: the intercept plus the lags, the day-level columns
 * and the weekday dummies at their means over the rows, as a function of the residual load (slopes floored).
 */
function slotCurve(
  model: LinearModel,
  slotValues: Float64Array,
  n: number,
  J: number,
  day: { readonly meanZ: Float64Array; readonly meanX: Float64Array; readonly weekdays: Int8Array },
  knots: Float64Array,
): MonotoneCurve {
  const a = J + 4;
  const b = model.coefficients;
  let level = model.intercept;
  for (const q of [J + 1, J + 2]) level += (b[q] as number) * meanOfRange(slotValues, q * n, n);
  level += (b[a - 1] as number) * meanOf(day.meanZ) + (b[a] as number) * meanOf(day.meanX);
  for (let w = 1; w <= 6; w++) level += (b[a - 1 + 1 + w] as number) * weekdayShare(day.weekdays, w);
  return monotoneHingeCurve(level, b[0] as number, b.subarray(1, 1 + J), knots);
}

/**
 * lambda of level 'shift' for a fit on `fitDay`: the one chosen on the choice day, the latest multiple of
 * SHIFT_CHOICE_EVERY_DAYS on or before fitDay (kept in settings.fits), by {@link holdoutShiftLambda}.
 * The choice depends only on the days before the choice day, so kept or not it is the same number.
 */
function shiftLambdaFor(view: HistoryView, columns: ResidualLoadColumns, settings: DriverSettings, fitDay: number): number {
  const choiceDay = refitDayOf(fitDay, SHIFT_CHOICE_EVERY_DAYS);
  const kept = settings.fits?.shiftLambdas.get(choiceDay);
  if (kept !== undefined) return kept;
  const lambdas = settings.shiftLambdas ?? LAMBDAS;
  const lambda = timedFits(settings.stopwatch, lambdas.length * view.slotsPerDay, () => holdoutShiftLambda(view, columns, settings, choiceDay).lambda);
  settings.fits?.shiftLambdas.set(choiceDay, lambda);
  return lambda;
}

/**
 * lambda by rolling-origin validation (L. J. Tashman 2000, Out-of-sample tests of forecasting accuracy:
 * an analysis and review, Int. J. Forecast. 16(4), 437-450): of the longest window's training days before
 * `originDay`, the last SHIFT_HOLDOUT_DAYS are held out; on the others alone are taken the model's scale,
 * each slot's least-squares fit at lambda 0 and its curve, the offsets' fences, and for each lambda the
 * knots and the least-squares fit with x + lambda D(d' - 1); each lambda is scored by the absolute errors
 * of its fits on the held-out days over all slots, on the model's scale (twice the pinball loss at 0.5),
 * and the lowest wins, the smallest lambda on a tie (so 0 where the shift does not forecast better).
 * lambda 0 when the days left to fit are fewer than settings.minTrainingDays.
 *
 * @returns lambda and each lambda's score (the sum of absolute errors), in the order of the grid
 */
export function holdoutShiftLambda(
  view: HistoryView,
  columns: ResidualLoadColumns,
  settings: DriverSettings,
  originDay: number,
): { lambda: number; scores: number[] } {
  const lambdas = [...new Set([0, ...(settings.shiftLambdas ?? LAMBDAS)])].sort((p, q) => p - q);
  const longest = Math.max(...settings.windowsDays);
  const training: number[] = [];
  for (let i = view.indexAtOrBefore(originDay - 1); i >= 0 && view.dayNumber(i) >= originDay - longest; i--) {
    const dn = view.dayNumber(i);
    if (LAGS.every((lag) => view.indexOf(dn - lag) >= 0)) training.push(i);
  }
  const H = SHIFT_HOLDOUT_DAYS;
  const m = training.length - H;
  if (m < settings.minTrainingDays) return { lambda: 0, scores: [] };
  // Rows in the order of `training` (latest first): 0..H-1 held out, H.. fitted.
  const { scale, quartiles } = scaleAndQuartiles(view, training.slice(H), longest - H, settings.scale);
  const days = new DriverDays(view, columns, scale, quartiles);
  const rowsOf = (from: number, to: number) =>
    training.slice(from, to).map((i) => {
      const dn = view.dayNumber(i);
      return { own: days.of(i), before: days.of(view.indexOf(dn - 1)), regressors: days.regressors(view.indexOf(dn - 1), view.indexOf(dn - 7), view.past(i).weekday) };
    });
  const held = rowsOf(0, H);
  const fitted = rowsOf(H, training.length);
  const dayOf = (rows: typeof held) => ({
    meanZ: Float64Array.from(rows, (d) => d.regressors.meanZ),
    meanX: Float64Array.from(rows, (d) => d.regressors.meanX),
    weekdays: Int8Array.from(rows, (d) => d.regressors.weekday),
  });
  const heldDay = dayOf(held);
  const fittedDay = dayOf(fitted);
  const builder = new SlotDayGramBuilder(
    { continuous: Float64Array.from(fitted.flatMap((d) => [d.regressors.meanZ, d.regressors.meanX])), width: 2, categories: fittedDay.weekdays, dummies: 6 },
    [m],
  );
  const S = view.slotsPerDay;
  const J = settings.knots;
  const a = J + 4;
  const k = a - 1 + 2 + 6;
  const fittedValues = new Float64Array(m * a);
  const heldValues = new Float64Array(H * a);
  const coefficients = new Float64Array(k);
  const work = new Float64Array(Math.max(m, H));
  const knots = new Float64Array(J);
  const curves: MonotoneCurve[] = [];
  const heldOffsets = new Float64Array(H);
  const fittedOffsets = new Float64Array(m);
  const shiftedFitted = new Float64Array(m);
  const shiftedHeld = new Float64Array(H);
  const scores: number[] = [];
  for (const lambda of lambdas) {
    let score = 0;
    for (let s = 0; s < S; s++) {
      for (let r = 0; r < m; r++) shiftedFitted[r] = ((fitted[r] as (typeof fitted)[number]).own.x[s] as number) + lambda * (fittedOffsets[r] as number);
      for (let r = 0; r < H; r++) shiftedHeld[r] = ((held[r] as (typeof held)[number]).own.x[s] as number) + lambda * (heldOffsets[r] as number);
      const sorted = Float64Array.from(shiftedFitted).sort();
      const slotKnots = new Float64Array(J);
      for (let j = 0; j < J; j++) slotKnots[j] = sortedQuantile(sorted, (j + 1) / (J + 1));
      knots.set(slotKnots);
      slotColumns(fitted, s, shiftedFitted, knots, fittedValues);
      slotColumns(held, s, shiftedHeld, knots, heldValues);
      const thin = thinHinges(fittedValues, m, J, [m]);
      let model: LinearModel | undefined;
      builder.forEachGram(fittedValues, a, (gram) => {
        for (const j of thin[0] as number[]) gram.scales[j] = 0;
        model = choleskyLeastSquares(gram, undefined, coefficients);
      });
      score += absoluteErrorSum(heldValues, H, a, heldDay, model as LinearModel, work);
      if (lambda === 0) curves.push(slotCurve(model as LinearModel, fittedValues, m, J, fittedDay, slotKnots));
    }
    scores.push(score);
    if (lambda === 0) {
      // Each row's D(d' - 1) through the curves fitted without the held-out days, clipped at the fitted rows' fences.
      const offsetWork = new Float64Array(S);
      const raw = Float64Array.from(fitted, (d) => dayOffset(curves, d.before.clipped, d.before.x, offsetWork));
      const fences = offsetFences(raw);
      raw.forEach((v, r) => (fittedOffsets[r] = clipToFences(v, fences)));
      held.forEach((d, r) => (heldOffsets[r] = clipToFences(dayOffset(curves, d.before.clipped, d.before.x, offsetWork), fences)));
    }
  }
  let best = 0;
  for (let i = 1; i < lambdas.length; i++) if ((scores[i] as number) < (scores[best] as number)) best = i;
  return { lambda: lambdas[best] as number, scores };
}

/** Slot s's columns of `rows` (x, the hinges at `knots`, lag 1, lag 7, the response z), column by column into `out`. */
function slotColumns(
  rows: readonly { readonly own: DriverDay; readonly regressors: DayRegressors }[],
  s: number,
  x: Float64Array,
  knots: Float64Array,
  out: Float64Array,
): void {
  const n = rows.length;
  const J = knots.length;
  for (let r = 0; r < n; r++) {
    const d = rows[r] as (typeof rows)[number];
    const xv = x[r] as number;
    out[r] = xv;
    for (let j = 0; j < J; j++) out[(1 + j) * n + r] = Math.max(xv - (knots[j] as number), 0);
    out[(J + 1) * n + r] = d.regressors.lag1[s] as number;
    out[(J + 2) * n + r] = d.regressors.lag7[s] as number;
    out[(J + 3) * n + r] = d.own.z[s] as number;
  }
}

/** Regressors of a day that come from the days before it (and its weekday). */
interface DayRegressors {
  /** Mean of the day before's prices on the model's scale, clipped at the far-out fences. */
  readonly meanZ: number;
  /** Mean residual load of the day before. */
  readonly meanX: number;
  /** The day before's and the week before's prices per slot on the model's scale, clipped at the far-out fences. */
  readonly lag1: Float64Array;
  readonly lag7: Float64Array;
  readonly weekday: number;
}

/**
 * Fewest training days on which a hinge column must be non-zero for it to enter a window's fit [-], and
 * the same as a share of the window's days. A hinge that only a handful of days reach has a slope fixed
 * by those few days, which the delivery day may then extrapolate far: such a column is left out.
 */
const HINGE_SUPPORT_DAYS = 20;
const HINGE_SUPPORT_SHARE = 0.1;

/**
 * Per count (the first counts[w] rows), the hinge columns (1..J; columns[j n + r]) that fewer than the
 * support's days of those rows reach: one pass over the rows per hinge, read off at every count.
 */
function thinHinges(columns: Float64Array, n: number, hinges: number, counts: readonly number[]): number[][] {
  const out = counts.map((): number[] => []);
  for (let j = 1; j <= hinges; j++) {
    let support = 0;
    let r = 0;
    counts.forEach((count, w) => {
      for (; r < count; r++) support += (columns[j * n + r] as number) > 0 ? 1 : 0;
      if (support < Math.max(HINGE_SUPPORT_DAYS, HINGE_SUPPORT_SHARE * count)) (out[w] as number[]).push(j);
    });
  }
  return out;
}

/** Scratch space of the slot-by-slot layouts, reused from one delivery day to the next. */
const scratchBuffers = new ScratchBuffers();

/** Per-day arrays of S slot values, slot by slot into `out` (S n long): out[s n + r] = days[r][s]. */
function bySlot(days: readonly Float64Array[], S: number, out: Float64Array): Float64Array {
  const n = days.length;
  let r = 0;
  // Four days at a time: each slot's four values go to one stretch of `out`, not each to a cache line of its own.
  for (; r + 4 <= n; r += 4) {
    const d0 = days[r] as Float64Array;
    const d1 = days[r + 1] as Float64Array;
    const d2 = days[r + 2] as Float64Array;
    const d3 = days[r + 3] as Float64Array;
    for (let s = 0; s < S; s++) {
      const at = s * n + r;
      out[at] = d0[s] as number;
      out[at + 1] = d1[s] as number;
      out[at + 2] = d2[s] as number;
      out[at + 3] = d3[s] as number;
    }
  }
  for (; r < n; r++) {
    const day = days[r] as Float64Array;
    for (let s = 0; s < S; s++) out[s * n + r] = day[s] as number;
  }
  return out;
}

/**
 * The residual loads of the last delivery day's longest window, sorted per slot, for the knots (the
 * j/(J+1) sample quantiles of definition 7 read off the sorted values with sortedQuantile): the next
 * day's window differs by a day or two, so they are updated rather than sorted again
 * (slotSortedValues.ts; the same numbers whatever was kept).
 */
const keptResidualLoads = new SlotSortedValues();

/** A past day on the model's scale: prices (z), prices clipped at the day's fences, residual load, means. */
interface DriverDay {
  readonly z: Float64Array;
  readonly clipped: Float64Array;
  readonly x: Float64Array;
  readonly meanZ: number;
  readonly meanX: number;
}

/** What does not depend on the delivery day, kept per gridded past day: fences of its prices, residual load. */
const dayInputs = new WeakMap<GriddedDay, { readonly low: number; readonly high: number; readonly x: Float64Array; readonly meanX: number; readonly columns: string }>();

/**
 * Blocks of the past days' arrays of DriverDays, reused by every forecast (one forecast at a time uses
 * them, and nothing it returns points into them): some 1.4 MB a forecast, no longer allocated afresh.
 */
const dayBlocks: Float64Array[] = [];

/** Per past day, the prices on the delivery day's scale and the residual load (computed once per delivery day). */
class DriverDays {
  private readonly cache = new Map<number, DriverDay>();
  private readonly signature: string;
  /**
   * The far-out fences of the training days' prices on the model's scale, from their quartiles transformed:
   * a day whose prices spiked in more than a quarter of its periods (an outage lasting the day) has day
   * fences that hold its spikes, so its regressors are clipped at these too. On the asinh scale they lie far
   * above a convex market's high-priced days, which fences on the price scale would clip
   * (docs/forecast-quality.md, the ninth wave: outage-spikes' fresh draw 3).
   */
  private readonly sampleFences: Fences;

  constructor(
    private readonly view: HistoryView,
    private readonly columns: ResidualLoadColumns,
    private readonly scale: RobustScale | null,
    sampleQuartiles: SampleBounds['quartiles'],
  ) {
    this.signature = `${columns.added.join(',')}-${columns.subtracted.join(',')}`;
    const { q1, q3 } = sampleQuartiles;
    this.sampleFences = scale === null ? fencesOfQuartiles(q1, q3) : fencesOfQuartiles(toAsinhScale(q1, scale), toAsinhScale(q3, scale));
  }

  of(i: number): DriverDay {
    let day = this.cache.get(i);
    if (day === undefined) {
      const past = this.view.past(i);
      let inputs = dayInputs.get(past);
      if (inputs === undefined || inputs.columns !== this.signature) {
        const x = residualLoad(past, this.columns);
        inputs = { ...farOutFences(past.prices), x, meanX: meanOf(x), columns: this.signature };
        dayInputs.set(past, inputs);
      }
      const prices = past.prices;
      const S = prices.length;
      const z = this.take(S);
      const clipped = this.take(S);
      const scale = this.scale;
      // The transformation is increasing, so clipping at the transformed fences equals transforming the clipped prices.
      const low = scale === null ? inputs.low : toAsinhScale(inputs.low, scale);
      const high = scale === null ? inputs.high : toAsinhScale(inputs.high, scale);
      // Then at the training days' fences (sampleFences).
      const { low: sampleLow, high: sampleHigh } = this.sampleFences;
      if (scale === null) z.set(prices);
      else toAsinhScales(prices, scale, z);
      let sum = 0;
      for (let s = 0; s < S; s++) {
        const v = z[s] as number;
        const d = v < low ? low : v > high ? high : v;
        const c = d < sampleLow ? sampleLow : d > sampleHigh ? sampleHigh : d;
        clipped[s] = c;
        sum += c;
      }
      day = { z, clipped, x: inputs.x, meanZ: sum / S, meanX: inputs.meanX };
      this.cache.set(i, day);
    }
    return day;
  }

  /** Room for the days' arrays: the blocks of dayBlocks from the first, taken in turn (the last forecast's reused). */
  private blockIndex = -1;
  private block: Float64Array = new Float64Array(0);
  private used = 0;

  /** An array of `length` values to be written (what an earlier forecast left there), a view of the current block. */
  private take(length: number): Float64Array {
    if (this.used + length > this.block.length) {
      this.blockIndex++;
      let block = dayBlocks[this.blockIndex];
      if (block === undefined || block.length < length) {
        block = new Float64Array(Math.max(length, 128 * length));
        dayBlocks[this.blockIndex] = block;
      }
      this.block = block;
      this.used = 0;
    }
    const out = this.block.subarray(this.used, this.used + length);
    this.used += length;
    return out;
  }

  /** The regressors of a day whose day before is past day `lag1` and week before `lag7`. */
  regressors(lag1: number, lag7: number, weekday: number): DayRegressors {
    const yesterday = this.of(lag1);
    return { meanZ: yesterday.meanZ, meanX: yesterday.meanX, lag1: yesterday.clipped, lag7: this.of(lag7).clipped, weekday };
  }

  toPrice(z: number): number {
    return this.scale === null ? z : fromAsinhScale(z, this.scale);
  }
}

/** The robust scale (null on the price scale) and the quartiles of all prices of the past days `rows`. */
function scaleAndQuartiles(view: HistoryView, rows: readonly number[], windowDays: number, scale: DriverSettings['scale']): { scale: RobustScale | null; quartiles: SampleBounds['quartiles'] } {
  if (scale === 'asinh') {
    const { scale: robust, bounds } = view.robustScaleWithBoundsOf(rows, windowDays);
    return { scale: robust, quartiles: bounds.quartiles };
  }
  const prices = new Float64Array(rows.reduce((sum, i) => sum + view.past(i).prices.length, 0));
  let at = 0;
  for (const i of rows) {
    prices.set(view.past(i).prices, at);
    at += view.past(i).prices.length;
  }
  return { scale: null, quartiles: sortedSampleBounds(prices.sort()).quartiles };
}

/** x + lambda D(d' - 1) per training row, into `out`. */
function shiftedLoads(x: Float64Array, offsets: Float64Array, lambda: number, out: Float64Array): Float64Array {
  for (let r = 0; r < x.length; r++) out[r] = (x[r] as number) + lambda * (offsets[r] as number);
  return out;
}

function meanOfRange(values: Float64Array, from: number, length: number): number {
  return meanOf(values.subarray(from, from + length));
}

/** Share of rows on weekday w (1..7). */
function weekdayShare(weekdays: Int8Array, w: number): number {
  let count = 0;
  for (let r = 0; r < weekdays.length; r++) if (weekdays[r] === w) count++;
  return count / weekdays.length;
}

function meanOf(values: Float64Array): number {
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += values[i] as number;
  return sum / values.length;
}

/** Huber's tuning constant: 95% efficiency at the normal (Holland and Welsch 1977). */
const HUBER_C = 1.345;
/** 1 / Phi^-1(3/4): the MAD times this estimates sigma for normal data. */
const MAD_TO_SIGMA = 1.482602218505602;

/**
 * Huber's clipping point c sigma of residuals r_1..r_n: c = 1.345, sigma = MAD / Phi^-1(3/4) with
 * MAD = med |r_i - med r| (the median is the order statistic n >> 1 counted from 0: the middle one for odd
 * n, the upper of the two middle ones for even n).
 */
export function huberClipLimit(residuals: Float64Array): number {
  const n = residuals.length;
  const work = scratchBuffers.get(4, n);
  work.set(residuals);
  const n2 = n >> 1;
  const med = selectInPlace(work, n2);
  for (let r = 0; r < n; r++) work[r] = Math.abs((residuals[r] as number) - med);
  const sigma = selectInPlace(work, n2) * MAD_TO_SIGMA;
  return HUBER_C * sigma;
}

/**
 * Replaces the response column of `columns` (the slot columns column by column, n rows each, response last) by Huber's
 * pseudo-observations of the fit `model`: y* = y_hat + psi(y - y_hat), psi(r) = max(-c sigma, min(c sigma, r)),
 * sigma = MAD of the residuals / Phi^-1(3/4). Least squares on them is Bickel's one-step Huber estimate.
 */
function pseudoObservations(
  columns: Float64Array,
  n: number,
  a: number,
  day: { readonly meanZ: Float64Array; readonly meanX: Float64Array; readonly weekdays: Int8Array },
  model: LinearModel,
  fitted: Float64Array,
): void {
  const y = (a - 1) * n;
  const residuals = residualsInto(columns, n, a, day, model, fitted);
  const limit = huberClipLimit(residuals.subarray(0, n));
  for (let r = 0; r < n; r++) {
    const e = residuals[r] as number;
    if (e > limit) columns[y + r] = (columns[y + r] as number) - (e - limit);
    else if (e < -limit) columns[y + r] = (columns[y + r] as number) - (e + limit);
  }
}

/** The sum of absolute residuals of `model` on the slot columns (n rows, response last) and day columns: twice the pinball loss at 0.5. */
function absoluteErrorSum(
  columns: Float64Array,
  n: number,
  a: number,
  day: { readonly meanZ: Float64Array; readonly meanX: Float64Array; readonly weekdays: Int8Array },
  model: LinearModel,
  work: Float64Array,
): number {
  const residuals = residualsInto(columns, n, a, day, model, work);
  let sum = 0;
  for (let r = 0; r < n; r++) sum += Math.abs(residuals[r] as number);
  return sum;
}

/** The residuals y - y_hat of `model` on the slot columns (n rows, response last) and day columns, into `fitted`. */
function residualsInto(
  columns: Float64Array,
  n: number,
  a: number,
  day: { readonly meanZ: Float64Array; readonly meanX: Float64Array; readonly weekdays: Int8Array },
  model: LinearModel,
  fitted: Float64Array,
): Float64Array {
  const b = model.coefficients;
  const p = a - 1;
  const y = p * n;
  const bz = b[p] as number;
  const bx = b[p + 1] as number;
  // Column by column: each row's fit adds the same terms in the same order as a row-by-row sum.
  fitted.fill(model.intercept, 0, n);
  let q = 0;
  for (; q + 1 < p; q += 2) {
    const b0 = b[q] as number;
    const b1 = b[q + 1] as number;
    const base = q * n;
    for (let r = 0; r < n; r++) fitted[r] = (fitted[r] as number) + b0 * (columns[base + r] as number) + b1 * (columns[base + n + r] as number);
  }
  for (; q < p; q++) {
    const bq = b[q] as number;
    const base = q * n;
    for (let r = 0; r < n; r++) fitted[r] = (fitted[r] as number) + bq * (columns[base + r] as number);
  }
  for (let r = 0; r < n; r++) {
    let f = (fitted[r] as number) + (bz * (day.meanZ[r] as number) + bx * (day.meanX[r] as number));
    const weekday = day.weekdays[r] as number;
    if (weekday <= 6) f += b[p + 1 + weekday] as number;
    fitted[r] = (columns[y + r] as number) - f;
  }
  return fitted;
}
