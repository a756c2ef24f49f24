import type { DayProblem } from '../../types.js';

/**
 * Whether the warehouse solver covers a day problem: null when it does, else the reason (the caller
 * then uses the general LP path). Covered: at least one period, equal-length finite price series,
 * dt > 0, efficiencies > 0, power limits >= 0, finite state-of-charge values, finite wear cost and
 * terminal value, no cycle cap or a finite cap >= 0. An empty window or an unreachable floor is
 * covered: the solver answers `infeasible` with the reason.
 */
export function uncoveredReason(problem: DayProblem): string | null {
  return scalarGap(problem) ?? priceGap(problem);
}

/** uncoveredReason without the per-period price check (solveWarehouseDay checks the prices as it converts them). */
export function scalarGap(problem: DayProblem): string | null {
  const b = problem.battery;
  const periods = problem.buyPricePerMwh.length;
  if (periods === 0) return 'the day has no delivery periods';
  if (problem.sellPricePerMwh.length !== periods) return 'buy and sell price series differ in length';
  if (!(problem.periodHours > 0 && Number.isFinite(problem.periodHours))) return 'the period length must be a positive number of hours';
  if (!(b.chargeEfficiency > 0 && Number.isFinite(b.chargeEfficiency) && b.dischargeEfficiency > 0 && Number.isFinite(b.dischargeEfficiency))) {
    return 'efficiencies must be positive numbers';
  }
  if (!(b.chargeMw >= 0 && Number.isFinite(b.chargeMw) && b.dischargeMw >= 0 && Number.isFinite(b.dischargeMw))) return 'power limits must be finite and >= 0';
  const finite =
    Number.isFinite(b.socMinMwh) &&
    Number.isFinite(b.socMaxMwh) &&
    Number.isFinite(problem.socStartMwh) &&
    Number.isFinite(problem.socEndMinMwh) &&
    Number.isFinite(b.degradationCostPerMwh) &&
    Number.isFinite(problem.terminalValuePerMwh ?? 0);
  if (!finite) return 'a state of charge, the wear cost or the terminal value is not a finite number';
  const cap = b.maxFromStoreMwhPerDay;
  if (cap !== undefined && !(cap >= 0 && Number.isFinite(cap))) return 'the cycle cap must be finite and >= 0';
  return null;
}

/** The first period whose buy or sell price is not a finite number, as a reason; null when all are. */
export function priceGap(problem: DayProblem): string | null {
  for (let t = 0; t < problem.buyPricePerMwh.length; t++) {
    if (!Number.isFinite(problem.buyPricePerMwh[t]) || !Number.isFinite(problem.sellPricePerMwh[t])) return `the price of period ${t} is not a finite number`;
  }
  return null;
}

/** True when solveWarehouseDay covers the problem (see uncoveredReason). */
export function coversDay(problem: DayProblem): boolean {
  return uncoveredReason(problem) === null;
}
