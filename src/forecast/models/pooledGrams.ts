import type { LinearModel } from '../linalg/linearModel.js';
import type { StandardisedGram } from '../linalg/standardisedGram.js';
import { standardiseCentredSums } from '../linalg/standardisedGram.js';

/**
 * Weighted sums of the centred cross products of several slots' designs (each slot centred at its own
 * means): least squares on them is the fit with one level per slot and slopes shared by the slots, the
 * within (fixed-effects) estimator, here with kernel weights per slot (a varying-coefficient model
 * smoothed in the time of day; Hastie and Tibshirani 1993; Cleveland and Devlin 1988).
 */
export class PooledGrams {
  private readonly grams: Float64Array[];
  private readonly cross: Float64Array[];
  private readonly squares: Float64Array;
  private readonly totals: Float64Array;
  /** Per neighbourhood slot and count index (index W + w): its column means and mean response. */
  private readonly means: Float64Array[];
  private readonly yMeans: Float64Array;
  private readonly scratchGram: Float64Array;
  private readonly scratchCross: Float64Array;

  /**
   * @param k columns of the Grams
   * @param W count indices (nested windows)
   * @param slots most slots in a neighbourhood
   */
  constructor(
    private readonly k: number,
    private readonly W: number,
    slots: number,
  ) {
    this.means = Array.from({ length: slots * W }, () => new Float64Array(k));
    this.yMeans = new Float64Array(slots * W);
    this.grams = Array.from({ length: W }, () => new Float64Array(k * k));
    this.cross = Array.from({ length: W }, () => new Float64Array(k));
    this.squares = new Float64Array(W);
    this.totals = new Float64Array(W);
    this.scratchGram = new Float64Array(k * k);
    this.scratchCross = new Float64Array(k);
  }

  reset(): void {
    for (let w = 0; w < this.W; w++) {
      (this.grams[w] as Float64Array).fill(0);
      (this.cross[w] as Float64Array).fill(0);
    }
    this.squares.fill(0);
    this.totals.fill(0);
  }

  /** Adds `weight` times the centred sums of one slot's Gram at count index w (slot `index` of the neighbourhood). */
  add(gram: StandardisedGram, w: number, weight: number, index: number): void {
    const { k } = this;
    const c = gram.n * weight;
    const g = this.grams[w] as Float64Array;
    const cy = this.cross[w] as Float64Array;
    const { scales, gram: corr, zty } = gram;
    for (let j = 0; j < k; j++) {
      const sj = scales[j] as number;
      if (sj === 0) continue;
      cy[j] = (cy[j] as number) + c * sj * (zty[j] as number);
      for (let l = j; l < k; l++) g[j * k + l] = (g[j * k + l] as number) + c * sj * (scales[l] as number) * (corr[j * k + l] as number);
    }
    this.squares[w] = (this.squares[w] as number) + c * gram.yVariance;
    this.totals[w] = (this.totals[w] as number) + c;
    (this.means[index * this.W + w] as Float64Array).set(gram.means);
    this.yMeans[index * this.W + w] = gram.yMean;
  }

  /** The pooled Gram at count index w, at the means of neighbourhood slot `index`, hinges `thin` left out. */
  gram(w: number, index: number, thin: readonly number[]): StandardisedGram {
    const means = this.means[index * this.W + w] as Float64Array;
    this.scratchGram.set(this.grams[w] as Float64Array);
    this.scratchCross.set(this.cross[w] as Float64Array);
    const out = standardiseCentredSums(this.totals[w] as number, means, this.yMeans[index * this.W + w] as number, this.scratchGram, this.scratchCross, this.squares[w] as number);
    for (const j of thin) out.scales[j] = 0;
    return out;
  }

  /**
   * The model with the shared slopes of `model` and the level of neighbourhood slot `index` at count
   * index w: intercept = its mean response - sum_j b_j (its mean of column j).
   */
  withLevel(model: LinearModel, index: number, w: number): LinearModel {
    const means = this.means[index * this.W + w] as Float64Array;
    let intercept = this.yMeans[index * this.W + w] as number;
    const b = model.coefficients;
    for (let j = 0; j < this.k; j++) intercept -= (b[j] as number) * (means[j] as number);
    return { intercept, coefficients: b };
  }
}
