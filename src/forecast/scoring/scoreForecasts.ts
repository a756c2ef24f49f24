import type { QuantileDay } from '../../types.js';
import { christoffersenFromHits, type ChristoffersenResult } from '../../stats/christoffersen.js';
import { kupiecPof, type KupiecResult } from '../../stats/kupiec.js';
import { ForecastInputError } from '../models/errors.js';
import { slotLayout } from '../models/slotGrid.js';
import { pinballLoss } from './pinball.js';

/** One scored delivery day: the forecast and the realised prices of its periods. */
export interface ScoredDay {
  readonly forecast: QuantileDay;
  /** Realised clearing price per period of the forecast [currency/MWh]. */
  readonly realised: readonly number[];
}

/** Empirical coverage of one central interval [q(tau), q(1 - tau)]. */
export interface IntervalCoverage {
  /** Lower level tau < 1/2. */
  readonly lower: number;
  /** Upper level 1 - tau. */
  readonly upper: number;
  /** Nominal coverage 1 - 2 tau. */
  readonly nominal: number;
  /** Share of realised prices with q(tau) <= y <= q(1 - tau). */
  readonly observed: number;
  /** Failures: realised prices outside the interval, on either side [-]. */
  readonly failures: number;
  /** Kupiec (1995) test of the failure rate 1 - nominal; null without observations. */
  readonly kupiec: KupiecResult | null;
  /**
   * Christoffersen (1998) tests of the failure sequence in time order (independence and conditional
   * coverage); null with fewer than two observations.
   */
  readonly christoffersen: ChristoffersenResult | null;
}

/** Scores of a set of (period, day) forecasts. */
export interface Scores {
  /** Number of scored periods. */
  readonly count: number;
  /** Mean pinball loss per level [currency/MWh]. */
  readonly pinball: readonly number[];
  /** Mean pinball loss over the levels and periods [currency/MWh]: approximates CRPS / 2 (factor 2 not included). */
  readonly crps: number;
  /** Calibration: share of realised prices strictly below the quantile, per level (ideal: the level). */
  readonly belowShare: readonly number[];
  /** Coverage of each central interval whose two levels are both forecast, innermost last. */
  readonly coverage: readonly IntervalCoverage[];
}

/** Scores overall and per local clock slot of the day. */
export interface ScoreTable {
  readonly levels: readonly number[];
  readonly overall: Scores;
  /** One entry per clock slot (slot grid of slotGrid.ts), with its local start `HH:MM`. */
  readonly bySlot: readonly (Scores & { readonly slotStart: string })[];
}

/**
 * Scores quantile forecasts against realised prices, overall and per period of the day (local clock
 * slot, so that the two periods of a repeated clock hour count for the same slot and a skipped hour
 * has fewer observations):
 * - pinball loss per level, rho_tau(y - q) (see pinball.ts), averaged over periods;
 * - `crps`: the mean of the pinball losses over the levels, which approximates CRPS / 2 (factor 2 not
 *   included; see crps.ts);
 * - calibration: the share of realised prices y < q(tau), per level; a calibrated forecast has
 *   share tau (the probability integral transform view of Gneiting, Balabdaoui and Raftery 2007);
 * - coverage of each central interval [q(tau), q(1 - tau)] whose levels are both in the forecast:
 *   the share with q(tau) <= y <= q(1 - tau), against nominal 1 - 2 tau;
 * - for each such interval, the failure sequence (1 when y lies outside it) in time order - the days
 *   in the order given, the periods of a day in order - tested for the failure rate 2 tau by Kupiec's
 *   proportion-of-failures test and for first-order independence and conditional coverage by
 *   Christoffersen's tests. Per slot the sequence runs over the days; overall it runs over every
 *   period, so it pools periods of one day, whose failures are dependent: the overall tests then
 *   reject more often than their level, and the per-slot tests are the ones to judge by.
 *
 * References: T. Gneiting, F. Balabdaoui and A. E. Raftery (2007), Probabilistic forecasts, calibration
 * and sharpness, JRSS B 69(2), 243-268, doi:10.1111/j.1467-9868.2007.00587.x; P. H. Kupiec (1995),
 * J. Derivatives 3(2), 73-84; P. F. Christoffersen (1998), Int. Economic Review 39(4), 841-862 (see
 * src/stats/kupiec.ts and christoffersen.ts).
 *
 * @param days forecasts with the same levels, each with one realised price per period, in time order
 * @throws ForecastInputError when the levels differ between days or a realised price is missing
 */
