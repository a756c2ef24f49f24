import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/errors/inputError.js';
import { expandGrid, settingKey } from '../../src/grid/expandGrid.js';
import type { GridAxis } from '../../src/grid/gridAxis.js';

function axis(name: string, values: readonly (number | string)[]): GridAxis {
  return Object.freeze({ name, option: `--${name}`, values: Object.freeze([...values]) });
}

const AXES = Object.freeze([axis('alpha', [0.02, 0.1]), axis('policy', ['quantile', 'median']), axis('unaccepted', ['follow-plan', 'follow-accepted'])]);

describe('expandGrid', () => {
  it('is the cartesian product in the documented order: first axis outermost, last fastest', () => {
    expect(expandGrid(AXES).map((p) => p.key)).toEqual([
      'alpha=0.02|policy=quantile|unaccepted=follow-plan',
      'alpha=0.02|policy=quantile|unaccepted=follow-accepted',
      'alpha=0.02|policy=median|unaccepted=follow-plan',
      'alpha=0.02|policy=median|unaccepted=follow-accepted',
      'alpha=0.1|policy=quantile|unaccepted=follow-plan',
      'alpha=0.1|policy=quantile|unaccepted=follow-accepted',
      'alpha=0.1|policy=median|unaccepted=follow-plan',
      'alpha=0.1|policy=median|unaccepted=follow-accepted',
    ]);
  });

  it('equals nested loops over the axes (index = mixed-radix number of the value positions)', () => {
    const axes = [axis('a', [3, 1, 2]), axis('b', ['x', 'y']), axis('c', [0.5, 0.25, 0.125, 1])];
    const loops: string[] = [];
    for (const a of axes[0]!.values) for (const b of axes[1]!.values) for (const c of axes[2]!.values) loops.push(`a=${a}|b=${b}|c=${c}`);
    const grid = expandGrid(axes);
    expect(grid.map((p) => p.key)).toEqual(loops);
    expect(grid.map((p) => p.index)).toEqual(loops.map((_, i) => i));
  });

  it('gives settings with numbers as numbers, keys that match settingKey, and the same grid every time', () => {
    const grid = expandGrid(AXES);
    expect(grid[5]?.setting).toEqual({ alpha: 0.1, policy: 'quantile', unaccepted: 'follow-accepted' });
    for (const point of grid) expect(settingKey(AXES, point.setting)).toBe(point.key);
    expect(expandGrid(AXES)).toEqual(grid);
  });

  it('with no axes is one empty setting; with an empty axis, none', () => {
    expect(expandGrid([]).map((p) => p.key)).toEqual(['']);
    expect(expandGrid([axis('a', [1]), axis('b', [])])).toEqual([]);
  });

  it('refuses more settings than allowed, naming every option and the counts', () => {
    const big = [axis('energy_mwh', Array.from({ length: 400 }, (_, i) => i + 1)), axis('power_mw', Array.from({ length: 300 }, (_, i) => i + 1))];
    expect(() => expandGrid(big)).toThrow(InputError);
    expect(() => expandGrid(big)).toThrow('command line: --energy_mwh, --power_mw: 400 --energy_mwh x 300 --power_mw is 120000 settings, more than the 100000 one sweep may have; use larger steps or fewer values');
    expect(expandGrid(big, { maxSettings: 120_000 })).toHaveLength(120_000);
  });

  it('refuses axis names that would make ambiguous keys or columns (a programming error)', () => {
    expect(() => expandGrid([axis('alpha', [1]), axis('alpha', [2])])).toThrow('distinct lower snake case');
    expect(() => expandGrid([axis('Alpha|x', [1])])).toThrow('Alpha|x');
  });
});
