import type { Highs } from 'highs';
import type { BatteryModel } from '../../src/types.js';
import { HIGHS_EXACT_OPTIONS } from './highsDayModel.js';

/**
 * The two-stage program of a day of step curves in its extensive form, in grid units, for HiGHS as a
 * MIP (npm `highs`; Huangfu and Hall 2018), built independently of src/curves: no stored-energy
 * variables, no lazy rows, no netting argument. Used as the reference of the stored-energy LP.
 *
 * First stage: y_{t,k} in [-chargeMw, dischargeMw], the net MW sold in step k of period t, with
 * y_{t,k} <= y_{t,k+1}. Second stage, per path w and period t (path w's price pi in step j(w,t)):
 *   d_{w,t} - c_{w,t} = y_{t,j(w,t)}                 the battery delivers what clears
 *   s_{w,t} = s_{w,t-1} + eta_c dt c - dt d / eta_d,  socMin <= s <= socMax,  s_{w,T} >= socEnd
 *   c <= chargeMw b, d <= dischargeMw (1 - b), b binary   (no simultaneous charge and discharge)
 *   d_{w,t} = 0 where step j(w,t) is not sellable      (the one restriction the LP makes)
 *   sum_t dt d_{w,t} / eta_d <= maxFromStoreMwhPerDay (energy out of the store)
 *   P_w = sum_t dt ( (pi - deg) d - pi c )
 * Objective, maximised: (1/S) sum_w P_w + lambda (eta - (1/(beta S)) sum_w z_w), z_w >= eta - P_w, z >= 0.
 *
 * With a proximal term (towards f_t [MWh] at penalty rho): the objective also subtracts
 * rho sum_{t,k} (n_{t,k}/S) |e_{t,k} - f_t|, e_{t,k} the change of stored energy of step k's quantity,
 * written here from its grid quantity: y = yp - ym, yp <= dischargeMw g, ym <= chargeMw (1 - g), g binary,
 * e = eta_c dt ym - dt yp / eta_d (a discharge of yp MW takes yp dt / eta_d out of the store, a charge of
 * ym MW puts eta_c ym dt in), u >= e - f, u >= f - e.
 */
export interface ExtensiveCurveDay {
  readonly battery: BatteryModel;
  readonly periodHours: number;
  readonly socStartMwh: number;
  readonly socEndMinMwh: number;
  /** prices[w][t] [currency/MWh]. */
  readonly prices: readonly (readonly number[])[];
  /** steps[t]: number of steps of period t; stepOf[w][t]: path w's step; sellable[t][k]. */
  readonly steps: readonly number[];
  readonly stepOf: readonly (readonly number[])[];
  readonly sellable: readonly (readonly boolean[])[];
  readonly riskWeight: number;
  readonly cvarShare: number;
  readonly proximal?: { readonly towardsStoredMwh: readonly number[]; readonly penaltyPerMwh: number };
}

