import type { DeliveryPeriod } from '../../types.js';
import { ForecastInputError } from './errors.js';

/**
 * The clock-slot grid: models index the periods of a delivery day by their local clock time, slot
 * s = floor(local minute of day / period length), s = 0 .. S - 1 with S = 1440 / period length
 * (96 for quarter-hours). A normal day fills each slot once. On a clock-change day the grid is kept:
 * - a short day (23 h, 92 quarter-hours) has no period in the skipped hour's slots; their values are
 *   interpolated linearly between the nearest filled slots of the same day (the first or last filled
 *   value is carried to the ends);
 * - a long day (25 h, 100 quarter-hours) has two periods in the repeated hour's slots; a slot holds
 *   their mean.
 * Forecasts are made on the grid and mapped back to the delivery day's own periods: each period takes
 * its slot's value (so both repeated periods of a long day get the same forecast, and the skipped
 * slots of a short day are dropped). Lags "the same period d days back" therefore mean the same
 * local clock slot, which is what daily price profiles follow.
 */
export interface SlotLayout {
  /** Period length [min]. */
  readonly periodMinutes: number;
  /** Slots per day S = 1440 / periodMinutes [-]. */
  readonly slotsPerDay: number;
  /** Slot of each period of the day, in period order. */
  readonly slots: Int32Array;
}

const LOCAL_TIME = /T(\d{2}):(\d{2})/;

/** Minute of the local day at which a period starts, read from its ISO 8601 start with offset. */
export function localMinuteOfDay(start: string): number {
  const match = LOCAL_TIME.exec(start);
  if (match === null) {
    throw new ForecastInputError('period start', `"${start}" has no local time of day`, 'write period starts as ISO 8601 with offset, e.g. 2027-03-28T03:00:00+02:00');
  }
  return Number(match[1]) * 60 + Number(match[2]);
}

/** The slot layout of a day from its periods (length from the first period's start and end). */
export function slotLayout(periods: readonly DeliveryPeriod[], field: string): SlotLayout {
  const first = periods[0];
  if (first === undefined) throw new ForecastInputError(field, 'a delivery day has no periods', 'give every day its periods');
  const periodMinutes = Math.round((Date.parse(first.end) - Date.parse(first.start)) / 60_000);
  if (!(periodMinutes > 0) || 1440 % periodMinutes !== 0) {
    throw new ForecastInputError(field, `period length ${periodMinutes} min does not divide a day`, 'use 15, 30 or 60 minute periods');
  }
  const slotsPerDay = 1440 / periodMinutes;
  const slots = Int32Array.from(periods, (p) => Math.floor(localMinuteOfDay(p.start) / periodMinutes));
  return { periodMinutes, slotsPerDay, slots };
}

/** Values per period -> values per slot (mean of a doubled slot, interpolation across a gap). */
export function toSlotGrid(values: readonly number[], layout: SlotLayout): Float64Array {
  const { slots, slotsPerDay } = layout;
  const sum = new Float64Array(slotsPerDay);
  const count = new Int32Array(slotsPerDay);
  values.forEach((v, t) => {
    const s = slots[t] as number;
    sum[s] = (sum[s] as number) + v;
    count[s] = (count[s] as number) + 1;
  });
  const grid = new Float64Array(slotsPerDay);
  let previous = -1;
  for (let s = 0; s < slotsPerDay; s++) {
    if ((count[s] as number) === 0) continue;
    grid[s] = (sum[s] as number) / (count[s] as number);
    fillGap(grid, previous, s);
    previous = s;
  }
  fillGap(grid, previous, slotsPerDay);
  return grid;
}

/** Fills slots strictly between filled slots lo and hi (-1 or S for an open end). */
function fillGap(grid: Float64Array, lo: number, hi: number): void {
  if (hi - lo <= 1 || (lo < 0 && hi >= grid.length)) return;
  for (let s = lo + 1; s < hi; s++) {
    if (lo < 0) grid[s] = grid[hi] as number;
    else if (hi >= grid.length) grid[s] = grid[lo] as number;
    else grid[s] = (grid[lo] as number) + ((s - lo) / (hi - lo)) * ((grid[hi] as number) - (grid[lo] as number));
  }
}

/** Values per slot -> values per period of a day with this layout. */
export function fromSlotGrid(grid: ArrayLike<number>, layout: SlotLayout): number[] {
  return Array.from(layout.slots, (s) => grid[s] as number);
}
