import { z } from 'zod';
import { hasInvisible } from '../errors/shownText.js';
import { isValidTimeZone } from './calendar.js';
import { unevenClockShift } from './clockShifts.js';
import { GATE_CLOSURE_PATTERN, IMBALANCE_RULE_KIND, isMultipleOf, MAX_CURRENCY_LENGTH, MAX_QUANTITY_STEP_MW, MIN_PRICE_TICK_PER_MWH, MIN_QUANTITY_STEP_MW, OLD_IMBALANCE_FIELD, PRICE_LIMIT_PER_MWH } from './marketLimits.js';

export { isMultipleOf, MAX_QUANTITY_STEP_MW, MIN_PRICE_TICK_PER_MWH, MIN_QUANTITY_STEP_MW, OLD_IMBALANCE_FIELD, PRICE_LIMIT_PER_MWH } from './marketLimits.js';

/** A number of a spec in [lo, hi]; Infinity (JSON's 1e999) and NaN are out of that range too. */
const bounded = (what: string, lo: number, hi: number) =>
  z
    .number({ error: (issue) => (issue.input === undefined ? `missing ${what}` : typeof issue.input === 'number' ? `${what} must be in [${lo}, ${hi}]` : `${what} must be a number`) })
    .min(lo, `${what} must be in [${lo}, ${hi}]`)
    .max(hi, `${what} must be in [${lo}, ${hi}]`);
/** A finite number of a spec (1e999 parses to Infinity and is refused). */
const finite = (what: string) =>
  z.number({ error: (issue) => (issue.input === undefined ? `missing ${what}` : `${what} must be a number`) }).finite();
const text = (what: string) =>
  z.string({ error: (issue) => (issue.input === undefined ? `missing ${what}` : `${what} must be text in double quotes`) });

/**
 * Imbalance price rule for histories without an `imbalance_price` column: an unaccepted buy is closed at
 * clearing + penaltyPerMwh (the operator pays more), an unaccepted sell at clearing - penaltyPerMwh
 * (the operator receives less). `key` is the field it is read from, named in its messages.
 */
const ruleSchema = (key: string) =>
  z.strictObject({
    kind: z.literal(IMBALANCE_RULE_KIND, { error: `${key}.kind must be "${IMBALANCE_RULE_KIND}"` }),
    /** Penalty added against the operator [currency/MWh], >= 0. */
    penaltyPerMwh: bounded('penaltyPerMwh', 0, PRICE_LIMIT_PER_MWH),
  });

export const imbalanceRuleSchema = ruleSchema('imbalance');

/**
 * How the exchange takes bid curves (docs/design.md section 8): their shape, and the most orders (price
 * and quantity pairs) one period's curve may have. Only step curves, a stack of limit orders, are
 * planned today.
 */
export const bidCurvesSchema = z.strictObject({
  /** `steps`: the net quantity changes in steps at the limit prices. Default `steps`. */
  shape: z.literal('steps', { error: 'bidCurves.shape must be "steps" (a stack of limit orders)' }).default('steps'),
  /** The most orders of one period's curve [-], 2 or more; default: no limit. */
  maxOrdersPerPeriod: z
    .number({ error: 'bidCurves.maxOrdersPerPeriod must be a whole number' })
    .int('bidCurves.maxOrdersPerPeriod must be a whole number')
    .min(2, 'bidCurves.maxOrdersPerPeriod must be at least 2')
    .optional(),
});

/** A number in [min, max], with messages that name the field. */
const stepField = (what: string, min: number, max: number, unit: string) =>
  finite(what).min(min, `${what} must be at least ${min} ${unit}`).max(max, `${what} must be at most ${max} ${unit}; check the unit`);

