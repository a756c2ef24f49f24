import { isValidDay } from '../../market/civilDays.js';
import { isAlpha } from '../../plan/alpha.js';
import { UNACCEPTED_RULES } from '../../settle/unacceptedRule.js';
import { numberIn, onlyKeys, plainRecord } from '../../errors/plainChecks.js';
import { PLAN_COMMAND_POLICIES, PLAN_DEFAULTS } from '../commandDefaults.js';
import { checkedInputSources } from '../inputSourcesCheck.js';
import { outFolderProblem, rangeProblem, RUN_LIMITS } from '../settingRules.js';
import type { CheckedPlanSettings } from './planRun.js';

/** The fields of the plan's settings in the schema's order (planSettingsSchema, planUseCase.ts). */
const PLAN_KEYS = ['inputs', 'day', 'alpha', 'policy', 'scenarios', 'unaccepted', 'socStartMwh', 'out', 'force', 'report', 'listOrders'] as const;

/**
 * The settings of `quantbid plan` as planSettingsSchema returns them, checked by hand without loading
 * zod; undefined when the schema might refuse them (it then words the problems), and for settings of
 * scenario planning (`scenarios`), which the schema checks. test/app/planSettingsCheck.test.ts holds
 * the two to the same answer on generated and mutated settings.
 */
export function checkedPlanSettings(value: unknown): CheckedPlanSettings | undefined {
  const settings = plainRecord(value);
  if (settings === undefined || !onlyKeys(settings, PLAN_KEYS) || settings.scenarios !== undefined) return undefined;
  const inputs = checkedInputSources(settings.inputs);
  if (inputs === undefined) return undefined;
  const { day, alpha = PLAN_DEFAULTS.alpha, policy, unaccepted = PLAN_DEFAULTS.unaccepted, socStartMwh, out, force = false, report = false, listOrders = false } = settings;
  if (day !== undefined && (typeof day !== 'string' || !isValidDay(day))) return undefined;
  if (!numberIn(alpha, -Infinity, Infinity) || !isAlpha(alpha)) return undefined;
  if ((policy !== undefined && !(PLAN_COMMAND_POLICIES as readonly unknown[]).includes(policy)) || !(UNACCEPTED_RULES as readonly unknown[]).includes(unaccepted)) return undefined;
  if (socStartMwh !== undefined && (!numberIn(socStartMwh, -Infinity, Infinity) || rangeProblem(socStartMwh, RUN_LIMITS.socStartMwh) !== null)) return undefined;
  if (out !== undefined && (typeof out !== 'string' || outFolderProblem(out) !== null)) return undefined;
  if (typeof force !== 'boolean' || typeof report !== 'boolean' || typeof listOrders !== 'boolean') return undefined;
  const optional = (key: string, field: unknown) => (Object.hasOwn(settings, key) ? { [key]: field } : {});
  return {
    inputs,
    ...optional('day', day),
    alpha,
    ...optional('policy', policy),
    ...optional('scenarios', undefined),
    unaccepted,
    ...optional('socStartMwh', socStartMwh),
    ...optional('out', out),
    force,
    report,
    listOrders,
  } as CheckedPlanSettings;
}
