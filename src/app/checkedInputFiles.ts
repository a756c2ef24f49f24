import { checkedBatterySpec } from '../battery/batterySpecCheck.js';
import { InputError } from '../errors/inputError.js';
import { scenarioOf, type Scenario } from '../io/scenarioOf.js';
import { checkedScenarioFields } from '../io/scenarioCheck.js';
import { oldFieldNote, readCheckedSpec } from '../io/specFile.js';
import { checkedMarketSpec } from '../market/marketSpecCheck.js';
import type { BatterySpec, MarketSpec } from '../types.js';
import { inputPathsOf, type InputName } from './inputPaths.js';
import type { InputSources } from './settingSchemas.js';

/**
 * The scenario file and the two spec files of a run, read and checked by the hand-written checks that
 * accept only what their schemas accept and return what the schemas return (scenarioCheck.ts,
 * marketSpecCheck.ts, batterySpecCheck.ts), for the fast paths of plan and backtest: undefined when a
 * check leaves a file to its schema, or the paths have a problem (the schema path then words it).
 */
export interface CheckedInputFiles<N extends InputName, O extends InputName> {
  readonly scenario: Scenario | undefined;
  readonly paths: Record<N, string> & Partial<Record<O, string>>;
  readonly market: { readonly path: string; readonly value: MarketSpec; readonly text: string };
  readonly battery: { readonly path: string; readonly value: BatterySpec };
}

/** The files of `sources` (inputPathsOf's `names`, which hold market and battery, and `optional`) when every check accepts them; else undefined. */
export function checkedInputFiles<N extends InputName, O extends InputName = never>(sources: InputSources, names: readonly N[], optional: readonly O[] = []): CheckedInputFiles<N, O> | undefined {
  let scenario: Scenario | undefined;
  if (sources.scenario !== undefined) {
    const read = readCheckedSpec(sources.scenario, checkedScenarioFields);
    if (read === undefined) return undefined;
    scenario = scenarioOf(read.value, read.text, sources.scenario);
  }
  let paths;
  try {
    paths = inputPathsOf(scenario, sources, names, optional).paths as Record<N, string> & Partial<Record<O, string>>;
  } catch (err) {
    if (err instanceof InputError) return undefined;
    throw err;
  }
  const specs = paths as Partial<Record<InputName, string>>;
  if (specs.market === undefined || specs.battery === undefined) throw new Error('checkedInputFiles: the names must hold market and battery');
  const market = readCheckedSpec(specs.market, checkedMarketSpec);
  const battery = readCheckedSpec(specs.battery, checkedBatterySpec);
  if (market === undefined || battery === undefined) return undefined;
  return { scenario, paths, market: { path: specs.market, ...market }, battery: { path: specs.battery, value: battery.value } };
}

/**
 * Readers of the files `checked` holds, for a run that asks for them by path as the schema readers
 * would be asked: the market's note of an old field name is given when the market is asked for, as
 * readMarketSpec gives it. Asking for another file is a fault of the caller.
 */
export function checkedReaders(checked: Pick<CheckedInputFiles<InputName, InputName>, 'scenario' | 'market' | 'battery'>): {
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