/** Schema of `market.json` (docs/design.md section 8), with sanity checks that say what to fix. */
export const marketSpecSchema = z
  .strictObject({
    /** IANA time zone of the delivery day, e.g. `Europe/Berlin`. Required. */
    timeZone: text('timeZone').refine(isValidTimeZone, { message: 'not an IANA time zone' }),
    /** Length of a delivery period [min]: 15, 30 or 60. Required. */
    periodMinutes: z.union([z.literal(15), z.literal(30), z.literal(60)], {
      error: (issue) => (issue.input === undefined ? 'missing periodMinutes' : 'periodMinutes must be 15, 30 or 60'),
    }),
    /** Lowest price the auction can clear at [currency/MWh]. Required. */
    priceFloor: bounded('priceFloor', -PRICE_LIMIT_PER_MWH, PRICE_LIMIT_PER_MWH),
    /** Highest price the auction can clear at [currency/MWh]. Required. */
    priceCap: bounded('priceCap', -PRICE_LIMIT_PER_MWH, PRICE_LIMIT_PER_MWH),
    /** Currency label printed beside prices, e.g. `EUR` or an invented one. Required. */
    currency: text('currency')
      .min(1, 'currency must not be empty')
      .max(MAX_CURRENCY_LENGTH, `currency must be a short label of at most ${MAX_CURRENCY_LENGTH} characters`)
      .refine((label) => !hasInvisible(label) && label.trim() === label, 'currency must be printable text without control characters or blanks around it'),
    /** Gate closure, local time of day on the day before delivery, `HH:MM`. Required. */
    gateClosure: text('gateClosure')
      .regex(GATE_CLOSURE_PATTERN, 'gateClosure must be a local time HH:MM'),
    /** Rule for the imbalance (balancing) price where a history has none. Default: none (required then). */
    imbalance: imbalanceRuleSchema.optional(),
    /** How the exchange takes bid curves (the `curve` and `auto` policies). Default: step curves, no limit. */
    bidCurves: bidCurvesSchema.optional(),
    /** The old name of `imbalance`, read as it; not both. */
    [OLD_IMBALANCE_FIELD]: ruleSchema(OLD_IMBALANCE_FIELD).optional(),
    /** Order quantities are whole multiples of this [MW], at least MIN_QUANTITY_STEP_MW. Default: none (quantities as planned). */
    quantityStepMw: stepField('quantityStepMw', MIN_QUANTITY_STEP_MW, MAX_QUANTITY_STEP_MW, 'MW').optional(),
    /** Smallest order the exchange takes [MW], at least MIN_QUANTITY_STEP_MW; smaller orders are dropped. Default: none. */
    minimumQuantityMw: stepField('minimumQuantityMw', MIN_QUANTITY_STEP_MW, MAX_QUANTITY_STEP_MW, 'MW').optional(),
    /** Limit prices are whole multiples of this [currency/MWh], at least MIN_PRICE_TICK_PER_MWH; floor and cap lie on it. Default: none. */
    priceTickPerMwh: finite('priceTickPerMwh').min(MIN_PRICE_TICK_PER_MWH, `priceTickPerMwh must be at least ${MIN_PRICE_TICK_PER_MWH}`).optional(),
  })
  .superRefine(
    (spec, ctx) => {
      // Runs even when other fields are wrong, so that every problem is listed at once; each check
      // looks only at fields that are themselves valid.
      const { priceFloor, priceCap, timeZone, periodMinutes, imbalance, fallback, priceTickPerMwh } = spec as Partial<Record<keyof typeof spec, unknown>>;
      if (imbalance !== undefined && fallback !== undefined) {
        ctx.addIssue({ code: 'custom', path: [OLD_IMBALANCE_FIELD], message: `both "imbalance" and its old name "${OLD_IMBALANCE_FIELD}" are given` });
      }
      if (isFinite(priceFloor) && isFinite(priceCap) && priceFloor >= priceCap) {
        ctx.addIssue({ code: 'custom', path: ['priceCap'], message: `priceCap (${priceCap}) must be above priceFloor (${priceFloor})` });
      }
      // Rounding limits to the tick keeps them inside [floor, cap] only when floor and cap lie on the tick.
      if (isFinite(priceTickPerMwh) && priceTickPerMwh > 0 && isFinite(priceFloor) && isFinite(priceCap) && priceFloor < priceCap) {
        if (priceTickPerMwh > priceCap - priceFloor) {
          ctx.addIssue({ code: 'custom', path: ['priceTickPerMwh'], message: `priceTickPerMwh (${priceTickPerMwh}) is wider than the whole price range [${priceFloor}, ${priceCap}]` });
        } else {
          for (const [name, value] of [['priceFloor', priceFloor], ['priceCap', priceCap]] as const) {
            if (!isMultipleOf(value, priceTickPerMwh)) ctx.addIssue({ code: 'custom', path: ['priceTickPerMwh'], message: `${name} (${value}) is not a whole number of ticks of ${priceTickPerMwh}` });
          }
        }
      }
      if (typeof timeZone === 'string' && isValidTimeZone(timeZone) && (periodMinutes === 15 || periodMinutes === 30 || periodMinutes === 60)) {
        const shift = unevenClockShift(timeZone, periodMinutes);
        if (shift !== null) {
          ctx.addIssue({ code: 'custom', path: ['periodMinutes'], message: `${timeZone} shifts its clocks by ${shift} minutes, so its clock-change days are not a whole number of ${periodMinutes}-minute periods` });
        }
      }
    },
    { when: (payload) => typeof payload.value === 'object' && payload.value !== null && !Array.isArray(payload.value) },
  )
  // The old name is read as the new one, so the rest of the program sees only `imbalance`.
  .transform(({ fallback, ...spec }) => (fallback === undefined ? spec : { ...spec, imbalance: fallback }));

