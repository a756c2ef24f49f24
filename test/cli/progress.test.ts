import { describe, expect, it } from 'vitest';
import { createProgress, formatDuration, progressLine } from '../../src/cli/progress.js';
import type { CliIo } from '../../src/cli/cliIo.js';

/** A terminal (or not) that records what is written to stderr, and a clock the test moves. */
function fakeTerminal(isTerminal = true) {
  const writes: string[] = [];
  const clock = { ms: 1000 };
  const io: CliIo = { stdout: () => undefined, stderr: (text) => void writes.push(text), stderrIsTerminal: isTerminal };
  return { io, writes, clock, now: () => clock.ms };
}

describe('createProgress', () => {
  it('draws nothing when stderr is not a terminal, or when quiet', () => {
    for (const [terminal, quiet] of [[false, false], [true, true]] as const) {
      const t = fakeTerminal(terminal);
      const progress = createProgress(t.io, { total: 10, quiet, now: t.now });
      progress.update(3);
      progress.finish();
      expect(progress.active).toBe(false);
      expect(t.writes).toEqual([]);
    }
  });

  it('redraws one line in place, at most once per 100 ms', () => {
    const t = fakeTerminal();
    const progress = createProgress(t.io, { total: 100, now: t.now });
    for (let done = 1; done <= 50; done++) {
      t.clock.ms += 7; // 50 updates over 350 ms
      progress.update(done);
    }
    // Drawn at the first update and then whenever 100 ms have passed since the last draw: 4 draws.
    expect(t.writes).toHaveLength(4);
    for (const write of t.writes) {
      expect(write.startsWith('\r')).toBe(true);
      expect(write.endsWith('\x1b[K')).toBe(true);
      expect(write).not.toContain('\n');
    }
  });

  it('estimates time left from the speed since the first update, not counting resumed work', () => {
    const t = fakeTerminal();
    const progress = createProgress(t.io, { total: 48, label: 'sweep', now: t.now });
    t.clock.ms += 2000;
    progress.update(12); // 12 resumed from a journal: no speed known yet
    t.clock.ms += 10_000;
    progress.update(24); // 12 settings in 10 s; 24 left: 20 s
    expect(t.writes).toEqual([
      '\rsweep [#####---------------] 12/48  25%  0:02 elapsed\x1b[K',
      '\rsweep [##########----------] 24/48  50%  0:12 elapsed  ~0:20 left\x1b[K',
    ]);
  });

  it('finish draws the final state and ends the line; nothing if nothing was drawn', () => {
    const t = fakeTerminal();
    const progress = createProgress(t.io, { total: 2, now: t.now });
    progress.finish();
    expect(t.writes).toEqual([]);
    progress.update(1);
    t.clock.ms += 30;
    progress.update(2); // within 100 ms: not drawn now
    progress.finish();
    expect(t.writes.slice(-2)).toEqual(['\r[####################] 2/2  100%  0:00 elapsed  ~0:00 left\x1b[K', '\n']);
  });
});

describe('progressLine and formatDuration', () => {
  it('fills the bar by the fraction done, rounded down; an empty job is full', () => {
    expect(progressLine({ label: '', total: 3, barWidth: 10 }, 1, 0, undefined)).toBe('[###-------] 1/3  33%  0:00 elapsed');
    expect(progressLine({ label: 'size', total: 0, barWidth: 4 }, 0, 61_000, undefined)).toBe('size [####] 0/0  100%  1:01 elapsed');
  });

  it.each([
    [0, '0:00'],
    [999, '0:00'],
    [59_999, '0:59'],
    [60_000, '1:00'],
    [3_599_000, '59:59'],
    [3_600_000, '1:00:00'],
    [90_061_000, '25:01:01'],
    [-5, '0:00'],
  ])('%s ms is %s', (ms, text) => {
    expect(formatDuration(ms)).toBe(text);
  });
});
