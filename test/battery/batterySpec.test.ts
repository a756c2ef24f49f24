import { describe, expect, it } from 'vitest';
import { equivalentFullCycles } from '../../src/battery/equivalentFullCycles.js';
import { batteryModel } from '../../src/battery/batterySpec.js';
import { InputError } from '../../src/errors/inputError.js';
import { parseJsonSpec } from '../../src/io/readSpecs.js';
import { BATTERY_FIELD_FIXES, parseBatterySpec } from '../../src/battery/batterySpec.js';
import { MARKET_FIELD_FIXES, parseMarketSpec } from '../../src/market/marketSpec.js';

const battery = (text: string) => parseJsonSpec(text, 'battery.json', parseBatterySpec, BATTERY_FIELD_FIXES);
const market = (text: string) => parseJsonSpec(text, 'market.json', parseMarketSpec, MARKET_FIELD_FIXES);

function problemsOf(run: () => unknown): string[] {
  try {
    run();
  } catch (err) {
    if (err instanceof InputError) return err.message.split('\n');
    throw err;
  }
  throw new Error('expected an InputError');
}

describe('battery spec', () => {
  it('splits a round-trip efficiency evenly: sqrt(0.81) = 0.9 each way (common practice)', () => {
    const spec = battery('{"energyMwh": 10, "chargeMw": 5, "dischargeMw": 4, "roundTripEfficiency": 0.81}');
    const model = batteryModel(spec);
    expect(model.chargeEfficiency).toBeCloseTo(0.9, 12);
    expect(model.dischargeEfficiency).toBeCloseTo(0.9, 12);
    expect(model.socMaxMwh).toBe(10);
    expect(model.socInitialMwh).toBe(5);
  });

  it('derives the cycle cap from the usable window: 2 cycles x (0.95 - 0.05) x 10 MWh = 18 MWh', () => {
    const spec = battery('{"energyMwh": 10, "chargeMw": 5, "dischargeMw": 5, "roundTripEfficiency": 0.9, "socMinFraction": 0.05, "socMaxFraction": 0.95, "maxCyclesPerDay": 2}');
    expect(batteryModel(spec).maxFromStoreMwhPerDay).toBeCloseTo(18, 12);
  });

  it('one cycle definition: a full swing of the window is one equivalent full cycle, the unit of the cap', () => {
    // Round trip 0.9, so eta_d = sqrt(0.9) = 0.9486833; usable 9 MWh. Two full swings take 18 MWh out of
    // the store and deliver 18 x 0.9486833 = 17.076299 MWh at the grid: 2 cycles, exactly the cap of 2 per
    // day (18 MWh out of the store). Counting the grid-side energy instead gave 17.076299 / 9 = 1.897.
    const model = batteryModel(battery('{"energyMwh": 10, "chargeMw": 5, "dischargeMw": 5, "roundTripEfficiency": 0.9, "socMinFraction": 0.05, "socMaxFraction": 0.95, "maxCyclesPerDay": 2}'));
    expect(equivalentFullCycles(17.076299, model)).toBeCloseTo(2, 6);
    expect(equivalentFullCycles(2 * 9 * model.dischargeEfficiency, model) * 9).toBeCloseTo(model.maxFromStoreMwhPerDay as number, 9);
  });

  it('lists every physical problem with its line and field, and says what to do', () => {
    const text = [
      '{',
      '  "energyMwh": -1,',
      '  "chargeMw": 0,',
      '  "dischargeMw": 5,',
      '  "roundTripEfficiency": 1.2,',
      '  "socMinFraction": 0.9,',
      '  "socMaxFraction": 0.2,',
      '  "socInitialFraction": 0.5',
      '}',
    ].join('\n');
    const lines = problemsOf(() => battery(text));
    expect(lines).toContain('battery.json:2: energyMwh: energyMwh must be in [0.001, 100000]; give the usable nameplate energy in MWh, e.g. 10');
    expect(lines.some((l) => l.startsWith('battery.json:3: chargeMw: chargeMw must be in [0.001, 100000];'))).toBe(true);
    expect(lines.some((l) => l.startsWith('battery.json:5: roundTripEfficiency: roundTripEfficiency must be in [0.05, 1];'))).toBe(true);
  });

  it('checks the window and the initial state once the fields are valid', () => {
    const lines = problemsOf(() => battery('{"energyMwh": 10, "chargeMw": 5, "dischargeMw": 5, "roundTripEfficiency": 0.9,\n "socMinFraction": 0.6, "socMaxFraction": 0.4,\n "socInitialFraction": 0.9}'));
    expect(lines.some((l) => /socMaxFraction: socMaxFraction \(0.4\) must be above socMinFraction \(0.6\)/.test(l))).toBe(true);
    expect(lines.some((l) => /socInitialFraction.*outside the window/.test(l))).toBe(true);
  });

  it('refuses both kinds of efficiency, unknown fields and broken JSON', () => {
    expect(problemsOf(() => battery('{"energyMwh": 10, "chargeMw": 5, "dischargeMw": 5, "roundTripEfficiency": 0.9, "chargeEfficiency": 0.9}'))[0]).toMatch(/not both/);
    expect(problemsOf(() => battery('{"energyMwh": 10, "chargeMw": 5, "dischargeMw": 5, "roundTripEfficiency": 0.9, "capacity": 3}'))[0]).toMatch(/capacity.*remove it or check its spelling/);
    expect(problemsOf(() => battery('{"energyMwh": 10,\n "chargeMw": 5,,}'))[0]).toMatch(/^battery.json:2: not valid JSON/);
  });
});

