import { z } from 'zod';
import { isValidDay } from '../market/calendar.js';
import { scenarioOf, type Scenario } from './scenarioOf.js';
import { parseJsonSpec } from './readSpecs.js';
import { MAX_SPEC_BYTES } from './specFile.js';
import { readInputFile } from './readInputFile.js';

export type { Scenario } from './scenarioOf.js';

/** Largest scenario file [bytes]: like a spec, it holds a few fields. */
const MAX_SCENARIO_BYTES = MAX_SPEC_BYTES;

const path = (field: string) => z.string({ error: `${field} must be a path (text)` }).min(1, `${field} must not be empty`);

export const scenarioSchema = z.strictObject({
  name: z.string({ error: 'name must be text' }).optional(),
  description: z.string({ error: 'description must be text' }).optional(),
  market: path('market').optional(),
  battery: path('battery').optional(),
  history: path('history').optional(),
  forecast: path('forecast').optional(),
  demoDay: z.string({ error: 'demoDay must be a day (text)' }).refine(isValidDay, 'demoDay must be a valid day YYYY-MM-DD').optional(),
});

const FIXES: Readonly<Record<string, string>> = {
  market: 'give the path of market.json relative to the scenario file',
  battery: 'give the path of battery.json relative to the scenario file',
  history: 'give the path of the price history CSV relative to the scenario file',
  forecast: 'give the path of the quantile forecast CSV relative to the scenario file',
  demoDay: 'give a day as YYYY-MM-DD',
  name: 'give a short name in double quotes, or leave it out',
  description: 'give a description in double quotes, or leave it out',
};

export function readScenario(file: string): Scenario {
  return parseScenario(readInputFile(file, { maxBytes: MAX_SCENARIO_BYTES }), file);
}

/** A scenario from its JSON text; `file` locates the paths it names. */
export function parseScenario(text: string, file: string): Scenario {
  const spec = parseJsonSpec(text, file, (v) => scenarioSchema.safeParse(v), FIXES);
  return scenarioOf(spec, text, file);
}
