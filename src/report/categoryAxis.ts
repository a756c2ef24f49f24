import type { BandAxis, BandTick, Quantity } from './chartTypes.js';

/**
 * Axis of named categories, one band each (days of a backtest, energy or power settings of a
 * sweep). Candidate tick sets label every 1st, 2nd, 5th, 10th, 20th ... band (1-2-5 ladder) from
 * the first; the chart shows the densest set whose labels fit.
 */
export function categoryAxis(labels: readonly string[], title: Quantity): BandAxis {
  const tickSets: BandTick[][] = [];
  for (let k = 0; ; k++) {
    const step = ([1, 2, 5][k % 3] as number) * 10 ** Math.floor(k / 3);
    tickSets.push(labels.flatMap((label, i) => (i % step === 0 ? [{ at: i + 0.5, label }] : [])));
    if (step >= labels.length) break;
  }
  return { kind: 'band', title, bandLabels: [...labels], tickSets };
}
