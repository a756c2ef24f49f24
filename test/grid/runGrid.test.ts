import { appendFileSync, existsSync, readFileSync, utimesSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { beforeAll, describe, expect, it } from 'vitest';
import type { GridOptions, GridOutcome } from '../../src/grid/index.js';
import { EXAMPLE_TASK, importCompiledGrid, priceFolder, wholeLines, type GridModule } from './gridHarness.js';

let sweep: GridModule;
beforeAll(async () => {
  sweep = await importCompiledGrid();
});

const ALPHAS = '0.02:0.2:0.02';
const JOURNAL = '.sweep-journal.jsonl';

interface Case {
  readonly dir: string;
  readonly dataFile: string;
  readonly options: (out: string, more?: Partial<GridOptions> & { alphas?: string; context?: object }) => GridOptions;
}

function exampleCase(name: string): Case {
  const { dir, dataFile } = priceFolder(name);
  return {
    dir,
    dataFile,
    options: (out, more = {}) => ({
      outDir: join(dir, out),
      axes: [sweep.parseNumberAxis('alpha', '--alphas', more.alphas ?? ALPHAS), sweep.parseWordAxis('policy', '--policies', 'quantile,median', ['quantile', 'median'])],
      taskModule: EXAMPLE_TASK,
      contextInput: { dataFile, ...more.context },
      identity: { command: 'example-sweep' },
      inputFiles: [dataFile],
      threads: 1,
      ...more,
    }),
  };
}

/** Runs a sweep and stops it once `after` settings are done (counting resumed ones). */
async function interrupted(options: GridOptions, after: number): Promise<Extract<GridOutcome, { status: 'interrupted' }>> {
  const controller = new AbortController();
  const outcome = await sweep.runGrid({ ...options, signal: controller.signal, onProgress: (done) => done >= after && controller.abort() });
  if (outcome.status !== 'interrupted') throw new Error('expected the sweep to stop');
  return outcome;
}

async function complete(options: GridOptions): Promise<Extract<GridOutcome, { status: 'complete' }>> {
  const outcome = await sweep.runGrid(options);
  if (outcome.status !== 'complete') throw new Error('expected the sweep to finish');
  return outcome;
}

function csvOf(dir: string, out: string): string {
  return readFileSync(join(dir, out, 'sweep.csv'), 'utf8');
}

async function rejection(run: Promise<unknown>): Promise<Error> {
  try {
    await run;
  } catch (err) {
    return err as Error;
  }
  throw new Error('expected the sweep to fail');
}

describe('runGrid output', () => {
  it('one line per setting in grid order; axis columns, then the task columns as the contract says; no journal left', async () => {
    const c = exampleCase('output');
    const outcome = await complete(c.options('clean'));
    const lines = csvOf(c.dir, 'clean').split('\n');
    expect(lines[0]).toBe('alpha,policy,spread,profit,trades,note,wide,missing');
    expect(lines).toHaveLength(1 + 20 + 1);
    expect(lines.at(-1)).toBe('');
    const grid = sweep.expandGrid(c.options('clean').axes);
    expect(lines.slice(1, -1).map((line) => line.split(',').slice(0, 2).join('|'))).toEqual(grid.map((p) => `${p.setting.alpha}|${p.setting.policy}`));
    for (const line of lines.slice(1, -1)) {
      const [, policy, spread, profit, trades, note, wide, missing] = line.split(',');
      expect(Number(trades)).toSatisfy(Number.isInteger);
      expect(profit).toMatch(/^-?\d+(\.\d{1,6})?$/); // formatNumber: at most 6 decimals
      expect(note).toBe(policy === 'median' ? 'mid' : 'edge');
      expect(wide).toBe(String(Number(spread) > 40));
      expect(missing).toBe('');
    }
    expect(outcome.results.map((r) => r.key)).toEqual(grid.map((p) => p.key));
    expect(outcome.files).toEqual([join(c.dir, 'clean', 'sweep.csv')]);
    expect(existsSync(join(c.dir, 'clean', JOURNAL))).toBe(false);
  });

  it('1, 2 and 3 threads write identical bytes; each thread that runs settings loads the context once', async () => {
    const c = exampleCase('threads');
    const bytes: string[] = [];
    for (const threads of [1, 2, 3]) {
      const loadLog = join(c.dir, `loads-${threads}.txt`);
      await complete(c.options(`t${threads}`, { threads, context: { spinMs: 1, loadLog } }));
      bytes.push(csvOf(c.dir, `t${threads}`));
      const loads = wholeLines(readFileSync(loadLog, 'utf8'));
      expect(loads).toHaveLength(threads);
      expect(new Set(loads).size).toBe(threads);
      // n threads: this one (thread id 0) and n - 1 workers.
      expect(loads.includes('0')).toBe(true);
    }
    expect(bytes[1]).toBe(bytes[0]);
    expect(bytes[2]).toBe(bytes[0]);
  });

  it('settings besides the grid run as tasks; their lines follow the grid\'s in their order, a null axis empty; grouped, 1, 2 and 3 threads write the same bytes', async () => {
    const c = exampleCase('more');
    const moreSettings = [{ alpha: null, policy: 'median' }, { alpha: null, policy: 'quantile' }];
    const bytes: string[] = [];
    for (const threads of [1, 2, 3]) {
      const outcome = await complete(c.options(`t${threads}`, { threads, moreSettings, groupOf: (setting) => String(setting.policy), context: { spinMs: 1 } }));
      expect(outcome.resumed).toBe(0);
      expect(outcome.results).toHaveLength(20);
      expect(outcome.more.map((m) => m.setting)).toEqual(moreSettings);
      bytes.push(csvOf(c.dir, `t${threads}`));
    }
    const lines = (bytes[0] as string).split('\n');
    expect(lines).toHaveLength(1 + 20 + 2 + 1);
    // The whole range of the prices: the 0 and 1 quantiles of the example task's sorted prices.
    const grid = lines.slice(1, 21).map((line) => line.split(','));
    expect(lines[21]?.split(',').slice(0, 2)).toEqual(['', 'median']);
    expect(lines[22]?.split(',').slice(0, 2)).toEqual(['', 'quantile']);
    expect(lines[21]?.split(',')[5]).toBe('whole');
    expect(Number(lines[21]?.split(',')[2])).toBeGreaterThan(Math.max(...grid.map((cells) => Number(cells[2]))));
    expect(bytes[1]).toBe(bytes[0]);
    expect(bytes[2]).toBe(bytes[0]);
  });

  it('workers started ahead run the grid, each loading the context once, and are stopped however the grid ends', async () => {
    const c = exampleCase('ahead');
    const loadLog = join(c.dir, 'loads.txt');
    const workers = sweep.startPoolWorkers(EXAMPLE_TASK, 3);
    expect(workers.waiting).toBe(2);
    await complete(c.options('out', { threads: 3, workers, context: { spinMs: 1, loadLog } }));
    expect(new Set(wholeLines(readFileSync(loadLog, 'utf8'))).size).toBe(3);
    expect(workers.waiting).toBe(0);
    await complete(c.options('plain', { threads: 1 }));
    expect(csvOf(c.dir, 'out')).toBe(csvOf(c.dir, 'plain'));
    // A grid refused before it runs (the table exists) stops the workers it was given.
    const unused = sweep.startPoolWorkers(EXAMPLE_TASK, 2);
    const err = await rejection(sweep.runGrid(c.options('out', { threads: 2, workers: unused })));
    expect(err.message).toContain('the output already exists');
    expect(unused.waiting).toBe(0);
    expect(sweep.startPoolWorkers(EXAMPLE_TASK, 1).waiting).toBe(0);
  });

  it('hands results over in the order they finish, not grid order', async () => {
    const c = exampleCase('completion');
    const jobs = [0.1, 0.2].map((alpha, id) => ({ id, key: `alpha=${alpha}`, setting: { alpha, policy: 'quantile' } }));
    const order: number[] = [];
    // The first setting waits until the second has started on the other thread, then 200 ms more.
    const contextInput = { dataFile: c.dataFile, callLog: join(c.dir, 'calls.txt'), slowAt: 0.1, slowMs: 200, waitForKey: 'alpha=0.2|policy=quantile' };
    const status = await sweep.runPool(jobs, { taskModule: EXAMPLE_TASK, threads: 2, contextInput }, (job) => order.push(job.id));
    expect(status).toBe('finished');
    expect(order).toEqual([1, 0]);
  });
});

describe('runGrid resume', () => {
  it('an interrupted run keeps its finished settings; the re-run computes only the rest and writes the same bytes', async () => {
    const c = exampleCase('resume');
    await complete(c.options('clean'));
    const stopped = await interrupted(c.options('run'), 5);
    expect(stopped).toMatchObject({ done: 5, total: 20, journal: join(c.dir, 'run', JOURNAL) });
    expect(existsSync(join(c.dir, 'run', 'sweep.csv'))).toBe(false);
    const journalled = wholeLines(readFileSync(stopped.journal, 'utf8')).slice(1).map((line) => (JSON.parse(line) as { key: string }).key);
    expect(journalled).toHaveLength(5);
    expect(sweep.interruptedMessage(stopped)).toBe(`stopped after 5 of 20 settings; the finished ones are kept in ${stopped.journal}.\nRun the same command again to resume (or add --restart to start over).\n`);

    const callLog = join(c.dir, 'calls.txt');
    const resumed = await complete(c.options('run', { threads: 2, context: { callLog } }));
    expect(resumed.resumed).toBe(5);
    const calls = wholeLines(readFileSync(callLog, 'utf8'));
    expect(calls).toHaveLength(15);
    expect(calls.filter((key) => journalled.includes(key))).toEqual([]);
    expect(csvOf(c.dir, 'run')).toBe(csvOf(c.dir, 'clean'));
    expect(existsSync(stopped.journal)).toBe(false);
  });

  it('on several threads, the settings running at the interrupt finish and are journalled', async () => {
    const c = exampleCase('resume-threads');
    await complete(c.options('clean'));
    const stopped = await interrupted(c.options('run', { threads: 3, context: { spinMs: 5 } }), 4);
    expect(stopped.done).toBeGreaterThanOrEqual(4);
    expect(wholeLines(readFileSync(stopped.journal, 'utf8'))).toHaveLength(1 + stopped.done);
    expect((await complete(c.options('run', { threads: 3 }))).resumed).toBe(stopped.done);
    expect(csvOf(c.dir, 'run')).toBe(csvOf(c.dir, 'clean'));
  });

  it('refuses a journal row it did not compute (no digest, an edited value, an injected text) as damaged, and leaves the journal', async () => {
    const c = exampleCase('by-hand');
    await complete(c.options('clean'));
    const { journal } = await interrupted(c.options('run'), 2);
    const [header, first] = wholeLines(readFileSync(journal, 'utf8')) as [string, string];
    const entry = JSON.parse(first) as { key: string; row: Record<string, unknown>; digest: string };
    const forged = [
      JSON.stringify({ key: entry.key, row: entry.row }),
      JSON.stringify({ ...entry, row: {} }),
      JSON.stringify({ ...entry, row: { ...entry.row, spread: 999999999 } }),
      JSON.stringify({ ...entry, row: { ...entry.row, note: '=cmd|x' } }),
      JSON.stringify({ ...entry, row: { ...entry.row, note: '<script>' } }),
      JSON.stringify({ ...entry, row: { ...entry.row, spread: 'many' } }),
    ];
    for (const line of forged) {
      const text = `${header}\n${line}\n`;
      writeFileSync(journal, text);
      const err = await rejection(sweep.runGrid(c.options('run')));
      expect(err.name, line).toBe('InputError');
      expect(err.message, line).toMatch(new RegExp(`^${journal}:2: the journal is damaged: .*; add --restart to discard it and start over$`));
      expect(readFileSync(journal, 'utf8')).toBe(text);
      expect(existsSync(join(c.dir, 'run', 'sweep.csv'))).toBe(false);
    }
    // A row with the right digest but a text a spreadsheet reads as a formula still fails the row contract.
    const options = c.options('run');
    const fingerprint = sweep.gridFingerprint({ identity: options.identity, axes: options.axes, inputFiles: options.inputFiles ?? [], taskModuleUrl: pathToFileURL(EXAMPLE_TASK).href });
    const injected = { ...entry.row, note: '=cmd|x' };
    writeFileSync(journal, `${header}\n${JSON.stringify({ key: entry.key, row: injected, digest: sweep.journalDigest(fingerprint, entry.key, injected) })}\n`);
    expect((await rejection(sweep.runGrid(options))).message).toMatch(new RegExp(`^${journal}:2: the journal is damaged: a row with column note = =cmd\\|x, which is not .*; add --restart`));
    await complete(c.options('run', { restart: true }));
    expect(csvOf(c.dir, 'run')).toBe(csvOf(c.dir, 'clean'));
  });

  it('ignores a torn last line and cuts it off before appending', async () => {
    const c = exampleCase('torn');
    await complete(c.options('clean'));
    const { journal } = await interrupted(c.options('run'), 3);
    appendFileSync(journal, '{"key":"alpha=0.08|policy=quantile","row":{"spread":4');
    const again = await interrupted(c.options('run'), 6);
    expect(again.done).toBe(6);
    const lines = wholeLines(readFileSync(journal, 'utf8'));
    expect(readFileSync(journal, 'utf8').endsWith('\n')).toBe(true);
    expect(lines).toHaveLength(1 + 6);
    for (const line of lines) expect(() => JSON.parse(line) as unknown).not.toThrow();
    await complete(c.options('run'));
    expect(csvOf(c.dir, 'run')).toBe(csvOf(c.dir, 'clean'));
  });

  it('refuses a journal of other arguments, inputs or identity, and leaves it as it was; --restart discards it', async () => {
    const c = exampleCase('mismatch');
    await complete(c.options('clean', { alphas: '0.02:0.2:0.04' }));
    const { journal } = await interrupted(c.options('run'), 3);
    const before = readFileSync(journal, 'utf8');
    const refusals = [
      c.options('run', { alphas: '0.02:0.2:0.04' }),
      c.options('run', { identity: { command: 'example-sweep', version: 2 } }),
    ];
    for (const options of refusals) {
      const err = await rejection(sweep.runGrid(options));
      expect(err.name).toBe('InputError');
      expect(err.message).toMatch(new RegExp(`^${journal}: --restart: holds 3 finished settings of a sweep started \\d{4}-\\d\\d-\\d\\dT[^ ]+ with other arguments or input files; run that sweep's command again to resume it, or add --restart to discard the journal and start this one$`));
    }
    writeFileSync(c.dataFile, readFileSync(c.dataFile, 'utf8').replace(/\]/, ',12.5]'));
    expect((await rejection(sweep.runGrid(c.options('run')))).message).toContain('--restart: holds 3 finished settings');
    expect(readFileSync(journal, 'utf8')).toBe(before);
    expect(existsSync(join(c.dir, 'run', 'sweep.csv'))).toBe(false);

    const restarted = await complete(c.options('run', { alphas: '0.02:0.2:0.04', restart: true }));
    expect(restarted.resumed).toBe(0);
    await complete(c.options('clean-changed', { alphas: '0.02:0.2:0.04' }));
    expect(csvOf(c.dir, 'run')).toBe(csvOf(c.dir, 'clean-changed'));
  });

  it('resumes after an input file is only touched: its content counts, not its time', async () => {
    const c = exampleCase('touched');
    await interrupted(c.options('run'), 3);
    utimesSync(c.dataFile, new Date(2030, 0, 1), new Date(2030, 0, 1));
    expect((await complete(c.options('run'))).resumed).toBe(3);
  });
});

