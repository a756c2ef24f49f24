import { ArgumentError } from '../stats/argumentError.js';
import { requireFiniteArray } from '../stats/validate.js';
import { bisectRoot } from './bisectRoot.js';
import { npv } from './npv.js';

/** Where IRR looks for a root of NPV(r): the grid minRate, minRate + step, ..., up to maxRate. */
export interface IrrOptions {
  /** Lowest rate scanned [-], > -1. Default -0.99. */
  readonly minRate: number;
  /** Highest rate scanned [-]. Default 10 (1000%). */
  readonly maxRate: number;
  /** Grid step [-], > 0. Default 0.01. */
  readonly step: number;
}

export const DEFAULT_IRR_OPTIONS: IrrOptions = Object.freeze({ minRate: -0.99, maxRate: 10, step: 0.01 });

/** IRR outcome: a status union, never NaN. */
export type IrrResult =
  | {
      readonly status: 'found';
      /** The root closest to 0 [-] (the only one for a conventional project). */
      readonly rate: number;
      /** Every root found on the scanned range, ascending [-]; more than one for non-conventional flows. */
      readonly rates: readonly number[];
    }
  | { readonly status: 'none'; readonly reason: string };

/**
 * Internal rate of return: a rate r with NPV(r) = 0 (npv's convention: CF_0 at t = 0, undiscounted).
 *
 * Notes: NPV(r) = sum_t CF_t (1 + r)^-t is continuous on r > -1. It is evaluated on the grid
 * r_i = minRate + i * step up to maxRate; each grid interval over which NPV changes sign (or a grid
 * point where it is exactly 0) gives one root, refined by bisection to double precision. Flows that
 * never change sign have no root ('none'), nor do flows whose NPV keeps one sign over the range.
 * Two roots closer together than one step are not seen (NPV has the same sign at both ends).
 *
 * @param cashFlows CF_0..CF_N [currency], finite, at least two
 * @param options scanned range, merged over DEFAULT_IRR_OPTIONS
 * @example
 * irr([-100, 39, 59, 55, 20]); // { status: 'found', rate: 0.2809484211599611, rates: [0.2809484211599611] }
 * irr([100, 10]);              // { status: 'none', reason: 'the cash flows never change sign ...' }
 *
 * Reference: R. A. Brealey, S. C. Myers and F. Allen, Principles of Corporate Finance (any
 * recent edition), the internal rate of return rule and its pitfalls (multiple rates).
 */
export function irr(cashFlows: readonly number[], options: Partial<IrrOptions> = {}): IrrResult {
  requireFiniteArray('cashFlows', cashFlows, 2);
  const { minRate, maxRate, step } = { ...DEFAULT_IRR_OPTIONS, ...options };
  if (!(minRate > -1 && Number.isFinite(minRate))) throw new ArgumentError('options.minRate', 'a finite rate > -1', minRate);
  if (!(maxRate > minRate && Number.isFinite(maxRate))) throw new ArgumentError('options.maxRate', `a finite rate > minRate = ${minRate}`, maxRate);
  if (!(step > 0 && Number.isFinite(step))) throw new ArgumentError('options.step', 'a finite number > 0', step);

  if (!cashFlows.some((c) => c > 0) || !cashFlows.some((c) => c < 0)) {
    return { status: 'none', reason: 'the cash flows never change sign, so NPV has no root' };
  }
  const f = (r: number): number => npv(r, cashFlows);
  const points = Math.floor((maxRate - minRate) / step + 1e-9);
  const rates: number[] = [];
  let previousRate = minRate;
  let previousValue = f(minRate);
  if (previousValue === 0) rates.push(minRate);
  for (let i = 1; i <= points + 1; i++) {
    const rate = i > points ? maxRate : minRate + i * step;
    if (rate <= previousRate) break;
    const value = f(rate);
    if (Number.isFinite(value) && Number.isFinite(previousValue)) {
      if (value === 0) rates.push(rate);
      else if (previousValue !== 0 && Math.sign(value) !== Math.sign(previousValue)) {
        rates.push(bisectRoot(f, previousRate, rate));
      }
    }
    previousRate = rate;
    previousValue = value;
  }
  if (rates.length === 0) {
    return { status: 'none', reason: `NPV does not change sign for rates from ${minRate} to ${maxRate}` };
  }
  const rate = rates.reduce((best, r) => (Math.abs(r) < Math.abs(best) ? r : best));
  return { status: 'found', rate, rates };
}
