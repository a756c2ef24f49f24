/** Where JSON text first goes wrong, what is wrong there, and what to do. */
export interface JsonSyntaxError {
  /** 0-based offset of the offending character (the text's length when the text ends too early). */
  readonly offset: number;
  readonly message: string;
  readonly fix: string;
}

const NUMBER = /-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][+-]?\d+)?/y;
const STRING_BODY = /(?:[^"\\\u0000-\u001f]|\\(?:["\\/bfnrt]|u[0-9a-fA-F]{4}))*/y;
const WORD = /[A-Za-z_$][\w$]*|-?Infinity/y;

/**
 * Finds the first syntax error in JSON text (RFC 8259), or null when the text is valid JSON.
 *
 * Written because the JavaScript engine's own messages do not always give a position; this scanner
 * names the offset of the first wrong character and the usual mistake behind it (trailing comma,
 * single quotes, NaN, comments, unquoted names). It walks the text once with an explicit stack, so
 * deeply nested garbage cannot overflow the call stack.
 */
export function jsonSyntaxError(text: string): JsonSyntaxError | null {
  const containers: ('object' | 'array')[] = [];
  let i = 0;
  const skipSpace = (): void => {
    while (i < text.length && (text[i] === ' ' || text[i] === '\t' || text[i] === '\n' || text[i] === '\r')) i++;
  };
  const fail = (expected: string): JsonSyntaxError => unexpected(text, i, expected);
  const readString = (): JsonSyntaxError | null => {
    i++; // opening quote
    STRING_BODY.lastIndex = i;
    STRING_BODY.exec(text);
    i = STRING_BODY.lastIndex;
    if (text[i] === '"') {
      i++;
      return null;
    }
    if (i >= text.length) return { offset: i, message: 'a quoted text is not closed', fix: 'add the closing double quote' };
    if (text[i] === '\\') return { offset: i, message: 'a backslash in a quoted text starts no valid escape', fix: 'write a backslash as \\\\ (paths may use forward slashes)' };
    return { offset: i, message: 'a line break or control character inside a quoted text', fix: 'close the quote on the same line' };
  };
  /** Reads `"name":` inside an object; returns an error or null. */
  const readName = (): JsonSyntaxError | null => {
    skipSpace();
    if (text[i] !== '"') return fail('a field name in double quotes');
    const error = readString();
    if (error !== null) return error;
    skipSpace();
    if (text[i] !== ':') return fail('":" after the field name');
    i++;
    return null;
  };

  for (;;) {
    // A value starts here.
    skipSpace();
    const c = text[i];
    if (c === '{' || c === '[') {
      i++;
      skipSpace();
      if (text[i] === (c === '{' ? '}' : ']')) {
        i++;
      } else {
        containers.push(c === '{' ? 'object' : 'array');
        if (c === '{') {
          const error = readName();
          if (error !== null) return error;
        }
        continue;
      }
    } else if (c === '"') {
      const error = readString();
      if (error !== null) return error;
    } else if (c !== undefined && (c === '-' || (c >= '0' && c <= '9')) && matchAt(NUMBER, text, i)) {
      i = NUMBER.lastIndex;
    } else if (text.startsWith('true', i) || text.startsWith('null', i)) {
      i += 4;
    } else if (text.startsWith('false', i)) {
      i += 5;
    } else {
      return fail('a value');
    }
    // After a value: close containers or expect a comma.
    for (;;) {
      skipSpace();
      const top = containers[containers.length - 1];
      if (top === undefined) return i < text.length ? fail('the end of the file after the closing bracket') : null;
      const close = top === 'object' ? '}' : ']';
      if (text[i] === close) {
        containers.pop();
        i++;
        continue;
      }
      if (text[i] !== ',') {
        if (startsValue(text[i])) return { offset: i, message: 'a comma is missing before this entry', fix: 'end the entry before with a comma' };
        return fail(`"," or "${close}"`);
      }
      const comma = i;
      i++;
      skipSpace();
      if (text[i] === close) return { offset: comma, message: `a comma before "${close}"`, fix: 'remove the last comma: JSON allows none after the last entry' };
      if (top === 'object') {
        const error = readName();
        if (error !== null) return error;
      }
      break;
    }
  }
}

/** Whether a character can start a JSON value (or, in an object, a field name). */
function startsValue(c: string | undefined): boolean {
  return c !== undefined && /["{[\d\-tfn]/.test(c);
}

function matchAt(pattern: RegExp, text: string, at: number): boolean {
  pattern.lastIndex = at;
  return pattern.exec(text) !== null;
}

/** The error for an unexpected character at `at`, with the usual mistake it points to. */
function unexpected(text: string, at: number, expected: string): JsonSyntaxError {
  const c = text[at];
  if (c === undefined) return { offset: at, message: `the file ends where ${expected} was expected`, fix: 'close every {, [ and " that is opened' };
  if (c === "'") return { offset: at, message: 'single quotes', fix: 'JSON quotes names and texts with double quotes: "name"' };
  if (text.startsWith('//', at) || text.startsWith('/*', at)) return { offset: at, message: 'a comment', fix: 'remove the comment: JSON has none' };
  const word = matchAt(WORD, text, at) ? text.slice(at, WORD.lastIndex) : '';
  if (word === 'NaN' || word.endsWith('Infinity')) return { offset: at, message: `${word} is not a JSON number`, fix: 'give a finite number' };
  if (word !== '' && expected.startsWith('a field name')) return { offset: at, message: `the field name ${word.slice(0, 40)} is not in double quotes`, fix: `write it as "${word.slice(0, 40)}"` };
  if (word !== '') return { offset: at, message: `unexpected word ${word.slice(0, 40)} where ${expected} was expected`, fix: 'quote texts with double quotes; numbers use a dot as the decimal mark' };
  const shown = JSON.stringify(c);
  return { offset: at, message: `unexpected ${shown} where ${expected} was expected`, fix: 'check the quotes, commas and brackets around it' };
}
