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
  it('plans the demo day with the default policy, auto: the candidate table, every submitted order listed, and the next command', async () => {
    const out = join(mkdtempSync(join(tmpdir(), 'quantbid-demo-')), 'out');
    const result = await run(['demo', '--out', out]);
    expect(result.code).toBe(0);
    const plan = JSON.parse(readFileSync(join(out, 'plan.json'), 'utf8')) as { policy: string; submitted: string; candidates: { name: string; fresh: { meanProfit: number } }[] };
    expect(plan.policy).toBe('auto');
    // The table on the console has one row per candidate of plan.json, the submitted one starred.
    const lines = result.stdout.split('\n');
    const header = lines.findIndex((line) => /^ {2}candidate .*vs price-taking \(se\)$/.test(line));
    expect(header).toBeGreaterThan(0);
    const rows = lines.slice(header + 1, header + 1 + plan.candidates.length);
    expect(lines[header + 1 + plan.candidates.length]).toMatch(/^ {2}submitted: /);
    expect(rows.map((line) => line.slice(2, 18).trim())).toEqual(plan.candidates.map((c) => c.name));
    expect(rows.filter((line) => line.startsWith('*')).map((line) => line.slice(2, 18).trim())).toEqual([plan.submitted]);
    expect(rows[0]?.slice(2, 18).trim()).toBe('price-taking');
    const orders = readFileSync(join(out, 'orders.csv'), 'utf8').trimEnd().split('\n').slice(1).map((line) => line.split(','));
    expect(orders.length).toBeGreaterThan(0);
    const listed = result.stdout.split('\n').filter((line) => /^ {4}\d\d:\d\d-\d\d:\d\d /.test(line));
    expect(listed).toHaveLength(orders.length);
    const market = JSON.parse(readFileSync(new URL('../../scenarios/halvorn/market.json', import.meta.url), 'utf8')) as { priceCap: number; priceFloor: number };
    listed.forEach((line, i) => {
      const [start, , side, quantity, limit, level] = orders[i] as string[];
      expect(line.startsWith(`    ${(start as string).slice(11, 16)}-`)).toBe(true);
      expect(line).toContain(` ${side} `);
      expect(line).toContain(`${Number(quantity).toFixed(3)} MW`);
      // A limit read at a level names it; price-taking's limits are the market's cap (buys) and floor
      // (sells), where an order is always accepted (common practice).
      const named = level !== '' ? `q${level}` : Number(limit) === market.priceCap ? 'cap' : Number(limit) === market.priceFloor ? 'floor' : 'step';
      expect(line).toContain(`at ${Number(limit).toFixed(2)} (${named})`);
    });
    if (plan.submitted === 'price-taking') {
      for (const [, , side, , limit] of orders) expect(Number(limit)).toBe(side === 'buy' ? market.priceCap : market.priceFloor);
    }
    expect(result.stdout).toMatch(/next: does auto beat the simple baselines over many days\? Replay it \(each day scored on paths: it takes a while\):\n {2}quantbid backtest --scenario \S+scenario\.json --from 2026-01-01 --to 2026-03-31 --policies auto,price-taking,quantile,perfect-foresight --out runs\/demo-q1 --report\n$/);
  });
});
