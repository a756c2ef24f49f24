import type { BatteryModel } from '../types.js';
import type { ScenarioSet } from '../scenarios/scenarioSet.js';
import { RowBuilder, type LpOutcome, type SparseLpSolver } from './linearProgram.js';
import type { PeriodPricePoints } from './pricePoints.js';

export interface CurveProgramRequest {
  /** The planning paths (their clearing prices; the program delivers every cleared quantity on them). */
  readonly scenarios: ScenarioSet;
  /** Breakpoints, sellable steps and each planning path's step, per period (curvePricePoints). */
  readonly points: readonly PeriodPricePoints[];
  readonly battery: BatteryModel;
  /** Period length dt [h]. */
  readonly periodHours: number;
  /** State of charge at the start of the day [MWh]. */
  readonly socStartMwh: number;
  /** Least state of charge at the end of the day on every planning path [MWh]. */
  readonly socEndMinMwh: number;
  /** lambda >= 0: the objective is mean profit + lambda x CVaR (the mean of the worst cvarShare of paths). */
  readonly riskWeight: number;
  /** beta in (0, 1], e.g. 0.05. */
  readonly cvarShare: number;
  readonly solver: SparseLpSolver;
  /** Most solves before giving up [-]. Default 100 (for each penalty). */
  readonly maxRounds?: number;
  /**
   * A proximal term towards fixed stored energies f_t (the flat bids'): the objective less
   * rho sum_{t,k} (n_{t,k} / S) |e_{t,k} - f_t| (n_{t,k}: planning paths in step k), solved for each
   * rho in turn, from the last basis. Without it the program is solved once, as written.
   */
  readonly proximal?: { readonly towardsStoredMwh: ArrayLike<number>; readonly penaltiesPerMwh: readonly number[] };
}

/** One solution of the program: the curves' stored energy per period and step, and the optimum. */
export interface CurveSolution {
  /** rho of the proximal term [currency/MWh] (0 without one). */
  readonly penaltyPerMwh: number;
  /** Net change of stored energy e_{t,k} in each period t and step k [MWh], non-increasing in k. */
  readonly storedMwh: readonly Float64Array[];
  /** Optimal objective: mean planned profit + lambda x CVaR over the planning paths, less the proximal term [currency]. */
  readonly objective: number;
}

export type CurveProgramOutcome =
  | {
      readonly status: 'optimal';
      /** Net change of stored energy e_{t,k} in each period t and step k [MWh], non-increasing in k. */
      readonly storedMwh: readonly Float64Array[];
      /** Optimal objective: mean planned profit + lambda x CVaR over the planning paths [currency]. */
      readonly objective: number;
      /** Solves, and rows added lazily (state of charge and cycle cap) [-]. */
      readonly rounds: number;
      readonly lazyRows: number;
      /** The solution at each penalty of the proximal term, in its order (one, at 0, without it); the first is storedMwh. */
      readonly family: readonly CurveSolution[];
    }
  | { readonly status: 'infeasible' | 'unbounded' | 'failed'; readonly reason: string };

