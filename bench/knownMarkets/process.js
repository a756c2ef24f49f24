// The data-generating process of the known-distribution markets (bench/knownMarkets/), and the exact
// predictive distribution of each delivery period given what is known at gate closure the day before.
// Invented markets: the zones are only clocks (real IANA zones, so that clock changes are real); no
// place, company or data set is described.
//
// Drivers, published in the history as forecast columns known before gate closure [MW]:
//   load L(d, t) = mean x (1 + a season(d)) x daily profile(local hour, day type) x (1 + w_d),
//     w_d an AR(1) over days (the weather of the day);
//   renewables R(d, t) = wind + solar: wind = capacity x logistic(a + b season + c omega(utc hour)),
//     omega a latent AR(1) over UTC hours; solar = capacity x clear-sky elevation factor x clearness k_d,
//     k_d a logistic of an AR(1) over days. Residual load x = (L - R) / 1000 [GW].
// Price of period t of day d, on a latent residual-load scale [GW]:
//   Y = x + m_d + r_d (eta_d + s(d, t) u_t),
//   m_d = phi D_{d-1}   (the persistent day-level component, OBSERVABLE at gate closure: D_{d-1} is the
//                        mean over the periods of day d - 1 of clip(g^-1(P - c) - x, -K, K), a function of
//                        yesterday's prices and drivers only),
//   eta_d ~ N(0, sdDay^2) shared by all periods of the day (the day's surprise),
//   u_t a stationary AR(1) over the periods of the day with N(0, 1) marginals (intra-day dependence),
//   s(d, t) = sd0 + sdRenewables x R / (wind + solar capacity) + sdPeak x peak bump(hour)  [GW],
//   r_d = volatileFactor with probability volatileProbability, else 1 (a volatile day, not known ahead).
// Base price B = c(hour, day type) + g(Y), with an additive daily/weekly price profile c and the
//   increasing merit order g(y) = beta (y - y0) + gamma max(0, y - knee)^2 (linear when gamma = 0,
//   convex above the knee otherwise; closed-form inverse).
// Spikes: a latent AR(1) v_t over the periods of the day (N(0, 1) marginals, Gaussian copula) and
//   U_t = Phi(v_t): the period is an up-spike when U_t > 1 - pUp(d, t), a down-spike when U_t < pDown(d, t).
//   pUp = up.p0 + up.p1 logistic((x - up.centreGw) / up.widthGw) (up.p1 = 0: outages at any hour);
//   pDown = down.p0 logistic((R / L - down.shareCentre) / down.shareWidth).
//   An up-spike price is cap - (cap - up.low) V^up.shape, V ~ U(0, 1) (towards the cap for shape > 1);
//   a down-spike price is uniform on [down.low, down.high]. The price is clamped into [floor, cap].
// Imbalance price: clamp(P + kappa (P - median of B) + sd N(0, 1)): it moves against whoever was surprised.
//
// Exact predictive distribution given F_{d-1} (every price and driver before day d, and the drivers of
// day d): m_d is known, eta_d + s u_t ~ N(0, S^2) with S^2 = sdDay^2 + s^2 (a sum of independent normals),
// so on a normal day P(B <= p) = Phi((g^-1(p - c) - x - m_d) / S); the volatile-day regime makes it a
// two-component scale mixture, and the spikes a three-part mixture:
//   F(p) = (1 - pUp - pDown) [(1 - pv) Phi(z / S) + pv Phi(z / (kv S))] + pUp F_up(p) + pDown F_down(p),
//   z = g^-1(p - c) - x - m_d, F_up(p) = 1 - ((cap - p) / (cap - up.low))^(1 / up.shape) on [up.low, cap],
//   F_down uniform. Its tau-quantile is found by bisection on p to the last bit of a double (F is
//   continuous and non-decreasing), or in closed form c + g(x + m_d + S Phi^-1(tau)) without spikes and
//   regimes; clamping into [floor, cap] is non-decreasing, so the clamped quantile is the quantile of the
//   clamped price.
import { Stream } from './random.js';

const HOUR_MS = 3_600_000;