describe('runGrid refusals and failures', () => {
  it('refuses to overwrite a table without force, before any work or journal', async () => {
    const c = exampleCase('force');
    await complete(c.options('out'));
    const err = await rejection(sweep.runGrid(c.options('out', { alphas: '0.1' })));
    expect(err.message).toBe(`${join(c.dir, 'out', 'sweep.csv')}: --out: the output already exists (sweep.csv); choose another --out folder or add --force to overwrite`);
    expect(existsSync(join(c.dir, 'out', JOURNAL))).toBe(false);
    await complete(c.options('out', { alphas: '0.1', force: true }));
    expect(csvOf(c.dir, 'out').split('\n')).toHaveLength(1 + 2 + 1);
  });

  it.each([0, 1.5, -2])('refuses --threads %s', async (threads) => {
    const c = exampleCase('threads-bad');
    const err = await rejection(sweep.runGrid(c.options('out', { threads })));
    expect(err.message).toBe(`command line: --threads: ${threads} is not a whole number of threads >= 1; give --threads 1 or more (1 runs without worker threads)`);
  });

  it.each([1, 2])('a task fault names the setting and keeps what finished before it (%s threads)', async (threads) => {
    const c = exampleCase(`fault-${threads}`);
    const err = await rejection(sweep.runGrid(c.options('out', { threads, context: { failAt: 0.06 } })));
    expect(err.name).toBe('Error');
    expect(err.message).toBe('the sweep task failed for setting alpha=0.06|policy=quantile: RangeError: no quantile at 0.06');
    const kept = wholeLines(readFileSync(join(c.dir, 'out', JOURNAL), 'utf8')).slice(1);
    expect(kept.length).toBeGreaterThanOrEqual(threads === 1 ? 4 : 1);
    expect(kept.some((line) => line.includes('alpha=0.06'))).toBe(false);
    expect(existsSync(join(c.dir, 'out', 'sweep.csv'))).toBe(false);
  });

  it.each([1, 2])('an InputError from the task reaches the caller as one (%s threads)', async (threads) => {
    const c = exampleCase(`input-${threads}`);
    const err = await rejection(sweep.runGrid(c.options('out', { threads, context: { badInputAt: 0.04 } })));
    expect(err.name).toBe('InputError');
    expect(err.message).toBe(`${c.dataFile}: --alphas: 0.04 is too wide for these prices; give a smaller alpha`);
  });

  it.each([1, 2])('a row that breaks the contract is a fault naming setting and column (%s threads)', async (threads) => {
    const c = exampleCase(`row-${threads}`);
    const err = await rejection(sweep.runGrid(c.options('out', { threads, context: { badRowAt: 0.02 } })));
    expect(err.message).toBe('the sweep task returned column spread = NaN, which is not a finite number, a plain string, a boolean or null for setting alpha=0.02|policy=quantile');
  });

  it('reports the failure earliest in grid order, also when a later setting failed first', async () => {
    const c = exampleCase('earliest');
    const context = { badRowAt: 0.04, slowAt: 0.04, slowMs: 300, failAt: 0.1 };
    const single = await rejection(sweep.runGrid(c.options('one', { threads: 1, context })));
    const several = await rejection(sweep.runGrid(c.options('three', { threads: 3, context })));
    expect(single.message).toBe('the sweep task returned column spread = NaN, which is not a finite number, a plain string, a boolean or null for setting alpha=0.04|policy=quantile');
    expect(several.message).toBe(single.message);
    // Grouped, jobs no longer start in grid order; the jobs before a failure still run, so the earliest is found.
    const grouped = await rejection(sweep.runGrid(c.options('grouped', { threads: 3, context, groupOf: (setting) => String(setting.policy) })));
    expect(grouped.message).toBe(single.message);
  });

  it('a worker thread that exits before its first setting stops the grid, and the loss is reported', async () => {
    const c = exampleCase('worker-exit');
    const module = join(c.dir, 'exitInWorker.mjs');
    writeFileSync(module, `import { isMainThread } from 'node:worker_threads';\nif (!isMainThread) process.exit(3);\nexport { run, loadContext } from ${JSON.stringify(pathToFileURL(EXAMPLE_TASK).href)};\n`);
    const workers = sweep.startPoolWorkers(module, 2);
    const err = await rejection(sweep.runGrid(c.options('out', { threads: 2, taskModule: module, workers, context: { spinMs: 20 } })));
    expect(err.message).toMatch(/^a sweep worker thread stopped with exit code 3 (between settings|while running setting alpha=)/);
    expect(existsSync(join(c.dir, 'out', 'sweep.csv'))).toBe(false);
  });

  it.each([1, 2])('a module without run is refused (%s threads)', async (threads) => {
    const c = exampleCase(`no-run-${threads}`);
    const module = join(c.dir, 'noRun.mjs');
    writeFileSync(module, 'export const name = 1;\n');
    const err = await rejection(sweep.runGrid(c.options('out', { threads, taskModule: module })));
    expect(err.message).toContain(`task module file://${module} does not export a function run(setting, context)`);
  });
});
