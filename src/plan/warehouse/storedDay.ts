import type { DayProblem } from '../../types.js';
import type { Window } from './pwl.js';

/**
 * The day problem (docs/day-solver.md) in stored-energy units: the warehouse problem (Cahn 1948;
 * Bellman 1956, "On the theory of dynamic programming - a warehousing problem", Management Sci.
 * 2(3), doi:10.1287/mnsc.2.3.272).
 *
 * Notes: with x_t = eta_c dt c_t [MWh put into the store] and y_t = dt d_t / eta_d [MWh taken out]
 *   s_t = s_{t-1} + x_t - y_t,   0 <= x_t <= X = eta_c dt chargeMw,   0 <= y_t <= Y = dt dischargeMw / eta_d,
 *   value = sum_t (q_t y_t - p_t x_t) + V s_T,   p_t = buy_t / eta_c,   q_t = (sell_t - deg) eta_d,
 *   cycle cap sum_t dt d_t / eta_d = sum_t y_t <= cap (the cap counts energy taken out of the store).
 * p_t is the price of one stored MWh, q_t the net revenue of one stored MWh sold (after wear).
 *
 * Simultaneous flows. Replacing a pair x, y > 0 by its net, (x - y, 0) when x >= y or (0, y - x)
 * otherwise, keeps x - y and hence every s_t, and lowers x and y (power) and sum y (cycle use).
 * The value changes by (p_t - q_t) y resp. (p_t - q_t) x; in grid units these are
 *   dt d (buy / (eta_c eta_d) - sell + deg)   resp.   dt c (buy - (sell - deg) eta_c eta_d),
 * both >= 0 unless q_t > p_t, i.e. (sell_t - deg) eta_c eta_d > buy_t. So outside such
 * "arbitrage periods" any solution can be netted without loss and complementarity never binds;
 * inside them (only possible at negative prices) the relaxation gains by burning energy in losses
 * and complementarity needs an exact treatment (arbitrageBranching.ts, valueProgram.ts).
 *
 * Per period, as a function of the net move w = x - y in [-Y, X], the best value under
 * complementarity is k_t(w) = -p_t w for w >= 0 and -q_t w for w <= 0: concave when p_t >= q_t,
 * convex in an arbitrage period. The convex hull of {(x, 0)} and {(0, y)} is the triangle
 * x / X + y / Y <= 1, over which the best value is the chord of k_t from (-Y, q_t Y) to (X, -p_t X).
 *
 * Step bounds. When s_0 lies in the window, both s_{t-1} and s_t lie in it, so a complementary
 * period moves at most W = socMax - socMin: X and Y are replaced by min(X, W) and min(Y, W).
 * This changes no feasible schedule (a schedule with a simultaneous pair can be netted first), but
 * it lowers the chord and so tightens the relaxation of arbitrage periods.
 */
export interface StoredDay {
  readonly periods: number;
  /** X [MWh]: the most one period can put into the store (after the step bound). */
  readonly chargeStepMwh: number;
  /** Y [MWh]: the most one period can take out of the store (after the step bound). */
  readonly dischargeStepMwh: number;
  /** eta_c dt chargeMw [MWh]: a full-power charge, before the step bound. */
  readonly chargeFullMwh: number;
  /** dt dischargeMw / eta_d [MWh]: a full-power discharge, before the step bound. */
  readonly dischargeFullMwh: number;
  /** p_t [currency/MWh stored] (see toStoredDay for the array's length). */
  readonly chargePrice: Float64Array;
  /** q_t [currency/MWh stored]. */
  readonly dischargePrice: Float64Array;
  /** 1 where q_t > p_t and both flows are possible (complementarity may bind), else 0. */
  readonly arbitrage: Uint8Array;
  readonly arbitrageCount: number;
  readonly socStartMwh: number;
  readonly socMinMwh: number;
  readonly socMaxMwh: number;
  /** [socMin, socMax] with the tolerance within which an edge counts as reached despite rounding [MWh]. */
  readonly window: Window;
  /** max(socMin, socEndMin) [MWh]. */
  readonly socEndFloorMwh: number;
  /** V [currency/MWh]. */
  readonly terminalValuePerMwh: number;
  /** Cap on sum_t y_t [MWh stored]; Infinity without a cycle cap. */
  readonly dischargeCapMwh: number;
  /** sum_t (p_t + q_t): not finite when some price is not (or the sum overflows; see priceGap). */
  readonly priceSum: number;
}