function isFinite(value: unknown): value is number {
  return typeof value === 'number' && Number.isFinite(value);
}

export const MARKET_FIELD_FIXES: Readonly<Record<string, string>> = {
  timeZone: 'use the market\'s IANA zone name, e.g. "Europe/Berlin" or "Australia/Adelaide"',
  periodMinutes: 'set the market time unit: 15, 30 or 60 (a period that divides every clock shift of the zone)',
  priceFloor: 'give the auction\'s lowest clearing price in currency/MWh, e.g. -500',
  priceCap: 'give the auction\'s highest clearing price in currency/MWh, above priceFloor, e.g. 4000',
  currency: 'give a short printable currency label such as "EUR"',
  gateClosure: 'give the local time on the day before delivery, e.g. "12:00"',
  'imbalance.kind': 'use {"kind": "clearing-plus-penalty", "penaltyPerMwh": 15}',
  'imbalance.penaltyPerMwh': 'give a penalty >= 0 in currency/MWh',
  'bidCurves.shape': 'use "steps", or leave bidCurves out',
  'bidCurves.maxOrdersPerPeriod': 'give the most orders the exchange takes in one period\'s curve, e.g. 10, or leave it out',
  [OLD_IMBALANCE_FIELD]: 'keep only "imbalance", the same rule under its new name',
  [`${OLD_IMBALANCE_FIELD}.kind`]: 'use {"kind": "clearing-plus-penalty", "penaltyPerMwh": 15}',
  [`${OLD_IMBALANCE_FIELD}.penaltyPerMwh`]: 'give a penalty >= 0 in currency/MWh',
  quantityStepMw: 'give the exchange\'s quantity step in MW, e.g. 0.1, or leave the field out',
  minimumQuantityMw: 'give the exchange\'s smallest order in MW, e.g. 0.1, or leave the field out',
  priceTickPerMwh: 'give the exchange\'s price tick in currency/MWh, e.g. 0.01, on which priceFloor and priceCap lie, or leave the field out',
};

/** Market spec, as read from `market.json`: the type of marketSpecSchema's output. */
export type MarketSpec = Readonly<z.output<typeof marketSpecSchema>>;

/** The imbalance price rule of a market spec. */
export type ImbalanceRule = Readonly<z.output<typeof imbalanceRuleSchema>>;

export function parseMarketSpec(value: unknown): z.ZodSafeParseResult<MarketSpec> {
  return marketSpecSchema.safeParse(value);
}
