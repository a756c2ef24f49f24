import { coveredDays } from '../backtest/coveredDays.js';
import { InputError, throwIfProblems, type InputProblem } from '../errors/inputError.js';
import { readBacktestInputsOnce, type BacktestInputData, type BacktestInputPaths, type MakeForecast } from '../io/readBacktestInputs.js';
import type { InputName } from './inputOptions.js';

export const GRID_INPUTS: readonly InputName[] = Object.freeze(['market', 'battery', 'forecast', 'history']);

/** Which forecast levels a grid reads: the alphas of the alpha policies and the median of the others. */
export interface LevelUse {
  /** Alphas the quantile and median policies run at, and the option they came from. */
  readonly alphas: readonly number[];
  readonly option: string;
  readonly policies: readonly string[];
}

/**
 * Reads and checks a grid command's inputs before any setting runs (in this thread, remembered for a
 * one-thread run): every file problem, alphas whose levels alpha or 1 - alpha lie outside the
 * forecast's levels (a quantile is never extrapolated), and a span without a covered day. With
 * `model` (--model) the forecast is made from the market and history instead of read.
 */
export function readGridInputs(paths: BacktestInputPaths, from: string, to: string, use: LevelUse, model?: { readonly levels: readonly number[]; readonly label: string; readonly make: MakeForecast }): BacktestInputData {
  // With --model the levels are known before the forecasts are made: a bad alpha fails before any fitting.
  if (model !== undefined) throwIfProblems(levelProblems(model.levels, model.label, use));
  const data = readBacktestInputsOnce(paths, model?.make);
  throwIfProblems(levelProblems(data.forecast.levels, data.forecast.file, use));
  if (coveredDays(data.history, data.forecast, from, to).length === 0) {
    throw new InputError([
      { file: paths.history, field: '--from', message: `no day from ${from} to ${to} has both a complete history and a complete forecast`, fix: 'choose days that both files cover' },
    ]);
  }
  return data;
}

function levelProblems(levels: readonly number[], file: string, use: LevelUse): InputProblem[] {
  const lowest = levels[0] ?? Number.NaN;
  const highest = levels[levels.length - 1] ?? Number.NaN;
  const outside = (level: number): boolean => !(level >= lowest - 1e-9 && level <= highest + 1e-9);
  const problems: InputProblem[] = [];
  const range = `[${lowest}, ${highest}]`;
  if (use.policies.some((p) => p === 'quantile' || p === 'median')) {
    const bad = use.alphas.filter((alpha) => outside(alpha) || outside(1 - alpha));
    if (bad.length > 0) {
      problems.push({ file, field: use.option, message: `alpha ${bad.join(', ')}: alpha or 1 - alpha lies outside the forecast's levels ${range}`, fix: `give alphas with alpha and 1 - alpha inside ${range}, or a forecast with those levels` });
    }
  }
  if (use.policies.some((p) => p === 'median' || p === 'point' || p === 'price-taking') && outside(0.5)) {
    problems.push({ file, field: '--policy', message: `the median (level 0.5) lies outside the forecast's levels ${range}`, fix: 'give a forecast with the level 0.5 inside its levels, or only the quantile policy' });
  }
  return problems;
}
