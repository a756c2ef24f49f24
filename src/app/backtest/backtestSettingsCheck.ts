import { BACKTEST_DEFAULTS } from '../../backtest/backtestOptions.js';
import { BACKTEST_POLICIES, type BacktestPolicy } from '../../backtest/backtestPolicy.js';
import { numberIn, onlyKeys, plainRecord } from '../../errors/plainChecks.js';
import { isValidDay } from '../../market/civilDays.js';
import { isAlpha } from '../../plan/alpha.js';
import { UNACCEPTED_RULES } from '../../settle/unacceptedRule.js';
import { checkedInputSources } from '../inputSourcesCheck.js';
import { outFolderProblem, spanProblem } from '../settingRules.js';
import type { CheckedBacktestSettings } from './backtestRun.js';

/** The fields of the backtest's settings in the schema's order (backtestSettingsSchema, backtestUseCase.ts). */
const BACKTEST_KEYS = ['inputs', 'model', 'from', 'to', 'alpha', 'unaccepted', 'policies', 'scenarios', 'out', 'force', 'report'] as const;

/**
 * The settings of `quantbid backtest` as backtestSettingsSchema returns them, checked by hand without
 * loading zod; undefined when the schema might refuse them (it then words the problems), and for
 * settings with `model` or `scenarios` (forecasts made from the history, scenario planning), which
 * the schema checks. test/app/backtest/backtestSettingsCheck.test.ts holds the two to the same answer
 * on generated and mutated settings.
 */
export function checkedBacktestSettings(value: unknown): CheckedBacktestSettings | undefined {
  const settings = plainRecord(value);
  if (settings === undefined || !onlyKeys(settings, BACKTEST_KEYS) || Object.hasOwn(settings, 'model') || Object.hasOwn(settings, 'scenarios')) return undefined;
  const inputs = checkedInputSources(settings.inputs);
  if (inputs === undefined) return undefined;
  const { from, to, alpha = BACKTEST_DEFAULTS.alpha, unaccepted = BACKTEST_DEFAULTS.unaccepted, policies = BACKTEST_DEFAULTS.policies, out, force = false, report = false } = settings;
  if (typeof from !== 'string' || !isValidDay(from) || typeof to !== 'string' || !isValidDay(to) || spanProblem(from, to) !== null) return undefined;
  if (!numberIn(alpha, -Infinity, Infinity) || !isAlpha(alpha)) return undefined;
  if (!(UNACCEPTED_RULES as readonly unknown[]).includes(unaccepted)) return undefined;
  const list = checkedPolicies(policies);
  if (list === undefined) return undefined;
  if (typeof out !== 'string' || outFolderProblem(out) !== null) return undefined;
  if (typeof force !== 'boolean' || typeof report !== 'boolean') return undefined;
  return { inputs, from, to, alpha, unaccepted, policies: list, out, force, report } as CheckedBacktestSettings;
}

/** A new list of the policies when `value` is an array of known policies, at least one, each once; else undefined. */
function checkedPolicies(value: unknown): BacktestPolicy[] | undefined {
  if (!Array.isArray(value) || value.length === 0) return undefined;
  const list: BacktestPolicy[] = [];
  for (let k = 0; k < value.length; k++) {
    const policy: unknown = value[k];
    if (!(BACKTEST_POLICIES as readonly unknown[]).includes(policy) || list.includes(policy as BacktestPolicy)) return undefined;
    list.push(policy as BacktestPolicy);
  }
  return list;
}
