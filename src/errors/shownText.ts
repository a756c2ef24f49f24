/** C0 and C1 controls, DEL, zero-width and direction marks and isolates, line and paragraph separators, BOM, lone surrogates. */
const INVISIBLE = /[\u0000-\u001f\u007f-\u009f\u200b-\u200f\u2028-\u202e\u2066-\u2069\ufeff]|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/g;
/** The same, but for the line break, which a terminal's text may hold. */
const INVISIBLE_BUT_LINE_BREAK = /[\u0000-\u0009\u000b-\u001f\u007f-\u009f\u200b-\u200f\u2028-\u202e\u2066-\u2069\ufeff]|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/g;
/** What JSON.stringify leaves raw that a terminal acts on or hides: DEL, C1 controls, marks, separators, BOM. */
const RAW_IN_JSON = /[\u007f-\u009f\u200b-\u200f\u2028-\u202e\u2066-\u2069\ufeff]/g;

/**
 * Text from an input file made safe to quote in a message: control characters and other invisible
 * code points are written as escapes (`\x00`, `\u200b`), and text longer than `maxChars` is cut with
 * its full length named, so that a file of garbage never floods or garbles the terminal.
 *
 * Example: shownText('ab\u0000c') is 'ab\x00c'; shownText('x'.repeat(100), 10) is 'xxxxxxxxxx... (100 characters)'.
 *
 * @param text text taken from an input
 * @param maxChars most characters kept [-], default 60
 */
export function shownText(text: string, maxChars = 60): string {
  const cut = text.length > maxChars ? text.slice(0, maxChars) : text;
  const escaped = cut.replace(INVISIBLE, escapeChar);
  return text.length > maxChars ? `${escaped}... (${text.length} characters)` : escaped;
}

/**
 * Text for a terminal: every control and invisible character escaped as shownText does, line breaks
 * kept, nothing cut. Whatever an input brought into a summary (a currency label, a path, a column
 * name) can then neither move the cursor, set the window title nor rewrite a line already printed.
 *
 * Example: terminalText('value 5 \u001b]0;owned\u0007EUR\n') is 'value 5 \x1b]0;owned\x07EUR\n'.
 */
export function terminalText(text: string): string {
  return text.replace(INVISIBLE_BUT_LINE_BREAK, escapeChar);
}

/**
 * JSON text for a terminal: JSON.stringify escapes the C0 controls but leaves DEL, the C1 controls
 * (e.g. U+009B, an 8-bit CSI) and the invisible marks raw; they are written as `\uXXXX` escapes, which
 * a JSON reader reads back as the same characters (RFC 8259, section 7), so the data stays the same.
 */
export function terminalJson(json: string): string {
  return json.replace(RAW_IN_JSON, (char) => `\\u${char.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

/** Whether the text holds a control or invisible character (those shownText escapes). */
export function hasInvisible(text: string): boolean {
  INVISIBLE.lastIndex = 0;
  const found = INVISIBLE.test(text);
  INVISIBLE.lastIndex = 0;
  return found;
}

function escapeChar(char: string): string {
  const code = char.charCodeAt(0);
  return code < 0x100 ? `\\x${code.toString(16).padStart(2, '0')}` : `\\u${code.toString(16).padStart(4, '0')}`;
}
