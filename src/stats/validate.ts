/**
 * Argument checks shared by the pure numeric functions. Each throws an ArgumentError naming the
 * argument; none changes its input.
 *
 * @example
 * requireFiniteArray('values', [1, 2], 1); // passes
 * requireOpenUnit('p', 1);                  // throws: must be a number in (0, 1); got 1
 */
import { ArgumentError } from './argumentError.js';

/** `value` must be a finite number. */
export function requireFinite(name: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new ArgumentError(name, 'a finite number', value);
  }
}

/** `value` must be a finite number > 0. */
export function requirePositive(name: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
    throw new ArgumentError(name, 'a finite number > 0', value);
  }
}

/** `value` must be a finite number >= 0. */
export function requireNonNegative(name: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < 0) {
    throw new ArgumentError(name, 'a finite number >= 0', value);
  }
}

/** `value` must be a number strictly between 0 and 1. */
export function requireOpenUnit(name: string, value: number): void {
  if (typeof value !== 'number' || !(value > 0 && value < 1)) {
    throw new ArgumentError(name, 'a number in (0, 1)', value);
  }
}

/** `value` must be an integer in [min, max]. */
export function requireIntegerIn(name: string, value: number, min: number, max = Infinity): void {
  if (!Number.isInteger(value) || value < min || value > max) {
    const range = max === Infinity ? `>= ${min}` : `in [${min}, ${max}]`;
    throw new ArgumentError(name, `an integer ${range}`, value);
  }
}

/** `values` must be an array of at least `minLength` finite numbers. */
export function requireFiniteArray(name: string, values: readonly number[], minLength: number): void {
  if (!Array.isArray(values) || values.length < minLength) {
    throw new ArgumentError(name, `an array of at least ${minLength} finite numbers`, values);
  }
  values.forEach((v, i) => requireFinite(`${name}[${i}]`, v));
}