/** Gaussian bump on a 24 h circle. */
function bump(hour, centre, width) {
  let d = Math.abs(hour - centre);
  if (d > 12) d = 24 - d;
  return Math.exp(-0.5 * (d / width) ** 2);
}

const logistic = (v) => 1 / (1 + Math.exp(-v));
const clamp = (v, lo, hi) => Math.min(hi, Math.max(lo, v));

/** Day of year 1..366 and ISO weekday 1..7 of a YYYY-MM-DD day. */
function calendarOf(day) {
  const ms = Date.parse(`${day}T00:00:00Z`);
  const start = Date.parse(`${day.slice(0, 4)}-01-01T00:00:00Z`);
  return { dayOfYear: Math.round((ms - start) / 86_400_000) + 1, weekday: ((new Date(ms).getUTCDay() + 6) % 7) + 1 };
}

/** Seasonal index: +1 in mid-winter, -1 in mid-summer of the setting's hemisphere. */
function seasonOf(dayOfYear, hemisphere) {
  return hemisphere * Math.cos((2 * Math.PI * (dayOfYear - 15)) / 365.25);
}

/** Local hour of day [h] of a period from its ISO start with offset, at the period's midpoint. */
function localHour(start, periodMinutes) {
  const m = /T(\d{2}):(\d{2})/.exec(start);
  return Number(m[1]) + (Number(m[2]) + periodMinutes / 2) / 60;
}

/** Clear-sky solar factor from the sun's elevation (declination after Cooper 1969). */
function clearSky(dayOfYear, utcHours, latitudeDeg, longitudeDeg) {
  const rad = Math.PI / 180;
  const decl = 23.45 * rad * Math.sin((2 * Math.PI * (284 + dayOfYear)) / 365);
  const omega = 15 * rad * (utcHours + longitudeDeg / 15 - 12);
  const lat = latitudeDeg * rad;
  const sinElev = Math.sin(lat) * Math.sin(decl) + Math.cos(lat) * Math.cos(decl) * Math.cos(omega);
  return sinElev > 0 ? 0.8 * sinElev ** 1.2 : 0;
}

/** Load profile multiplier by local hour and day type (0 working day, 1 Saturday, 2 Sunday). */
function loadProfile(hour, dayType, season, load) {
  const off = dayType > 0;
  const rise = off ? 7.5 : 6.2;
  const day = logistic((hour - rise) / 0.7) * (1 - logistic((hour - 22.6) / 0.8));
  const morning = (off ? 0.4 : 1) * load.morningPeak * bump(hour, off ? 10.5 : 8.5, 1.4);
  const evening = (load.eveningPeak + load.winterEvening * Math.max(0, season)) * bump(hour, 19, 1.6);
  const afternoon = load.summerAfternoon * Math.max(0, -season) * bump(hour, 15.5, 2.5);
  const weekly = dayType === 1 ? load.saturday : dayType === 2 ? load.sunday : 1;
  return weekly * (0.78 + 0.2 * day + morning + evening + afternoon);
}

/** The merit order g(y) and its inverse. */
export function meritOrder(price) {
  const { beta, y0, gamma, knee } = price;
  const atKnee = beta * (knee - y0);
  return {
    g: (y) => beta * (y - y0) + (y > knee ? gamma * (y - knee) ** 2 : 0),
    inverse: (v) => {
      if (gamma === 0 || v <= atKnee) return y0 + v / beta;
      return knee + (-beta + Math.sqrt(beta * beta + 4 * gamma * (v - atKnee))) / (2 * gamma);
    },
  };
}

/** Additive price profile c(hour, day type) [currency/MWh]. */
function priceProfile(hour, dayType, profile) {
  const off = dayType > 0;
  const peaks = (off ? profile.weekendPeaks : 1) * (profile.morning * bump(hour, 8, 1.2) + profile.evening * bump(hour, 19, 1.5));
  const midday = profile.middayDip * bump(hour, 13, 2.2);
  const weekly = dayType === 1 ? profile.saturday : dayType === 2 ? profile.sunday : 0;
  return profile.base + peaks - midday + weekly;
}

