import type { QuantileDay } from '../../types.js';
import { ForecastInputError } from '../models/errors.js';
import { slotLayout } from '../models/slotGrid.js';
import { quantileAt } from './quantileFunction.js';
import { SeededStream } from './seededStream.js';

/** What {@link scenarioPaths} needs. */
export interface ScenarioPathsRequest {
  /** The delivery day's quantile forecast: its periods, levels and prices (any levels in (0, 1)). */
  readonly quantileDay: QuantileDay;
  /**
   * The dependence template: past whole-day vectors on the clock-slot grid (slotGrid.ts), one per past
   * day, e.g. a model's out-of-sample errors or the probability integral transforms of a vendor's past
   * forecasts (see dependenceTemplate.ts). Only their ranks across the days are used. At least one.
   */
  readonly template: readonly ArrayLike<number>[];
  /** Number of paths n [-], >= 1. */
  readonly n: number;
  /** Seed of the choice of template days and of the tie-breaks. */
  readonly seed: number;
  /** The market's price floor and cap [currency/MWh]: path prices stay within them. Default none. */
  readonly priceFloor?: number;
  readonly priceCap?: number;
}

/**
 * Whole-day price paths with the forecast's marginals and the template's dependence between the
 * periods of a day: the Schaake shuffle (Clark et al. 2004), the empirical copula reordering of
 * equidistant quantiles of ensemble copula coupling (Schefzik, Thorarinsdottir and Gneiting 2013).
 *
 * Method, for one delivery day with periods t and n paths:
 * 1. Marginal samples: in every period the n quantiles x_t(r) = Q_t((r + 1/2) / n), r = 0..n-1, of the
 *    period's quantile function (linear between the forecast's levels, linear beyond the outermost
 *    ones, within [floor, cap]; quantileFunction.ts).
 * 2. Template: n past days of the template, drawn without replacement with the seed (when n exceeds
 *    the template's m days, every day is used floor(n / m) times and n mod m days once more).
 * 3. Reordering: in every period, rank the n template days by their value in the period's clock slot
 *    (ties, e.g. a day used twice, broken by one seeded order shared by all periods); path j takes the
 *    sample whose rank equals its template day's rank: x_t(rank_t(j)).
 * So path j is high where its template day's error was high: the paths keep the rank dependence of
 * the template across the periods of a day (the 18:00 error moves with the 19:00 one), while each
 * period's n values are exactly the forecast's quantiles. The periods of a repeated clock hour (a
 * 25-hour day) share a slot and so a rank; the skipped slots of a 23-hour day are not used.
 *
 * References: M. Clark, S. Gangopadhyay, L. Hay, B. Rajagopalan and R. Wilby (2004), The Schaake
 * shuffle: a method for reconstructing space-time variability in forecasted precipitation and
 * temperature fields, J. Hydrometeorol. 5(1), 243-262, doi:10.1175/1525-7541(2004)005<0243:TSSAMF>2.0.CO;2;
 * R. Schefzik, T. L. Thorarinsdottir and T. Gneiting (2013), Uncertainty quantification in complex
 * simulation models using ensemble copula coupling, Statist. Sci. 28(4), 616-640, doi:10.1214/13-STS443.
 *
 * @returns paths[j][t] [currency/MWh], n paths over the day's periods
 * @throws ForecastInputError for n < 1, an empty template, or a template vector shorter than the slot grid
 */
export function scenarioPaths(request: ScenarioPathsRequest): number[][] {
  const { quantileDay, template, n, seed } = request;
  if (!Number.isInteger(n) || n < 1) throw new ForecastInputError('n', `${n} is not a whole number of paths >= 1`, 'ask for at least one path');
  const m = template.length;
  if (m === 0) throw new ForecastInputError('template', 'no past day to take the dependence from', 'give at least one past whole-day vector');
  const layout = slotLayout(quantileDay.periods, 'quantileDay.periods');
  template.forEach((row, d) => {
    if (row.length < layout.slotsPerDay) {
      throw new ForecastInputError(`template[${d}]`, `${row.length} values for ${layout.slotsPerDay} clock slots`, 'give one value per clock slot of the day');
    }
  });
  const stream = new SeededStream(seed);
  const days = templateDays(m, n, stream);
  const tieBreak = stream.permutation(n);
  const floor = request.priceFloor ?? -Infinity;
  const cap = request.priceCap ?? Infinity;
  const T = quantileDay.periods.length;
  const paths = Array.from({ length: n }, () => new Array<number>(T));
  const order = Int32Array.from({ length: n }, (_, j) => j);
  const values = new Float64Array(n);
  const samples = new Float64Array(n);
  const rankedSlots = new Map<number, Int32Array>();
  for (let t = 0; t < T; t++) {
    const s = layout.slots[t] as number;
    let ranked = rankedSlots.get(s);
    if (ranked === undefined) {
      for (let j = 0; j < n; j++) values[j] = (template[days[j] as number] as ArrayLike<number>)[s] as number;
      ranked = Int32Array.from(order).sort((p, q) => (values[p] as number) - (values[q] as number) || (tieBreak[p] as number) - (tieBreak[q] as number));
      rankedSlots.set(s, ranked);
    }
    const levels = quantileDay.levels;
    const prices = quantileDay.prices[t] as readonly number[];
    for (let r = 0; r < n; r++) samples[r] = quantileAt(levels, prices, (r + 0.5) / n, floor, cap);
    // ranked[r] is the path whose template value has rank r: it takes the r-th smallest sample.
    for (let r = 0; r < n; r++) (paths[ranked[r] as number] as number[])[t] = samples[r] as number;
  }
  return paths;
}

/** The template day of each path: a seeded draw without replacement, cycling when n > m. */
function templateDays(m: number, n: number, stream: SeededStream): Int32Array {
  const out = new Int32Array(n);
  let filled = 0;
  while (filled < n) {
    const shuffled = stream.permutation(m);
    for (let i = 0; i < m && filled < n; i++) out[filled++] = shuffled[i] as number;
  }
  return out;
}
