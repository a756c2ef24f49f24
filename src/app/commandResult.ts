import { jsonText } from '../io/planOutputs.js';

/**
 * What a use case returns: its summary (the content of summary.json or `--json`) and the short human
 * summary the CLI prints; a grid command stopped by Ctrl-C returns `interrupted` with what to say.
 */
export interface Done<Summary> {
  readonly status: 'done';
  readonly summary: Summary;
  /** The human summary, lines ending in line breaks. */
  readonly text: string;
}

export interface Interrupted {
  readonly status: 'interrupted';
  /** What was kept and how to go on, lines ending in line breaks. */
  readonly message: string;
  /** The signal that stopped it: Ctrl-C (SIGINT) or SIGTERM. */
  readonly signal: 'SIGINT' | 'SIGTERM';
}

/** What a front end prints of a finished use case: the summary as JSON (`--json`), else the human summary. */
export function printedText(result: Done<unknown>, json: boolean): string {
  return json ? jsonText(result.summary) : result.text;
}
