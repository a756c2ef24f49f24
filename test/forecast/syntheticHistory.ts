import type { DeliveryPeriod, HistoryDay, PriceHistory } from '../../src/types.js';
import { seededNormal } from './seededRandom.js';

/**
 * A seeded synthetic price history for behaviour tests (never for check values): daily and weekly
 * profiles, a persistent day-level shock, slot noise, rare spikes, and a `load_mw` exogenous column
 * that drives part of the price. The market zone is fictional: UTC+1 in winter and UTC+2 in summer,
 * the clocks moving forward at 02:00 on day `shortDay` (a 23-hour day) and back at 03:00 on day
 * `longDay` (a 25-hour day).
 */
export interface SyntheticOptions {
  readonly days: number;
  readonly periodMinutes: 15 | 30 | 60;
  readonly seed: number;
  /** Index of the 23-hour day, or -1. */
  readonly shortDay: number;
  /** Index of the 25-hour day, or -1 (after shortDay). */
  readonly longDay: number;
  /** First day, YYYY-MM-DD. */
  readonly start: string;
}

const DEFAULT_OPTIONS: SyntheticOptions = { days: 200, periodMinutes: 60, seed: 1, shortDay: -1, longDay: -1, start: '2031-01-06' };

export function syntheticHistory(options: Partial<SyntheticOptions> = {}): PriceHistory {
  const o = { ...DEFAULT_OPTIONS, ...options };
  const z = seededNormal(o.seed);
  const S = 1440 / o.periodMinutes;
  const days: HistoryDay[] = [];
  let shock = 0;
  const startMs = Date.parse(`${o.start}T00:00:00Z`);
  for (let d = 0; d < o.days; d++) {
    const day = new Date(startMs + d * 86_400_000).toISOString().slice(0, 10);
    const weekday = new Date(startMs + d * 86_400_000).getUTCDay(); // 0 = Sunday
    shock = 0.8 * shock + 4 * z();
    const load: number[] = [];
    const price: number[] = [];
    for (let s = 0; s < S; s++) {
      const hour = (s * o.periodMinutes) / 60;
      const profile = 10 * Math.exp(-((hour - 8) ** 2) / 6) + 14 * Math.exp(-((hour - 19) ** 2) / 5);
      const weekend = weekday === 0 || weekday === 6 ? -8 : 0;
      const l = 500 + 20 * profile + 10 * weekend + 15 * z();
      const spike = z() > 2.9 ? 60 * Math.abs(z()) : 0;
      load.push(l);
      price.push(30 + profile + weekend + shock + 0.05 * (l - 500) + 2 * z() + spike);
    }
    const { periods, slots } = periodsOf(day, d, o, S);
    days.push({
      day,
      periods,
      pricePerMwh: slots.map((s) => price[s] as number),
      imbalancePricePerMwh: null,
      exogenous: { load_mw: slots.map((s) => load[s] as number) },
    });
  }
  return { days, exogenousNames: ['load_mw'], incompleteDays: [] };
}

function periodsOf(day: string, d: number, o: SyntheticOptions, S: number): { periods: DeliveryPeriod[]; slots: number[] } {
  const summer = o.shortDay >= 0 && d > o.shortDay && (o.longDay < 0 || d < o.longDay);
  const local: { slot: number; offset: string }[] = [];
  const perHour = 60 / o.periodMinutes;
  for (let s = 0; s < S; s++) {
    const hour = Math.floor(s / perHour);
    if (d === o.shortDay) {
      if (hour === 2) continue;
      local.push({ slot: s, offset: hour < 2 ? '+01:00' : '+02:00' });
    } else if (d === o.longDay) {
      local.push({ slot: s, offset: hour <= 2 ? '+02:00' : '+01:00' });
    } else {
      local.push({ slot: s, offset: summer ? '+02:00' : '+01:00' });
    }
  }
  if (d === o.longDay) {
    // the repeated hour 02:00-02:59 at +01:00 follows the first one at +02:00
    const firstAfter = local.findIndex((p) => p.slot >= 3 * perHour);
    const repeated = Array.from({ length: perHour }, (_, q) => ({ slot: 2 * perHour + q, offset: '+01:00' }));
    local.splice(firstAfter, 0, ...repeated);
  }
  const stamp = (slot: number, offset: string): string => {
    const minutes = slot * o.periodMinutes;
    const hh = String(Math.floor(minutes / 60)).padStart(2, '0');
    const mm = String(minutes % 60).padStart(2, '0');
    return `${day}T${hh}:${mm}:00${offset}`;
  };
  const starts = local.map((p) => stamp(p.slot, p.offset));
  const periods = starts.map((start, t) => {
    const startMs = Date.parse(start);
    const end = starts[t + 1] ?? isoWithOffset(startMs + o.periodMinutes * 60_000, local[t]?.offset ?? '+01:00');
    return { start, end, startMs };
  });
  return { periods, slots: local.map((p) => p.slot) };
}

function isoWithOffset(ms: number, offset: string): string {
  const sign = offset.startsWith('-') ? -1 : 1;
  const [h, m] = offset.slice(1).split(':').map(Number) as [number, number];
  const shifted = new Date(ms + sign * (h * 60 + m) * 60_000).toISOString().slice(0, 19);
  return `${shifted}${offset}`;
}
