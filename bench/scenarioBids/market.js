// A known-distribution market of bench/knownMarkets/ as the scenario bench uses it: its history and its
// TRUE quantile forecast as quantbid's domain types, and a sampler of TRUE whole-day paths of the
// clearing and imbalance prices, drawn from the day's exact conditional law (bench/knownMarkets/process.js
// describes the process; this file samples the same process given what is known at gate closure):
//   Y_t = mu_t + r (eta + s_t u_t),  clearing = c_t + g(Y_t), or a spike; imbalance = clamp(P + kappa (P - median) + sd N)
// with the day's surprise eta ~ N(0, sdDay^2), the volatile-day factor r, u an AR(1) over the periods with
// N(0, 1) marginals, s_t = sqrt(sd_t^2 - sdDay^2) from the period's law, spikes by the latent AR(1) v_t
// (up when Phi(v_t) > 1 - pUp, down when Phi(v_t) < pDown), prices clamped into [floor, cap] and rounded
// to cents, as the history's prices are. The paths are therefore draws from the truth, the setting in
// which the "true quantiles" figures were measured.
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { LEVELS, marketSpecOf, simulateSetting } from '../knownMarkets/generate.js';
import { meritOrder } from '../knownMarkets/process.js';
import { Stream } from '../knownMarkets/random.js';
import { BATTERY, SETTINGS, SPAN } from '../knownMarkets/settings.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const dist = (path) => import(pathToFileURL(join(root, 'dist', path)).href);

const clamp = (v, lo, hi) => Math.min(hi, Math.max(lo, v));
const round2 = (v) => Math.round(v * 100) / 100;

/** The bench's battery as quantbid's model. */
export async function benchBattery() {
  const { batteryModel, parseBatterySpec } = await dist('index.js');
  return batteryModel(parseBatterySpec(BATTERY).data);
}

/**
 * One setting loaded: market spec, history (all three years), the true forecast days of the scored year,
 * the days' laws, and `paths(day, count, purpose)` giving true paths { clearing, imbalance } (arrays of
 * paths over the day's periods) from a seeded stream named by setting, day and purpose. `draw` 0 is the
 * bench's own data; another whole number is an independent draw of the same setting (generate.js --draw),
 * its paths from streams named by the draw as well.
 */
export async function loadKnownMarket(name, draw = 0) {
  const setting = SETTINGS.find((s) => s.name === name);
  if (setting === undefined) throw new Error(`no setting ${name}`);
  const { parseMarketSpec } = await dist('index.js');
  const { normalCdf } = await dist('stats/normalCdf.js');
  const simulation = await simulateSetting(setting, draw);
  const market = parseMarketSpec(marketSpecOf(setting)).data;
  const history = {
    days: simulation.days.map((d) => ({ day: d.day, periods: d.periods, pricePerMwh: Array.from(d.price), imbalancePricePerMwh: Array.from(d.imbalance), exogenous: {} })),
    exogenousNames: [],
    incompleteDays: [],
  };
  const forecastDays = new Map(simulation.days.filter((d) => d.truth !== null).map((d) => [d.day, { day: d.day, levels: LEVELS, periods: d.periods, prices: d.truth }]));
  const byDay = new Map(simulation.days.map((d) => [d.day, d]));
  const merit = meritOrder(setting.price);
  const { noise, spikes, imbalance: imbalanceLaw } = setting;
  const { floor, cap, periodMinutes } = setting.market;
  const rhoNoise = noise.rhoHour ** (periodMinutes / 60);
  const rhoSpike = spikes.rhoHour ** (periodMinutes / 60);
  const pv = noise.volatileProbability ?? 0;
  const kv = noise.volatileFactor ?? 1;

  function paths(day, count, purpose) {
    const record = byDay.get(day);
    if (record === undefined) throw new Error(`no day ${day}`);
    const stream = new Stream(draw === 0 ? `${setting.name}/true-paths/${day}/${purpose}` : `${setting.name}/draw-${draw}/true-paths/${day}/${purpose}`);
    const clearing = [];
    const imbalance = [];
    for (let w = 0; w < count; w++) {
      const eta = noise.sdDay * stream.normal();
      const r = pv > 0 && stream.uniform() < pv ? kv : 1;
      let u = stream.normal();
      let v = stream.normal();
      const c = [];
      const f = [];
      record.laws.forEach((law, t) => {
        if (t > 0) {
          u = rhoNoise * u + Math.sqrt(1 - rhoNoise ** 2) * stream.normal();
          v = rhoSpike * v + Math.sqrt(1 - rhoSpike ** 2) * stream.normal();
        }
        const s = Math.sqrt(Math.max(0, law.sd ** 2 - noise.sdDay ** 2));
        let price = law.c + merit.g(law.mu + r * (eta + s * u));
        const U = normalCdf(v);
        const size = stream.uniform();
        if (U > 1 - law.pUp) price = cap - (cap - spikes.up.low) * size ** spikes.up.shape;
        else if (U < law.pDown) price = spikes.down.low + (spikes.down.high - spikes.down.low) * size;
        price = round2(clamp(price, floor, cap));
        const median = law.c + merit.g(law.mu);
        c.push(price);
        f.push(round2(clamp(price + imbalanceLaw.kappa * (price - median) + imbalanceLaw.sd * stream.normal(), floor, cap)));
      });
      clearing.push(c);
      imbalance.push(f);
    }
    return { clearing, imbalance };
  }

  return { setting, market, history, forecastDays, truthDays: [...forecastDays.keys()], paths, span: SPAN };
}

/** A DayScenarioSource of true paths: planning, validation (as many as planning) and fresh paths from separate streams. */
export async function trueScenarioSource(known, planningPaths, freshPaths) {
  const { scenarioSet } = await dist('scenarios/scenarioSet.js');
  const set = (p) => scenarioSet(p.clearing, p.imbalance, p.imbalance);
  return (forecast) => ({
    planning: set(known.paths(forecast.day, planningPaths, 'planning')),
    validation: set(known.paths(forecast.day, planningPaths, 'validation')),
    fresh: set(known.paths(forecast.day, freshPaths, 'fresh')),
  });
}

/** The names of the settings, in the bench's order. */
export const SETTING_NAMES = SETTINGS.map((s) => s.name);
