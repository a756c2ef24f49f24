import type { BatteryModel, DayProblem } from '../../src/types.js';

/**
 * Seeded random day problems (docs/design.md section 4) for checks against a general-purpose solver.
 *
 * The days are invented on purpose: they are inputs only, never check values. What they cover:
 * 24 hourly periods or 92, 96, 100 quarter-hours (clock-change days); prices with and without
 * negative stretches, prices rounded to cents (ties); buy >= sell spreads as in the quantile policy
 * and buy = sell as in the point policy; tight and loose state-of-charge windows; a start at the
 * window's edges; cycle cap on and off; degradation cost; efficiency 1 and below; a terminal value.
 *
 * Randomness: Marsaglia's xorshift32 (Marsaglia 2003, "Xorshift RNGs", J. Stat. Softw. 8(14),
 * doi:10.18637/jss.v008.i14), seeded by the 32-bit FNV-1a hash of the case name (Fowler, Noll and
 * Vo; IETF draft-eastlake-fnv), so each named case is reproducible and independent of the others.
 */

/** What to force in a generated day; anything left out is drawn at random. */
export interface RandomDayOptions {
  /**
   * Number of periods: 24 (hours) or 92, 96, 100 (quarter-hours) as drawn by default; any other
   * count gives a short day of hours (small enough for javascript-lp-solver's branch and bound).
   */
  readonly periods?: number;
  /** true: force a stretch of negative prices; false: no negative prices (clamped at 0). */
  readonly negativePrices?: boolean;
  /** Force the cycle cap on (true) or off (false). */
  readonly cycleCap?: boolean;
}

/** A small seeded generator: xorshift32 with uniform, integer and pick helpers. */
export class SeededRandom {
  private state: number;

  constructor(seed: number) {
    this.state = seed >>> 0 || 0x9e3779b9;
  }

  /** Seeded by the FNV-1a hash of a case name. */
  static fromName(name: string): SeededRandom {
    let hash = 0x811c9dc5;
    for (let i = 0; i < name.length; i++) {
      hash ^= name.charCodeAt(i);
      hash = Math.imul(hash, 0x01000193) >>> 0;
    }
    return new SeededRandom(hash);
  }

  /** Uniform in [0, 1). */
  next(): number {
    let x = this.state;
    x ^= x << 13;
    x ^= x >>> 17;
    x ^= x << 5;
    this.state = x >>> 0;
    return this.state / 4294967296;
  }

  uniform(low: number, high: number): number {
    return low + (high - low) * this.next();
  }

  /** True with probability p. */
  chance(p: number): boolean {
    return this.next() < p;
  }

  pick<T>(items: readonly T[]): T {
    return items[Math.floor(this.next() * items.length)] as T;
  }
}

const cents = (x: number): number => Math.round(x * 100) / 100;

/** A random day problem, reproducible from its case name. */
export function randomDay(caseName: string, options: RandomDayOptions = {}): DayProblem {
  const rng = SeededRandom.fromName(caseName);
  const periods = options.periods ?? rng.pick([24, 92, 96, 100] as const);
  const periodHours = periods <= 24 ? 1 : 0.25;
  const battery = randomBattery(rng, options.cycleCap ?? rng.chance(0.5));
  const negative = options.negativePrices ?? rng.chance(0.5);
  const median = randomPrices(rng, periods, negative).map((m) => (options.negativePrices === false ? Math.max(0, m) : m));
  const pointPolicy = rng.chance(0.4);
  const spreadScale = rng.pick([0.5, 3, 15]);
  const buy: number[] = [];
  const sell: number[] = [];
  for (const m of median) {
    const half = pointPolicy ? 0 : cents(spreadScale * rng.next());
    buy.push(cents(m + half));
    sell.push(cents(options.negativePrices === false ? Math.max(0, m - half) : m - half));
  }
  const { socMinMwh: low, socMaxMwh: high } = battery;
  const socStartMwh = rng.pick([low, high, low + (high - low) * rng.next()]);
  const endChoice = rng.next();
  const socEndMinMwh = endChoice < 0.4 ? socStartMwh : endChoice < 0.8 ? low : low + (high - low) * rng.next();
  const terminal = rng.chance(0.2) ? { terminalValuePerMwh: cents(rng.uniform(0, 80)) } : {};
  return Object.freeze({
    periodHours,
    buyPricePerMwh: Object.freeze(buy),
    sellPricePerMwh: Object.freeze(sell),
    battery,
    socStartMwh,
    socEndMinMwh,
    ...terminal,
  });
}

