import { createHash, type Hash } from 'node:crypto';
import type { HistoryDay, PriceHistory } from '../types.js';

/**
 * Version of what a stored day forecast means. Bump it whenever a change to the forecaster, its
 * defaults or the clamping changes the prices it makes for the same inputs: every stored day then
 * gets a new key and is made again.
 */
export const FORECAST_STORE_VERSION = 2;

/** Everything besides the history that a day's stored forecast depends on. */
export interface DayForecastSetup {
  /** Method name, e.g. `arx-hs`. */
  readonly method: string;
  /** Levels tau in (0, 1), strictly increasing. */
  readonly levels: readonly number[];
  /** The forecaster's settings, defaults merged in (ForecastOptions). */
  readonly options: unknown;
  /** The market's zone, period length [min], and price floor and cap [currency/MWh] (the clamp). */
  readonly market: { readonly timeZone: string; readonly periodMinutes: number; readonly priceFloor: number; readonly priceCap: number };
  /** The software's version: a new release never reads an older one's forecasts. */
  readonly softwareVersion: string;
}

/**
 * Digests of a history for the keys of its days' forecasts: `before[i]` stands for every day before
 * `history.days[i]` (its date, period starts, prices and exogenous columns), `target[i]` for what is
 * known of day i itself at gate closure (date, period starts, exogenous columns; not its prices).
 *
 * `before` is a hash chain, before[i + 1] = SHA-256(before[i] || day i), so the whole history is hashed
 * once, and adding days after the end of the history leaves the digests of the earlier days unchanged.
 * Imbalance prices and incomplete days are left out: the forecaster never reads them.
 */
export function historyDigests(history: PriceHistory): { readonly before: readonly string[]; readonly target: readonly string[] } {
  const names = history.exogenousNames;
  let chain = createHash('sha256').update(`quantbid history chain\n${JSON.stringify(names)}`).digest();
  const before: string[] = [];
  const target: string[] = [];
  for (const day of history.days) {
    before.push(chain.toString('hex'));
    target.push(hashDay(createHash('sha256'), day, names, false).digest('hex'));
    chain = hashDay(createHash('sha256').update(chain), day, names, true).digest();
  }
  return { before, target };
}

/**
 * The key of the stored forecast of `day`: SHA-256 (hex) of the store version, the setup (in a fixed
 * key order) and the two history digests of the day. Equal keys mean equal inputs, so equal forecasts.
 */
export function dayForecastKey(setup: DayForecastSetup, day: string, digestBefore: string, digestTarget: string): string {
  const head = canonicalJson({ store: FORECAST_STORE_VERSION, ...setup, day });
  return createHash('sha256').update(`${head}\n${digestBefore}\n${digestTarget}`).digest('hex');
}

/** Adds a day to `hash`: date, period starts, prices (when `withPrices`) and exogenous columns as float64 bytes. */
function hashDay(hash: Hash, day: HistoryDay, names: readonly string[], withPrices: boolean): Hash {
  hash.update(`${day.day}\n${day.periods.map((p) => p.start).join(',')}\n`);
  if (withPrices) hash.update(new Uint8Array(Float64Array.from(day.pricePerMwh).buffer));
  for (const name of names) hash.update(new Uint8Array(Float64Array.from(day.exogenous[name] ?? []).buffer));
  return hash;
}

/** JSON with object keys sorted at every depth, so that the same value always gives the same text. */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) =>
    v !== null && typeof v === 'object' && !Array.isArray(v) ? Object.fromEntries(Object.entries(v as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))) : v,
  );
}
