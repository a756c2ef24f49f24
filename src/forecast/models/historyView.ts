import type { DeliveryPeriod, HistoryDay, PriceHistory } from '../../types.js';
import { DaySetScale } from './daySetScale.js';
import { ForecastInputError } from './errors.js';
import type { SampleBounds } from './farOutFences.js';
import type { RobustScale } from './robustAsinh.js';
import type { SlotLayout } from './slotGrid.js';
import { slotLayout, toSlotGrid } from './slotGrid.js';

/** A past delivery day on the clock-slot grid (see slotGrid.ts). */
export interface GriddedDay {
  /** YYYY-MM-DD. */
  readonly day: string;
  /** Days since 1970-01-01 [-]. */
  readonly dayNumber: number;
  /** ISO weekday, 1 = Monday ... 7 = Sunday. */
  readonly weekday: number;
  /** Realised clearing price per slot [currency/MWh], length S. */
  readonly prices: Float64Array;
  /** Exogenous columns per slot, in the order of the view's exogenousNames. */
  readonly exogenous: readonly Float64Array[];
}

/** What may be known of the delivery day before gate closure: its calendar, periods and exogenous columns. */
export interface TargetDay {
  readonly day: string;
  readonly dayNumber: number;
  readonly weekday: number;
  readonly periods: readonly DeliveryPeriod[];
  readonly layout: SlotLayout;
  /** Exogenous columns per slot, in the order of the view's exogenousNames. */
  readonly exogenous: readonly Float64Array[];
}

const DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Days since 1970-01-01 of a YYYY-MM-DD calendar day (proleptic Gregorian). */
export function dayNumberOf(day: string): number {
  const m = DAY.exec(day);
  if (m === null) throw new ForecastInputError('day', `"${day}" is not YYYY-MM-DD`, 'write days as YYYY-MM-DD');
  return Math.round(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])) / 86_400_000);
}

/** ISO weekday (1 = Monday ... 7 = Sunday) of a day number; day 0, 1970-01-01, was a Thursday. */
export function weekdayOf(dayNumber: number): number {
  return ((((dayNumber + 3) % 7) + 7) % 7) + 1;
}

/**
 * Puts history days on the slot grid once and keeps them (keyed by the day object, so a changed
 * history is a different key). It reads a day's prices only when asked for that day as a past day.
 */
export class GridCache {
  private readonly days = new WeakMap<HistoryDay, GriddedDay>();
  private readonly dayNumbers = new WeakMap<HistoryDay, number>();
  /**
   * robustScale of sets of gridded days' prices, kept sorted from one window to the next: one kept set
   * per window length, so that windows of different lengths asked in turn (the candidates of `auto`)
   * each move from their own last set by a day instead of being sorted afresh.
   */
  private readonly scaleSets = new Map<number, DaySetScale>();

  /** The kept sorted set of the windows of `windowDays` calendar days (daySetScale.ts). */
  scales(windowDays: number): DaySetScale {
    let scales = this.scaleSets.get(windowDays);
    if (scales === undefined) {
      scales = new DaySetScale();
      this.scaleSets.set(windowDays, scales);
    }
    return scales;
  }

  constructor(
    readonly exogenousNames: readonly string[],
    readonly slotsPerDay: number,
  ) {}

  past(source: HistoryDay, field: string): GriddedDay {
    const cached = this.days.get(source);
    if (cached !== undefined) return cached;
    const layout = this.layoutOf(source.periods, `${field}.periods`);
    requireFinite(source.pricePerMwh, source.periods.length, `${field}.pricePerMwh`);
    const dayNumber = this.dayNumber(source);
    const gridded: GriddedDay = {
      day: source.day,
      dayNumber,
      weekday: weekdayOf(dayNumber),
      prices: toSlotGrid(source.pricePerMwh, layout),
      exogenous: this.exogenousOf(source, layout, field),
    };
    this.days.set(source, gridded);
    return gridded;
  }

  /** The day number of a history day (kept). */
  dayNumber(source: HistoryDay): number {
    let dn = this.dayNumbers.get(source);
    if (dn === undefined) {
      dn = dayNumberOf(source.day);
      this.dayNumbers.set(source, dn);
    }
    return dn;
  }

  target(source: HistoryDay, field: string): TargetDay {
    const layout = this.layoutOf(source.periods, `${field}.periods`);
    const dayNumber = dayNumberOf(source.day);
    return {
      day: source.day,
      dayNumber,
      weekday: weekdayOf(dayNumber),
      periods: source.periods,
      layout,
      exogenous: this.exogenousOf(source, layout, field),
    };
  }

  private layoutOf(periods: readonly DeliveryPeriod[], field: string): SlotLayout {
    const layout = slotLayout(periods, field);
    if (layout.slotsPerDay !== this.slotsPerDay) {
      throw new ForecastInputError(field, `periods of ${layout.periodMinutes} min, unlike the delivery day's`, 'give a history with one period length');
    }
    return layout;
  }