function randomBattery(rng: SeededRandom, cycleCap: boolean): BatteryModel {
  const energyMwh = rng.pick([1, 2, 10, 40]) * rng.uniform(0.5, 1.5);
  const cRate = rng.pick([0.25, 0.5, 1, 2, 4]);
  const chargeMw = energyMwh * cRate * rng.uniform(0.7, 1.3);
  const dischargeMw = rng.chance(0.5) ? chargeMw : energyMwh * cRate * rng.uniform(0.7, 1.3);
  const efficiencyKind = rng.next();
  let chargeEfficiency = 1;
  let dischargeEfficiency = 1;
  if (efficiencyKind < 0.6) {
    chargeEfficiency = dischargeEfficiency = Math.sqrt(rng.uniform(0.7, 0.95));
  } else if (efficiencyKind < 0.9) {
    chargeEfficiency = rng.uniform(0.85, 0.99);
    dischargeEfficiency = rng.uniform(0.85, 0.99);
  }
  // Tight windows are a few percent of the energy: the power limits then rarely bind.
  const tight = rng.chance(0.25);
  const socMinFraction = tight ? rng.uniform(0.3, 0.6) : rng.pick([0, 0.05, 0.1, 0.2]);
  const socMaxFraction = tight ? socMinFraction + rng.uniform(0.01, 0.1) : rng.pick([0.8, 0.9, 1]);
  const socMinMwh = energyMwh * socMinFraction;
  const socMaxMwh = energyMwh * socMaxFraction;
  const cycles = rng.pick([0.1, 0.5, 1, 1.5, 2]);
  return Object.freeze({
    energyMwh,
    chargeMw,
    dischargeMw,
    chargeEfficiency,
    dischargeEfficiency,
    socMinMwh,
    socMaxMwh,
    socInitialMwh: socMinMwh,
    socFinalMinMwh: undefined,
    maxFromStoreMwhPerDay: cycleCap ? cycles * (socMaxMwh - socMinMwh) : undefined,
    degradationCostPerMwh: rng.chance(0.5) ? 0 : cents(rng.uniform(0.5, 20)),
  });
}

/**
 * Median prices: a two-peak daily shape plus noise and occasional spikes; with `negative`, a
 * stretch of negative prices (floor-like plateaus included) around midday.
 */
function randomPrices(rng: SeededRandom, periods: number, negative: boolean): number[] {
  const level = rng.uniform(20, 120);
  const swing = rng.uniform(5, 80);
  const noise = rng.pick([0.5, 5, 20]);
  const prices: number[] = [];
  const dipStart = Math.floor(periods * rng.uniform(0.3, 0.5));
  const dipLength = Math.max(1, Math.floor(periods * rng.uniform(0.05, 0.3)));
  const dipDepth = rng.uniform(level + 5, level + 300);
  const plateau = rng.chance(0.3);
  for (let t = 0; t < periods; t++) {
    const hour = (24 * t) / periods;
    const shape = Math.sin((Math.PI * (hour - 5)) / 12) + 0.6 * Math.sin((Math.PI * (hour - 14)) / 6);
    let price = level + swing * shape + noise * (rng.next() - 0.5) * 2;
    if (rng.chance(0.02)) price += rng.uniform(100, 800);
    if (negative && t >= dipStart && t < dipStart + dipLength) price = plateau ? level - dipDepth : price - dipDepth * rng.uniform(0.6, 1);
    prices.push(cents(price));
  }
  return prices;
}
