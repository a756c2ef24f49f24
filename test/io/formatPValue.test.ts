import { describe, expect, it } from 'vitest';
import { formatPValue } from '../../src/io/formatNumber.js';

describe('formatPValue', () => {
  it('4 decimals from 1e-4 up, scientific notation with two significant digits below, never 0', () => {
    expect(formatPValue(0.02734)).toBe('0.0273');
    expect(formatPValue(0.97299)).toBe('0.973');
    expect(formatPValue(1)).toBe('1');
    expect(formatPValue(1e-4)).toBe('0.0001');
    expect(formatPValue(9.94e-5)).toBe('9.9e-5');
    expect(formatPValue(3.24e-7)).toBe('3.2e-7');
    expect(formatPValue(1.26e-30)).toBe('1.3e-30');
    expect(formatPValue(0)).toBe('<1e-300');
  });
});
