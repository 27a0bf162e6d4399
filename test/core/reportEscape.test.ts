// Escaping of user text for the terminal, HTML, Markdown and CSV cells, and the reports built with it.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { csvCell, escapeControls, escapeHtml, escapeMarkdown, markdownCode } from '../../core/report/escape';
import { REPORT_CSP, renderReportHtml } from '../../core/report/reportHtml';
import { renderReportMarkdown } from '../../core/report/reportMarkdown';
import { renderReportCsv } from '../../core/report/reportCsv';
import { sampleFit, sampleRecord } from '../fixtures/benchLog/sampleRecord';

/** What a hostile capture header or file name can carry: clear the screen, set the terminal's title, an 8-bit CSI, reorder the line. */
const CLEAR_SCREEN = '\u001b[2J\u001b[H';
const SET_TITLE = '\u001b]0;owned\u0007';
const C1_CSI = '\u009b31m';
const RIGHT_TO_LEFT = '\u202e';
/** Every character that acts instead of showing: C0, DEL, C1, the separators and the bidi controls. */
const ACTING = /[\u0000-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/;

describe('escapeControls', () => {
  it.each([
    [`CH1${CLEAR_SCREEN}`, 'CH1\\u001b[2J\\u001b[H'],
    [`x${SET_TITLE}y`, 'x\\u001b]0;owned\\u0007y'],
    [`${C1_CSI}red`, '\\u009b31mred'],
    [`gpj.${RIGHT_TO_LEFT}csv`, 'gpj.\\u202ecsv'],
    ['a\u0000b\u2066c\u2069', 'a\\u0000b\\u2066c\\u2069'],
    ['ring\nforged line\ttab\r', 'ring\\u000aforged line\\u0009tab\\u000d'],
    ['SN042 µ Ω 0.1 %', 'SN042 µ Ω 0.1 %'],
  ])('a field %j shows as %j', (input, expected) => {
    expect(escapeControls(input)).toBe(expected);
  });

  it('keeps the line feeds and tabs that lay out whole output, and nothing else', () => {
    expect(escapeControls(`a\tb\n${CLEAR_SCREEN}\r\n`, 'keep-layout')).toBe('a\tb\n\\u001b[2J\\u001b[H\\u000d\n');
  });

  it('leaves JSON output valid and equal to what was written, whatever its strings hold', () => {
    fc.assert(
      fc.property(fc.array(fc.string({ unit: 'binary' }), { maxLength: 4 }), (strings) => {
        const shown = escapeControls(JSON.stringify({ strings }), 'keep-layout');
        expect(shown).not.toMatch(ACTING);
        expect(JSON.parse(shown)).toEqual({ strings });
      }),
      { numRuns: 300 },
    );
  });
});

describe('escapeHtml', () => {
  it.each([
    ['<script>alert(1)</script>', '&lt;script&gt;alert(1)&lt;/script&gt;'],
    ['"><img src=x onerror=alert(1)>', '&quot;&gt;&lt;img src=x onerror=alert(1)&gt;'],
    ["it's & <b>", 'it&#39;s &amp; &lt;b&gt;'],
    ['SN042 µ Ω', 'SN042 µ Ω'],
    [`SN${RIGHT_TO_LEFT}042\u0000`, 'SN\\u202e042\\u0000'],
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

  it.each([
    ['---', '\\---'],
    ['=== heading underline', '\\=== heading underline'],
    ['1. item', '1\\. item'],
    ['# title', '\\# title'],
    ['-12.5 V', '-12.5 V'],
    // The escape's backslash is itself escaped, so the reader sees \u202e.
    [`SN${RIGHT_TO_LEFT}42`, 'SN\\\\u202e42'],
  ])('escapes a block marker or a control in %j', (input, expected) => {
    expect(escapeMarkdown(input)).toBe(expected);
  });
});

describe('markdownCode', () => {
  it('keeps a path with backticks and line breaks inside one code span on one line', () => {
    const out = markdownCode('/bench/a`b\n# Injected\r\n| x |');
    expect(out).toBe("`/bench/a'b\\u000a# Injected\\u000d\\u000a| x |`");
    expect(out.match(/`/g)).toHaveLength(2);
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
    [' =1+1', "' =1+1"],
    ['   @SUM(A1)', "'   @SUM(A1)"],
    ['\n=cmd|calc', `"'\n=cmd|calc"`],
    ['\u00a0+1+2', "'\u00a0+1+2"],
    [' -2+3', "' -2+3"],
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
    [' -12.5', '" -12.5"'],
  ])('numbers (and numeric text) stay numbers: %j', (input, expected) => {
    expect(csvCell(input)).toBe(expected);
  });

  it('writes empty cells for null, undefined and non-finite numbers', () => {
    expect([csvCell(null), csvCell(undefined), csvCell(Number.NaN), csvCell(Infinity)]).toEqual(['', '', '', '']);
  });
});

describe('reports of a record with hostile paths and fields', () => {
  const hostile = `x\n# Injected heading\n| forged | row |\n\`code\` ${RIGHT_TO_LEFT}\u0000`;
  const record = sampleRecord({
    unit: `SN${RIGHT_TO_LEFT}042`,
    note: hostile,
    capture: { ...sampleRecord().capture, path: `/bench/${hostile}.csv` },
    fit: sampleFit({ file: `${hostile}.csv`, channel: hostile }),
  });

  it('Markdown: nothing breaks out of a line, a table row or the reproduce code span', () => {
    const md = renderReportMarkdown([record]);
    expect(md).not.toMatch(/^# Injected/m);
    expect(md).not.toMatch(/^\| forged/m);
    expect(md).not.toMatch(/[\u0000\u202e]/);
    const reproduce = md.split('\n').filter((line) => line.startsWith('Reproduce: '));
    expect(reproduce).toHaveLength(1);
    // One code span: its opening and closing backtick, none from the path.
    expect(reproduce[0].match(/`/g)).toHaveLength(2);
    expect(reproduce[0]).toContain('\\u000a# Injected heading');
  });

  it('HTML: a Content-Security-Policy that allows no script, first in the head', () => {
    const html = renderReportHtml([record], { logPath: '/bench/log.jsonl', generatedAt: '2025-03-14T10:00:00.000Z', software: { name: 'ringbench', version: '0' } });
    const head = html.slice(html.indexOf('<head>'), html.indexOf('</head>'));
    const policy = /<meta http-equiv="Content-Security-Policy" content="([^"]+)">/.exec(head);
    expect(policy?.[1]).toBe(REPORT_CSP);
    expect(REPORT_CSP).toMatch(/default-src 'none'/);
    expect(REPORT_CSP).not.toMatch(/script-src|unsafe-eval/);
    // Before anything the policy governs (the style, the title).
    expect(head.indexOf('Content-Security-Policy')).toBeLessThan(head.indexOf('<style>'));
    expect(html).not.toMatch(/[\u0000\u202e]/);
    expect(html).toContain('SN\\u202e042');
  });

  it('CSV: a note starting with white space and a formula is neutralised, the record still one row', () => {
    const csv = renderReportCsv([sampleRecord({ note: ' =HYPERLINK("http://x","y")' })]);
    const rows = csv.trimEnd().split('\r\n');
    expect(rows).toHaveLength(2);
    expect(rows[1]).toContain(`"' =HYPERLINK(""http://x"",""y"")"`);
  });
});
