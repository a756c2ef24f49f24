import { readFileSync, writeFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { solveDay } from '../../../src/plan/solveDay.js';
import { checkSchedule } from '../../reference/checkSchedule.js';
import { HIGHS_NPM_VERSION, loadHighsSolver, solveDayWithHighs } from '../../reference/highsDayModel.js';
import { TRACED_DAY, traceDay } from './dayTrace.js';

// docs/day-solver.md follows one day through every stage of the warehouse solver with the numbers
// of the code. This test regenerates those numbers (dayTrace.ts) and fails when a block of the
// document differs, so the document cannot drift from the code; with QUANTBID_WRITE_TRACE=1 it
// rewrites the blocks instead. The traced optimum is checked against HiGHS (npm `highs`, version in
// HIGHS_NPM_VERSION) solving the day's MIP with zero gaps, and against the LP path.
const DOC = new URL('../../../docs/day-solver.md', import.meta.url);
const highs = await loadHighsSolver();
const trace = traceDay(TRACED_DAY);

const marker = /<!-- trace:([a-z]+) -->\n([\s\S]*?)<!-- \/trace:\1 -->/g;

function withBlocks(text: string): string {
  return text.replace(marker, (_, name: string) => `<!-- trace:${name} -->\n${trace.blocks[name] ?? `(no block named ${name})`}\n<!-- /trace:${name} -->`);
}

describe('docs/day-solver.md', () => {
  it('shows exactly the numbers the code produces for the traced day', () => {
    const text = readFileSync(DOC, 'utf8');
    const expected = withBlocks(text);
    if (process.env.QUANTBID_WRITE_TRACE === '1' && expected !== text) writeFileSync(DOC, expected);
    const names = [...text.matchAll(marker)].map((m) => m[1]);
    expect(names).toEqual(Object.keys(trace.blocks));
    // On a mismatch: QUANTBID_WRITE_TRACE=1 npx vitest run test/plan/warehouse/daySolverDoc.test.ts, then read the diff.
    expect(readFileSync(DOC, 'utf8')).toBe(expected);
  });

  it('traces a day that exercises every stage, as the prose says', () => {
    const facts = trace.facts;
    expect(facts.arbitragePeriods).toBe(1);
    expect(facts.firstMethod).toBe('sweep');
    expect(facts.rootOutcome).toBe('split');
    expect(facts.nodes).toBeGreaterThanOrEqual(3);
    expect(facts.rootTrials).toBeGreaterThanOrEqual(2);
    // The cap binds: the energy taken out of the store (discharged at the grid / eta_d) is the cap.
    expect(facts.dischargedMwh / TRACED_DAY.battery.dischargeEfficiency).toBeCloseTo(TRACED_DAY.battery.maxFromStoreMwhPerDay!, 12);
    expect(facts.programJoin).toBeGreaterThanOrEqual(1);
    expect(facts.programJoin).toBeLessThan(TRACED_DAY.buyPricePerMwh.length);
  });

  it(`the traced optimum is HiGHS ${HIGHS_NPM_VERSION}'s MIP optimum, and the LP path's`, () => {
    const reference = solveDayWithHighs(highs, TRACED_DAY, true);
    expect(reference.status).toBe('optimal');
    if (reference.status !== 'optimal') return;
    expect(trace.facts.objective).toBeCloseTo(reference.objective, 9);
    expect(trace.facts.programObjective).toBeCloseTo(reference.objective, 9);
    const lp = solveDay(TRACED_DAY, { solver: 'lp' });
    expect(lp.status).toBe('optimal');
    if (lp.status !== 'optimal') return;
    expect(lp.objective).toBeCloseTo(reference.objective, 6);
    expect(checkSchedule(TRACED_DAY, lp.schedule, 1e-7)).toEqual([]);
  });
});