/**
 * The two-stage stochastic program of a day of step curves (docs/design.md section 4.7): the curves
 * first, then on each planning path w the battery delivers what clears, within every limit.
 *
 * Stored-energy units. In period t and step k the curve changes the stored energy by
 * e_{t,k} = ep_{t,k} - em_{t,k} [MWh] (ep put in, em taken out, both >= 0). The net quantity sold at the
 * grid, y = -e / (eta_c dt) for e >= 0 and -e eta_d / dt for e < 0, is a decreasing map of e, so a curve
 * whose net sale rises with the price is e non-increasing in k. Path w falls in step j(w,t) in period t
 * (pricePoints.ts), so its state of charge
 *
 *   s_{w,t} = s_0 + sum_{tau <= t} e_{tau, j(w,tau)}
 *
 * is linear in the decisions, and so are every limit and the profit
 *
 *   P_w = sum_t [ -pi_{w,t} ep_{t,j} / eta_c + (pi_{w,t} - deg) eta_d em_{t,j} ]:
 *
 *   maximise (1/S) sum_w P_w + lambda ( eta - (1 / (beta S)) sum_w z_w )
 *   z_w >= eta - P_w, z_w >= 0                            (CVaR by Rockafellar and Uryasev 2000)
 *   e_{t,k+1} <= e_{t,k}                                   (monotone curves)
 *   0 <= ep <= eta_c chargeMw dt,  0 <= em <= dischargeMw dt / eta_d  (power limits)
 *   em_{t,k} = 0 in a step holding a negative planning price
 *   socMin <= s_{w,t} <= socMax,  s_{w,T} >= socEnd         (every path, every period)
 *   sum_t em_{t,j(w,t)} <= maxFromStoreMwhPerDay             (cycle cap out of the store, every path)
 *
 * Why it is exact: on a path with pi >= 0, raising ep and em together never pays (it buys
 * 1/eta_c >= eta_d MWh for every MWh it sells), so an optimum nets them, with the same states of charge
 * and a profit at least as high; in steps holding a negative price em is 0. So no schedule with
 * simultaneous charge and discharge is ever taken, and the program equals the extensive form in
 * grid units with a binary per path and period against simultaneous flows (test/curves, against HiGHS
 * as a MIP). The one-sided rule em = 0 where planning prices are negative is the one restriction.
 *
 * With a proximal term (request.proximal) the objective also subtracts rho sum_{t,k} (n_{t,k}/S) u_{t,k},
 * u_{t,k} >= |e_{t,k} - f_t| (two rows each): the curves are pulled towards the flat bids' stored
 * energies f_t, as much as the paths that fall in each step; rho = 0 is the program above, rho large
 * the flat bids. The netting argument holds as it stands (netting ep and em keeps e, hence u). The
 * program is solved for each rho of the list in turn, keeping every lazy row and the last basis.
 *
 * Solved with lazy rows: first the monotonicity, end-of-day and risk rows; after each solve every path's
 * states of charge are simulated (cheap), and for each path the prefix row at its most violated time
 * (both bounds in one row: socMin - s_0 <= sum <= socMax - s_0) and, when violated, its cycle-cap row are
 * added; the solver starts again from its last basis. A solution that violates no row of the full
 * program is optimal for it, since it is optimal for a relaxation. A row once added is never added again,
 * so the loop ends.
 */
