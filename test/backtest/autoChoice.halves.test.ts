import { describe, expect, it } from 'vitest';
import type { Order } from '../../src/types.js';
import { LOSSLESS_BATTERY } from '../reference/losslessBattery.js';
import { chooseAuto, type Candidate } from '../../src/backtest/autoChoice.js';
import { whyText } from '../../src/app/plan/scenarioPlanSummary.js';
import { scenarioSet } from '../../src/scenarios/scenarioSet.js';

// auto's switching rule (src/backtest/autoChoice.ts) on a heavy-tailed advantage worked out by hand.
// One period of one hour, a lossless battery without wear, 1,000 fresh paths. Price-taking places no
// order (profit 0 on every path); the other candidate sells 1 MW at the floor, so it earns the path's
// price: 100 on five paths, -0.01 on the other 995. By hand:
//   mean  = (5 x 100 - 995 x 0.01) / 1000 = 0.49005
//   sd    = sqrt((5 x 99.50995^2 + 995 x 0.50005^2) / 999) = sqrt(49759.9 / 999) = 7.0576
//   se    = 7.0576 / sqrt(1000) = 0.22318,   mean / se = 2.196 > 2
// (the paired t statistic, Montgomery and Runger, Applied Statistics and Probability for Engineers,
// section 10-4). The z = 2 test alone would switch. With all five high paths among the even paths the
// odd half's mean is -0.01: the advantage is not seen on both halves, so price-taking is kept. With the
// same values spread three even and two odd, the halves' means are (300 - 497 x 0.01) / 500 = 0.59006 and
// (200 - 498 x 0.01) / 500 = 0.39004, both positive, and the candidate is submitted.

const battery = LOSSLESS_BATTERY;
const sell: Order = { periodStart: '2026-01-01T00:00:00Z', periodEnd: '2026-01-01T01:00:00Z', side: 'sell', quantityMw: 1, limitPrice: -500, quantileLevel: null };
const candidates: Candidate[] = [
  { name: 'price-taking', policy: 'price-taking', alpha: null, bids: [null], kind: 'schedule', planned: null },
  { name: 'median 0.05', policy: 'median', alpha: 0.05, bids: [sell], kind: 'schedule', planned: null },
];

function choose(highPaths: readonly number[]) {
  const prices = Array.from({ length: 1000 }, (_, w) => [highPaths.includes(w) ? 100 : -0.01]);
  return chooseAuto({
    candidates,
    fresh: scenarioSet(prices, prices, prices),
    battery,
    periodHours: 1,
    socStartMwh: 2,
    socEndMinMwh: 0,
    unaccepted: 'follow-accepted',
    riskWeight: 0,
    switchStandardErrors: 2,
  });
}

describe('auto: the advantage must be seen on both halves of the fresh paths', () => {
  it('keeps price-taking when the paths that make the advantage all fall in one half', () => {
    const choice = choose([0, 2, 4, 6, 8]);
    const score = choice.scores[1] as (typeof choice.scores)[number];
    expect(score.advantage.mean).toBeCloseTo(0.49005, 5);
    expect(score.advantage.standardError).toBeCloseTo(0.22318, 4);
    expect(score.halfAdvantages[0]).toBeCloseTo(0.9901, 6);
    expect(score.halfAdvantages[1]).toBeCloseTo(-0.01, 9);
    expect(choice.best).toBe(1);
    expect(choice.chosen).toBe(0);
    expect(whyText(choice, 2)).toContain('not ahead on both halves');
  });

  it('submits the candidate when both halves show it', () => {
    const choice = choose([0, 2, 4, 1, 3]);
    const score = choice.scores[1] as (typeof choice.scores)[number];
    expect(score.advantage.mean).toBeCloseTo(0.49005, 5);
    expect(score.halfAdvantages[0]).toBeCloseTo(0.59006, 5);
    expect(score.halfAdvantages[1]).toBeCloseTo(0.39004, 5);
    expect(choice.chosen).toBe(1);
  });
});