  private exogenousOf(source: HistoryDay, layout: SlotLayout, field: string): Float64Array[] {
    return this.exogenousNames.map((name) => {
      const column = source.exogenous[name];
      const where = `${field}.exogenous.${name}`;
      if (column === undefined) throw new ForecastInputError(where, 'the column is missing on this day', 'give every day every exogenous column');
      requireFinite(column, source.periods.length, where);
      return toSlotGrid(column, layout);
    });
  }
}

function requireFinite(values: readonly number[], length: number, field: string): void {
  if (values.length !== length) {
    throw new ForecastInputError(field, `${values.length} values for ${length} periods`, 'give one value per delivery period');
  }
  values.forEach((v, t) => {
    if (!Number.isFinite(v)) throw new ForecastInputError(`${field}[${t}]`, `not a finite number (${v})`, 'fill or drop the day');
  });
}

/**
 * What a forecast for one delivery day may read: the days strictly before it (prices and exogenous
 * columns) and, of the delivery day itself, only its calendar, periods and exogenous columns. The
 * view is built from a slice of the history that ends before the delivery day and a copy of the
 * delivery day without its prices, so no model can look ahead: there is nothing ahead to read.
 */
export class HistoryView {
  private readonly dayNumbers: Int32Array;

  private constructor(
    private readonly pastDays: readonly HistoryDay[],
    readonly target: TargetDay,
    private readonly grids: GridCache,
  ) {
    this.dayNumbers = new Int32Array(pastDays.length);
    pastDays.forEach((d, i) => (this.dayNumbers[i] = grids.dayNumber(d)));
    for (let i = 1; i < this.dayNumbers.length; i++) {
      if ((this.dayNumbers[i] as number) <= (this.dayNumbers[i - 1] as number)) {
        throw new ForecastInputError(`history.days[${i}]`, `${pastDays[i]?.day} does not follow ${pastDays[i - 1]?.day}`, 'sort the days in ascending order without repeats');
      }
    }
    const last = this.dayNumbers[this.dayNumbers.length - 1];
    if (last !== undefined && last >= target.dayNumber) {
      throw new ForecastInputError('history.days', `the delivery day ${target.day} is not after the days before it`, 'sort the days in ascending order');
    }
  }

  /**
   * The view for delivery day `history.days[dayIndex]`: the days before it, and of that day only its
   * calendar, periods and exogenous columns (its prices are never read and may be NaN).
   */
  static before(history: PriceHistory, dayIndex: number, grids?: GridCache): HistoryView {
    const target = history.days[dayIndex];
    if (!Number.isInteger(dayIndex) || target === undefined) {
      throw new ForecastInputError('dayIndex', `${dayIndex} is not the index of a day of the history (0..${history.days.length - 1})`, 'pick a day of the history');
    }
    const cache = grids ?? new GridCache(history.exogenousNames, slotLayout(target.periods, `history.days[${dayIndex}].periods`).slotsPerDay);
    return new HistoryView(history.days.slice(0, dayIndex), cache.target(target, `history.days[${dayIndex}]`), cache);
  }

  get slotsPerDay(): number {
    return this.grids.slotsPerDay;
  }

  get exogenousNames(): readonly string[] {
    return this.grids.exogenousNames;
  }

  /** Number of past days. */
  get pastCount(): number {
    return this.pastDays.length;
  }

  /** Past day i, 0 <= i < pastCount, on the slot grid. */
  past(i: number): GriddedDay {
    const source = this.pastDays[i];
    if (source === undefined) throw new RangeError(`past day ${i} is not before the delivery day (${this.pastDays.length} days are)`);
    return this.grids.past(source, `history.days[${i}]`);
  }

  /**
   * robustScale (robustAsinh.ts) of the prices of past days `days` one after the other, the same
   * numbers bit for bit, from the sorted prices of the last set asked for a window of `windowDays`
   * calendar days (daySetScale.ts; the window's length only picks the kept set to start from).
   */
  robustScaleOf(days: readonly number[], windowDays: number): RobustScale {
    return this.grids.scales(windowDays).of(days.map((i) => this.past(i).prices));
  }

  /**
   * {@link robustScaleOf} and, from the same sorted prices, their far-out fences, lowest and highest
   * price (farOutFences.ts; DaySetScale.withBounds).
   */
  robustScaleWithBoundsOf(days: readonly number[], windowDays: number): { scale: RobustScale; bounds: SampleBounds } {
    return this.grids.scales(windowDays).withBounds(days.map((i) => this.past(i).prices));
  }

  /** Day number of past day i. */
  dayNumber(i: number): number {
    return this.dayNumbers[i] as number;
  }

  /** Index of the latest past day on or before `dayNumber`, or -1. */
  indexAtOrBefore(dayNumber: number): number {
    let lo = 0;
    let hi = this.dayNumbers.length - 1;
    let found = -1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      if ((this.dayNumbers[mid] as number) <= dayNumber) {
        found = mid;
        lo = mid + 1;
      } else {
        hi = mid - 1;
      }
    }
    return found;
  }

  /** Index of the past day with exactly this day number, or -1. */
  indexOf(dayNumber: number): number {
    const i = this.indexAtOrBefore(dayNumber);
    return i >= 0 && this.dayNumbers[i] === dayNumber ? i : -1;
  }
}
