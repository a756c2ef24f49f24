import { it } from 'vitest';
import { readFileSync, writeFileSync } from 'node:fs';
import { caseArgv, prepareOut, runCli, scratchFolder, snapshot, type CorpusCase, type Manifest } from './corpusRunner.js';
it('explore', async () => {
  const draft = JSON.parse(readFileSync('/tmp/cases_draft.json', 'utf8')) as { cases: CorpusCase[] };
  const manifest: Manifest = { defaults: { day: '2027-06-15', inputs: { market: 'base/market.json', battery: 'base/battery.json', forecast: 'base/quantilesWide.csv' } }, cases: draft.cases, historyCases: [] };
  const report: unknown[] = [];
  for (const c of draft.cases) {
    const scratch = scratchFolder();
    const { out } = prepareOut(c.out ?? 'fresh', scratch.path);
    const before = snapshot(out);
    const run = await runCli(caseArgv(manifest, c, out));
    const after = snapshot(out);
    report.push({ name: c.name, want: c.exit, code: run.code, same: JSON.stringify(before) === JSON.stringify(after), stderr: run.stderr.replaceAll(out, '{OUT}').split('\n') });
    scratch.done();
  }
  writeFileSync('/tmp/explore.json', JSON.stringify(report, null, 1));
}, 120000);
