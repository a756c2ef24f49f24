import { dirname, resolve } from 'node:path';
import { z } from 'zod';
import { isValidDay } from '../market/calendar.js';
import { lineOfJsonPath } from './jsonProblems.js';
import { MAX_SPEC_BYTES, parseJsonSpec } from './readSpecs.js';
import { readInputFile } from './readInputFile.js';

/** A scenario file bundles the paths of the inputs, relative to itself (docs/design.md section 8). */
export interface Scenario {
  readonly file: string;
  readonly name: string;
  /** Absolute paths, where given. */
  readonly market?: string;
  readonly battery?: string;
  readonly history?: string;
  readonly forecast?: string;
  /** The delivery day the demo plans, where given. */
  readonly demoDay?: string;
  /** Line of each path entry in the scenario file, to point at a wrong path. */
  readonly lines: Readonly<Partial<Record<'market' | 'battery' | 'history' | 'forecast', number>>>;
}

/** Largest scenario file [bytes]: like a spec, it holds a few fields. */
const MAX_SCENARIO_BYTES = MAX_SPEC_BYTES;

const path = (field: string) => z.string({ error: `${field} must be a path (text)` }).min(1, `${field} must not be empty`);

const scenarioSchema = z.strictObject({
  name: z.string({ error: 'name must be text' }).optional(),
  description: z.string({ error: 'description must be text' }).optional(),
  market: path('market').optional(),
  battery: path('battery').optional(),
  history: path('history').optional(),
  forecast: path('forecast').optional(),
  demoDay: z.string({ error: 'demoDay must be a day (text)' }).refine(isValidDay, 'demoDay must be a valid day YYYY-MM-DD').optional(),
});

const ENTRIES = ['market', 'battery', 'history', 'forecast'] as const;

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
  const base = dirname(resolve(file));
  const at = (relative: string): string => resolve(base, relative);
  const scenario: Scenario = {
    file,
    name: spec.name ?? file,
    ...(spec.market === undefined ? {} : { market: at(spec.market) }),
    ...(spec.battery === undefined ? {} : { battery: at(spec.battery) }),
    ...(spec.history === undefined ? {} : { history: at(spec.history) }),
    ...(spec.forecast === undefined ? {} : { forecast: at(spec.forecast) }),
    ...(spec.demoDay === undefined ? {} : { demoDay: spec.demoDay }),
    lines: Object.fromEntries(ENTRIES.flatMap((name) => (spec[name] === undefined ? [] : [[name, lineOfJsonPath(text, [name]) ?? 1]]))),
  };
  return scenario;
}