export function solveExtensiveCurveMip(highs: Highs, day: ExtensiveCurveDay): { status: 'optimal'; objective: number } | { status: 'infeasible' | 'other' } {
  const { battery: b, periodHours: dt, prices } = day;
  const S = prices.length;
  const T = day.steps.length;
  const inf = highs.infinity;
  const yOffset: number[] = [];
  let n = 0;
  for (let t = 0; t < T; t++) {
    yOffset.push(n);
    n += day.steps[t] as number;
  }
  const pathBase = n;
  const perPath = 4 * T; // c, d, s, bin per period
  n += S * perPath;
  const etaCol = n;
  const zCol = n + 1;
  const withRisk = day.riskWeight > 0;
  if (withRisk) n += 1 + S;
  // Proximal term: per step yp, ym, g, u.
  const proximalBase = n;
  let stepCount = 0;
  for (let t = 0; t < T; t++) stepCount += day.steps[t] as number;
  if (day.proximal !== undefined) n += 4 * stepCount;
  const cost = new Float64Array(n);
  const lower = new Float64Array(n);
  const upper = new Float64Array(n);
  const integrality = new Int32Array(n);
  const c = (w: number, t: number) => pathBase + w * perPath + t;
  const d = (w: number, t: number) => pathBase + w * perPath + T + t;
  const s = (w: number, t: number) => pathBase + w * perPath + 2 * T + t;
  const bin = (w: number, t: number) => pathBase + w * perPath + 3 * T + t;
  for (let t = 0; t < T; t++) {
    for (let k = 0; k < (day.steps[t] as number); k++) {
      lower[(yOffset[t] as number) + k] = -b.chargeMw;
      upper[(yOffset[t] as number) + k] = b.dischargeMw;
    }
  }
  const socEnd = Math.max(b.socMinMwh, day.socEndMinMwh);
  for (let w = 0; w < S; w++) {
    for (let t = 0; t < T; t++) {
      const pi = (prices[w] as readonly number[])[t] as number;
      const j = (day.stepOf[w] as readonly number[])[t] as number;
      upper[c(w, t)] = b.chargeMw;
      upper[d(w, t)] = (day.sellable[t] as readonly boolean[])[j] ? b.dischargeMw : 0;
      lower[s(w, t)] = t === T - 1 ? socEnd : b.socMinMwh;
      upper[s(w, t)] = b.socMaxMwh;
      upper[bin(w, t)] = 1;
      integrality[bin(w, t)] = 1;
      cost[c(w, t)] = (-dt * pi) / S;
      cost[d(w, t)] = (dt * (pi - b.degradationCostPerMwh)) / S;
    }
  }
  if (withRisk) {
    lower[etaCol] = -inf;
    upper[etaCol] = inf;
    cost[etaCol] = day.riskWeight;
    for (let w = 0; w < S; w++) {
      upper[zCol + w] = inf;
      cost[zCol + w] = -day.riskWeight / (day.cvarShare * S);
    }
  }
  const proximalColumn = (t: number, k: number, part: number) => proximalBase + 4 * ((yOffset[t] as number) + k) + part; // 0 yp, 1 ym, 2 g, 3 u
  if (day.proximal !== undefined) {
    for (let t = 0; t < T; t++) {
      for (let k = 0; k < (day.steps[t] as number); k++) {
        let share = 0;
        for (let w = 0; w < S; w++) if ((day.stepOf[w] as readonly number[])[t] === k) share += 1 / S;
        upper[proximalColumn(t, k, 0)] = b.dischargeMw;
        upper[proximalColumn(t, k, 1)] = b.chargeMw;
        upper[proximalColumn(t, k, 2)] = 1;
        integrality[proximalColumn(t, k, 2)] = 1;
        upper[proximalColumn(t, k, 3)] = inf;
        cost[proximalColumn(t, k, 3)] = -day.proximal.penaltyPerMwh * share;
      }
    }
  }
  const starts = [0];
  const indices: number[] = [];
  const values: number[] = [];
  const rowLower: number[] = [];
  const rowUpper: number[] = [];
  const row = (cols: number[], vals: number[], lo: number, hi: number) => {
    indices.push(...cols);
    values.push(...vals);
    starts.push(indices.length);
    rowLower.push(lo);
    rowUpper.push(hi);
  };
  for (let t = 0; t < T; t++) for (let k = 0; k + 1 < (day.steps[t] as number); k++) row([(yOffset[t] as number) + k, (yOffset[t] as number) + k + 1], [1, -1], -inf, 0);
  if (day.proximal !== undefined) {
    for (let t = 0; t < T; t++) {
      const f = day.proximal.towardsStoredMwh[t] as number;
      for (let k = 0; k < (day.steps[t] as number); k++) {
        const [yp, ym, g, u] = [0, 1, 2, 3].map((part) => proximalColumn(t, k, part)) as [number, number, number, number];
        row([(yOffset[t] as number) + k, yp, ym], [1, -1, 1], 0, 0);
        row([yp, g], [1, -b.dischargeMw], -inf, 0);
        row([ym, g], [1, b.chargeMw], -inf, b.chargeMw);
        // e = eta_c dt ym - dt yp / eta_d; u >= e - f and u >= f - e.
        row([u, ym, yp], [1, -b.chargeEfficiency * dt, dt / b.dischargeEfficiency], -f, inf);
        row([u, ym, yp], [1, b.chargeEfficiency * dt, -dt / b.dischargeEfficiency], f, inf);
      }
    }
  }
  for (let w = 0; w < S; w++) {
    for (let t = 0; t < T; t++) {
      const j = (day.stepOf[w] as readonly number[])[t] as number;
      row([d(w, t), c(w, t), (yOffset[t] as number) + j], [1, -1, -1], 0, 0);
      if (t === 0) row([s(w, 0), c(w, 0), d(w, 0)], [1, -b.chargeEfficiency * dt, dt / b.dischargeEfficiency], day.socStartMwh, day.socStartMwh);
      else row([s(w, t), s(w, t - 1), c(w, t), d(w, t)], [1, -1, -b.chargeEfficiency * dt, dt / b.dischargeEfficiency], 0, 0);
      row([c(w, t), bin(w, t)], [1, -b.chargeMw], -inf, 0);
      row([d(w, t), bin(w, t)], [1, b.dischargeMw], -inf, b.dischargeMw);
    }
    if (b.maxFromStoreMwhPerDay !== undefined) row(Array.from({ length: T }, (_, t) => d(w, t)), new Array<number>(T).fill(dt / b.dischargeEfficiency), -inf, b.maxFromStoreMwhPerDay);
    if (withRisk) {
      const cols = [zCol + w, etaCol];
      const vals = [1, -1];
      for (let t = 0; t < T; t++) {
        const pi = (prices[w] as readonly number[])[t] as number;
        cols.push(c(w, t), d(w, t));
        vals.push(-dt * pi, dt * (pi - b.degradationCostPerMwh));
      }
      row(cols, vals, 0, inf);
    }
  }
  const model = highs.createModel({
    numCols: n,
    numRows: rowLower.length,
    sense: highs.constants.objectiveSense.maximize,
    colCost: cost,
    colLower: lower,
    colUpper: upper,
    rowLower,
    rowUpper,
    integrality,
    matrix: { format: 'csr', numRows: rowLower.length, numCols: n, starts, indices, values },
  });
  try {
    model.options.set({ ...HIGHS_EXACT_OPTIONS });
    const status = model.run().modelStatus;
    if (status === highs.constants.modelStatus.optimal) return { status: 'optimal', objective: model.getObjectiveValue() };
    if (status === highs.constants.modelStatus.infeasible) return { status: 'infeasible' };
    return { status: 'other' };
  } finally {
    model.dispose();
  }
}
