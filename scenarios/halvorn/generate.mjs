#!/usr/bin/env node
/**
 * Seeded generator of the fictional "Halvorn" demo market (an invented island region; its invented
 * "Halvorn day-ahead auction" clears in the invented currency HLV). Nothing here describes a real
 * market, place, company or data set: every number comes from the seeded generators below.
 *
 * Run: `node scenarios/halvorn/generate.mjs` (from anywhere; outputs go beside this file).
 * Writes market.json, battery.json, scenario.json, history.csv.gz and quantiles.csv.gz, byte-identical
 * on every run (same SEED, no clock, no Math.random), and prints the figures of the data on stderr.
 *
 * ---------------------------------------------------------------------------------------------------
 * The model, in the order it is simulated
 * ---------------------------------------------------------------------------------------------------
 * Clock: delivery periods of 15 min from 2025-01-01T00:00 to 2027-01-01T23:45 local time in
 * Europe/Berlin (the zone is only a clock: 92 periods on spring clock-change days, 100 in autumn).
 * History is written up to 2026-12-31; 2027-01-01 (the demo's "tomorrow") has only a forecast.
 *
 * 1. Load [MW]. L = seasonal level (winter higher) x daily profile (night trough, morning peak near
 *    08:30, evening peak near 19:00 that is stronger in winter) x weekly factor (Saturday 0.91,
 *    Sunday and the fictional calendar's public holidays 0.85, weaker and later morning peak)
 *    x (1 + day deviation, AR(1) over days, sd 3 %: the "weather" the forecaster partly knows).
 *    The published load forecast uses the day deviation as known the day before (off by about
 *    0.8 %) and carries an error that is AR(1) over hours, sd 1.5 %.
 * 2. Wind [MW]. A latent Gaussian AR(1) over UTC hours, w_h = PHI_W w_{h-1} + sqrt(1-PHI_W^2) e_h
 *    (persistence of about 3 days), interpolated to periods; capacity factor = logistic(a + b*season
 *    + c*w), windier in winter. The wind forecast sees w + u with u another AR(1) over hours, so its
 *    error is largest at mid capacity factors (where the logistic is steepest), as for real fleets.
 * 3. Solar [MW]. Clear-sky output from the solar elevation (declination after Cooper 1969, hour angle
 *    from UTC and the invented island's longitude), raised to a power, times a daily clearness index
 *    (logistic of an AR(1) over days, clearer in summer) with a small intraday AR(1) wobble. The
 *    forecast sees the daily clearness with an error and not the wobble.
 * 4. Fuel/day factor F_d = mu(season) * exp(f_d), f_d = PHI_F f_{d-1} + SIG_F e_d: a persistent cost
 *    level shared by all periods of a day (winter higher). The forecaster knows f_{d-1} the day before,
 *    so its expectation is mu * exp(PHI_F f_{d-1}); the innovation is a day-level surprise. A second
 *    additive day shock (imports, outages) is not known at all.
 * 5. Clearing price [HLV/MWh] = merit order of residual load x = load - wind - solar [GW], nonlinear:
 *    above a must-run knee the thermal stack sets a convex, fuel-scaled price with a steep scarcity
 *    tail; below the knee (windy nights, sunny weekend middays) surplus renewables push the price
 *    down a concave curve into NEGATIVE values; plus a ramp premium at the morning and evening peaks,
 *    an AR(1) noise over periods whose size grows with the price, rare scarcity SPIKES (events of
 *    1-3 h at peak hours, a few per year, more likely in winter, peak +200..+1250 on top of the
 *    clearing price) and the day shocks, clamped into [floor, cap].
 *    The daily shape (two peaks), the midday solar dip (deeper in summer, when the sun is high),
 *    the weekly shape and the seasonal level all come through load, solar and F; negative prices come
 *    from persistent wind on low-load nights and weekends.
 * 6. Vendor quantile forecast, made the day before from the published load and renewables forecasts
 *    and the expected fuel factor: median m = the same merit order at the forecast residual load
 *    + ramp premium + a small vendor bias per day (the vendor is not perfect); spread
 *    s = K * hour multiplier * sqrt((slope of merit order x residual-load forecast error)^2
 *    + (relative price uncertainty)^2 + floor^2): wide where the forecast sits on a steep part of the
 *    curve or the wind is uncertain, wider at the peaks. Levels q(tau) = m + s * T(z_tau) with
 *    T the Tukey g-and-h transform of the normal quantile z_tau (Hoaglin 1985): g > 0 (right skew)
 *    at normal residual loads, g < 0 near and below the knee (the downside is the risk there),
 *    h > 0 (fat tails). K is set so that the 80 % central interval covers roughly, not exactly,
 *    80 % of outcomes. In about 0.1 % of rows one level is then nudged below the level before it
 *    (a crossing), as in real vendor files, so that readers exercise their rearrangement.
 * 7. Imbalance (balancing) price "moves against whoever was surprised":
 *    imbalance = clearing + KAPPA * (clearing - vendor median) + noise, clamped into [floor, cap].
 *
 * Random numbers: xoshiro128** (Blackman & Vigna 2021) seeded per named stream through a 32-bit
 * mixer of SEED and the stream name, so that each process has its own stream and changing one
 * process leaves the others untouched; normal deviates by the Box-Muller transform (Box & Muller
 * 1958); the normal quantile by bisection on the normal CDF, with erf from Abramowitz & Stegun
 * (1964) eq. 7.1.26 (|error| < 1.5e-7, ample for synthetic data).
 *
 * References
 * [1] D. Blackman, S. Vigna (2021). Scrambled linear pseudorandom number generators. ACM Transactions
 *     on Mathematical Software 47(4), 36. doi:10.1145/3460772
 * [2] G. E. P. Box, M. E. Muller (1958). A note on the generation of random normal deviates. Annals of
 *     Mathematical Statistics 29(2), 610-611. doi:10.1214/aoms/1177706645
 * [3] M. Abramowitz, I. A. Stegun (1964). Handbook of Mathematical Functions, NBS Applied Mathematics
 *     Series 55, eq. 7.1.26.
 * [4] D. C. Hoaglin (1985). Summarizing shape numerically: the g-and-h distributions. In D. C. Hoaglin,
 *     F. Mosteller, J. W. Tukey (eds.), Exploring Data Tables, Trends, and Shapes, Wiley, 461-513.
 *     doi:10.1002/9781118150702.ch11
 * [5] P. I. Cooper (1969). The absorption of radiation in solar stills. Solar Energy 12(3), 333-346.
 *     doi:10.1016/0038-092X(69)90047-4
 */

