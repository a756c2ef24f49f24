import { joinMarkup, Markup, markup } from './markup.js';
import { PAGE_STYLE } from './pageStyle.js';

export interface PageSection {
  /** Anchor of the section: lower-case letters, digits and hyphens. */
  readonly id: string;
  readonly heading: string;
  /** Charts, tables, paragraphs, in order. */
  readonly blocks: readonly Markup[];
}

export interface PageSpec {
  /** Document title and main heading. */
  readonly title: string;
  /** One line under the heading. */
  readonly subtitle?: string;
  readonly sections: readonly PageSection[];
  /** Small print at the end. */
  readonly footer?: string;
}

const ID = /^[a-z][a-z0-9-]*$/;

/**
 * Content Security Policy of every report: nothing may be fetched (no scripts, fonts, images or
 * style sheets from anywhere); only the inline style sheet applies. A report is a single file that
 * opens offline and makes no network request.
 */
export const REPORT_CSP = "default-src 'none'; style-src 'unsafe-inline'; img-src data:; base-uri 'none'; form-action 'none'";

/**
 * A self-contained HTML5 document: inline CSS with a print style sheet, no scripts, a contents list
 * when there are three or more sections. The same spec always gives the same text.
 */
export function htmlPage(spec: PageSpec): string {
  for (const s of spec.sections) {
    if (!ID.test(s.id)) throw new RangeError(`section id "${s.id}" must be lower-case letters, digits and hyphens, starting with a letter`);
  }
  const nav =
    spec.sections.length >= 3 &&
    markup`<nav aria-label="contents"><ol>${spec.sections.map((s) => markup`<li><a href="#${s.id}">${s.heading}</a></li>`)}</ol></nav>`;
  const sections = spec.sections.map((s) => markup`<section id="${s.id}">
<h2>${s.heading}</h2>
${joinMarkup(s.blocks)}
</section>`);
  const page = markup`<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${REPORT_CSP}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${spec.title}</title>
<link rel="icon" href="data:,">
<style>${Markup.trusted(PAGE_STYLE)}</style>
</head>
<body>
<header>
<h1>${spec.title}</h1>
${spec.subtitle !== undefined && markup`<p>${spec.subtitle}</p>`}
${nav}
</header>
<main>
${joinMarkup(sections)}
</main>
${spec.footer !== undefined && markup`<footer><p>${spec.footer}</p></footer>`}
</body>
</html>
`;
  return page.text;
}

/** A paragraph of escaped text. */
export function paragraph(text: string): Markup {
  return markup`<p>${text}</p>`;
}
