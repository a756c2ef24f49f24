/**
 * Estimated width of a line of text in a sans-serif face [px], for laying out legends, tick labels
 * and captions before a browser measures anything. The per-character advances [em] are those of a
 * wide common sans face (DejaVu Sans, the fallback on many Linux systems, measured in Chromium:
 * lower case 0.56 on average, capitals 0.67, digits 0.64) rounded up, so narrower faces only leave
 * more room; the browser test measures the real boxes and fails on any overlap.
 *
 * @param text one line of text
 * @param fontSize font size [px]
 */
export function textWidth(text: string, fontSize: number): number {
  let em = 0;
  for (const ch of text) em += advance(ch);
  return em * fontSize;
}

function advance(ch: string): number {
  if (" .,:;'|iljI".includes(ch)) return 0.34;
  if ('()[]!rtf'.includes(ch)) return 0.42;
  if ('mwMW%'.includes(ch)) return 0.95;
  if (/[A-Z]/.test(ch)) return 0.7;
  if (/[0-9]/.test(ch)) return 0.64;
  if ('\u2212+=<>~\u25b2\u25bc'.includes(ch)) return 0.84;
  return 0.6;
}

/** Greedy word wrap of `text` into lines no wider than `maxWidth` [px] at `fontSize` [px]. */
export function wrapText(text: string, maxWidth: number, fontSize: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/).filter((w) => w !== '')) {
    const candidate = line === '' ? word : `${line} ${word}`;
    if (line !== '' && textWidth(candidate, fontSize) > maxWidth) {
      lines.push(line);
      line = word;
    } else {
      line = candidate;
    }
  }
  if (line !== '') lines.push(line);
  return lines;
}
