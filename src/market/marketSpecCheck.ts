import { hasInvisible } from '../errors/shownText.js';
import { FAILED, numberIn, onlyKeys, plainRecord } from '../errors/plainChecks.js';
import type { MarketSpec } from './marketSpec.js';
import { isValidTimeZone } from './calendar.js';
import { unevenClockShift } from './clockShifts.js';
import {
  GATE_CLOSURE_PATTERN,
  IMBALANCE_RULE_KIND,
  isMultipleOf,
  MAX_CURRENCY_LENGTH,
  MAX_QUANTITY_STEP_MW,
  MIN_PRICE_TICK_PER_MWH,
  MIN_QUANTITY_STEP_MW,
  OLD_IMBALANCE_FIELD,
  PRICE_LIMIT_PER_MWH,
} from './marketLimits.js';

/** The fields of market.json in the schema's order (marketSpec.ts): zod's output lists them so. */
const MARKET_KEYS = ['timeZone', 'periodMinutes', 'priceFloor', 'priceCap', 'currency', 'gateClosure', 'imbalance', 'bidCurves', OLD_IMBALANCE_FIELD, 'quantityStepMw', 'minimumQuantityMw', 'priceTickPerMwh'] as const;

/**
 * market.json's value as marketSpecSchema returns it, checked by hand without loading zod; undefined
 * when the schema might refuse it (it then words the problems). Every rule is the schema's, on the
 * same shared limits (marketLimits.ts); test/market/marketSpecCheck.test.ts holds the two to the same
 * answer on generated and mutated specs.
 */
export function checkedMarketSpec(value: unknown): MarketSpec | undefined {
  const spec = plainRecord(value);
  if (spec === undefined || !onlyKeys(spec, MARKET_KEYS)) return undefined;
  const { timeZone, periodMinutes, priceFloor, priceCap, currency, gateClosure } = spec;
  if (typeof timeZone !== 'string' || !isValidTimeZone(timeZone)) return undefined;
  if (periodMinutes !== 15 && periodMinutes !== 30 && periodMinutes !== 60) return undefined;
  if (!numberIn(priceFloor, -PRICE_LIMIT_PER_MWH, PRICE_LIMIT_PER_MWH) || !numberIn(priceCap, -PRICE_LIMIT_PER_MWH, PRICE_LIMIT_PER_MWH)) return undefined;
  if (typeof currency !== 'string' || currency.length < 1 || currency.length > MAX_CURRENCY_LENGTH || hasInvisible(currency) || currency.trim() !== currency) return undefined;
  if (typeof gateClosure !== 'string' || !GATE_CLOSURE_PATTERN.test(gateClosure)) return undefined;
  const parsed: Record<string, unknown> = { timeZone, periodMinutes, priceFloor, priceCap, currency, gateClosure };
  const optional: readonly [string, (field: unknown) => unknown][] = [
    ['imbalance', imbalanceRule],
    ['bidCurves', bidCurves],
    [OLD_IMBALANCE_FIELD, imbalanceRule],
    ['quantityStepMw', (step) => (numberIn(step, MIN_QUANTITY_STEP_MW, MAX_QUANTITY_STEP_MW) ? step : FAILED)],
    ['minimumQuantityMw', (minimum) => (numberIn(minimum, MIN_QUANTITY_STEP_MW, MAX_QUANTITY_STEP_MW) ? minimum : FAILED)],
    ['priceTickPerMwh', (tick) => (numberIn(tick, MIN_PRICE_TICK_PER_MWH, Infinity) ? tick : FAILED)],
  ];
  for (const [key, check] of optional) {
    if (!Object.hasOwn(spec, key)) continue;
    const field = spec[key] === undefined ? undefined : check(spec[key]);
    if (field === FAILED) return undefined;
    parsed[key] = field;
  }
  // The schema's checks between fields, on fields that are all valid here.
  const { imbalance, fallback, priceTickPerMwh } = parsed;
  if (imbalance !== undefined && fallback !== undefined) return undefined;
  if (priceFloor >= priceCap) return undefined;
  if (typeof priceTickPerMwh === 'number' && (priceTickPerMwh > priceCap - priceFloor || !isMultipleOf(priceFloor, priceTickPerMwh) || !isMultipleOf(priceCap, priceTickPerMwh))) return undefined;
  if (unevenClockShift(timeZone, periodMinutes) !== null) return undefined;
  // The schema's transform: the old name is read as the new one.
  const { [OLD_IMBALANCE_FIELD]: old, ...rest } = parsed;
  return (old === undefined ? rest : { ...rest, imbalance: old }) as unknown as MarketSpec;
}

function imbalanceRule(value: unknown): unknown {
  const rule = plainRecord(value);
  if (rule === undefined || !onlyKeys(rule, ['kind', 'penaltyPerMwh'])) return FAILED;
  if (rule.kind !== IMBALANCE_RULE_KIND || !numberIn(rule.penaltyPerMwh, 0, PRICE_LIMIT_PER_MWH)) return FAILED;
  return { kind: rule.kind, penaltyPerMwh: rule.penaltyPerMwh };
}

function bidCurves(value: unknown): unknown {
  const curves = plainRecord(value);
  if (curves === undefined || !onlyKeys(curves, ['shape', 'maxOrdersPerPeriod'])) return FAILED;
  if (curves.shape !== undefined && curves.shape !== 'steps') return FAILED;
  const most = curves.maxOrdersPerPeriod;
  if (most !== undefined && !(Number.isSafeInteger(most) && (most as number) >= 2)) return FAILED;
  return Object.hasOwn(curves, 'maxOrdersPerPeriod') ? { shape: 'steps', maxOrdersPerPeriod: most } : { shape: 'steps' };
}
