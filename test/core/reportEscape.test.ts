// Escaping of user text for HTML, Markdown and CSV cells.
import { describe, expect, it } from 'vitest';
import { csvCell, escapeHtml, escapeMarkdown } from '../../core/report/escape';

describe('escapeHtml', () => {
  it.each([
    ['<script>alert(1)</script>', '&lt;script&gt;alert(1)&lt;/script&gt;'],
    ['"><img src=x onerror=alert(1)>', '&quot;&gt;&lt;img src=x onerror=alert(1)&gt;'],
    ["it's & <b>", 'it&#39;s &amp; &lt;b&gt;'],
    ['SN042 µ Ω', 'SN042 µ Ω'],
  ])('%s', (input, expected) => {
    expect(escapeHtml(input)).toBe(expected);
  });
});

describe('escapeMarkdown', () => {
  it('neutralises table pipes, emphasis, links, HTML and line breaks', () => {
    const out = escapeMarkdown('a|b *c* [x](http://e) <script>\nnext');
    expect(out).toBe('a\\|b \\*c\\* \\[x\\](http://e) &lt;script&gt; next');
    expect(out).not.toMatch(/<|\n/);
  });
});

describe('csvCell', () => {
  // Formula neutralising: common practice, see the OWASP "CSV Injection" page.
  it.each([
    ['=HYPERLINK("http://x","y")', `"'=HYPERLINK(""http://x"",""y"")"`],
    ['+1+cmd|calc', "'+1+cmd|calc"],
    ['-2+3', "'-2+3"],
    ['@SUM(A1)', "'@SUM(A1)"],
    ['\tTAB', "'\tTAB"],
    ['\rCR', `"'\rCR"`],
    ['plain', 'plain'],
    ['a,b', '"a,b"'],
    ['say "hi"', '"say ""hi"""'],
  ])('text %j becomes %j', (input, expected) => {
    expect(csvCell(input)).toBe(expected);
  });

  it.each([
    [-12.5, '-12.5'],
    [4.7e-9, '4.7e-9'],
    [0, '0'],
    ['-12.5', '-12.5'],
    ['+3e-6', '+3e-6'],
  ])('numbers (and numeric text) stay numbers: %j', (input, expected) => {
    expect(csvCell(input)).toBe(expected);
  });

  it('writes empty cells for null, undefined and non-finite numbers', () => {
    expect([csvCell(null), csvCell(undefined), csvCell(Number.NaN), csvCell(Infinity)]).toEqual(['', '', '', '']);
  });
});