/**
 * The exact predictive distribution of one period given gate-closure information, as plain numbers.
 * @typedef {object} PeriodLaw
 * @property {number} c additive profile [currency/MWh]
 * @property {number} mu x + m_d [GW]
 * @property {number} sd S [GW] on a normal day
 * @property {number} pUp, pDown spike probabilities
 */

/**
 * CDF of the clamp-free price of one period at p (see the header).
 * @param {PeriodLaw} law
 * @param {object} setting
 * @param {(x: number) => number} normalCdf
 */
export function periodCdf(law, setting, p, normalCdf, merit = meritOrder(setting.price)) {
  const { pv, kv } = regime(setting);
  const z = merit.inverse(p - law.c) - law.mu;
  const base = (1 - pv) * normalCdf(z / law.sd) + (pv > 0 ? pv * normalCdf(z / (kv * law.sd)) : 0);
  let out = (1 - law.pUp - law.pDown) * base;
  if (law.pUp > 0) {
    const { low } = setting.spikes.up;
    const top = setting.market.cap;
    out += law.pUp * (p <= low ? 0 : p >= top ? 1 : 1 - ((top - p) / (top - low)) ** (1 / setting.spikes.up.shape));
  }
  if (law.pDown > 0) {
    const { low, high } = setting.spikes.down;
    out += law.pDown * clamp((p - low) / (high - low), 0, 1);
  }
  return out;
}

function regime(setting) {
  return { pv: setting.noise.volatileProbability ?? 0, kv: setting.noise.volatileFactor ?? 1 };
}

/**
 * The tau-quantiles of one period's price, clamped into [floor, cap]: closed form on a normal-only law,
 * else bisection on the CDF until the bracket cannot shrink (adjacent doubles).
 */
export function periodQuantiles(law, setting, levels, normal) {
  const merit = meritOrder(setting.price);
  const { floor, cap } = setting.market;
  const { pv, kv } = regime(setting);
  if (law.pUp === 0 && law.pDown === 0 && pv === 0) {
    return levels.map((tau) => clamp(law.c + merit.g(law.mu + law.sd * normal.quantile(tau)), floor, cap));
  }
  const widest = law.sd * Math.max(1, kv);
  let lo = Math.min(law.c + merit.g(law.mu - 40 * widest), floor, setting.spikes.down.low ?? floor);
  let hi = Math.max(law.c + merit.g(law.mu + 40 * widest), cap);
  const out = [];
  for (const tau of levels) {
    let a = lo;
    let b = hi;
    for (let i = 0; i < 200; i++) {
      const mid = 0.5 * (a + b);
      if (!(mid > a && mid < b)) break;
      if (periodCdf(law, setting, mid, normal.cdf, merit) < tau) a = mid;
      else b = mid;
    }
    out.push(clamp(b, floor, cap));
    lo = a;
  }
  return out;
}

/**
 * The mean price of one period under its exact law (for the expected profit of a plan):
 *   E[P] = (1 - pUp - pDown) E[B] + pUp (cap - (cap - up.low) / (up.shape + 1)) + pDown (down.low + down.high) / 2,
 *   E[B] = c + beta (mu - y0) + gamma E[(Y - knee)_+^2],  E[(Y - k)_+^2] = S^2 ((1 + a^2)(1 - Phi(a)) - a phi(a)),
 * a = (k - mu) / S for Y ~ N(mu, S^2) (the truncated second moment of the normal), mixed over the
 * volatile-day regime. The base price B is not clamped here: the function throws when B would lie beyond
 * the floor or cap with a probability above 1e-9 (it never does in the settings), so the clamp cannot
 * move the mean.
 */
