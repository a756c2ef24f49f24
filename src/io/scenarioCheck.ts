import { isValidDay } from '../market/civilDays.js';
import { onlyKeys, plainRecord } from '../errors/plainChecks.js';
import type { ScenarioFields } from './scenarioOf.js';

/** The fields of a scenario file in the schema's order (readScenario.ts), and whether each is a path. */
const SCENARIO_FIELDS = [
  ['name', 'text'],
  ['description', 'text'],
  ['market', 'path'],
  ['battery', 'path'],
  ['history', 'path'],
  ['forecast', 'path'],
  ['demoDay', 'day'],
] as const;
const SCENARIO_KEYS = SCENARIO_FIELDS.map(([key]) => key);

/**
 * A scenario file's value as its schema (scenarioSchema, readScenario.ts) returns it, checked by hand
 * without loading zod; undefined when the schema might refuse it (it then words the problems).
 */
export function checkedScenarioFields(value: unknown): ScenarioFields | undefined {
  const scenario = plainRecord(value);
  if (scenario === undefined || !onlyKeys(scenario, SCENARIO_KEYS)) return undefined;
  const parsed: Record<string, string | undefined> = {};
  for (const [key, kind] of SCENARIO_FIELDS) {
    if (!Object.hasOwn(scenario, key)) continue;
    const field = scenario[key];
    if (field !== undefined && (typeof field !== 'string' || (kind === 'path' && field.length === 0) || (kind === 'day' && !isValidDay(field)))) return undefined;
    parsed[key] = field;
  }
  return parsed;
}