describe('market spec', () => {
  it('accepts a valid spec and rejects floor >= cap, bad zones and period lengths', () => {
    expect(market('{"timeZone": "Europe/Berlin", "periodMinutes": 15, "priceFloor": -500, "priceCap": 4000, "currency": "HLV", "gateClosure": "12:00"}').periodMinutes).toBe(15);
    const lines = problemsOf(() => market('{"timeZone": "Mars/Olympus", "periodMinutes": 20, "priceFloor": 100, "priceCap": 100, "currency": "HLV", "gateClosure": "25:00"}'));
    expect(lines.some((l) => /timeZone: not an IANA time zone/.test(l))).toBe(true);
    expect(lines.some((l) => /periodMinutes: periodMinutes must be 15, 30 or 60/.test(l))).toBe(true);
    expect(lines.some((l) => /gateClosure must be a local time HH:MM/.test(l))).toBe(true);
    const cap = problemsOf(() => market('{"timeZone": "Europe/Berlin", "periodMinutes": 15, "priceFloor": 100, "priceCap": 100, "currency": "HLV", "gateClosure": "12:00"}'));
    expect(cap[0]).toMatch(/priceCap: priceCap \(100\) must be above priceFloor \(100\)/);
  });

  it('reads the imbalance rule under its old name "fallback" as "imbalance"; both names is an error on the old one\'s line', () => {
    const head = '{"timeZone": "Europe/Berlin", "periodMinutes": 15, "priceFloor": -500, "priceCap": 4000, "currency": "HLV", "gateClosure": "12:00",\n';
    const rule = '{"kind": "clearing-plus-penalty", "penaltyPerMwh": 15}';
    const renamed = market(`${head} "imbalance": ${rule}}`);
    expect(renamed.imbalance).toEqual({ kind: 'clearing-plus-penalty', penaltyPerMwh: 15 });
    const old = market(`${head} "fallback": ${rule}}`);
    expect(old).toEqual(renamed);
    expect(Object.keys(old)).not.toContain('fallback');
    expect(problemsOf(() => market(`${head} "imbalance": ${rule},\n "fallback": ${rule}}`))).toEqual([
      'market.json:3: fallback: both "imbalance" and its old name "fallback" are given; keep only "imbalance", the same rule under its new name',
    ]);
    expect(problemsOf(() => market(`${head} "fallback": {"kind": "fixed", "penaltyPerMwh": 15}}`))).toEqual([
      'market.json:2: fallback.kind: fallback.kind must be "clearing-plus-penalty"; use {"kind": "clearing-plus-penalty", "penaltyPerMwh": 15}',
    ]);
  });

  it('reads the optional order steps and names each bad one with its line and what to do', () => {
    const head = '{"timeZone": "Europe/Berlin", "periodMinutes": 15, "priceFloor": -500, "priceCap": 4000, "currency": "HLV", "gateClosure": "12:00",\n';
    const spec = market(`${head} "quantityStepMw": 0.1, "minimumQuantityMw": 0.1, "priceTickPerMwh": 0.01}`);
    expect([spec.quantityStepMw, spec.minimumQuantityMw, spec.priceTickPerMwh]).toEqual([0.1, 0.1, 0.01]);
    expect(problemsOf(() => market(`${head} "quantityStepMw": 0,\n "minimumQuantityMw": 5000,\n "priceTickPerMwh": -1}`))).toEqual([
      "market.json:2: quantityStepMw: quantityStepMw must be at least 0.001 MW; give the exchange's quantity step in MW, e.g. 0.1, or leave the field out",
      "market.json:3: minimumQuantityMw: minimumQuantityMw must be at most 1000 MW; check the unit; give the exchange's smallest order in MW, e.g. 0.1, or leave the field out",
      "market.json:4: priceTickPerMwh: priceTickPerMwh must be at least 0.0001; give the exchange's price tick in currency/MWh, e.g. 0.01, on which priceFloor and priceCap lie, or leave the field out",
    ]);
    expect(problemsOf(() => market(`${head} "quantityStepMw": "0.1"}`))[0]).toMatch(/^market.json:2: quantityStepMw: quantityStepMw must be a number;/);
    // Rounding a limit to the tick keeps it inside [floor, cap] only when both lie on the tick: -500 is
    // 2000 ticks of 0.25, 4000.1 is not a whole number of them.
    const offTick = '{"timeZone": "Europe/Berlin", "periodMinutes": 15, "priceFloor": -500, "priceCap": 4000.1, "currency": "HLV", "gateClosure": "12:00",\n';
    expect(problemsOf(() => market(`${offTick} "priceTickPerMwh": 0.25}`))).toEqual([
      'market.json:2: priceTickPerMwh: priceCap (4000.1) is not a whole number of ticks of 0.25; give the exchange\'s price tick in currency/MWh, e.g. 0.01, on which priceFloor and priceCap lie, or leave the field out',
    ]);
    expect(problemsOf(() => market(`${head} "priceTickPerMwh": 5000}`))[0]).toMatch(/priceTickPerMwh \(5000\) is wider than the whole price range \[-500, 4000\]/);
  });
});
