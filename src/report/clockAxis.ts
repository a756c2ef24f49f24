import type { BandAxis, BandTick } from './chartTypes.js';
import { PERIOD_TICK_HOURS } from './periodAxis.js';

const CLOCK = /^(\d{2}):(\d{2})$/;

/**
 * Axis of the periods of a day by local clock time, one band per slot (`HH:MM`, in order, covering
 * the day), for values pooled over many days such as scores per period of the day. Ticks sit at slot
 * starts on whole hours every 1, 2, 3, 4, 6 or 12 hours (as periodAxis), and the end of the last
 * slot is labelled 24:00 when the slots fill whole hours.
 *
 * @param slotStarts local start of each slot, `HH:MM`, ascending
 * @param periodMinutes length of a slot [min]
 * @param timeZone IANA zone named in the axis title
 */
export function clockAxis(slotStarts: readonly string[], periodMinutes: number, timeZone?: string): BandAxis {
  const times = slotStarts.map((text) => {
    const m = CLOCK.exec(text);
    if (m === null) throw new RangeError(`not a clock time HH:MM: ${text}`);
    return { hour: Number(m[1]), minute: Number(m[2]), text };
  });
  const end = (t: { hour: number; minute: number }) => {
    const minutes = t.hour * 60 + t.minute + periodMinutes;
    return `${String(Math.floor(minutes / 60)).padStart(2, '0')}:${String(minutes % 60).padStart(2, '0')}`;
  };
  const bandLabels = times.map((t) => `${t.text}\u2013${end(t)}`);
  const last = times[times.length - 1];
  const fillsDay = last !== undefined && last.hour * 60 + last.minute + periodMinutes === 24 * 60;
  const tickSets = PERIOD_TICK_HOURS.map((step) => {
    const ticks: BandTick[] = [];
    times.forEach((t, i) => {
      if (t.minute === 0 && t.hour % step === 0) ticks.push({ at: i, label: t.text });
    });
    if (fillsDay) ticks.push({ at: times.length, label: '24:00' });
    return ticks;
  });
  return { kind: 'band', title: { label: 'period of the day, start', unit: timeZone === undefined ? 'local time' : `local time, ${timeZone}` }, bandLabels, tickSets };
}
