import { describe, expect, it } from 'vitest';
import type { BatteryModel, DayProblem } from '../../src/types.js';
import { solveDay } from '../../src/plan/solveDay.js';
import { testBattery } from './testBattery.js';

const battery = testBattery;

function day(prices: number[], b: BatteryModel, socStartMwh = 0, socEndMinMwh = 0): DayProblem {
  return Object.freeze({ periodHours: 1, buyPricePerMwh: Object.freeze([...prices]), sellPricePerMwh: Object.freeze([...prices]), battery: b, socStartMwh, socEndMinMwh });
}

describe('solveDay on hand-worked days', () => {
  it('round trip 0.8: 1 MWh bought yields 0.8 MWh sold (common practice)', () => {
    // Two 1-hour periods at 10 and 100; 1 MWh / 1 MW; eta_c = eta_d = sqrt(0.8).
    // Charging 1 MW for 1 h stores sqrt(0.8) = 0.894 MWh (< 1 MWh, so the window does not bind);
    // discharging it all delivers 0.894 * sqrt(0.8) = 0.8 MWh. Value = 100 * 0.8 - 10 * 1 = 70.
    const eta = Math.sqrt(0.8);
    const outcome = solveDay(day([10, 100], battery({ chargeEfficiency: eta, dischargeEfficiency: eta })));
    expect(outcome.status).toBe('optimal');
    if (outcome.status !== 'optimal') return;
    expect(outcome.schedule.chargeMw[0]).toBeCloseTo(1, 9);
    expect(outcome.schedule.dischargeMw[1]).toBeCloseTo(0.8, 9);
    expect(outcome.objective).toBeCloseTo(70, 9);
  });

  it('a negative price with a full store: no burning energy by charging and discharging at once', () => {
    // Prices -100 then 50; eta_c = eta_d = 0.9; window [0, 0.45] MWh; start and end floor 0.
    // Without complementarity the LP would charge 1 MW (paid 100) and discharge 0.405 MW in the same
    // hour (costing 40.5) to stay within 0.45 MWh: 59.5 in hour 1. Physically one mode per period:
    // charge 0.5 MW (0.45 MWh stored), paid 50; then sell 0.45 * 0.9 = 0.405 MW at 50 = 20.25.
    // Optimum 70.25, below the relaxation's 59.5 + 20.25 = 79.75.
    const outcome = solveDay(day([-100, 50], battery({ chargeEfficiency: 0.9, dischargeEfficiency: 0.9, socMaxMwh: 0.45 })));
    expect(outcome.status).toBe('optimal');
    if (outcome.status !== 'optimal') return;
    expect(outcome.objective).toBeCloseTo(70.25, 9);
    expect(outcome.schedule.chargeMw[0]).toBeCloseTo(0.5, 9);
    expect(outcome.schedule.dischargeMw[0]).toBe(0);
    expect(outcome.schedule.dischargeMw[1]).toBeCloseTo(0.405, 9);
  });

  it('three periods: charge in the cheapest, sell in the dearest, idle otherwise', () => {
    // Prices 40, 20, 60, efficiency 1, 1 MWh / 1 MW, start 0, end floor 0: buy 1 MWh at 20, sell at 60.
    // Buying at 40 as well cannot help: the store holds 1 MWh and the only later sale is in hour 3.
    const outcome = solveDay(day([40, 20, 60], battery({})));
    expect(outcome.status === 'optimal' && outcome.objective).toBeCloseTo(40, 9);
  });

  it('an unreachable end floor is infeasible with a reason', () => {
    // From 0 MWh at 1 MW for 2 hours at most 2 MWh could be charged, the window caps it at 1 MWh: 1.5 is out of reach.
    const outcome = solveDay(day([10, 20], battery({ energyMwh: 2, socMaxMwh: 2, chargeMw: 0.5 }), 0, 1.5));
    expect(outcome.status).toBe('infeasible');
    if (outcome.status === 'infeasible') expect(outcome.reason).toMatch(/cannot be reached/);
  });
});
