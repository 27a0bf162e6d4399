// The HTML, Markdown and CSV reports: content, yield, escaping of hostile text, self-containment.
import { describe, expect, it } from 'vitest';
import { renderReportHtml, type ReportOptions } from '../../core/report/reportHtml';
import { renderReportMarkdown } from '../../core/report/reportMarkdown';
import { renderReportCsv } from '../../core/report/reportCsv';
import { summarizeYield } from '../../core/report/yieldSummary';
import { formatLogTable } from '../../core/report/logTable';
import { reproduceCommand } from '../../core/report/reproduce';
import { evaluateResponse } from '../../core/response/secondOrder';
import { evaluateCautions } from '../../core/safety/evaluateCautions';
import type { BenchRecord } from '../../core/report/benchRecord';
import { sampleDesign, sampleFit, sampleRecord, sampleTransitions, sampleVerdict } from '../fixtures/benchLog/sampleRecord';

const HOSTILE = ['<script>alert(1)</script>', '"><img src=x onerror=alert(2)>', "'><svg onload=alert(3)>"];

const design = sampleDesign();
const checked = (id: string, unit: string, pass: boolean, time: string): BenchRecord =>
  sampleRecord({
    id,
    unit,
    time,
    verdict: sampleVerdict(pass),
    design: { path: '/bench/gate-loop.json', name: design.name, sha256: 'cd'.repeat(32), spec: design },
  });

const records: BenchRecord[] = [
  checked('00000000000a', 'SN040', true, '2025-03-14T09:00:00.000Z'),
  checked('00000000000b', 'SN041', false, '2025-03-14T09:10:00.000Z'),
  checked('00000000000c', 'SN041', true, '2025-03-14T09:40:00.000Z'), // reworked: latest decides
  checked('00000000000d', 'SN043', false, '2025-03-14T09:20:00.000Z'),
  sampleRecord({ id: '00000000000e', unit: 'SN044', time: '2025-03-14T09:30:00.000Z' }),
];

/** A logged step with its transition metrics, and a ringdown whose transitions were not measured. */
const withTransitions = sampleRecord({ id: '0000000000a1', fit: sampleFit({ transitions: sampleTransitions() }) });
const ringdown = sampleRecord({
  id: '0000000000a2',
  fit: sampleFit({ transitions: { ...sampleTransitions(), reason: 'a ringdown about one level has no step to measure', measured: null, model: null } }),
});

const options: ReportOptions = {
  logPath: '/bench/bench.jsonl',
  generatedAt: '2025-03-14T12:00:00.000Z',
  software: { name: 'ringbench', version: '0.1.0' },
};

/** A synthetic capture of the logged fit: the gate loop's step response. */
function traceFor(record: BenchRecord) {
  const time = Float64Array.from({ length: 1300 }, (_, i) => i * 1e-9);
  const f = record.fit;
  const values = evaluateResponse(
    { t0: f.t0.value, yPre: 0, yFinal: f.finalValue.value, alpha: f.alpha.value, omega0: f.omega0.value, a: -f.finalValue.value, b: -f.alpha.value * f.finalValue.value },
    time,
  );
  return { time, values, unit: 'V', name: 'CH1' };
}

describe('summarizeYield', () => {
  it('takes each unit from its latest checked measurement; yield is pass / (pass + fail)', () => {
    const summary = summarizeYield(records);
    expect(summary.units.map((u) => [u.unit, u.status, u.records.length])).toEqual([
      ['SN040', 'pass', 1],
      ['SN041', 'pass', 2],
      ['SN043', 'fail', 1],
      ['SN044', 'not checked', 1],
    ]);
    expect([summary.pass, summary.fail, summary.notChecked]).toEqual([2, 1, 1]);
    expect(summary.yieldPercent).toBeCloseTo(200 / 3, 12);
  });

  it('a later unchecked measurement does not erase an earlier verdict', () => {
    const later = sampleRecord({ id: '00000000000f', unit: 'SN043', time: '2025-03-14T11:00:00.000Z' });
    expect(summarizeYield([...records, later]).units.find((u) => u.unit === 'SN043')!.status).toBe('fail');
  });

  it('has no yield when nothing was checked', () => {
    expect(summarizeYield([sampleRecord()]).yieldPercent).toBeNull();
    expect(summarizeYield([])).toEqual({ units: [], pass: 0, fail: 0, notChecked: 0, yieldPercent: null });
  });
});

