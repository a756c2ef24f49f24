import { bestResult } from '../backtest/bestResult.js';
import type { SizeGridSetting, SizeRow } from './sizeSettingRow.js';

/** A finished setting of a sizing grid with its row of size.csv. */
export interface SizeResult {
  readonly setting: SizeGridSetting;
  readonly row: SizeRow;
}

/** An axis of the sizing grid: its name in size.csv and its values in grid order. */
export interface SizeAxis {
  readonly name: string;
  readonly values: readonly (number | string)[];
}

/** A size next to a chosen one in the grid, and its NPV: how sharp the optimum is. */
export interface NeighbourNpv {
  readonly energyMwh: number;
  readonly powerMw: number;
  /** NPV [currency]. */
  readonly npv: number;
  /** npv - the chosen size's NPV [currency]; <= 0 around the highest NPV. */
  readonly npvChange: number;
}

export interface SizePick {
  readonly energyMwh: number;
  readonly powerMw: number;
  readonly roundTripEfficiency: number;
  readonly row: SizeRow;
  /** The up to 8 sizes one grid step away in energy, power or both, same efficiency and policy, energy then power ascending. */
  readonly neighbours: readonly NeighbourNpv[];
}

export interface PolicyBestSizes {
  readonly policy: string;
  /** The size with the highest NPV (first in grid order on a tie). */
  readonly highestNpv: SizePick | null;
  /** The size with the highest IRR among those that have one; null when none has. */
  readonly highestIrr: SizePick | null;
}

/**
 * Per policy (in the order of the policy axis), the size with the highest NPV and the one with the
 * highest IRR over every energy, power and efficiency, each with the NPV of its grid neighbours.
 */
export function bestSizes(results: readonly SizeResult[], axes: readonly SizeAxis[]): PolicyBestSizes[] {
  const values = (name: string): readonly (number | string)[] => axes.find((axis) => axis.name === name)?.values ?? [];
  const energies = values('energy_mwh');
  const powers = values('power_mw');
  const key = (e: unknown, p: unknown, eff: unknown, policy: unknown): string => `${String(e)}|${String(p)}|${String(eff)}|${String(policy)}`;
  const byKey = new Map(results.map((r) => [key(r.setting.energy_mwh, r.setting.power_mw, r.setting.round_trip_efficiency, r.setting.policy), r]));

  const pick = (chosen: SizeResult | null): SizePick | null => {
    if (chosen === null) return null;
    const { energy_mwh: e, power_mw: p, round_trip_efficiency: eff, policy } = chosen.setting;
    const npv = chosen.row.npv as number;
    const [i, j] = [energies.indexOf(e as number), powers.indexOf(p as number)];
    const neighbours: NeighbourNpv[] = [];
    for (const di of [-1, 0, 1]) {
      for (const dj of [-1, 0, 1]) {
        const other = byKey.get(key(energies[i + di], powers[j + dj], eff, policy));
        const otherNpv = other?.row.npv;
        if ((di !== 0 || dj !== 0) && typeof otherNpv === 'number') {
          neighbours.push({ energyMwh: energies[i + di] as number, powerMw: powers[j + dj] as number, npv: otherNpv, npvChange: otherNpv - npv });
        }
      }
    }
    return { energyMwh: e as number, powerMw: p as number, roundTripEfficiency: eff as number, row: chosen.row, neighbours };
  };

  return values('policy').map((policy) => {
    const mine = results.filter((r) => r.setting.policy === policy);
    return { policy: String(policy), highestNpv: pick(bestResult(mine, 'npv')), highestIrr: pick(bestResult(mine, 'irr')) };
  });
}
