/**
 * Exact decimal ranges: `start:end:step` expanded without floating-point drift.
 *
 * Each bound is read as an exact decimal (an integer mantissa and a power-of-ten scale), the three are
 * brought to a common scale, and value i is start + i * step in integer arithmetic, so the 24th value
 * of `0.02:0.48:0.02` is exactly `0.48`, not `0.48000000000000004` as repeated float addition gives.
 * The end is included when it lies on the grid; otherwise the last value is the largest one below it
 * (`0:1:0.3` gives 0, 0.3, 0.6, 0.9).
 *
 * Notes: value_i = (m_start + i * m_step) / 10^s for i = 0 .. floor((m_end - m_start) / m_step),
 * with m the mantissas at the common scale s.
 */

/** A decimal read exactly: value = mantissa / 10^scale. */
export interface ExactDecimal {
  readonly mantissa: bigint;
  readonly scale: number;
}

const DECIMAL = /^(-?)(\d*)(?:\.(\d*))?$/;

/** Reads `-12.50`, `0.02`, `.5` or `3` exactly; undefined for anything else (exponents included). */
export function parseExactDecimal(text: string): ExactDecimal | undefined {
  const match = DECIMAL.exec(text.trim());
  if (match === null) return undefined;
  const [, sign = '', whole = '', fraction = ''] = match;
  if (whole === '' && fraction === '') return undefined;
  const mantissa = BigInt(`${whole}${fraction}` || '0');
  return { mantissa: sign === '-' ? -mantissa : mantissa, scale: fraction.length };
}

/** The shortest decimal text of mantissa / 10^scale: no trailing zeros, no exponent, no `-0`. */
export function exactDecimalText(value: ExactDecimal): string {
  const negative = value.mantissa < 0n;
  const digits = (negative ? -value.mantissa : value.mantissa).toString().padStart(value.scale + 1, '0');
  const whole = digits.slice(0, digits.length - value.scale);
  const fraction = digits.slice(digits.length - value.scale).replace(/0+$/, '');
  const text = fraction === '' ? whole : `${whole}.${fraction}`;
  return negative && text !== '0' ? `-${text}` : text;
}

/** A parsed range, checked: step > 0 and start <= end. */
export type RangeOutcome =
  | { readonly status: 'ok'; readonly count: bigint; readonly valueText: (i: number) => string }
  | { readonly status: 'bad'; readonly message: string };

/**
 * Parses `start:end:step` (each an exact decimal). `count` is the number of values, found before any
 * is made, so that a caller can refuse a huge range without building it.
 */
export function parseDecimalRange(text: string): RangeOutcome {
  const parts = text.split(':');
  if (parts.length !== 3) return { status: 'bad', message: `"${text}" is not a range start:end:step` };
  const [start, end, step] = parts.map(parseExactDecimal);
  if (start === undefined || end === undefined || step === undefined) {
    return { status: 'bad', message: `"${text}" has a part that is not a plain decimal number (write 0.02, not 2e-2)` };
  }
  const scale = Math.max(start.scale, end.scale, step.scale);
  const [a, b, h] = [start, end, step].map((d) => d.mantissa * 10n ** BigInt(scale - d.scale)) as [bigint, bigint, bigint];
  if (h <= 0n) return { status: 'bad', message: `the step of "${text}" is not positive` };
  if (a > b) return { status: 'bad', message: `the start of "${text}" is above its end` };
  return { status: 'ok', count: (b - a) / h + 1n, valueText: (i) => exactDecimalText({ mantissa: a + BigInt(i) * h, scale }) };
}
