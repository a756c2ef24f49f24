import { describe, expect, it } from 'vitest';
import { COMMANDS, runMain } from './runMain.js';
import { packageVersion } from '../../src/app/packageInfo.js';

// The help text of every command, compared with the stored snapshots in __snapshots__/: a change of
// an option, a default or an example shows up in review. After an intended change, regenerate with
//   npx vitest run test/cli/helpSnapshots.test.ts -u
// and read the diff.

const run = (argv: readonly string[]) => runMain(argv);

describe('help text', () => {
  it('quantbid --help', async () => {
    const r = await run(['--help']);
    expect(r).toMatchObject({ code: 0, stderr: '' });
    expect(r.stdout).toMatchSnapshot();
  });

  for (const command of COMMANDS) {
    it(`quantbid ${command} --help`, async () => {
      const r = await run([command, '--help']);
      expect(r).toMatchObject({ code: 0, stderr: '' });
      expect(r.stdout).toMatchSnapshot();
      // Every command shows two or three real examples (DEVELOPERS.md, "Adding a command").
      expect(r.stdout).toMatch(/\nExamples:\n(  quantbid .*\n(?: {3,}.*\n)*){2,}/);
    });
  }

  it('quantbid --version prints the version of package.json', async () => {
    expect(await run(['--version'])).toEqual({ code: 0, stdout: `${packageVersion()}\n`, stderr: '' });
  });

  it('does not depend on the width of the terminal', async () => {
    const narrow = { columns: 40, isTTY: true };
    const saved = { out: { ...narrow, columns: process.stdout.columns, isTTY: process.stdout.isTTY }, err: { columns: process.stderr.columns, isTTY: process.stderr.isTTY } };
    const wide = (await run(['size', '--help'])).stdout;
    try {
      Object.assign(process.stdout, narrow);
      Object.assign(process.stderr, narrow);
      expect((await run(['size', '--help'])).stdout).toBe(wide);
    } finally {
      Object.assign(process.stdout, { columns: saved.out.columns, isTTY: saved.out.isTTY });
      Object.assign(process.stderr, saved.err);
    }
    // Wrapped at 80 columns (HELP_WIDTH); only the example lines, written by hand, may be longer.
    const beforeExamples = wide.slice(0, wide.indexOf('\nColumns of size.csv'));
    expect(Math.max(...beforeExamples.split('\n').map((l) => l.length))).toBeLessThanOrEqual(80);
  });
});
