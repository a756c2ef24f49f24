import { SeededStream } from '../paths/seededStream.js';
import { energyScore } from './energyScore.js';
import { variogramScore } from './variogramScore.js';

/** One scored delivery day of whole-day paths: paths[j][t] and the realised price of each period t. */
export interface ScoredPathDay {
  readonly day: string;
  readonly paths: readonly (readonly number[])[];
  readonly realised: readonly number[];
}

/** Mean scores of paths over days. */
export interface PathScores {
  /** Days scored [-]. */
  readonly days: number;
  /** Mean energy score over the days [currency/MWh] (energyScore.ts). */
  readonly energyScore: number;
  /** Mean variogram score of order 0.5 over the days [(currency/MWh)^1] (variogramScore.ts). */
  readonly variogramScore: number;
  /**
   * The same two scores of the same paths with each period's values shuffled across the paths
   * independently (seeded): the same marginals without the dependence between periods. Scores above
   * the paths' own mean the paths' dependence helps.
   */
  readonly periodsIndependent: { readonly energyScore: number; readonly variogramScore: number };
}

/**
 * Energy score (Gneiting and Raftery 2007) and variogram score of order 0.5 (Scheuerer and Hamill
 * 2015) of whole-day paths, averaged over the days, beside the same scores of the paths with their
 * periods made independent (each period's values permuted across the paths with a seeded stream), so a
 * reader can tell whether the paths' joint behaviour, not only their marginals, is right.
 *
 * @param days at least one day, each with at least one path as long as its realised prices
 * @param seed seed of the independent shuffle
 */
export function scorePaths(days: readonly ScoredPathDay[], seed = 1): PathScores {
  const stream = new SeededStream(seed);
  let es = 0;
  let vs = 0;
  let esIndependent = 0;
  let vsIndependent = 0;
  for (const day of days) {
    es += energyScore(day.paths, day.realised);
    vs += variogramScore(day.paths, day.realised);
    const n = day.paths.length;
    const shuffled = day.paths.map((path) => [...path]);
    for (let t = 0; t < day.realised.length; t++) {
      const order = stream.permutation(n);
      for (let j = 0; j < n; j++) (shuffled[j] as number[])[t] = (day.paths[order[j] as number] as readonly number[])[t] as number;
    }
    esIndependent += energyScore(shuffled, day.realised);
    vsIndependent += variogramScore(shuffled, day.realised);
  }
  const count = days.length;
  return {
    days: count,
    energyScore: es / count,
    variogramScore: vs / count,
    periodsIndependent: { energyScore: esIndependent / count, variogramScore: vsIndependent / count },
  };
}
