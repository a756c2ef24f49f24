import type { StandardisedGram } from './standardisedGram.js';

/** A fitted linear model y = intercept + sum_j coefficients[j] x_j, on the original scale of x and y. */
export interface LinearModel {
  readonly intercept: number;
  readonly coefficients: Float64Array;
}

/** intercept + sum_j coefficients[j] row[j]. */
export function predictLinear(model: LinearModel, row: ArrayLike<number>): number {
  let s = model.intercept;
  const b = model.coefficients;
  for (let j = 0; j < b.length; j++) s += (b[j] as number) * (row[j] as number);
  return s;
}

/**
 * Maps coefficients beta of the standardised columns z_j = (x_j - m_j) / s_j back to the original
 * scale: b_j = beta_j / s_j (0 for a constant column), intercept = ybar - sum_j b_j m_j. The coefficients
 * are written into `coefficients` (at least gram.k long; a fresh array unless given).
 */
export function fromStandardised(gram: StandardisedGram, beta: ArrayLike<number>, coefficients: Float64Array = new Float64Array(gram.k)): LinearModel {
  return { intercept: originalScale(gram, beta, coefficients), coefficients };
}

/**
 * predictLinear(fromStandardised(gram, beta), row), the same number, with the coefficients written
 * into `scratch` (at least gram.k long) instead of a new model.
 */
export function predictStandardised(gram: StandardisedGram, beta: ArrayLike<number>, row: ArrayLike<number>, scratch: Float64Array): number {
  let s = originalScale(gram, beta, scratch);
  for (let j = 0; j < gram.k; j++) s += (scratch[j] as number) * (row[j] as number);
  return s;
}

/** The coefficients b_j of fromStandardised into `coefficients`; returns the intercept. */
function originalScale(gram: StandardisedGram, beta: ArrayLike<number>, coefficients: Float64Array): number {
  let intercept = gram.yMean;
  for (let j = 0; j < gram.k; j++) {
    const s = gram.scales[j] as number;
    const b = s === 0 ? 0 : (beta[j] as number) / s;
    coefficients[j] = b;
    intercept -= b * (gram.means[j] as number);
  }
  return intercept;
}
