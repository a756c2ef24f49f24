import { InputError } from '../errors/inputError.js';
import { scenarioOf, type Scenario } from '../io/scenarioOf.js';
import { checkedScenarioFields } from '../io/scenarioCheck.js';
import { oldFieldNote, readCheckedSpec } from '../io/specFile.js';
import type { BatterySpec, MarketSpec } from '../types.js';
import { inputPathsOf, type InputName } from './inputPaths.js';
import type { InputSources } from './settingSchemas.js';

/**
 * The first half of the fast paths of plan and backtest, light enough to load before the rest: the
 * scenario file read and checked by its hand-written check (scenarioCheck.ts, accepting only what its
 * schema accepts), and the run's input paths. The spec files are checked next (checkedSpecFiles.ts),
 * and the run then asks for them by path through checkedReaders.
 */
export interface CheckedInputPaths<N extends InputName, O extends InputName> {
  readonly scenario: Scenario | undefined;
  readonly paths: Record<N, string> & Partial<Record<O, string>>;
}

/** The scenario and the paths of `sources` (inputPathsOf's `names` and `optional`) when the scenario's check accepts it and the paths have no problem; else undefined (the schema path then words it). */
export function checkedInputPaths<N extends InputName, O extends InputName = never>(sources: InputSources, names: readonly N[], optional: readonly O[] = []): CheckedInputPaths<N, O> | undefined {
  let scenario: Scenario | undefined;
  if (sources.scenario !== undefined) {
    const read = readCheckedSpec(sources.scenario, checkedScenarioFields);
    if (read === undefined) return undefined;
    scenario = scenarioOf(read.value, read.text, sources.scenario);
  }
  try {
    return { scenario, paths: inputPathsOf(scenario, sources, names, optional).paths as Record<N, string> & Partial<Record<O, string>> };
  } catch (err) {
    if (err instanceof InputError) return undefined;
    throw err;
  }
}

/** The files a fast path read and checked: the scenario, market.json (with its text, for the note of an old field name) and battery.json. */
export interface CheckedFiles {
  readonly scenario: Scenario | undefined;
  readonly market: { readonly path: string; readonly value: MarketSpec; readonly text: string };
  readonly battery: { readonly path: string; readonly value: BatterySpec };
}

/**
 * Readers of the files `checked` holds, for a run that asks for them by path as the schema readers
 * would be asked: the market's note of an old field name is given when the market is asked for, as
 * readMarketSpec gives it. Asking for another file is a fault of the caller.
 */
export function checkedReaders(checked: CheckedFiles): {
  readonly readScenario: (file: string) => Scenario;
  readonly readMarketSpec: (path: string, note?: (text: string) => void) => MarketSpec;
  readonly readBatterySpec: (path: string) => BatterySpec;
} {
  const { scenario, market, battery } = checked;
  return {
    readScenario: (file) => same(file, scenario?.file, scenario as Scenario),
    readMarketSpec: (path, note) => {
      const said = oldFieldNote(path, same(path, market.path, market.text));
      if (said !== undefined) note?.(said);
      return market.value;
    },
    readBatterySpec: (path) => same(path, battery.path, battery.value),
  };
}

/** What was read for `expected`, asked for as `path`: a run asks for the files the checks read. */
function same<T>(path: string, expected: string | undefined, value: T): T {
  if (path !== expected) throw new Error(`checkedReaders: ${path} was asked for, ${expected ?? 'nothing'} was read`);
  return value;
}
