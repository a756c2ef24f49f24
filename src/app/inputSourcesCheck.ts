import { onlyKeys, plainRecord } from '../errors/plainChecks.js';
import { pathProblem } from './settingRules.js';
import type { InputSources } from './settingSchemas.js';

/** The fields of the input sources in the schema's order (inputSourcesSchema, settingSchemas.ts). */
const INPUT_KEYS = ['scenario', 'market', 'battery', 'forecast', 'history'] as const;

/**
 * The `inputs` of a command's settings as inputSourcesSchema returns them, checked by hand without
 * loading zod (each field absent, undefined or a path that is not empty); undefined when the schema
 * might refuse them (it then words the problems).
 */
export function checkedInputSources(value: unknown): InputSources | undefined {
  const sources = plainRecord(value);
  if (sources === undefined || !onlyKeys(sources, INPUT_KEYS)) return undefined;
  const inputs: Record<string, string | undefined> = {};
  for (const key of INPUT_KEYS) {
    if (!Object.hasOwn(sources, key)) continue;
    const path = sources[key];
    if (path !== undefined && (typeof path !== 'string' || pathProblem(path) !== null)) return undefined;
    inputs[key] = path;
  }
  return inputs;
}
