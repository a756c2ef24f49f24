import type { MarketSpec, PriceHistory, QuantileDay } from '../../types.js';
import { InputError } from '../../errors/inputError.js';
import { ForecastInputError } from '../../forecast/models/errors.js';
import { dayNumberOf } from '../../forecast/models/historyView.js';
import { forecastFileScenarioPaths } from '../../forecast/paths/dependenceTemplate.js';
import { daySeed } from '../../forecast/paths/seededStream.js';
import { readScenarioPaths, type ScenarioPathsFile } from '../../io/readScenarioPaths.js';
import { MIN_DAY_PATHS } from './pathScenarios.js';
import type { ScenarioSettings } from './scenarioSettings.js';

/** The `file` of paths made from the quantile file and the history: what error messages name. */
export const QUANTILE_PATHS_SOURCE = 'quantile file + history';

/** Whole-day paths of a run and a line saying where they came from (plan.json, summary.json, the console). */
export interface RunScenarioPaths {
  readonly paths: ScenarioPathsFile;
  readonly source: string;
}

/**
 * Paths per planned day made from a quantile forecast and the price history (no paths file): for each
 * day D of `days` with a forecast, forecastFileScenarioPaths (the Schaake shuffle of D's quantiles, the
 * dependence from the PIT template of the file's past days, or the history's seasonal naive errors
 * when it has fewer than 28) given only forecast days before D and history days before D: at gate
 * closure, the day before delivery, nothing of D is known. Each day is drawn with daySeed(seed, D), so a
 * day's paths do not depend on the span around it. n per day: three times the planning paths (the
 * planning set, and as many validation and fresh paths), at least MIN_DAY_PATHS.
 */
export function quantileScenarioPaths(request: {
  readonly forecastDays: ReadonlyMap<string, QuantileDay>;
  readonly history: PriceHistory;
  readonly market: MarketSpec;
  readonly days: readonly string[];
  readonly planningPaths: number;
  readonly seed: number;
}): RunScenarioPaths {
  const { forecastDays, history, market, seed } = request;
  const n = quantilePathCount(request.planningPaths);
  const allForecasts = [...forecastDays.values()];
  const days = new Map<string, number[][]>();
  const templates: { template: 'pit' | 'naive-errors'; templateDays: number }[] = [];
  for (const day of [...request.days].sort()) {
    const quantileDay = forecastDays.get(day);
    if (quantileDay === undefined) continue;
    const made = madeOrNoTemplate(day, () =>
      forecastFileScenarioPaths({
        quantileDay,
        pastForecasts: allForecasts.filter((f) => f.day < day),
        history: { ...history, days: history.days.filter((d) => d.day < day) },
        n,
        seed: daySeed(seed, dayNumberOf(day)),
        priceFloor: market.priceFloor,
        priceCap: market.priceCap,
      }),
    );
    days.set(day, made.paths);
    templates.push(made);
  }
  return { paths: { file: QUANTILE_PATHS_SOURCE, days }, source: sourceText(templates, n, seed) };
}

/** The day's paths, or an InputError when nothing before the day gives a template (scenarioPaths refuses an empty one). */
function madeOrNoTemplate<T>(day: string, make: () => T): T {
  try {
    return make();
  } catch (error) {
    if (!(error instanceof ForecastInputError) || error.field !== 'template') throw error;
    throw new InputError([{ file: 'history', field: 'price', message: `no past day to learn the dependence between the periods of ${day} from (no earlier forecast day with its prices, no history day 7 days after another)`, fix: 'give a longer history, or give --paths FILE (quantbid forecast --paths 364 writes one)' }]);
  }
}

/** Paths per day made from a quantile file: a planning set and a validation and a fresh set as large, at least MIN_DAY_PATHS [-]. */
export function quantilePathCount(planningPaths: number): number {
  return Math.max(MIN_DAY_PATHS, 3 * planningPaths);
}

/**
 * The paths of a curve or auto run: the --paths file when given (its days cut to `days`), else made
 * from the quantile forecast and the history (quantileScenarioPaths).
 *
 * @throws InputError without --paths and without a history
 */
export function runScenarioPaths(
  settings: ScenarioSettings,
  run: { readonly market: MarketSpec; readonly history: PriceHistory | null; readonly forecastDays: ReadonlyMap<string, QuantileDay>; readonly days: readonly string[]; readonly policies: readonly string[] },
): RunScenarioPaths {
  if (settings.paths !== undefined) {
    const file = readScenarioPaths(settings.paths, run.market);
    const wanted = new Set(run.days);
    return { paths: { file: file.file, days: new Map([...file.days].filter(([day]) => wanted.has(day))) }, source: `paths file ${settings.paths}` };
  }
  if (run.history === null) throw noPathsProblem(run.policies);
  return quantileScenarioPaths({ forecastDays: run.forecastDays, history: run.history, market: run.market, days: run.days, planningPaths: settings.planningPaths, seed: settings.pathSeed });
}

/** The problem of curve or auto with neither a paths file nor a history: both ways out. */
export function noPathsProblem(policies: readonly string[]): InputError {
  const policyText = policies.length === 1 ? `the ${policies[0]} policy plans` : `${policies.join(' and ')} plan`;
  return new InputError([
    {
      file: 'command line',
      field: '--paths',
      message: `${policyText} on whole-day price paths: none were given and there is no history to make them from the quantile file`,
      fix: 'give --paths FILE (quantbid forecast --paths 364 writes one), or give --history FILE (or a scenario with a history) to make them from the quantile file',
    },
  ]);
}

function sourceText(templates: readonly { template: 'pit' | 'naive-errors'; templateDays: number }[], n: number, seed: number): string {
  const pit = templates.filter((t) => t.template === 'pit');
  const naive = templates.filter((t) => t.template === 'naive-errors');
  const range = (list: typeof templates): string => {
    const sizes = list.map((t) => t.templateDays);
    const low = Math.min(...sizes);
    const high = Math.max(...sizes);
    return low === high ? `${low}` : `${low} to ${high}`;
  };
  const perDays = (list: typeof templates): string => (templates.length === 1 ? '' : ` on ${list.length} days`);
  const parts = [
    ...(pit.length > 0 ? [`the PIT template of ${range(pit)} past days${perDays(pit)}`] : []),
    ...(naive.length > 0 ? [`the seasonal naive errors template of ${range(naive)} past days${perDays(naive)}`] : []),
  ];
  return `${QUANTILE_PATHS_SOURCE}, Schaake shuffle with ${parts.length > 0 ? parts.join(' and ') : 'no template (no day planned)'}, ${n} paths per day, seed ${seed}`;
}
