import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/errors/inputError.js';
import { parseAxes, parseNumberAxis, parseWordAxis } from '../../src/grid/gridAxis.js';

const ALPHA = Object.freeze({ accept: (a: number) => a > 0 && a < 0.5, expected: 'a number in (0, 0.5)' });
const UNACCEPTED = Object.freeze(['follow-plan', 'follow-accepted']);

function problemsOf(parse: () => unknown): string[] {
  try {
    parse();
  } catch (err) {
    if (err instanceof InputError) return err.message.split('\n');
    throw err;
  }
  throw new Error('expected an InputError');
}

describe('parseNumberAxis', () => {
  it('mixes ranges and single values in the order written', () => {
    const axis = parseNumberAxis('alpha', '--alphas', '0.02:0.06:0.02, 0.1,0.25', ALPHA);
    expect(axis).toEqual({ name: 'alpha', option: '--alphas', values: [0.02, 0.04, 0.06, 0.1, 0.25] });
  });

  it('names the option, the value and what to do in every problem, all of them at once', () => {
    expect(problemsOf(() => parseNumberAxis('alpha', '--alphas', '0.1:0.2:0,abc,0.5', ALPHA))).toEqual([
      'command line: --alphas: the step of "0.1:0.2:0" is not positive; write start:end:step with start <= end and a step > 0, e.g. 0.02:0.48:0.02',
      'command line: --alphas: "abc" is not a plain decimal number; write a number such as 0.1, or a range start:end:step',
      'command line: --alphas: 0.5 is not a number in (0, 0.5); give only a number in (0, 0.5)',
    ]);
  });

  it('refuses a value given twice, also when written differently', () => {
    expect(problemsOf(() => parseNumberAxis('alpha', '--alphas', '0.1,0.10,0.05:0.15:0.05'))).toEqual([
      'command line: --alphas: 0.1 is given more than once; list each value once',
    ]);
  });

  it('refuses more values than a sweep may have, before making them', () => {
    const [problem] = problemsOf(() => parseNumberAxis('energy_mwh', '--energy-mwh', '0:1000000000:1'));
    expect(problem).toBe('command line: --energy-mwh: "0:1000000000:1" gives 1000000001 values, more than the 100000 one sweep may have; use a larger step or a shorter range');
    expect(problemsOf(() => parseNumberAxis('x', '--x', '1:10:1,11:20:1', { maxValues: 15 }))[0]).toContain('"11:20:1" gives 10 values, more than the 15');
  });

  it('refuses values a double cannot hold exactly', () => {
    expect(problemsOf(() => parseNumberAxis('x', '--x', '0.12345678901234567'))[0]).toBe(
      'command line: --x: 0.12345678901234567 has more digits than a number holds exactly; use at most 15 significant digits',
    );
  });

  it('refuses an empty spec and empty items', () => {
    expect(problemsOf(() => parseNumberAxis('x', '--x', ''))[0]).toContain('"" is not a plain decimal number');
    expect(problemsOf(() => parseNumberAxis('x', '--x', '0.1,,0.2'))[0]).toContain('"" is not a plain decimal number');
  });
});

describe('parseWordAxis and parseAxes', () => {
  it('keeps allowed words in the order written', () => {
    expect(parseWordAxis('unaccepted', '--unaccepted', 'follow-accepted, follow-plan', UNACCEPTED).values).toEqual(['follow-accepted', 'follow-plan']);
  });

  it('names the allowed words and refuses repeats', () => {
    expect(problemsOf(() => parseWordAxis('unaccepted', '--unaccepted', 'follow-plan,follow,follow-plan', UNACCEPTED))).toEqual([
      'command line: --unaccepted: "follow" is not one of follow-plan, follow-accepted; give a comma-separated list of follow-plan, follow-accepted',
      'command line: --unaccepted: follow-plan is given more than once; list each value once',
    ]);
  });

  it('lists the problems of every option together', () => {
    const problems = problemsOf(() =>
      parseAxes([() => parseNumberAxis('alpha', '--alphas', '0.3:0.2:0.1', ALPHA), () => parseWordAxis('unaccepted', '--unaccepted', 'none', UNACCEPTED)]),
    );
    expect(problems.map((line) => line.split(':')[1])).toEqual([' --alphas', ' --unaccepted']);
  });
});
