// The import summary on every face: the fit command's block and --json field, the bench log record and its
// check, and the HTML and Markdown reports.

import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';
import { parseBenchRecord } from '../../core/report/benchRecord';
import { renderReportHtml } from '../../core/report/reportHtml';
import { renderReportMarkdown } from '../../core/report/reportMarkdown';
import { benchLogRequestProblem } from '../../main/api/guards';
import { createBenchRecord } from '../../main/app/benchLogRecord';
import { measureFile } from '../../main/app/measureFile';
import { runCli } from '../../main/cli/program';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

async function fit(...args: string[]): Promise<string> {
  let out = '';
  const code = await runCli(['fit', ...args], { out: (t) => (out += t), err: () => {}, cwd: ROOT, interactive: false });
  expect(code).toBe(0);
  return out;
}

describe('fit', () => {
  it('prints what the importer inferred as a block before the results', async () => {
    const text = await fit('sample-captures/gate-drive-turn-on.csv', '--column', 'CH2');
    const lines = text.split('\n');
    expect(lines.slice(1, 5)).toEqual([
      '  import           UTF-8, semicolon-separated, decimal comma, LF line ends',
      '  table            header on line 6, data from line 7, 2,000 rows',
      "  time axis        column 'Time [ns]' in ns, every 50 ps",
      '  channels         CH1 (V): 2,000 samples; CH2 (V): 2,000 samples',
    ]);
    expect(lines[5]).toMatch(/^ {2}status /);
  });

  it('names the interval a preamble states and its line', async () => {
    const text = await fit('sample-captures/pulse-jig-discharge.csv');
    expect(text).toContain("  time axis        interval 40 ns from 'Sample Interval' on line 2\n");
    expect(text).toContain('  table            header on line 4, data from line 5, 2,000 rows\n');
  });

  it('carries the summary as the top-level import field of --json', async () => {
    const json = JSON.parse(await fit('sample-captures/half-bridge-clipped.csv', '--json')) as Record<string, unknown>;
    const expected = parseCapture(readFileSync(path.join(ROOT, 'sample-captures', 'half-bridge-clipped.csv'), 'utf8')).importSummary;
    expect(json.import).toEqual(JSON.parse(JSON.stringify(expected)));
    expect((json.import as typeof expected).channels[0].clipped).toBeGreaterThan(0);
  });
});

describe('the bench log and the reports', () => {
  const measured = measureFile('test/fixtures/capture/lc-filter-decimal-comma.csv', {}, ROOT, null, true);
  const record = createBenchRecord(measured, { unit: 'SN7', operator: null, note: null }, {}, { clock: () => new Date('2026-01-02T03:04:05Z'), newId: () => 'abcdefabcdef' });

  it('keeps the summary in the record, and still reads records logged without one', () => {
    expect(parseBenchRecord(JSON.stringify(record), 1).fit.import?.decimalMark).toBe(',');
    const { import: _dropped, ...oldFit } = record.fit;
    expect(parseBenchRecord(JSON.stringify({ ...record, fit: oldFit }), 1).fit.import).toBeUndefined();
    expect(() => parseBenchRecord(JSON.stringify({ ...record, fit: { ...record.fit, import: 5 } }), 3)).toThrow(/line 3: record field "fit.import"/);
  });

  it("checks a window's log request field by field, the summary too", () => {
    const { record: _r, schema: _s, id: _i, time: _t, software: _w, ...request } = JSON.parse(JSON.stringify(record));
    expect(benchLogRequestProblem(request)).toBeNull();
    const { import: _dropped, ...oldFit } = request.fit;
    expect(benchLogRequestProblem({ ...request, fit: oldFit })).toBeNull();
    const bad = (change: Record<string, unknown>) => benchLogRequestProblem({ ...request, fit: { ...request.fit, import: { ...request.fit.import, ...change } } });
    expect(bad({ delimiter: 'pipe' })).toMatch(/^fit: import: delimiter must be one of/);
    expect(bad({ lineEnd: 'LFCR' })).toMatch(/^fit: import: lineEnd/);
    expect(bad({ time: { kind: 'interval', interval: -1, from: 'option', key: null, line: null } })).toMatch(/^fit: import: time/);
    expect(bad({ channels: [{ name: 'CH1' }] })).toMatch(/^fit: import: channels/);
    expect(bad({ extra: 1 })).toBe('fit: import: has an unknown field "extra"');
  });

  it('shows it per measurement in the Markdown and HTML reports', () => {
    const markdown = renderReportMarkdown([record]);
    expect(markdown).toContain('How the file was read:');
    expect(markdown).toContain('- import: UTF-8, semicolon-separated, decimal comma, LF line ends');
    expect(markdown).toContain("- time axis: column 't \\[us\\]' in µs, every 500 ns");
    const html = renderReportHtml([record], { logPath: '/bench/log.jsonl', generatedAt: '2026-01-02T03:04:05Z', software: { name: 'ringbench', version: 'test' } });
    expect(html).toContain('<h4>How the file was read</h4>');
    expect(html).toContain('<tr><th scope="row">channels</th><td>V_out (V): 37 samples, 3 dropped; I_L (A): 39 samples, 1 dropped</td></tr>');
  });
});