export function periodMean(law, setting, normal) {
  const { beta, y0, gamma, knee } = setting.price;
  const { floor, cap } = setting.market;
  const { pv, kv } = regime(setting);
  const merit = meritOrder(setting.price);
  const phi = (z) => Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);
  const baseMean = (sd) => {
    const a = (knee - law.mu) / sd;
    const tail = gamma === 0 ? 0 : gamma * sd * sd * ((1 + a * a) * (1 - normal.cdf(a)) - a * phi(a));
    const outside = normal.cdf((merit.inverse(floor - law.c) - law.mu) / sd) + 1 - normal.cdf((merit.inverse(cap - law.c) - law.mu) / sd);
    if (outside > 1e-9) throw new Error(`the base price reaches the floor or cap with probability ${outside}: its mean would need the clamp`);
    return law.c + beta * (law.mu - y0) + tail;
  };
  const base = (1 - pv) * baseMean(law.sd) + (pv > 0 ? pv * baseMean(kv * law.sd) : 0);
  const up = setting.market.cap - (setting.market.cap - setting.spikes.up.low) / (setting.spikes.up.shape + 1);
  const down = (setting.spikes.down.low + setting.spikes.down.high) / 2;
  return (1 - law.pUp - law.pDown) * base + law.pUp * up + law.pDown * down;
}

/**
 * Simulates a setting over [from, to] and computes the true quantiles of the days from truthFrom on.
 * @param {object} setting see settings.js
 * @param {object} tools { deliveryPeriods(day, zone, minutes), normal: { cdf, quantile }, days(from, to) }
 * @param {{ from: string, to: string, truthFrom: string, levels: number[], draw?: number }} span draw: 0 (the
 *   default) the bench's own draw; another whole number a fresh, independent draw of the same setting
 * @returns {{ days: object[] }} per day: day, periods, price, imbalance, load, renewables, laws, and from
 *   truthFrom on truth (quantiles per period at the levels) and mean (the mean price per period); else null
 */