export function scoreForecasts(days: readonly ScoredDay[]): ScoreTable {
  const first = days[0];
  if (first === undefined) throw new ForecastInputError('days', 'nothing to score', 'give at least one forecast day with realised prices');
  const levels = first.forecast.levels;
  const pairs = centralPairs(levels);
  const overall = new Accumulator(levels.length, pairs);
  const perSlot: Accumulator[] = [];
  let slotsPerDay = 0;
  let periodMinutes = 0;
  days.forEach((scored, d) => {
    const { forecast, realised } = scored;
    const field = `days[${d}]`;
    if (forecast.levels.length !== levels.length || forecast.levels.some((tau, k) => tau !== levels[k])) {
      throw new ForecastInputError(`${field}.forecast.levels`, 'the levels differ from those of the first day', 'score forecasts made at the same levels together');
    }
    if (realised.length !== forecast.periods.length) {
      throw new ForecastInputError(`${field}.realised`, `${realised.length} prices for ${forecast.periods.length} periods`, 'give one realised price per period');
    }
    const layout = slotLayout(forecast.periods, `${field}.forecast.periods`);
    slotsPerDay = layout.slotsPerDay;
    periodMinutes = layout.periodMinutes;
    realised.forEach((y, t) => {
      const q = forecast.prices[t];
      if (!Number.isFinite(y) || q === undefined) {
        throw new ForecastInputError(`${field}.realised[${t}]`, `no finite realised price and forecast (${y})`, 'drop the period or fill the price');
      }
      const s = layout.slots[t] as number;
      overall.add(y, q, levels);
      (perSlot[s] ??= new Accumulator(levels.length, pairs)).add(y, q, levels);
    });
  });
  return {
    levels: [...levels],
    overall: overall.scores(levels),
    bySlot: Array.from({ length: slotsPerDay }, (_, s) => ({
      slotStart: clock(s * periodMinutes),
      ...(perSlot[s] ?? new Accumulator(levels.length, pairs)).scores(levels),
    })),
  };
}

/** Index pairs (k, l) with levels[k] < 1/2 and levels[l] = 1 - levels[k] (to 1e-9), outermost first. */
export function centralPairs(levels: readonly number[]): [number, number][] {
  const pairs: [number, number][] = [];
  levels.forEach((tau, k) => {
    if (tau >= 0.5) return;
    const l = levels.findIndex((other) => Math.abs(other - (1 - tau)) <= 1e-9);
    if (l >= 0) pairs.push([k, l]);
  });
  return pairs;
}

function clock(minutes: number): string {
  return `${String(Math.floor(minutes / 60)).padStart(2, '0')}:${String(minutes % 60).padStart(2, '0')}`;
}

/** Running sums of one group of periods. */
class Accumulator {
  private count = 0;
  private readonly pinball: Float64Array;
  private readonly below: Float64Array;
  private readonly inside: Float64Array;
  /** Failure sequence of each central pair, in the order the periods were added. */
  private readonly outside: number[][];

  constructor(
    levelCount: number,
    private readonly pairs: readonly [number, number][],
  ) {
    this.pinball = new Float64Array(levelCount);
    this.below = new Float64Array(levelCount);
    this.inside = new Float64Array(pairs.length);
    this.outside = pairs.map(() => []);
  }

  add(y: number, q: readonly number[], levels: readonly number[]): void {
    this.count++;
    levels.forEach((tau, k) => {
      const qk = q[k] as number;
      this.pinball[k] = (this.pinball[k] as number) + pinballLoss(y, qk, tau);
      if (y < qk) this.below[k] = (this.below[k] as number) + 1;
    });
    this.pairs.forEach(([k, l], p) => {
      const inside = y >= (q[k] as number) && y <= (q[l] as number);
      if (inside) this.inside[p] = (this.inside[p] as number) + 1;
      (this.outside[p] as number[]).push(inside ? 0 : 1);
    });
  }

  scores(levels: readonly number[]): Scores {
    const n = this.count;
    const pinball = Array.from(this.pinball, (v) => v / n);
    return {
      count: n,
      pinball,
      crps: pinball.reduce((s, v) => s + v, 0) / pinball.length,
      belowShare: Array.from(this.below, (v) => v / n),
      coverage: this.pairs.map(([k, l], p) => {
        // Rounded so that 0.95 - 0.05 reads 0.9, not 0.8999999999999999.
        const nominal = Number(((levels[l] as number) - (levels[k] as number)).toPrecision(12));
        const failures = n - (this.inside[p] as number);
        const sequence = this.outside[p] as number[];
        return {
          lower: levels[k] as number,
          upper: levels[l] as number,
          nominal,
          observed: (this.inside[p] as number) / n,
          failures,
          kupiec: n >= 1 ? kupiecPof(n, failures, 1 - nominal) : null,
          christoffersen: n >= 2 ? christoffersenFromHits(sequence, 1 - nominal) : null,
        };
      }),
    };
  }
}
