import { describe, expect, it } from 'vitest';
import { coord, escapeText, htmlPage, htmlTable, joinMarkup, lineChart, Markup, markup, paragraph, periodAxis } from '../../src/report/index.js';

describe('escapeText', () => {
  it('turns the five markup characters into entities (HTML and XML alike)', () => {
    expect(escapeText(`<a href="x">Tom & Jerry's</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;Tom &amp; Jerry&#39;s&lt;/a&gt;');
  });
  it('escapes an ampersand once, so entities in input stay visible as text', () => {
    expect(escapeText('&amp;')).toBe('&amp;amp;');
  });
  it('replaces characters XML 1.0 forbids (section 2.2) with U+FFFD and keeps tab, newline, astral characters', () => {
    expect(escapeText('a\u0000b\u0008c\u001Fd\uFFFF')).toBe('a\uFFFDb\uFFFDc\uFFFDd\uFFFD');
    expect(escapeText('lone \uD800 surrogate')).toBe('lone \uFFFD surrogate');
    expect(escapeText('tab\tline\nok \u{1F50B}')).toBe('tab\tline\nok \u{1F50B}');
  });
});

describe('markup tag', () => {
  it('escapes strings, keeps nested Markup, rounds numbers, drops false/null/undefined', () => {
    const inner = markup`<b>${'<i>'}</b>`;
    expect(markup`<p title="${'"q"'}">${inner}${1 / 3}${false}${null}${undefined}${['a', '<', inner]}</p>`.text).toBe('<p title="&quot;q&quot;"><b>&lt;i&gt;</b>0.33a&lt;<b>&lt;i&gt;</b></p>');
  });
  it('joins fragments, skipping empty ones', () => {
    expect(joinMarkup([markup`<a/>`, null, '<x>'], ',').text).toBe('<a/>,&lt;x&gt;');
  });
  it('only Markup.trusted makes markup from raw text', () => {
    expect(Markup.trusted('<b/>').text).toBe('<b/>');
    expect(String(paragraph('<b/>'))).toBe('<p>&lt;b/&gt;</p>');
  });
});

describe('coord', () => {
  it('rounds to 1/100 px, shortest text, no -0, no exponent, refuses NaN', () => {
    expect(coord(1 / 3)).toBe('0.33');
    expect(coord(12)).toBe('12');
    expect(coord(-0.001)).toBe('0');
    expect(coord(0.1 + 0.2)).toBe('0.3');
    expect(() => coord(Number.NaN)).toThrow(RangeError);
    expect(() => coord(Number.POSITIVE_INFINITY)).toThrow(RangeError);
  });
});

describe('text put into a page or chart is escaped everywhere', () => {
  const hostile = '</title><script>alert("x")</script> & \'q\'';
  const periods = [
    { start: '2027-01-01T00:00:00+01:00', end: '2027-01-01T01:00:00+01:00' },
    { start: '2027-01-01T01:00:00+01:00', end: '2027-01-01T02:00:00+01:00' },
  ];
  const chart = lineChart({ id: 'c', title: hostile, caption: hostile, x: periodAxis(periods, hostile), y: { label: hostile, unit: hostile }, series: [{ name: hostile, values: [1, 2] }], guides: [{ value: 1.5, label: hostile }] });
  const page = htmlPage({ title: hostile, subtitle: hostile, footer: hostile, sections: [{ id: 's', heading: hostile, blocks: [chart, htmlTable({ caption: hostile, columns: [{ header: hostile, unit: hostile }], rows: [[hostile]] })] }] });

  it('no raw script tag and no raw quote survives; the text is there, escaped', () => {
    expect(page).not.toMatch(/<script/i);
    expect(page).not.toContain('alert("x")');
    expect(page).toContain('&lt;/title&gt;&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; &#39;q&#39;');
  });
  it('the page has exactly one <title> and one <svg>, as written', () => {
    expect(page.match(/<title>/g)).toHaveLength(1);
    expect(page.match(/<svg /g)).toHaveLength(1);
  });
  it('refuses ids that would need escaping', () => {
    expect(() => lineChart({ id: 'a b"', title: '', caption: '', x: periodAxis(periods, 'UTC'), y: { label: 'y', unit: '-' }, series: [] })).toThrow(/chart id/);
    expect(() => htmlPage({ title: 't', sections: [{ id: '#x', heading: 'h', blocks: [] }] })).toThrow(/section id/);
  });
});
