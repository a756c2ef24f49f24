import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { cliHooks } from '../../src/cli/cliHooks.js';
import type { CliIo } from '../../src/cli/cliIo.js';
import { printResult } from '../../src/cli/printResult.js';
import { jsonText } from '../../src/io/planOutputs.js';
import { FIXTURES } from '../hardening/corpusRunner.js';
import { runMain } from './runMain.js';

/**
 * Whatever an input brings into what quantbid prints (a label, a path, a note) reaches the terminal
 * with its control characters escaped: an escape sequence (ECMA-48: ESC ] 0 ; ... BEL sets the window
 * title, ESC [ 2 K erases the line, CSI as the single byte U+009B) is shown, never acted on.
 */
const scratch = mkdtempSync(join(tmpdir(), 'quantbid-terminal-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

function capture(): { io: CliIo; out: () => string; err: () => string } {
  let stdout = '';
  let stderr = '';
  return { io: { stdout: (s) => void (stdout += s), stderr: (s) => void (stderr += s), stderrIsTerminal: false }, out: () => stdout, err: () => stderr };
}

const TITLE = '\u001b]0;owned\u0007';
const ERASE = '\u001b[2K\r';

describe('printing to a terminal', () => {
  it('escapes control characters in the human summary and keeps its line breaks', () => {
    const c = capture();
    printResult(c.io, { status: 'done', summary: {}, text: `value 5 ${TITLE}HLV\n${ERASE}value 9999\n` }, false);
    expect(c.out()).toBe('value 5 \\x1b]0;owned\\x07HLV\n\\x1b[2K\\x0dvalue 9999\n');
  });

  it('escapes in --json what JSON leaves raw (DEL, C1 controls, direction marks), and the JSON reads back the same', () => {
    const c = capture();
    const summary = { currency: 'HLV\u009b31m\u007f\u202e', note: `a${TITLE}` };
    printResult(c.io, { status: 'done', summary, text: '' }, true);
    expect(c.out()).not.toMatch(/[\u0000-\u0009\u000b-\u001f\u007f-\u009f\u202e]/);
    expect(c.out()).toContain('"currency": "HLV\\u009b31m\\u007f\\u202e"');
    expect(JSON.parse(c.out())).toEqual(summary);
    expect(c.out()).not.toBe(jsonText(summary));
  });

  it('escapes control characters in notes and warnings, and in the message of a stopped grid', () => {
    const c = capture();
    const hooks = cliHooks(c.io, false);
    hooks.note(`note: ${TITLE}\n`);
    hooks.warn(`warn: ${ERASE}\n`);
    expect(c.err()).toBe('note: \\x1b]0;owned\\x07\nwarn: \\x1b[2K\\x0d\n');
    const stopped = capture();
    let code = -1;
    const exited = new Error('exited');
    expect(() =>
      printResult(stopped.io, { status: 'interrupted', message: `kept in ${TITLE}/journal\n`, signal: 'SIGTERM' }, false, (exit) => {
        code = exit;
        throw exited;
      }),
    ).toThrow(exited);
    expect(stopped.err()).toBe('kept in \\x1b]0;owned\\x07/journal\n');
    expect(code).toBe(143);
  });

  it('escapes control characters of an --out path in the summary of a real plan', async () => {
    const out = join(scratch, `plan${TITLE}`);
    const run = await runMain(['plan', '--market', join(FIXTURES, 'base/market.json'), '--battery', join(FIXTURES, 'base/battery.json'), '--forecast', join(FIXTURES, 'base/quantilesWide.csv'), '--day', '2027-06-15', '--out', out]);
    expect(run.code, run.stderr).toBe(0);
    expect(run.stdout).not.toContain('\u001b');
    expect(run.stdout).toContain(`wrote ${join(scratch, 'plan\\x1b]0;owned\\x07')}/orders.csv`);
  });
});