export function simulateMarket(setting, tools, span) {
  const { name, market, load, wind, solar, price, noise, spikes, imbalance } = setting;
  const draw = span.draw ?? 0;
  const stream = (process) => new Stream(draw === 0 ? `${name}/${process}` : `${name}#${draw}/${process}`);
  const weatherStream = stream('load-weather');
  const windStream = stream('wind');
  const clearnessStream = stream('clearness');
  const dayStream = stream('day-level');
  const regimeStream = stream('volatile-days');
  const periodStream = stream('period-noise');
  const spikeStream = stream('spikes');
  const spikeSizeStream = stream('spike-size');
  const imbalanceStream = stream('imbalance');
  const merit = meritOrder(price);
  const rhoNoise = noise.rhoHour ** (market.periodMinutes / 60);
  const rhoSpike = spikes.rhoHour ** (market.periodMinutes / 60);
  const renewableCapacity = wind.capacityMw + solar.capacityMw;

  const days = tools.days(span.from, span.to);
  const firstMs = Date.parse(`${span.from}T00:00:00Z`) - 2 * 86_400_000;
  // Latent wind state per UTC hour over the whole span (plus margins), AR(1), N(0, 1) marginals.
  const hours = Math.ceil((Date.parse(`${span.to}T00:00:00Z`) - firstMs) / HOUR_MS) + 96;
  const omega = new Float64Array(hours);
  omega[0] = windStream.normal();
  for (let i = 1; i < hours; i++) omega[i] = wind.phiHour * omega[i - 1] + Math.sqrt(1 - wind.phiHour ** 2) * windStream.normal();
  const windAt = (ms) => {
    const h = (ms - firstMs) / HOUR_MS;
    const i = Math.floor(h);
    return omega[i] + (h - i) * (omega[i + 1] - omega[i]);
  };

  let weather = load.weatherSd * weatherStream.normal();
  let clearness = clearnessStream.normal();
  let dayLevelNext = 0;
  const out = [];
  for (const day of days) {
    const periods = tools.deliveryPeriods(day, market.timeZone, market.periodMinutes);
    const { dayOfYear, weekday } = calendarOf(day);
    const dayType = weekday === 6 ? 1 : weekday === 7 ? 2 : 0;
    const season = seasonOf(dayOfYear, setting.hemisphere);
    weather = load.weatherPhi * weather + Math.sqrt(1 - load.weatherPhi ** 2) * load.weatherSd * weatherStream.normal();
    clearness = 0.7 * clearness + Math.sqrt(1 - 0.49) * clearnessStream.normal();
    const clearIndex = logistic(solar.clearnessBias - solar.clearnessSeason * season + 1.3 * clearness);
    const m = dayLevelNext;
    const eta = noise.sdDay * dayStream.normal();
    const volatile = (noise.volatileProbability ?? 0) > 0 && regimeStream.uniform() < noise.volatileProbability;
    const r = volatile ? noise.volatileFactor : 1;
    const T = periods.length;
    const record = {
      day,
      periods,
      price: new Float64Array(T),
      imbalance: new Float64Array(T),
      load: new Float64Array(T),
      renewables: new Float64Array(T),
      laws: [],
      truth: null,
      mean: null,
    };
    let u = periodStream.normal();
    let v = spikeStream.normal();
    let dSum = 0;
    for (let t = 0; t < T; t++) {
      const p = periods[t];
      const hour = localHour(p.start, market.periodMinutes);
      const midMs = p.startMs + (market.periodMinutes * 60_000) / 2;
      const utcHours = (midMs % 86_400_000) / HOUR_MS;
      const L = load.meanMw * (1 + load.seasonAmplitude * season) * loadProfile(hour, dayType, season, load) * (1 + weather);
      const W = wind.capacityMw * logistic(wind.bias + wind.season * season + wind.scale * windAt(midMs));
      const S = solar.capacityMw * clearSky(dayOfYear, utcHours, setting.latitude, setting.longitude) * clearIndex;
      // The published columns are rounded to 0.1 MW; the price reads the published values.
      const loadMw = round1(L);
      const renewablesMw = round1(W + S);
      const R = renewablesMw;
      const x = (loadMw - renewablesMw) / 1000;
      const c = priceProfile(hour, dayType, price.profile);
      const s = noise.sd0 + noise.sdRenewables * (R / renewableCapacity) + noise.sdPeak * (bump(hour, 8, 1.5) + bump(hour, 19, 1.5));
      const sdTotal = Math.sqrt(noise.sdDay ** 2 + s ** 2);
      const pUp = spikes.up.p0 + spikes.up.p1 * logistic((x - spikes.up.centreGw) / spikes.up.widthGw);
      const pDown = spikes.down.p0 > 0 ? spikes.down.p0 * logistic((R / loadMw - spikes.down.shareCentre) / spikes.down.shareWidth) : 0;
      if (t > 0) {
        u = rhoNoise * u + Math.sqrt(1 - rhoNoise ** 2) * periodStream.normal();
        v = rhoSpike * v + Math.sqrt(1 - rhoSpike ** 2) * spikeStream.normal();
      }
      const y = x + m + r * (eta + s * u);
      const base = c + merit.g(y);
      const U = tools.normal.cdf(v);
      const size = spikeSizeStream.uniform();
      let clearing = base;
      if (U > 1 - pUp) clearing = market.cap - (market.cap - spikes.up.low) * size ** spikes.up.shape;
      else if (U < pDown) clearing = spikes.down.low + (spikes.down.high - spikes.down.low) * size;
      clearing = clamp(clearing, market.floor, market.cap);
      const median = c + merit.g(x + m);
      const imbalancePrice = clamp(clearing + imbalance.kappa * (clearing - median) + imbalance.sd * imbalanceStream.normal(), market.floor, market.cap);
      record.price[t] = round2(clearing);
      record.imbalance[t] = round2(imbalancePrice);
      record.load[t] = loadMw;
      record.renewables[t] = renewablesMw;
      record.laws.push({ c, mu: x + m, sd: sdTotal, pUp, pDown });
      dSum += clamp(merit.inverse(record.price[t] - c) - x, -noise.clipGw, noise.clipGw);
    }
    // The persistent component of tomorrow, from today's (rounded, published) prices and drivers.
    dayLevelNext = noise.phi * (dSum / T);
    if (day >= span.truthFrom) {
      record.truth = record.laws.map((law) => periodQuantiles(law, setting, span.levels, tools.normal));
      record.mean = record.laws.map((law) => periodMean(law, setting, tools.normal));
    }
    out.push(record);
  }
  return { days: out };
}

const round2 = (v) => Math.round(v * 100) / 100;
const round1 = (v) => Math.round(v * 10) / 10;
