/**
 * Text of a tick or value label in a chart: a fixed number of decimals, the typographic minus sign
 * U+2212 for negative values (Unicode Standard, "Minus Sign"), never "-0". Large steps are shortened
 * with k (thousands) or M (millions) so a label stays short beside an axis.
 *
 * Examples: tickLabel(-20, 0) = "−20"; tickLabel(0.25, 2) = "0.25"; tickLabels([0, 20000, 40000], 20000)
 * = ["0", "20k", "40k"].
 */
export function tickLabel(value: number, decimals: number): string {
  const text = value.toFixed(decimals);
  if (Number(text) === 0) return (0).toFixed(decimals);
  return text.startsWith('-') ? `\u2212${text.slice(1)}` : text;
}

/**
 * Labels for a set of ticks `step` apart. In thousands (k) when the largest tick reaches 10 000 and
 * the step is at least 100, in millions (M) from 10 000 000 with a step of at least 100 000.
 */
export function tickLabels(values: readonly number[], step: number, decimals: number): string[] {
  const largest = Math.max(...values.map(Math.abs));
  for (const [factor, suffix] of [[1e6, 'M'], [1e3, 'k']] as const) {
    if (largest >= 10 * factor && step >= factor / 10) {
      const scaledDecimals = Math.max(0, decimals - Math.round(Math.log10(factor)), decimalsOf(step / factor));
      return values.map((v) => (v === 0 ? '0' : `${tickLabel(v / factor, scaledDecimals)}${suffix}`));
    }
  }
  return values.map((v) => tickLabel(v, decimals));
}

/** Decimals needed to write a ladder step exactly (0.5 -> 1, 0.02 -> 2, 20 -> 0). */
function decimalsOf(step: number): number {
  for (let d = 0; d < 12; d++) if (Math.abs(Number(step.toFixed(d)) - step) < 1e-9 * Math.max(1, step)) return d;
  return 12;
}

/**
 * A value for reading (tooltips, table cells, value labels): at most `maxDecimals` decimals with
 * trailing zeros dropped, typographic minus, never "-0". Example: numberText(-2.5, 3) = "−2.5".
 */
export function numberText(value: number, maxDecimals = 2): string {
  if (!Number.isFinite(value)) return String(value);
  const text = value.toFixed(maxDecimals).replace(/(\.\d*?)0+$/, '$1').replace(/\.$/, '');
  if (Number(text) === 0) return '0';
  return text.startsWith('-') ? `\u2212${text.slice(1)}` : text;
}