describe('renderReportHtml', () => {
  const traces = Object.fromEntries(records.map((r) => [r.id, traceFor(r)]));
  const html = renderReportHtml(records, { ...options, traces, recordNotes: { '00000000000e': ['The capture /bench/x.csv is missing.'] } });

  it('is one self-contained document: inline style, no scripts, no external resources', () => {
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
    expect(html).toContain('<style>');
    expect(html).toContain('@media print');
    expect(html).not.toMatch(/<script|<link|<img|<iframe|@import|url\(http/i);
    // The only URL is the SVG namespace name, which is never fetched.
    const urls = [...html.matchAll(/https?:\/\/[^\s"'<)]+/g)].map((m) => m[0]);
    expect(new Set(urls)).toEqual(new Set(['http://www.w3.org/2000/svg']));
  });

  it('has the yield table with a row per unit, its status and the totals', () => {
    const table = /<table class="yield-table">([\s\S]*?)<\/table>/.exec(html)![1];
    expect(table.match(/<tr>/g)!.length).toBe(1 + 4 + 1);
    expect(table).toContain('2 pass · 1 fail · 1 not checked');
    expect(table).toContain('66.7 %');
    expect(table).toMatch(/SN043<\/a>.*badge fail/);
    expect(table).toMatch(/SN044<\/a>.*badge not-checked/);
  });

  it('shows every measurement with its fit values in engineering notation and its verdict per quantity', () => {
    expect(html.match(/<article class="measurement"/g)!.length).toBe(records.length);
    expect(html).toContain('24.00 Ms^-1 ± 110 ks^-1 (0.46 %)');
    expect(html).toContain('<table class="verdict">');
    expect(html).toMatch(/Likely cause: R about 29\.0 % high/);
    expect(html).toContain('The capture /bench/x.csv is missing.');
  });

  it('draws one plot per measurement with a capture, with fit, prediction and band for a design', () => {
    expect(html.match(/<svg /g)!.length).toBe(records.length);
    expect(html.match(/class="prediction"/g)!.length).toBe(4);
    expect(html.match(/class="band"/g)!.length).toBe(4);
    expect(html.match(/<polyline class="fit"/g)!.length).toBe(records.length);
    const ids = [...html.matchAll(/clipPath id="([^"]+)"/g)].map((m) => m[1]);
    expect(new Set(ids).size).toBe(ids.length);
  });

  it('tells how to reproduce each fit: command, capture hash, software version', () => {
    expect(html).toContain('ringbench fit /bench/captures/sn042-gate.csv --topology series --known C=2.2n');
    expect(html).toContain('ab'.repeat(32));
    expect(html).toMatch(/Logged by ringbench 0\.1\.0/);
  });

  it('always carries the deferral to local codes', () => {
    expect(html).toMatch(/follow your local electrical codes/);
  });

  it('shows rise time, overshoot, peak time and settling time, model ± uncertainty beside the measured value, and the level method', () => {
    const page = renderReportHtml([withTransitions, ringdown], options);
    const table = /<table class="transitions">([\s\S]*?)<\/table>/.exec(page)![1];
    expect(table).toContain('<th>Model (fit)</th><th>Measured (samples)</th>');
    expect(table).toContain('<tr><th scope="row">rise time</th><td class="num">4.583 ns ± 21 ps (0.46 %)</td><td class="num">4.61 ns</td></tr>');
    expect(table).toContain('<tr><th scope="row">overshoot</th><td class="num">68.61 % ± 0.21 % (0.31 %)</td><td class="num">69.3 %</td></tr>');
    expect(table).toMatch(/peak time<\/th><td class="num">15\.72 ns ± 110 ps/);
    expect(table).toContain('<tr><th scope="row">settling (2 %)</th><td class="num">161.10 ns ± 900 ps (0.56 %)</td><td class="num">163 ns</td></tr>');
    expect(page).toContain('State levels: fitted model; peak and settling times from t0.');
    expect(page).toContain('Not measured: a ringdown about one level has no step to measure.');
    expect(page.match(/<table class="transitions">/g)).toHaveLength(1);
  });

  it('leaves the transitions out for a record logged without them', () => {
    expect(html).not.toContain('Transitions');
  });

  it.each(HOSTILE)('escapes hostile text everywhere it can appear: %s', (attack) => {
    const hostile = sampleRecord({
      id: '0000000000ff',
      unit: attack,
      operator: attack,
      note: attack,
      fit: { ...sampleRecord().fit, file: attack, channel: attack, warnings: [attack], message: attack, status: 'max-iterations', transitions: { ...sampleTransitions(), warnings: [attack] } },
      capture: { path: attack, sha256: attack, bytes: 1, channel: attack },
      verdict: sampleVerdict(false),
      design: { path: attack, name: attack, sha256: attack, spec: design },
    });
    const page = renderReportHtml([hostile], {
      ...options,
      title: attack,
      logPath: attack,
      traces: { '0000000000ff': { ...traceFor(hostile), name: attack } },
      recordNotes: { '0000000000ff': [attack] },
      logNotes: [attack],
    });
    expect(page).not.toContain(attack);
    expect(page).not.toMatch(/<(script|img|svg onload)[\s>]/i);
    // Attribute text inside a real tag would be live; the same words as escaped text are not.
    // Quoted attribute values cannot be left (quotes are escaped), so look at the tags without them.
    expect(page.replace(/"[^"]*"/g, '""')).not.toMatch(/<[a-z][^>]*\son(error|load)=/i);
    expect(page).toContain('&lt;');
  });
});

describe('renderReportMarkdown', () => {
  const md = renderReportMarkdown(records, { meta: ['Log /bench/bench.jsonl'] });

  it('has the summary table, the yield and a section per unit', () => {
    expect(md).toMatch(/^# Bench report/);
    expect(md).toContain('| SN043 | 1 | 2025-03-14 09:20:00 UTC | gate loop rev C | fail |');
    expect(md).toContain('**Yield 66.7 %**: 2 pass, 1 fail, 1 not checked.');
    expect(md.match(/^## SN0\d\d: /gm)!.length).toBe(4);
    expect(md).toContain('| alpha | 24.00 Ms^-1 ± 110 ks^-1 (0.46 %) |');
    expect(md).toMatch(/follow your local electrical codes/);
  });

  it('has the transitions table and names the level method', () => {
    const out = renderReportMarkdown([withTransitions, ringdown]);
    expect(out).toContain('Transitions, state levels: fitted model; peak and settling times from t0.');
    expect(out).toContain('| Quantity | Model (fit) | Measured (samples) |');
    expect(out).toContain('| rise time | 4.583 ns ± 21 ps (0.46 %) | 4.61 ns |');
    expect(out).toContain('| overshoot | 68.61 % ± 0.21 % (0.31 %) | 69.3 % |');
    expect(out).toMatch(/\| peak time \| 15\.72 ns ± 110 ps .* \| 15\.8 ns \|/);
    expect(out).toContain('| settling (2 %) | 161.10 ns ± 900 ps (0.56 %) | 163 ns |');
    expect(out).toContain('Transitions, not measured: a ringdown about one level has no step to measure.');
  });

  it.each(HOSTILE)('escapes hostile text: %s', (attack) => {
    const out = renderReportMarkdown([sampleRecord({ unit: `${attack}|x`, note: attack, operator: attack })]);
    expect(out).not.toContain(attack);
    expect(out).not.toMatch(/<(script|img|svg)/i);
    expect(out).toContain('&lt;');
  });
});

/** RFC 4180 rows (quoted cells may hold commas, quotes and line breaks). */
function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') cell += text[++i];
      else if (c === '"') quoted = false;
      else cell += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') row.push(cell), (cell = '');
    else if (c === '\r' && text[i + 1] === '\n') {
      row.push(cell), rows.push(row), (row = []), (cell = ''), i++;
    } else cell += c;
  }
  return rows;
}

describe('renderReportCsv', () => {
  it('writes one row per measurement with numbers in SI base units', () => {
    const rows = parseCsv(renderReportCsv(records));
    expect(rows).toHaveLength(1 + records.length);
    const header = rows[0];
    expect(new Set(rows.map((r) => r.length))).toEqual(new Set([header.length]));
    const row = rows[3];
    const cell = (name: string) => row[header.indexOf(name)];
    expect(cell('unit')).toBe('SN041');
    expect(Number(cell('alpha_per_s'))).toBe(2.4e7);
    expect(Number(cell('f0_hz'))).toBeCloseTo(32e6, 6);
    expect(cell('verdict')).toBe('pass');
    expect(cell('design')).toBe('gate loop rev C');
    expect(cell('note')).toBe('gate loop, after rework of R12');
    expect(cell('R_ohm')).toBe('');
    expect(cell('decision')).toBe(records[2].verdict?.decision ?? '');
    expect(cell('decision_rule')).toBe(records[2].verdict?.rule?.name ?? '');
  });

  it('keeps the station and the guard-banded decision with its rule, empty where a record has none', () => {
    const rows = parseCsv(renderReportCsv([sampleRecord({ station: 'fixture 3' }), sampleRecord()]));
    const header = rows[0];
    const cell = (r: number, name: string) => rows[r][header.indexOf(name)];
    expect(cell(1, 'station')).toBe('fixture 3');
    expect(cell(2, 'station')).toBe('');
    expect(header.indexOf('decision')).toBe(header.indexOf('verdict') + 1);
  });

  it('neutralises formula cells from user text but leaves numbers alone (common practice, OWASP "CSV Injection")', () => {
    const csv = renderReportCsv([sampleRecord({ unit: '=cmd|\'/C calc\'!A0', note: '@SUM(1+1)', operator: '-5' })]);
    const row = csv.split('\r\n')[1];
    expect(row).toContain(`'=cmd|'/C calc'!A0`);
    expect(row).toContain("'@SUM(1+1)");
    expect(row).toMatch(/,-5,/);
    expect(row).not.toMatch(/,[=+@]/);
  });

  it('has model, uncertainty and measured columns for each transition metric and the level method', () => {
    const rows = parseCsv(renderReportCsv([withTransitions, ringdown, sampleRecord()]));
    const header = rows[0];
    const cell = (r: number, name: string) => rows[r][header.indexOf(name)];
    for (const name of ['rise_time_s', 'rise_time_s_stderr', 'rise_time_measured_s', 'overshoot_pct', 'overshoot_measured_pct', 'peak_time_s', 'peak_time_measured_s', 'settling_2pct_s', 'settling_2pct_s_stderr', 'settling_2pct_measured_s', 'transition_levels']) {
      expect(header).toContain(name);
    }
    expect(new Set(rows.map((r) => r.length))).toEqual(new Set([header.length]));
    expect(Number(cell(1, 'rise_time_s'))).toBe(4.583e-9);
    expect(Number(cell(1, 'rise_time_s_stderr'))).toBe(0.021e-9);
    expect(Number(cell(1, 'overshoot_measured_pct'))).toBe(69.3);
    expect(Number(cell(1, 'settling_2pct_measured_s'))).toBe(1.63e-7);
    expect(cell(1, 'transition_levels')).toBe('fitted model');
    for (const r of [2, 3]) expect([cell(r, 'rise_time_s'), cell(r, 'overshoot_measured_pct'), cell(r, 'transition_levels')]).toEqual(['', '', '']);
  });

  it('lists the fired caution ids', () => {
    const cautions = evaluateCautions({ peakVoltage: 400 });
    const csv = renderReportCsv([sampleRecord({ cautions: { fired: cautions.fired, energies: {} } })]);
    expect(csv).toContain('accessible-ac-peak;de-energize-50v;elv-ac-crest;elv-dc');
  });
});

describe('a peak not weighed for the cautions', () => {
  it('is said in HTML and Markdown', () => {
    const note = 'the channel states no unit, so its peak was weighed neither as a voltage nor as a current; state V or A with --value-unit';
    const record = sampleRecord({ cautions: { fired: [], energies: {}, peakNotWeighed: note } });
    expect(renderReportHtml([record], options)).toContain(`Not weighed: ${note}.`);
    expect(renderReportMarkdown([record])).toContain(`Not weighed for the cautions: ${note}.`);
  });
});

describe('formatLogTable and reproduceCommand', () => {
  it('prints time, unit, regime, f0, zeta and verdict per record', () => {
    const table = formatLogTable(records.slice(0, 2)).split('\n');
    expect(table[0]).toMatch(/^time\s+unit\s+regime\s+f0\s+zeta\s+verdict$/);
    expect(table[1]).toMatch(/^2025-03-14 09:00:00\s+SN040\s+underdamped\s+32 MHz\s+0\.119\s+pass$/);
    expect(table[2]).toMatch(/SN041 .* fail$/);
  });

  it('shows control and bidirectional characters in a unit id escaped', () => {
    const table = formatLogTable([sampleRecord({ unit: 'SN\u001b[2J42\u202e\u0000' })]);
    expect(table).toContain('SN\\u001b[2J42\\u202e\\u0000');
    expect(table).not.toMatch(/[\u0000-\u0009\u000b-\u001f\u202e]/);
  });

  it('quotes paths and values for a POSIX shell', () => {
    const record = sampleRecord({
      capture: { path: "/bench/o'brien run/cap.csv", sha256: 'ab'.repeat(32), bytes: 1, channel: 'CH1' },
      settings: { topology: null, known: null, column: 'V C', sampleInterval: '2n', from: '-10n', to: null, sortTime: true },
    });
    expect(reproduceCommand(record)).toBe(`ringbench fit '/bench/o'\\''brien run/cap.csv' --column 'V C' --sample-interval 2n --from -10n --sort-time`);
  });

  it('runs a logged fit again with every reading, mode and setup option the record states', () => {
    const record = sampleRecord({
      settings: {
        topology: 'series', known: 'C=1n', column: null, sampleInterval: null, from: null, to: null, sortTime: false,
        segment: '2', event: '3', probeRatio: '10', invert: true, jumpStart: true, modes: '2', mode: '2', scopeBandwidth: '200M', probeCapacitance: '10p', groundLead: '6in',
      },
    });
    expect(reproduceCommand(record)).toBe(
      `ringbench fit ${record.capture.path} --topology series --known C=1n --segment 2 --event 3 --probe-ratio 10 --invert --jump-start --modes 2 --mode 2 --scope-bandwidth 200M --probe-capacitance 10p --ground-lead 6in`,
    );
    // Without a known part (a record checked against a design) fit would refuse --mode: it is left out.
    expect(reproduceCommand(sampleRecord({ settings: { ...record.settings, known: null, topology: null } }))).not.toContain('--mode ');
  });
});
