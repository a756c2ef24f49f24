import type { RobustScale } from '../models/robustAsinh.js';
import { fromAsinhScale, robustScale, toAsinhScale } from '../models/robustAsinh.js';

/** A monotone increasing map of prices onto the scale on which forecast errors are measured, and back. */
export interface ErrorScale {
  readonly name: 'price' | 'asinh';
  /** Price [currency/MWh] -> scale value. */
  to(price: number): number;
  /** Scale value -> price [currency/MWh]. */
  from(value: number): number;
  /** The a and b of an asinh scale (robustAsinh.ts). */
  readonly robust?: RobustScale;
}

/** Errors in currency/MWh: e = P - P_hat. */
export const PRICE_SCALE: ErrorScale = Object.freeze({ name: 'price', to: (p: number) => p, from: (z: number) => z });

/**
 * Errors on the variance-stabilised scale of the ARX models: e = Z(P) - Z(P_hat) with
 * Z(p) = asinh((p - a) / b), a and b the median and normalised MAD of `prices` (robustAsinh.ts), and
 * quantiles mapped back by P = a + b sinh(Z(P_hat) + e).
 *
 * Notes: on this scale an error of a given size means a larger price move where prices are far from
 * their median, so the intervals widen with the price level and in spiky seasons and turn asymmetric
 * on the price scale, as price errors do; because Z is increasing, the tau-quantile of Z(P) maps to
 * the tau-quantile of P, and conformal coverage on the Z scale is coverage on the price scale.
 *
 * Reference: B. Uniejewski, R. Weron and F. Ziel (2018), Variance stabilizing transformations for
 * electricity spot price forecasting, IEEE Trans. Power Syst. 33(2), 2219-2229,
 * doi:10.1109/TPWRS.2017.2734563.
 *
 * @param prices the realised prices the scale is fitted on (the calibration days'), at least one
 */
export function asinhErrorScale(prices: ArrayLike<number>): ErrorScale {
  return asinhErrorScaleOf(robustScale(prices));
}

/** {@link asinhErrorScale} with a and b given (robustScale of the calibration prices, computed by the caller). */
export function asinhErrorScaleOf(scale: RobustScale): ErrorScale {
  return { name: 'asinh', to: (p) => toAsinhScale(p, scale), from: (z) => fromAsinhScale(z, scale), robust: scale };
}
