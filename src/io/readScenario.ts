import { dirname, resolve } from 'node:path';
import { z } from 'zod';
import { parseJsonSpec } from './readSpecs.js';
import { readInputFile } from './readInputFile.js';

/** A scenario file bundles the paths of the inputs, relative to itself (DESIGN.md section 8). */
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
}

const path = (field: string) => z.string({ error: `${field} must be a path (text)` }).min(1, `${field} must not be empty`);

const scenarioSchema = z.strictObject({
  name: z.string().optional(),
  description: z.string().optional(),
  market: path('market').optional(),
  battery: path('battery').optional(),
  history: path('history').optional(),
  forecast: path('forecast').optional(),
  demoDay: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'demoDay must be YYYY-MM-DD').optional(),
});

const FIXES: Readonly<Record<string, string>> = {
  market: 'give the path of market.json relative to the scenario file',
  battery: 'give the path of battery.json relative to the scenario file',
  history: 'give the path of the price history CSV relative to the scenario file',
  forecast: 'give the path of the quantile forecast CSV relative to the scenario file',
  demoDay: 'give a day as YYYY-MM-DD',
};

export function readScenario(file: string): Scenario {
  const spec = parseJsonSpec(readInputFile(file), file, (v) => scenarioSchema.safeParse(v), FIXES);
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
  };
  return scenario;
}
