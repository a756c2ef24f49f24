import { z } from 'zod';
import type { MarketSpec } from '../types.js';
import { isValidTimeZone } from './calendar.js';
import { unevenClockShift } from './clockShifts.js';

const finite = (what: string) =>
  z.number({ error: (issue) => (issue.input === undefined ? `missing ${what}` : `${what} must be a number`) }).finite();
const text = (what: string) =>
  z.string({ error: (issue) => (issue.input === undefined ? `missing ${what}` : `${what} must be text in double quotes`) });

/** Schema of `market.json` (docs/design.md section 8), with sanity checks that say what to fix. */
export const marketSpecSchema = z
  .strictObject({
    timeZone: text('timeZone').refine(isValidTimeZone, { message: 'not an IANA time zone' }),
    periodMinutes: z.union([z.literal(15), z.literal(30), z.literal(60)], {
      error: (issue) => (issue.input === undefined ? 'missing periodMinutes' : 'periodMinutes must be 15, 30 or 60'),
    }),
    priceFloor: finite('priceFloor'),
    priceCap: finite('priceCap'),
    currency: text('currency').min(1, 'currency must not be empty'),
    gateClosure: text('gateClosure')
      .regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'gateClosure must be a local time HH:MM'),
    fallback: z
      .strictObject({
        kind: z.literal('clearing-plus-penalty', { error: 'fallback.kind must be "clearing-plus-penalty"' }),
        penaltyPerMwh: finite('penaltyPerMwh').min(0, 'penaltyPerMwh must be >= 0'),
      })
      .optional(),
  })
  .superRefine(
    (spec, ctx) => {
      // Runs even when other fields are wrong, so that every problem is listed at once; each check
      // looks only at fields that are themselves valid.
      const { priceFloor, priceCap, timeZone, periodMinutes } = spec as Partial<Record<keyof typeof spec, unknown>>;
      if (isFinite(priceFloor) && isFinite(priceCap) && priceFloor >= priceCap) {
        ctx.addIssue({ code: 'custom', path: ['priceCap'], message: `priceCap (${priceCap}) must be above priceFloor (${priceFloor})` });
      }
      if (typeof timeZone === 'string' && isValidTimeZone(timeZone) && (periodMinutes === 15 || periodMinutes === 30 || periodMinutes === 60)) {
        const shift = unevenClockShift(timeZone, periodMinutes);
        if (shift !== null) {
          ctx.addIssue({ code: 'custom', path: ['periodMinutes'], message: `${timeZone} shifts its clocks by ${shift} minutes, so its clock-change days are not a whole number of ${periodMinutes}-minute periods` });
        }
      }
    },
    { when: (payload) => typeof payload.value === 'object' && payload.value !== null && !Array.isArray(payload.value) },
  );

function isFinite(value: unknown): value is number {
  return typeof value === 'number' && Number.isFinite(value);
}

export const MARKET_FIELD_FIXES: Readonly<Record<string, string>> = {
  timeZone: 'use the market\'s IANA zone name, e.g. "Europe/Berlin" or "Australia/Adelaide"',
  periodMinutes: 'set the market time unit: 15, 30 or 60 (a period that divides every clock shift of the zone)',
  priceFloor: 'give the auction\'s lowest clearing price in currency/MWh, e.g. -500',
  priceCap: 'give the auction\'s highest clearing price in currency/MWh, above priceFloor, e.g. 4000',
  currency: 'give a currency label such as "EUR"',
  gateClosure: 'give the local time on the day before delivery, e.g. "12:00"',
  'fallback.kind': 'use {"kind": "clearing-plus-penalty", "penaltyPerMwh": 15}',
  'fallback.penaltyPerMwh': 'give a penalty >= 0 in currency/MWh',
};

export function parseMarketSpec(value: unknown): z.ZodSafeParseResult<MarketSpec> {
  return marketSpecSchema.safeParse(value) as z.ZodSafeParseResult<MarketSpec>;
}
