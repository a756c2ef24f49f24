import { PERIOD_MODE } from '../periodMode.js';
import type { Kernel } from './pwl.js';
import type { StoredDay } from './storedDay.js';

/**
 * The shape of period t's value k_t(w) of its net move w = x_t - y_t at a multiplier mu on
 * discharged energy, after the period's mode: the one dispatch every stage makes per period.
 *
 *   chargeOnly, dischargeOnly  the mode allows one flow: k_t is one linear piece
 *   concave   both flows allowed and q_t - mu <= p_t: k_t(w) = -p_t w (w >= 0), -(q_t - mu) w (w <= 0)
 *             is concave and equals the sup-convolution of its two pieces (netting loses nothing)
 *   convex    an arbitrage period (storedDay.ts) left free, with q_t - mu > p_t: k_t is the maximum
 *             of its two pieces; one mode is chosen exactly (the dynamic program, the branching) or
 *             the period is relaxed to its chord (the sweep, the chord bounds)
 *
 * The two flow-only shapes share their codes with PERIOD_MODE, so a fixed mode is its own shape.
 */
export const PERIOD_SHAPE = { chargeOnly: PERIOD_MODE.chargeOnly, dischargeOnly: PERIOD_MODE.dischargeOnly, concave: 3, convex: 4 } as const;

export type PeriodShape = (typeof PERIOD_SHAPE)[keyof typeof PERIOD_SHAPE];

const CONVEX = PERIOD_SHAPE.convex;
const CONCAVE = PERIOD_SHAPE.concave;

/** The shape of period t at multiplier mu under `mode` (a PERIOD_MODE value). */
export function periodShape(day: StoredDay, t: number, mu: number, mode: number): PeriodShape {
  if (mode !== PERIOD_MODE.free) return mode as PeriodShape;
  // The prices are compared in every period, not only in arbitrage periods: a comparison first met
  // at the first negative price of a run would stop the optimised callers there (lineSweep.ts).
  const gains = day.dischargePrice[t]! - mu > day.chargePrice[t]!;
  return day.arbitrage[t] === 1 && gains ? CONVEX : CONCAVE;
}

/** The loaded day at a multiplier mu on discharged energy with per-period modes: what one run of a stage solves. */
export interface DayAtMultiplier {
  readonly day: StoredDay;
  readonly mu: number;
  readonly modes: Int8Array;
}

/**
 * Fills `out` with period t's value of its move as a two-piece kernel (pwl.ts) and returns the
 * period's shape. Forward (a state after period t from one before it, move w = s_t - s_{t-1}): the
 * lower piece is the discharge, slope -(q_t - mu) on [-Y, 0], the upper piece the charge, slope
 * -p_t on [0, X]. Backward (a state before period t from one after it, w' = -w): the charge
 * reflected, slope p_t on [-X, 0], then the discharge reflected, slope q_t - mu on [0, Y]. A piece
 * the mode forbids has length 0.
 */
export function periodKernel(run: DayAtMultiplier, t: number, direction: 'forward' | 'backward', out: Kernel): PeriodShape {
  const { day, mu } = run;
  const shape = periodShape(day, t, mu, run.modes[t]!);
  const chargeMwh = shape === PERIOD_SHAPE.dischargeOnly ? 0 : day.chargeStepMwh;
  const dischargeMwh = shape === PERIOD_SHAPE.chargeOnly ? 0 : day.dischargeStepMwh;
  const p = day.chargePrice[t]!;
  const qm = day.dischargePrice[t]! - mu;
  const { lower, upper } = out;
  lower.to = upper.from = 0;
  if (direction === 'backward') {
    lower.from = -chargeMwh;
    lower.slope = p;
    upper.to = dischargeMwh;
    upper.slope = qm;
  } else {
    lower.from = -dischargeMwh;
    lower.slope = -qm;
    upper.to = chargeMwh;
    upper.slope = -p;
  }
  return shape;
}

/** k(w) of a forward kernel: the value of moving w in the period (w in [lower.from, upper.to]). */
export function kernelValue(kernel: Kernel, w: number): number {
  return w >= 0 ? kernel.upper.slope * w : kernel.lower.slope * w;
}
