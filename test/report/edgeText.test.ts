import { describe, expect, it } from 'vitest';
import type { BacktestMetrics } from '../../src/backtest/backtestMetrics.js';
import type { EdgeTest } from '../../src/backtest/edgeTest.js';
import { baselineHeadline } from '../../src/report/edgeText.js';

// The headline's verb follows the run's profits: behind is LOSES, equal as written is a tie (an `auto`
// that kept price-taking's bids every day earns exactly what price-taking earns), ahead beats it.
const edge = { status: 'not-tested', tested: 'auto', reference: 'price-taking', meanDifference: 0, reason: 'no difference' } as unknown as EdgeTest;
const write = (x: number, decimals: number) => x.toFixed(decimals);

function headline(tested: number, baseline: number): string {
  const metrics = {
    policies: { auto: { profit: tested }, 'price-taking': { profit: baseline } },
    tested: 'auto',
    baseline: { policy: 'price-taking', edge, testedLoses: tested < baseline },
  } as unknown as BacktestMetrics;
  return baselineHeadline(metrics, 'HLV', write)?.verdict ?? '';
}

describe('the headline against the strongest simple baseline', () => {
  it('says LOSES when behind, even by less than the written precision', () => {
    expect(headline(1576.2, 1577)).toContain('auto LOSES, 1576 against 1577 HLV');
    expect(headline(1576.9, 1577)).toContain('auto LOSES, 1577 against 1577 HLV');
  });
  it('says ties with it when not behind and equal as written, beats it when ahead', () => {
    expect(headline(1577, 1577)).toContain('auto ties with it, 1577 against 1577 HLV');
    expect(headline(1577.2, 1577)).toContain('auto ties with it');
    expect(headline(1600, 1577)).toContain('auto beats it, 1600 against 1577 HLV');
  });
});