export function solveCurveProgram(request: CurveProgramRequest): CurveProgramOutcome {
  const { scenarios, points, battery, periodHours: dt, socStartMwh: s0, riskWeight, cvarShare, solver } = request;
  const S = scenarios.pathCount;
  const T = scenarios.periodCount;
  if (points.length !== T) throw new RangeError(`solveCurveProgram: ${points.length} price points for ${T} periods`);
  if (!(riskWeight >= 0)) throw new RangeError(`solveCurveProgram: risk weight ${riskWeight}; give a number >= 0`);
  const etaC = battery.chargeEfficiency;
  const etaD = battery.dischargeEfficiency;
  const deg = battery.degradationCostPerMwh;
  const socEnd = Math.max(battery.socMinMwh, request.socEndMinMwh);
  const usable = battery.socMaxMwh - battery.socMinMwh;
  const offset = new Int32Array(T + 1);
  for (let t = 0; t < T; t++) offset[t + 1] = (offset[t] as number) + 2 * ((points[t] as PeriodPricePoints).breakpoints.length + 1);
  const curveColumns = offset[T] as number;
  const withRisk = riskWeight > 0;
  const etaColumn = curveColumns;
  const proximal = request.proximal;
  const distanceColumn = curveColumns + (withRisk ? 1 + S : 0);
  const distanceColumns = proximal === undefined ? 0 : curveColumns / 2;
  const columns = distanceColumn + distanceColumns;
  const cost = new Float64Array(columns);
  const lower = new Float64Array(columns);
  const upper = new Float64Array(columns);
  const epMax = Math.min(etaC * battery.chargeMw * dt, usable);
  const emMax = Math.min((battery.dischargeMw * dt) / etaD, usable);
  // column(w, t): the ep column of path w's step in period t (em is the next one).
  const column = (w: number, t: number): number => (offset[t] as number) + 2 * ((points[t] as PeriodPricePoints).stepOfPath[w] as number);
  for (let t = 0; t < T; t++) {
    const p = points[t] as PeriodPricePoints;
    for (let k = 0; k <= p.breakpoints.length; k++) {
      const ep = (offset[t] as number) + 2 * k;
      upper[ep] = epMax;
      upper[ep + 1] = p.sellable[k] === 1 ? emMax : 0;
    }
    const prices = scenarios.clearingPricePerMwh;
    for (let w = 0; w < S; w++) {
      const pi = prices[t * S + w] as number;
      const ep = column(w, t);
      cost[ep] = (cost[ep] as number) - pi / (etaC * S);
      cost[ep + 1] = (cost[ep + 1] as number) + ((pi - deg) * etaD) / S;
    }
  }
  if (withRisk) {
    lower[etaColumn] = -Infinity;
    upper[etaColumn] = Infinity;
    cost[etaColumn] = riskWeight;
    for (let w = 0; w < S; w++) {
      upper[etaColumn + 1 + w] = Infinity;
      cost[etaColumn + 1 + w] = -riskWeight / (cvarShare * S);
    }
  }
  // The share of the planning paths in each step, n_{t,k} / S, by distance column (the proximal weights).
  const stepShare = new Float64Array(distanceColumns);
  if (proximal !== undefined) {
    for (let t = 0; t < T; t++) for (let w = 0; w < S; w++) {
      const u = ((offset[t] as number) >> 1) + ((points[t] as PeriodPricePoints).stepOfPath[w] as number);
      stepShare[u] = (stepShare[u] as number) + 1 / S;
    }
    for (let u = 0; u < distanceColumns; u++) upper[distanceColumn + u] = Infinity;
  }
  const rows = new RowBuilder();
  if (proximal !== undefined) {
    // u_{t,k} >= e_{t,k} - f_t and u_{t,k} >= f_t - e_{t,k}.
    for (let t = 0; t < T; t++) {
      const f = proximal.towardsStoredMwh[t] as number;
      for (let k = 0; k <= (points[t] as PeriodPricePoints).breakpoints.length; k++) {
        const ep = (offset[t] as number) + 2 * k;
        const u = distanceColumn + (ep >> 1);
        rows.add([ep, ep + 1, u], [1, -1, -1], -Infinity, f);
        rows.add([ep, ep + 1, u], [1, -1, 1], f, Infinity);
      }
    }
  }
  for (let t = 0; t < T; t++) {
    const m = (points[t] as PeriodPricePoints).breakpoints.length;
    for (let k = 0; k < m; k++) {
      const a = (offset[t] as number) + 2 * k;
      rows.add([a + 2, a + 3, a, a + 1], [1, -1, -1, 1], -Infinity, 0);
    }
  }
  const pathIndices = new Int32Array(2 * T + 2);
  const pathValues = new Float64Array(2 * T + 2);
  for (let w = 0; w < S; w++) {
    fillPrefix(w, T - 1);
    rows.add(pathIndices.subarray(0, 2 * T), pathValues.subarray(0, 2 * T), socEnd - s0, battery.socMaxMwh - s0);
  }
  if (withRisk) {
    const prices = scenarios.clearingPricePerMwh;
    for (let w = 0; w < S; w++) {
      for (let t = 0; t < T; t++) {
        const pi = prices[t * S + w] as number;
        const ep = column(w, t);
        pathIndices[2 * t] = ep;
        pathValues[2 * t] = -pi / etaC;
        pathIndices[2 * t + 1] = ep + 1;
        pathValues[2 * t + 1] = (pi - deg) * etaD;
      }
      pathIndices[2 * T] = etaColumn + 1 + w;
      pathValues[2 * T] = 1;
      pathIndices[2 * T + 1] = etaColumn;
      pathValues[2 * T + 1] = -1;
      rows.add(pathIndices, pathValues, 0, Infinity);
    }
  }

  /** Fills pathIndices/pathValues with path w's e columns of periods 0..last (ep +1, em -1). */
  function fillPrefix(w: number, last: number): void {
    for (let t = 0; t <= last; t++) {
      const ep = column(w, t);
      pathIndices[2 * t] = ep;
      pathValues[2 * t] = 1;
      pathIndices[2 * t + 1] = ep + 1;
      pathValues[2 * t + 1] = -1;
    }
  }

  const penalties = proximal === undefined ? [0] : proximal.penaltiesPerMwh;
  if (penalties.length === 0 || !penalties.every((rho) => rho >= 0 && Number.isFinite(rho))) throw new RangeError(`solveCurveProgram: penalties ${penalties.join(', ')}; give finite numbers >= 0`);
  const distanceCost = (rho: number): Float64Array => stepShare.map((share) => -rho * share);
  if (proximal !== undefined) cost.set(distanceCost(penalties[0] as number), distanceColumn);
  const session = solver.open({ columnCost: cost, columnLower: lower, columnUpper: upper, rows: rows.build() });
  try {
    const tol = 1e-7 * Math.max(1, battery.energyMwh);
    const added = new Set<number>(); // w * (T + 1) + t for prefix rows, w * (T + 1) + T for cycle-cap rows
    const cap = battery.maxFromStoreMwhPerDay;
    const maxRounds = request.maxRounds ?? 100;
    let lazyRows = 0;
    let rounds = 0;
    const family: CurveSolution[] = [];
    for (const [index, rho] of penalties.entries()) {
      if (index > 0) session.changeCosts(distanceColumn, distanceCost(rho));
      const solved = solveLazily(rho);
      if (!('storedMwh' in solved)) return solved;
      family.push(solved);
    }
    const first = family[0] as CurveSolution;
    return { status: 'optimal', storedMwh: first.storedMwh, objective: first.objective, rounds, lazyRows, family };

    /** The lazy-row loop at one penalty: solve, add the violated rows, again, until none is violated. */
    function solveLazily(rho: number): CurveSolution | { status: 'infeasible' | 'unbounded' | 'failed'; reason: string } {
    for (let round = 1; round <= maxRounds; round++) {
      rounds++;
      const outcome: LpOutcome = session.solve();
      if (outcome.status !== 'optimal') return { status: outcome.status, reason: outcome.detail };
      const x = outcome.columns;
      const more = new RowBuilder();
      for (let w = 0; w < S; w++) {
        let s = s0;
        let worstUp = tol;
        let atUp = -1;
        let worstDown = tol;
        let atDown = -1;
        let fromStore = 0;
        for (let t = 0; t < T; t++) {
          const ep = column(w, t);
          const em = x[ep + 1] as number;
          s += (x[ep] as number) - em;
          fromStore += em;
          if (s - battery.socMaxMwh > worstUp && !added.has(w * (T + 1) + t)) {
            worstUp = s - battery.socMaxMwh;
            atUp = t;
          }
          if (battery.socMinMwh - s > worstDown && !added.has(w * (T + 1) + t)) {
            worstDown = battery.socMinMwh - s;
            atDown = t;
          }
        }
        for (const t of atUp === atDown ? [atUp] : [atUp, atDown]) {
          if (t < 0) continue;
          added.add(w * (T + 1) + t);
          fillPrefix(w, t);
          more.add(pathIndices.subarray(0, 2 * t + 2), pathValues.subarray(0, 2 * t + 2), battery.socMinMwh - s0, battery.socMaxMwh - s0);
        }
        if (cap !== undefined && fromStore > cap + tol && !added.has(w * (T + 1) + T)) {
          added.add(w * (T + 1) + T);
          for (let t = 0; t < T; t++) {
            pathIndices[t] = column(w, t) + 1;
            pathValues[t] = 1;
          }
          more.add(pathIndices.subarray(0, T), pathValues.subarray(0, T), -Infinity, cap);
        }
      }
      if (more.count === 0) {
        const storedMwh: Float64Array[] = [];
        for (let t = 0; t < T; t++) {
          const steps = (points[t] as PeriodPricePoints).breakpoints.length + 1;
          const e = new Float64Array(steps);
          for (let k = 0; k < steps; k++) {
            const ep = (offset[t] as number) + 2 * k;
            // Net the two flows; clip solver dust so that e is non-increasing exactly.
            const net = (x[ep] as number) - (x[ep + 1] as number);
            e[k] = k === 0 ? net : Math.min(net, e[k - 1] as number);
          }
          storedMwh.push(e);
        }
        return { penaltyPerMwh: rho, storedMwh, objective: outcome.objective };
      }
      lazyRows += more.count;
      session.addRows(more.build());
    }
    return { status: 'failed', reason: `no solution within ${maxRounds} solves` };
    }
  } finally {
    session.close();
  }
}