/** Arrays a caller lends toStoredDay to fill instead of allocating (each at least `periods` long). */
export interface StoredDayArrays {
  readonly chargePrice: Float64Array;
  readonly dischargePrice: Float64Array;
  readonly arbitrage: Uint8Array;
}

/**
 * The day in stored units. With `arrays` the price and arbitrage arrays are those (longer than the
 * day when lent by a solver sized for longer days; read them up to `periods`): the solver reuses one
 * set from day to day, as allocating typed arrays costs more than filling them.
 */
export function toStoredDay(problem: DayProblem, arrays?: StoredDayArrays): StoredDay {
  const { battery: b, periodHours: dt } = problem;
  const periods = problem.buyPricePerMwh.length;
  const chargeFullMwh = b.chargeEfficiency * dt * b.chargeMw;
  const dischargeFullMwh = (dt * b.dischargeMw) / b.dischargeEfficiency;
  const inside = problem.socStartMwh >= b.socMinMwh && problem.socStartMwh <= b.socMaxMwh;
  const width = inside ? b.socMaxMwh - b.socMinMwh : Infinity;
  const chargeStepMwh = Math.min(chargeFullMwh, width);
  const dischargeStepMwh = Math.min(dischargeFullMwh, width);
  const chargePrice = arrays?.chargePrice ?? new Float64Array(periods);
  const dischargePrice = arrays?.dischargePrice ?? new Float64Array(periods);
  const arbitrage = arrays?.arbitrage ?? new Uint8Array(periods);
  let arbitrageCount = 0;
  let priceSum = 0;
  const both = chargeStepMwh > 0 && dischargeStepMwh > 0;
  for (let t = 0; t < periods; t++) {
    chargePrice[t] = problem.buyPricePerMwh[t]! / b.chargeEfficiency;
    dischargePrice[t] = (problem.sellPricePerMwh[t]! - b.degradationCostPerMwh) * b.dischargeEfficiency;
    priceSum += chargePrice[t]! + dischargePrice[t]!;
    // Stored and counted without a branch: the first days a solver sees may have no arbitrage period,
    // and a branch first taken later throws the compiled function away.
    const isArbitrage = both && dischargePrice[t]! > chargePrice[t]! ? 1 : 0;
    arbitrage[t] = isArbitrage;
    arbitrageCount += isArbitrage;
  }
  const cap = b.maxFromStoreMwhPerDay;
  const eps = 1e-12 * Math.max(1, Math.abs(b.socMaxMwh), Math.abs(b.socMinMwh), chargeStepMwh, dischargeStepMwh);
  return {
    periods,
    chargeStepMwh,
    dischargeStepMwh,
    chargeFullMwh,
    dischargeFullMwh,
    chargePrice,
    dischargePrice,
    arbitrage,
    arbitrageCount,
    socStartMwh: problem.socStartMwh,
    socMinMwh: b.socMinMwh,
    socMaxMwh: b.socMaxMwh,
    window: { lo: b.socMinMwh, hi: b.socMaxMwh, eps },
    socEndFloorMwh: Math.max(b.socMinMwh, problem.socEndMinMwh),
    terminalValuePerMwh: problem.terminalValuePerMwh ?? 0,
    dischargeCapMwh: cap === undefined ? Infinity : cap,
    priceSum,
  };
}
