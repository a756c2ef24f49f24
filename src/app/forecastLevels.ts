import type { InputProblem } from '../errors/inputError.js';
import { readsAlpha, readsMedian, type BacktestPolicy } from '../backtest/backtestPolicy.js';
import { upperLevel } from '../plan/alpha.js';

/** Which forecast levels a run reads: the policies it runs, the alphas it runs them at, and the options they came from. */
export interface LevelUse {
  readonly policies: readonly BacktestPolicy[];
  readonly alphas: readonly number[];
  /** The option of the alphas, e.g. `--alpha` or `--alphas`, and of the policies, e.g. `--policy`. */
  readonly alphaOption: string;
  readonly policyOption: string;
}

/** Levels closer than this are one level (a level read from a header may differ from 1 - alpha by an ulp). */
const SAME_LEVEL = 1e-9;

/**
 * The one check that a run reads only levels within the forecast's (a quantile is never
 * extrapolated, docs/design.md section 4), for every command: each alpha whose alpha or 1 - alpha a
 * policy reads and that lies outside the levels, and the median where a policy reads it. `file` is
 * the forecast's name in messages (its path, or `--model NAME`).
 */
export function forecastLevelProblems(levels: readonly number[], file: string, use: LevelUse): InputProblem[] {
  const lowest = levels[0] ?? Number.NaN;
  const highest = levels[levels.length - 1] ?? Number.NaN;
  const outside = (level: number): boolean => !(level >= lowest - SAME_LEVEL && level <= highest + SAME_LEVEL);
  const range = `[${lowest}, ${highest}]`;
  const problems: InputProblem[] = [];
  const badAlphas = !use.policies.some(readsAlpha) ? [] : use.alphas.filter((alpha) => outside(alpha) || outside(upperLevel(alpha)));
  if (badAlphas.length > 0) {
    problems.push({
      file,
      field: use.alphaOption,
      message: `${badAlphas.map((alpha) => `alpha ${alpha} needs the levels ${alpha} and ${upperLevel(alpha)}`).join(', ')}, outside the forecast's levels ${range}`,
      fix: `choose ${use.alphaOption} so that alpha and 1 - alpha lie within ${range}`,
    });
  }
  if (use.policies.some(readsMedian) && outside(0.5)) {
    problems.push({ file, field: use.policyOption, message: `the median (level 0.5) lies outside the forecast's levels ${range}`, fix: 'give a forecast with the level 0.5 inside its levels, or only the quantile policy' });
  }
  return problems;
}
