import { dirname, resolve } from 'node:path';
import { lineOfJsonPath } from './jsonProblems.js';

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

/** A scenario file's fields as its schema returns them (readScenario.ts). */
export interface ScenarioFields {
  readonly name?: string | undefined;
  readonly description?: string | undefined;
  readonly market?: string | undefined;
  readonly battery?: string | undefined;
  readonly history?: string | undefined;
  readonly forecast?: string | undefined;
  readonly demoDay?: string | undefined;
}

const ENTRIES = ['market', 'battery', 'history', 'forecast'] as const;

/** The scenario of checked fields read from `text` of `file`: paths made absolute from the file's folder, each entry's line. */
export function scenarioOf(spec: ScenarioFields, text: string, file: string): Scenario {
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