import { gzipSync } from 'node:zlib';
import { renameSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { DateTime } from 'luxon';

// ------------------------------------------------------------------------------------------------
// Constants: the whole scenario is a function of these.
// ------------------------------------------------------------------------------------------------

/** Master seed of every random stream. */
const SEED = 20270101;

const ZONE = 'Europe/Berlin';
const PERIOD_MINUTES = 15;
const PERIOD_MS = PERIOD_MINUTES * 60_000;
const FIRST_DAY = '2025-01-01';
/** Last day written to the history; the forecast also covers DEMO_DAY. */
const LAST_HISTORY_DAY = '2026-12-31';
const DEMO_DAY = '2027-01-01';

const PRICE_FLOOR = -500;
const PRICE_CAP = 4000;

/** Quantile levels 0.05, 0.10, ..., 0.95. */
const LEVELS = Array.from({ length: 19 }, (_, i) => Math.round(5 * (i + 1)) / 100);

/** Fixed public holidays of the fictional Halvorn calendar (month-day), treated like Sundays. */
const HOLIDAYS = new Set(['01-01', '04-09', '06-21', '09-14', '12-24', '12-25', '12-26', '12-31']);

/** Island geography (invented): latitude and longitude [deg], used only for the sun's path. */
const LATITUDE_DEG = 54.5;
const LONGITUDE_DEG = 11.0;

/** Fleet sizes [MW]. */
const WIND_CAPACITY_MW = 4200;
const SOLAR_CAPACITY_MW = 3600;
/** Seasonal load level [MW]: LOAD_MEAN + LOAD_SEASON * season. */
const LOAD_MEAN_MW = 5300;
const LOAD_SEASON_MW = 800;

/** Wind latent AR(1) coefficient per hour, and the forecast-error AR(1) (coefficient, sd). */
const PHI_W = 0.985;
const PHI_WIND_ERR = 0.93;
const SD_WIND_ERR = 0.28;
/** Logistic link of wind capacity factor: logistic(A + B*season + C*w). */
const WIND_A = -1.0;
const WIND_B = 0.35;
const WIND_C = 1.45;

/** Fuel/day factor: AR(1) over days of log F. */
const PHI_F = 0.98;
const SIG_F = 0.04;

/** Merit order: must-run knee [GW]. */
const KNEE_GW = 1.35;

/** Scarcity events: daily probability (scaled by season) and peak size range [HLV/MWh]. */
const SPIKE_DAILY_PROBABILITY = 0.011;
const SPIKE_MIN = 200;
const SPIKE_RANGE = 1050;

/** Vendor spread multiplier (calibration) and g-and-h tail parameter. */
const VENDOR_K = 0.75;
const VENDOR_H = 0.09;
/** Share of quantile rows given a crossing. */
const CROSSING_PROBABILITY = 0.001;

/** Imbalance price: sensitivity to the forecast surprise [-]. */
const KAPPA = 0.5;

// ------------------------------------------------------------------------------------------------
// Random numbers
// ------------------------------------------------------------------------------------------------

/**
 * 32-bit avalanche mixer (add a Weyl constant, then xor-shift-multiply rounds).
 * @param {number} x 32-bit integer
 * @returns {number} unsigned 32-bit integer
 */
function mix32(x) {
  let z = (x + 0x9e3779b9) | 0;
  z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
  z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
  return (z ^ (z >>> 16)) >>> 0;
}

/** A seeded stream: xoshiro128** [1] for uniforms, Box-Muller [2] for normals. */
class Rng {
  /**
   * @param {number} seed master seed
   * @param {string} name stream name; each name gives an independent-looking stream
   */
  constructor(seed, name) {
    let h = mix32(seed);
    for (let i = 0; i < name.length; i += 1) h = mix32(h ^ Math.imul(name.charCodeAt(i), 0x01000193));
    this.a = (h = mix32(h)) | 0;
    this.b = (h = mix32(h)) | 0;
    this.c = (h = mix32(h)) | 0;
    this.d = (h = mix32(h)) | 0;
    if ((this.a | this.b | this.c | this.d) === 0) this.d = 1;
    /** @type {number | null} */
    this.spare = null;
  }

  /** @returns {number} next 32-bit output of xoshiro128** */
  nextUint32() {
    const b = this.b;
    const r0 = Math.imul(b, 5);
    const result = Math.imul((r0 << 7) | (r0 >>> 25), 9);
    const t = b << 9;
    this.c ^= this.a;
    this.d ^= this.b;
    this.b ^= this.c;
    this.a ^= this.d;
    this.c ^= t;
    this.d = (this.d << 11) | (this.d >>> 21);
    return result >>> 0;
  }

  /** @returns {number} uniform in the open interval (0, 1) */
  uniform() {
    return (this.nextUint32() + 0.5) / 4294967296;
  }

  /** @returns {number} standard normal deviate (Box-Muller, the second value kept for the next call) */
  normal() {
    if (this.spare !== null) {
      const s = this.spare;
      this.spare = null;
      return s;
    }
    const r = Math.sqrt(-2 * Math.log(this.uniform()));
    const theta = 2 * Math.PI * this.uniform();
    this.spare = r * Math.sin(theta);
    return r * Math.cos(theta);
  }

  /**
   * @param {number} n number of choices
   * @returns {number} integer in 0..n-1
   */
  int(n) {
    return Math.min(n - 1, Math.floor(this.uniform() * n));
  }
}

/**
 * Stationary AR(1) path x_i = phi x_{i-1} + sd sqrt(1 - phi^2) e_i with x_0 ~ N(0, sd^2).
 * @param {Rng} rng
 * @param {number} n length
 * @param {number} phi coefficient in [0, 1)
 * @param {number} sd stationary standard deviation
 * @returns {Float64Array}
 */
function ar1(rng, n, phi, sd) {
  const out = new Float64Array(n);
  const k = sd * Math.sqrt(1 - phi * phi);
  let x = sd * rng.normal();
  for (let i = 0; i < n; i += 1) {
    if (i > 0) x = phi * x + k * rng.normal();
    out[i] = x;
  }
  return out;
}

// ------------------------------------------------------------------------------------------------
// Small math
// ------------------------------------------------------------------------------------------------

/** @param {number} x @returns {number} */
const logistic = (x) => 1 / (1 + Math.exp(-x));

/** @param {number} x @param {number} lo @param {number} hi @returns {number} */
const clamp = (x, lo, hi) => Math.min(hi, Math.max(lo, x));

/**
 * Gaussian bump exp(-((h - mu)/width)^2 / 2), on a 24 h circle.
 * @param {number} h hour of day [h]
 * @param {number} mu centre [h]
 * @param {number} width [h]
 * @returns {number}
 */
function bump(h, mu, width) {
  let d = Math.abs(h - mu);
  if (d > 12) d = 24 - d;
  return Math.exp(-0.5 * (d / width) ** 2);
}

/**
 * Error function, Abramowitz & Stegun (1964) eq. 7.1.26 [3], |error| < 1.5e-7.
 * @param {number} x
 * @returns {number}
 */
function erf(x) {
  const s = x < 0 ? -1 : 1;
  const ax = Math.abs(x);
  const t = 1 / (1 + 0.3275911 * ax);
  const poly = t * (0.254829592 + t * (-0.284496736 + t * (1.421413741 + t * (-1.453152027 + t * 1.061405429))));
  return s * (1 - poly * Math.exp(-ax * ax));
}

/**
 * Standard normal quantile by bisection on Phi(z) = (1 + erf(z / sqrt 2)) / 2.
 * @param {number} p probability in (0, 1)
 * @returns {number}
 */
function normalQuantile(p) {
  let lo = -10;
  let hi = 10;
  for (let i = 0; i < 100; i += 1) {
    const mid = (lo + hi) / 2;
    if ((1 + erf(mid / Math.SQRT2)) / 2 < p) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/**
 * Tukey g-and-h transform [4]: T(z) = (exp(g z) - 1)/g * exp(h z^2 / 2), T(z) = z exp(h z^2/2) at g = 0.
 * Monotone increasing in z for h >= 0.
 * @param {number} z standard normal quantile
 * @param {number} g skewness parameter (> 0: right skew)
 * @param {number} h tail parameter (>= 0: heavier tails)
 * @returns {number}
 */
function gAndH(z, g, h) {
  const core = Math.abs(g) < 1e-9 ? z : Math.expm1(g * z) / g;
  return core * Math.exp((h * z * z) / 2);
}

/**
 * Fixed-decimal text without a negative zero.
 * @param {number} x
 * @param {number} digits
 * @returns {string}
 */
function fixed(x, digits) {
  const s = x.toFixed(digits);
  return Number(s) === 0 ? (0).toFixed(digits) : s;
}

// ------------------------------------------------------------------------------------------------
// Physical building blocks
// ------------------------------------------------------------------------------------------------

/**
 * Seasonal index: +1 in mid-January, -1 in mid-July.
 * @param {number} dayOfYear 1..366
 * @returns {number}
 */
const seasonIndex = (dayOfYear) => Math.cos((2 * Math.PI * (dayOfYear - 15)) / 365.25);

/**
 * Clear-sky solar capacity factor [-] from the sun's elevation at an instant.
 * Declination after Cooper (1969) [5]; hour angle from UTC and the longitude (no equation of time).
 * @param {number} dayOfYear 1..366
 * @param {number} utcHours hours since UTC midnight [h]
 * @returns {number} in [0, 0.8]
 */
function clearSkySolar(dayOfYear, utcHours) {
  const rad = Math.PI / 180;
  const decl = 23.45 * rad * Math.sin((2 * Math.PI * (284 + dayOfYear)) / 365);
  const omega = 15 * rad * (utcHours + LONGITUDE_DEG / 15 - 12);
  const lat = LATITUDE_DEG * rad;
  const sinElev = Math.sin(lat) * Math.sin(decl) + Math.cos(lat) * Math.cos(decl) * Math.cos(omega);
  return sinElev > 0 ? 0.8 * sinElev ** 1.2 : 0;
}

/**
 * Load profile multiplier [-] by local hour, for working days and days off.
 * @param {number} h local hour of day at the period's midpoint [h]
 * @param {boolean} offDay weekend or holiday
 * @param {number} season seasonal index in [-1, 1]
 * @returns {number}
 */
function loadProfile(h, offDay, season) {
  const rise = offDay ? 7.5 : 6.2;
  const day = logistic((h - rise) / 0.7) * (1 - logistic((h - 22.6) / 0.8));
  const morning = offDay ? 0.03 * bump(h, 10.5, 1.8) : 0.07 * bump(h, 8.5, 1.3);
  const evening = (0.08 + 0.05 * Math.max(0, season)) * bump(h, 19.0, 1.6);
  return 0.78 + 0.2 * day + morning + evening;
}

/**
 * Merit order: clearing price [HLV/MWh] at residual load x [GW] and fuel/day factor [-].
 * Above the knee: convex, fuel-scaled thermal stack plus a steep scarcity tail.
 * Below the knee: surplus renewables, concave fall into negative prices (not fuel-scaled).
 * @param {number} xGw residual load [GW]
 * @param {number} fuel day factor [-]
 * @returns {number}
 */
function meritOrder(xGw, fuel) {
  if (xGw >= KNEE_GW) {
    const y = xGw - KNEE_GW;
    return 25 + fuel * (28 + 16 * y + 2.0 * y * y) + 60 * Math.exp((xGw - 7.4) / 0.45);
  }
  const y = KNEE_GW - xGw;
  return 25 + fuel * 28 - 40 * y - 14 * y * y;
}

/**
 * Ramp premium at the morning and evening peaks [HLV/MWh].
 * @param {number} h local hour [h]
 * @param {boolean} offDay
 * @param {number} fuel day factor [-]
 * @returns {number}
 */
function rampPremium(h, offDay, fuel) {
  const w = offDay ? 0.5 : 1;
  return w * fuel * (6 * bump(h, 7.75, 1.0) + 10 * bump(h, 18.75, 1.3));
}

// ------------------------------------------------------------------------------------------------
// Calendar
// ------------------------------------------------------------------------------------------------

/**
 * @typedef {object} Period
 * @property {number} ms start, epoch milliseconds
 * @property {string} iso start, ISO 8601 with offset
 * @property {number} dayIdx index of the delivery day
 * @property {number} localHour local hour at the period's midpoint [h]
 * @property {number} utcHour hours since UTC midnight at the midpoint [h]
 * @property {number} hourIdx hours since the first period, at the midpoint [h]
 * @property {number} doy day of year
 * @property {boolean} offDay weekend or holiday
 * @property {number} weekday 1 = Monday .. 7 = Sunday
 */

/**
 * Delivery periods from FIRST_DAY 00:00 to the end of DEMO_DAY, local time.
 * @returns {{ periods: Period[], days: string[] }}
 */
function buildCalendar() {
  const start = DateTime.fromISO(`${FIRST_DAY}T00:00`, { zone: ZONE });
  const end = DateTime.fromISO(`${DEMO_DAY}T00:00`, { zone: ZONE }).plus({ days: 1 });
  if (!start.isValid || !end.isValid) throw new Error(`generate: bad zone or day (${ZONE})`);
  const startMs = start.toMillis();
  /** @type {Period[]} */
  const periods = [];
  /** @type {string[]} */
  const days = [];
  for (let ms = startMs; ms < end.toMillis(); ms += PERIOD_MS) {
    const dt = DateTime.fromMillis(ms, { zone: ZONE });
    const day = /** @type {string} */ (dt.toISODate());
    if (days[days.length - 1] !== day) days.push(day);
    const mid = ms + PERIOD_MS / 2;
    const weekday = dt.weekday;
    periods.push({
      ms,
      iso: /** @type {string} */ (dt.toISO({ suppressMilliseconds: true })),
      dayIdx: days.length - 1,
      localHour: dt.hour + (dt.minute + PERIOD_MINUTES / 2) / 60,
      utcHour: (mid % 86_400_000) / 3_600_000,
      hourIdx: (mid - startMs) / 3_600_000,
      doy: dt.ordinal,
      offDay: weekday >= 6 || HOLIDAYS.has(day.slice(5)),
      weekday,
    });
  }
  return { periods, days };
}

/**
 * Linear interpolation of an hourly series at a fractional hour index.
 * @param {Float64Array} series
 * @param {number} hourIdx
 * @returns {number}
 */
function atHour(series, hourIdx) {
  const i = Math.floor(hourIdx);
  const f = hourIdx - i;
  return (1 - f) * /** @type {number} */ (series[i]) + f * /** @type {number} */ (series[i + 1]);
}

// ------------------------------------------------------------------------------------------------
// Simulation
// ------------------------------------------------------------------------------------------------

/**
 * Simulate every process over the whole calendar (history days and the forecast-only demo day).
 * @returns {{ periods: Period[], days: string[], spikeEvents: number, price: Float64Array,
 *   imbalance: Float64Array, loadForecast: Float64Array, renewablesForecast: Float64Array,
 *   quantiles: number[][], crossingsInjected: number }}
 */
function simulate() {
  const { periods, days } = buildCalendar();
  const nP = periods.length;
  const nD = days.length;
  const nH = Math.ceil(/** @type {Period} */ (periods[nP - 1]).hourIdx) + 2;

  // Hourly processes (UTC hours, so clock changes do not disturb them).
  const windLatent = ar1(new Rng(SEED, 'wind'), nH, PHI_W, 1);
  const windErr = ar1(new Rng(SEED, 'wind-forecast-error'), nH, PHI_WIND_ERR, SD_WIND_ERR);
  const loadErr = ar1(new Rng(SEED, 'load-forecast-error'), nH, 0.9, 0.015);
  const cloudWobble = ar1(new Rng(SEED, 'cloud-wobble'), nH, 0.8, 0.12);

  // Daily processes.
  const clearLatent = ar1(new Rng(SEED, 'clearness'), nD, 0.55, 1);
  const clearErr = ar1(new Rng(SEED, 'clearness-forecast-error'), nD, 0, 0.45);
  const weatherLoad = ar1(new Rng(SEED, 'load-day'), nD, 0.8, 0.03);
  const weatherLoadKnown = new Float64Array(nD);
  {
    const r = new Rng(SEED, 'load-day-known');
    for (let d = 0; d < nD; d += 1) weatherLoadKnown[d] = /** @type {number} */ (weatherLoad[d]) + 0.008 * r.normal();
  }
  const fuelLog = ar1(new Rng(SEED, 'fuel'), nD, PHI_F, SIG_F / Math.sqrt(1 - PHI_F * PHI_F));
  const dayShock = ar1(new Rng(SEED, 'day-shock'), nD, 0, 5);
  const vendorBias = ar1(new Rng(SEED, 'vendor-bias'), nD, 0.5, 2.5);

  // Scarcity events: a start period and a length per event.
  /** @type {Float64Array} */
  const spike = new Float64Array(nP);
  let spikeEvents = 0;
  {
    const r = new Rng(SEED, 'spikes');
    const firstPeriodOfDay = new Int32Array(nD + 1).fill(-1);
    periods.forEach((p, i) => {
      if (firstPeriodOfDay[p.dayIdx] === -1) firstPeriodOfDay[p.dayIdx] = i;
    });
    firstPeriodOfDay[nD] = nP;
    const startHours = [7, 7.5, 8, 17, 17.5, 18, 18.5, 19];
    for (let d = 0; d < nD; d += 1) {
      const p0 = /** @type {Period} */ (periods[/** @type {number} */ (firstPeriodOfDay[d])]);
      const prob = SPIKE_DAILY_PROBABILITY * (1 + 0.8 * seasonIndex(p0.doy));
      const u = r.uniform();
      const startHour = startHours[r.int(startHours.length)] ?? 18;
      const len = 4 * (1 + r.int(3));
      const peak = SPIKE_MIN + SPIKE_RANGE * r.uniform() ** 1.7;
      if (u >= prob || d >= nD - 1) continue; // no event (and none on the forecast-only day)
      spikeEvents += 1;
      const from = /** @type {number} */ (firstPeriodOfDay[d]);
      const to = /** @type {number} */ (firstPeriodOfDay[d + 1]);
      let k = 0;
      for (let i = from; i < to; i += 1) {
        const h = /** @type {Period} */ (periods[i]).localHour - PERIOD_MINUTES / 120;
        if (h >= startHour && k < len) {
          spike[i] = peak * Math.sin((Math.PI * (k + 0.5)) / len);
          k += 1;
        }
      }
    }
  }

  const zs = LEVELS.map((tau) => normalQuantile(tau));
  const priceNoiseRng = new Rng(SEED, 'price-noise');
  // The stream keeps the name it was first generated with, so the committed data regenerate byte for byte.
  const imbalanceRng = new Rng(SEED, 'fallback-noise');
  const crossingRng = new Rng(SEED, 'crossings');

  const out = {
    periods,
    days,
    spikeEvents,
    price: new Float64Array(nP),
    imbalance: new Float64Array(nP),
    loadForecast: new Float64Array(nP),
    renewablesForecast: new Float64Array(nP),
    /** @type {number[][]} */
    quantiles: [],
    crossingsInjected: 0,
  };

  let noise = 0;
  for (let t = 0; t < nP; t += 1) {
    const p = /** @type {Period} */ (periods[t]);
    const d = p.dayIdx;
    const season = seasonIndex(p.doy);
    const h = p.localHour;

    // 1. load
    const weekFactor = p.offDay ? (p.weekday === 6 && !HOLIDAYS.has(days[d]?.slice(5) ?? '') ? 0.91 : 0.85) : 1;
    const loadBase = (LOAD_MEAN_MW + LOAD_SEASON_MW * season) * loadProfile(h, p.offDay, season) * weekFactor;
    const loadTrue = loadBase * (1 + /** @type {number} */ (weatherLoad[d]));
    const loadFcst = loadBase * (1 + /** @type {number} */ (weatherLoadKnown[d])) * (1 + atHour(loadErr, p.hourIdx));

    // 2. wind
    const wLat = atHour(windLatent, p.hourIdx);
    const wLatF = wLat + atHour(windErr, p.hourIdx);
    const windMean = WIND_A + WIND_B * season;
    const cfWind = logistic(windMean + WIND_C * wLat);
    const cfWindF = logistic(windMean + WIND_C * wLatF);
    const windTrue = WIND_CAPACITY_MW * cfWind;
    const windFcst = WIND_CAPACITY_MW * cfWindF;

    // 3. solar
    const clear = clearSkySolar(p.doy, p.utcHour);
    const solarMean = 0.5 - 0.7 * season;
    const kTrue = clamp(logistic(solarMean + 1.3 * /** @type {number} */ (clearLatent[d])) * (1 + atHour(cloudWobble, p.hourIdx)), 0, 1);
    const kF = logistic(solarMean + 1.3 * (/** @type {number} */ (clearLatent[d]) + /** @type {number} */ (clearErr[d])));
    const solarTrue = SOLAR_CAPACITY_MW * clear * kTrue;
    const solarFcst = SOLAR_CAPACITY_MW * clear * kF;

    // 4. fuel / day factor
    const mu = 1 + 0.15 * season;
    const fuelTrue = mu * Math.exp(/** @type {number} */ (fuelLog[d]));
    const fuelKnown = mu * Math.exp(PHI_F * (d > 0 ? /** @type {number} */ (fuelLog[d - 1]) : 0));

    // 5. clearing price
    const xTrue = (loadTrue - windTrue - solarTrue) / 1000;
    const core = meritOrder(xTrue, fuelTrue) + rampPremium(h, p.offDay, fuelTrue) + /** @type {number} */ (dayShock[d]);
    noise = 0.8 * noise + 0.6 * priceNoiseRng.normal() * (4 + 0.05 * Math.abs(core));
    const price = clamp(core + noise + /** @type {number} */ (spike[t]), PRICE_FLOOR, PRICE_CAP);

    // 6. vendor forecast
    const xF = (loadFcst - windFcst - solarFcst) / 1000;
    const median = meritOrder(xF, fuelKnown) + rampPremium(h, p.offDay, fuelKnown) + /** @type {number} */ (vendorBias[d]);
    const slope = (meritOrder(xF + 0.05, fuelKnown) - meritOrder(xF - 0.05, fuelKnown)) / 0.1; // HLV per GW
    const sdWindMw = WIND_CAPACITY_MW * cfWindF * (1 - cfWindF) * WIND_C * SD_WIND_ERR;
    const sdSolarMw = SOLAR_CAPACITY_MW * clear * kF * (1 - kF) * 1.3 * 0.45;
    const sdLoadMw = 0.02 * loadFcst;
    const sdXGw = Math.sqrt(sdWindMw ** 2 + sdSolarMw ** 2 + sdLoadMw ** 2) / 1000;
    const hourMult = 1 + 0.15 * bump(h, 8, 1.5) + 0.25 * bump(h, 19, 1.5);
    const spread =
      VENDOR_K * hourMult * Math.sqrt((slope * sdXGw) ** 2 + (0.1 * Math.abs(median)) ** 2 + 8 ** 2);
    const g = 0.2 - 0.45 * logistic((KNEE_GW + 0.4 - xF) / 0.35);
    const q = zs.map((z) => clamp(median + spread * gAndH(z, g, VENDOR_H), PRICE_FLOOR, PRICE_CAP));
    if (crossingRng.uniform() < CROSSING_PROBABILITY) {
      const k = 1 + crossingRng.int(LEVELS.length - 1);
      const below = /** @type {number} */ (q[k - 1]) - (0.05 + 1.5 * crossingRng.uniform());
      if (below >= PRICE_FLOOR) {
        q[k] = below;
        out.crossingsInjected += 1;
      }
    }
    out.quantiles.push(q);

    // 7. imbalance
    const imb = price + KAPPA * (price - median) + imbalanceRng.normal() * (3 + 0.04 * Math.abs(price));

    out.price[t] = price;
    out.imbalance[t] = clamp(imb, PRICE_FLOOR, PRICE_CAP);
    out.loadForecast[t] = loadFcst;
    out.renewablesForecast[t] = windFcst + solarFcst;
  }
  return out;
}

// ------------------------------------------------------------------------------------------------
// Output
// ------------------------------------------------------------------------------------------------

const HERE = dirname(fileURLToPath(import.meta.url));

/**
 * Write a file atomically (temporary file, then rename).
 * @param {string} name file name beside this script
 * @param {string | Uint8Array} data
 */
function writeAtomic(name, data) {
  const path = join(HERE, name);
  const tmp = `${path}.tmp-${process.pid}`;
  writeFileSync(tmp, data);
  renameSync(tmp, path);
}

/** @param {unknown} value @returns {string} */
const json = (value) => `${JSON.stringify(value, null, 2)}\n`;

function main() {
  const sim = simulate();
  const { periods, days } = sim;
  const lastHistoryIdx = days.indexOf(LAST_HISTORY_DAY);
  if (lastHistoryIdx < 0 || days[days.length - 1] !== DEMO_DAY) throw new Error('generate: calendar does not span the days');

  writeAtomic(
    'market.json',
    json({
      timeZone: ZONE,
      periodMinutes: PERIOD_MINUTES,
      priceFloor: PRICE_FLOOR,
      priceCap: PRICE_CAP,
      currency: 'HLV',
      gateClosure: '12:00',
      imbalance: { kind: 'clearing-plus-penalty', penaltyPerMwh: 15 },
    }),
  );
  writeAtomic(
    'battery.json',
    json({
      energyMwh: 10,
      chargeMw: 5,
      dischargeMw: 5,
      roundTripEfficiency: 0.88,
      socMinFraction: 0.05,
      socMaxFraction: 0.95,
      socInitialFraction: 0.5,
      maxCyclesPerDay: 2,
      degradationCostPerMwh: 4,
    }),
  );
  writeAtomic(
    'scenario.json',
    json({
      name: 'Halvorn day-ahead auction (fictional demo)',
      description:
        'Invented island region Halvorn, quarter-hour day-ahead auction in the invented currency HLV, ' +
        'clock Europe/Berlin. Seeded synthetic history 2025-2026 with imbalance prices and load/renewables ' +
        'forecasts, a vendor-style 19-level quantile forecast through the demo day 2027-01-01, and a ' +
        '10 MWh / 5 MW battery. No real market, place or data.',
      market: 'market.json',
      battery: 'battery.json',
      history: 'history.csv.gz',
      forecast: 'quantiles.csv.gz',
      demoDay: DEMO_DAY,
    }),
  );

  // history.csv.gz and quantiles.csv.gz, with the figures gathered on the way.
  const historyLines = ['period_start,price,imbalance_price,load_forecast_mw,renewables_forecast_mw'];
  const quantileLines = [`period_start,${LEVELS.map((l) => `q${l}`).join(',')}`];
  const i10 = LEVELS.indexOf(0.1);
  const i90 = LEVELS.indexOf(0.9);
  const i05 = LEVELS.indexOf(0.05);
  const i95 = LEVELS.indexOf(0.95);
  const i50 = LEVELS.indexOf(0.5);
  let n = 0;
  let sum = 0;
  let sumSq = 0;
  let negative = 0;
  let above300 = 0;
  let maxPrice = -Infinity;
  let minPrice = Infinity;
  let in80 = 0;
  let in90 = 0;
  let below50 = 0;
  let pinball = 0;
  let crossingRows = 0;
  let imbalanceAgainst = 0;
  let sumLoad = 0;
  let sumRen = 0;

  for (let t = 0; t < periods.length; t += 1) {
    const p = /** @type {Period} */ (periods[t]);
    const q = /** @type {number[]} */ (sim.quantiles[t]).map((v) => Number(fixed(v, 2)));
    quantileLines.push(`${p.iso},${q.map((v) => fixed(v, 2)).join(',')}`);
    for (let k = 1; k < q.length; k += 1) {
      if (/** @type {number} */ (q[k]) < /** @type {number} */ (q[k - 1])) {
        crossingRows += 1;
        break;
      }
    }
    if (p.dayIdx > lastHistoryIdx) continue;

    const priceText = fixed(/** @type {number} */ (sim.price[t]), 2);
    const imbalanceText = fixed(/** @type {number} */ (sim.imbalance[t]), 2);
    historyLines.push(
      `${p.iso},${priceText},${imbalanceText},${fixed(/** @type {number} */ (sim.loadForecast[t]), 1)},${fixed(/** @type {number} */ (sim.renewablesForecast[t]), 1)}`,
    );
    const price = Number(priceText);
    const imbalance = Number(imbalanceText);
    n += 1;
    sum += price;
    sumSq += price * price;
    if (price < 0) negative += 1;
    if (price >= 300) above300 += 1;
    maxPrice = Math.max(maxPrice, price);
    minPrice = Math.min(minPrice, price);
    const at = (/** @type {number} */ k) => /** @type {number} */ (q[k]);
    if (price >= at(i10) && price <= at(i90)) in80 += 1;
    if (price >= at(i05) && price <= at(i95)) in90 += 1;
    if (price < at(i50)) below50 += 1;
    LEVELS.forEach((tau, k) => {
      const e = price - at(k);
      pinball += e >= 0 ? tau * e : (tau - 1) * e;
    });
    const surprise = price - at(i50);
    if (surprise !== 0 && Math.sign(imbalance - price) === Math.sign(surprise)) imbalanceAgainst += 1;
    sumLoad += /** @type {number} */ (sim.loadForecast[t]);
    sumRen += /** @type {number} */ (sim.renewablesForecast[t]);
  }

  const history = gzipSync(Buffer.from(`${historyLines.join('\n')}\n`, 'utf8'), { level: 9 });
  const quantiles = gzipSync(Buffer.from(`${quantileLines.join('\n')}\n`, 'utf8'), { level: 9 });
  writeAtomic('history.csv.gz', history);
  writeAtomic('quantiles.csv.gz', quantiles);

  const mean = sum / n;
  const pct = (/** @type {number} */ x) => `${(100 * x).toFixed(2)} %`;
  const lines = [
    `halvorn: seed ${SEED}`,
    `  history rows               ${n} (${lastHistoryIdx + 1} days, ${FIRST_DAY} .. ${LAST_HISTORY_DAY})`,
    `  quantile rows              ${periods.length} (${days.length} days, through ${DEMO_DAY})`,
    `  mean price                 ${mean.toFixed(2)} HLV/MWh (sd ${Math.sqrt(sumSq / n - mean * mean).toFixed(2)}, min ${minPrice.toFixed(2)}, max ${maxPrice.toFixed(2)})`,
    `  negative periods           ${negative} (${pct(negative / n)})`,
    `  spike events               ${sim.spikeEvents} (periods >= 300 HLV/MWh: ${above300})`,
    `  coverage 80 % interval     ${pct(in80 / n)} (q0.1..q0.9)`,
    `  coverage 90 % interval     ${pct(in90 / n)} (q0.05..q0.95)`,
    `  share below median         ${pct(below50 / n)}`,
    `  mean pinball (19 lv.)      ${(pinball / n / LEVELS.length).toFixed(3)} HLV/MWh`,
    `  crossing rows              ${crossingRows}`,
    `  imbalance against surprise ${pct(imbalanceAgainst / n)}`,
    `  mean load forecast         ${(sumLoad / n).toFixed(1)} MW, mean renewables forecast ${(sumRen / n).toFixed(1)} MW`,
    `  history.csv.gz             ${history.length} bytes`,
    `  quantiles.csv.gz           ${quantiles.length} bytes`,
  ];
  process.stderr.write(`${lines.join('\n')}\n`);
}

main();
