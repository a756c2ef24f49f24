/** What `auto` chose for one delivery day: a method and its calibration window. */
export interface DayChoice {
  /** Delivery day, YYYY-MM-DD. */
  readonly day: string;
  readonly method: string;
  /** Calibration window [calendar days]. */
  readonly calibrationDays: number;
}

/**
 * The record of `auto`'s choices that forecast.json and every summary of a --model run carry: the
 * choice of each day in day order, and how many days each (method, window) was chosen, most first
 * (ties in the order first chosen). Null when no day was forecast by `auto`.
 */
export function chosenMethodsRecord(choices: readonly DayChoice[]): {
  readonly perDay: readonly DayChoice[];
  readonly counts: readonly { readonly method: string; readonly calibrationDays: number; readonly days: number }[];
} | null {
  if (choices.length === 0) return null;
  const counts = new Map<string, { method: string; calibrationDays: number; days: number }>();
  for (const c of choices) {
    const key = `${c.method}|${c.calibrationDays}`;
    const entry = counts.get(key) ?? { method: c.method, calibrationDays: c.calibrationDays, days: 0 };
    entry.days++;
    counts.set(key, entry);
  }
  const perDay = [...choices].sort((a, b) => (a.day < b.day ? -1 : a.day > b.day ? 1 : 0)).map((c) => ({ day: c.day, method: c.method, calibrationDays: c.calibrationDays }));
  return { perDay, counts: [...counts.values()].sort((a, b) => b.days - a.days) };
}
