import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { CliIo } from '../../src/cli/cliIo.js';
import { main } from '../../src/cli/main.js';

async function run(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const io: CliIo = { stdout: (s) => void (stdout += s), stderr: (s) => void (stderr += s), stderrIsTerminal: false };
  const code = await main(['node', 'quantbid', ...args], io);
  return { code, stdout, stderr };
}

describe('quantbid demo', () => {
  it('prints every order it planned, the price-taking plan of the day beside it, and the next command', async () => {
    const out = join(mkdtempSync(join(tmpdir(), 'quantbid-demo-')), 'out');
    const result = await run(['demo', '--out', out]);
    expect(result.code).toBe(0);
    const orders = readFileSync(join(out, 'orders.csv'), 'utf8').trimEnd().split('\n').slice(1).map((line) => line.split(','));
    expect(orders.length).toBeGreaterThan(0);
    const listed = result.stdout.split('\n').filter((line) => /^ {4}\d\d:\d\d-\d\d:\d\d /.test(line));
    expect(listed).toHaveLength(orders.length);
    listed.forEach((line, i) => {
      const [start, , side, quantity, limit, level] = orders[i] as string[];
      expect(line.startsWith(`    ${(start as string).slice(11, 16)}-`)).toBe(true);
      expect(line).toContain(` ${side} `);
      expect(line).toContain(`${Number(quantity).toFixed(3)} MW`);
      expect(line).toContain(`at ${Number(limit).toFixed(2)} (q${level})`);
      // A limit at the quantile of level tau is accepted with probability tau (buy: price <= q(tau)) or
      // 1 - tau (sell: price >= q(tau)), the definition of a quantile: 0.9 for alpha 0.1, both sides.
      expect(line).toMatch(/P\(accepted\) 0\.90$/);
    });
    const plan = JSON.parse(readFileSync(join(out, 'plan.json'), 'utf8')) as { value: { expected: { value: number } }; baseline: { value: { expected: { value: number } } } };
    const mine = plan.value.expected.value;
    const taking = plan.baseline.value.expected.value;
    const gap = Math.abs(mine - taking).toFixed(2);
    expect(result.stdout).toContain(`price-taking (same forecast, median schedule, always accepted) expects ${Number(taking.toFixed(2))} HLV: this plan expects ${Number(gap)} HLV ${mine < taking ? 'LESS' : 'more'}`);
    expect(result.stdout).toMatch(/next: does this policy beat the simple baselines over many days\? Replay it:\n {2}quantbid backtest --scenario \S+scenario\.json --from 2026-01-01 --to 2026-03-31 --out runs\/demo-q1 --report\n$/);
  });
});
