// The one table of result rows: which rows a fit has, how they read, and that every face follows it.
import { describe, expect, it } from 'vitest';
import { RESULT_ROWS, TRANSITION_ROWS, briefValue, fitResultRows, fitStateText, fitTransitionRows, hertz, regimeTag, rowQuantity } from '../../core/report/resultRows';
import { renderReportHtml } from '../../core/report/reportHtml';
import { formatFitText } from '../../core/report/fitText';
import { renderReportCsv } from '../../core/report/reportCsv';
import { renderReportMarkdown } from '../../core/report/reportMarkdown';
import { formatLogTable } from '../../core/report/logTable';
import { escapeMarkdown } from '../../core/report/escape';
import { sampleFit, sampleRecord, sampleTransitions } from '../fixtures/benchLog/sampleRecord';

const q = (value: number, stderr: number | null, unit: string) => ({ value, stderr, unit });
const withComponents = sampleFit({
  components: { topology: 'series', known: 'C=2.2n', R: q(1.94, 0.01, 'ohm'), L: q(11.2e-9, 0.1e-9, 'H'), C: q(2.2e-9, 0, 'F') },
});
const overdamped = sampleFit({ regime: 'overdamped', omegaD: undefined });
/** A first-order fit: a time constant, and no ring (alpha ... Q do not apply: NaN, no standard error). */
const firstOrder = sampleFit({
  regime: 'first-order',
  omegaD: undefined,
  tau: q(2e-6, 1e-8, 's'),
  alpha: q(NaN, null, 's^-1'),
  omega0: q(NaN, null, 'rad/s'),
  zeta: q(NaN, null, ''),
  Q: q(NaN, null, ''),
});
/** A fit that stopped at the iteration limit, as a log record from before the rule still carries its regime. */
const stopped = sampleFit({ status: 'max-iterations', message: 'stopped after 60 iterations without meeting the tolerance' });

describe('the result row table', () => {
  it('names every row by its key path in the fit summary, or by what it is derived from', () => {
    for (const spec of RESULT_ROWS) expect(rowQuantity(spec, spec.name === 'tau' ? firstOrder : withComponents), spec.name).toBeDefined();
    expect(new Set(RESULT_ROWS.map((r) => r.column)).size).toBe(RESULT_ROWS.length);
  });

  it('has omega_d only when underdamped and R, L, C only with components', () => {
    expect(fitResultRows(withComponents).map((r) => r.symbol)).toEqual(['alpha', 'omega0', 'omega_d', 'f0', 'zeta', 'Q', 'final value', 't0', 'R', 'L', 'C']);
    expect(fitResultRows(overdamped).map((r) => r.symbol)).toEqual(['alpha', 'omega0', 'f0', 'zeta', 'Q', 'final value', 't0']);
  });

  it('has tau only for a first-order fit, and leaves out the rates that do not apply to it (NaN, or null after JSON)', () => {
    expect(fitResultRows(firstOrder).map((r) => r.symbol)).toEqual(['tau', 'final value', 't0']);
    expect(fitResultRows(firstOrder)[0].text).toBe('2.000 µs ± 10 ns (0.5 %)');
    const throughJson = JSON.parse(JSON.stringify(firstOrder)) as typeof firstOrder;
    expect(throughJson.alpha.value).toBeNull();
    expect(fitResultRows(throughJson).map((r) => r.symbol)).toEqual(['tau', 'final value', 't0']);
    expect(briefValue(firstOrder, 'zeta')).toBe('-');
  });

  it('formats a row as value ± stderr and, briefly, as the value alone, in engineering notation', () => {
    const alpha = fitResultRows(withComponents)[0];
    expect(alpha.text).toBe('24.00 Ms^-1 ± 110 ks^-1 (0.46 %)');
    expect(alpha.brief).toBe('24 Ms^-1');
    expect(briefValue(withComponents, 'f0')).toBe('32 MHz');
    expect(briefValue(overdamped, 'omegaD')).toBe('-');
  });

  it('gives the event time no relative uncertainty: its zero is the trigger, not a physical origin', () => {
    const t0 = fitResultRows(withComponents).find((r) => r.name === 't0');
    expect(t0?.text).toMatch(/^-?[\d.]+ [a-zµ]*s ± [\d.]+ [a-zµ]*s$/);
    const early = fitResultRows(sampleFit({ t0: q(1e-12, 2e-9, 's') })).find((r) => r.name === 't0');
    expect(early?.text).toBe('0.0 ns ± 2.0 ns');
  });

  it('converts angular frequency to hertz with its uncertainty', () => {
    expect(hertz(q(2 * Math.PI * 1e3, 2 * Math.PI, 'rad/s'))).toEqual({ value: 1e3, stderr: 1, unit: 'Hz' });
    expect(hertz(q(1, null, 'rad/s')).stderr).toBeNull();
  });
});

describe('every face reads the table', () => {
  const rows = fitResultRows(withComponents);

  it('the command line text: one line per row, the components basis heading R, L, C', () => {
    const lines = formatFitText(withComponents).split('\n');
    const at = (label: string) => lines.findIndex((l) => l.startsWith(`  ${label.padEnd(16)} `));
    for (const row of rows) expect(lines[at(row.symbol)]).toBe(`  ${row.symbol.padEnd(16)} ${row.text}`);
    expect(at('components')).toBe(at('R') - 1);
    expect(lines[at('components')]).toContain('series, known C=2.2n');
    expect(formatFitText(overdamped)).not.toMatch(/omega_d|components/);
  });

  it('the command line text: the level method, then each transition metric from the model and as measured', () => {
    const text = formatFitText(sampleFit({ transitions: { ...sampleTransitions(), warnings: ['noise lifts the largest sample'] } }));
    expect(text).toContain('  transitions      state levels: fitted model; peak and settling times from t0\n');
    expect(text).toContain('  rise time        4.583 ns ± 21 ps (0.46 %), measured 4.61 ns\n');
    expect(text).toContain('  overshoot        68.61 % ± 0.21 % (0.31 %), measured 69.3 %\n');
    expect(text).toContain('  peak time        15.72 ns ± 110 ps (0.7 %), measured 15.8 ns\n');
    expect(text).toContain('  settling (2 %)   161.10 ns ± 900 ps (0.56 %), measured 163 ns\n');
    expect(text).toContain('  warning: transitions: noise lifts the largest sample\n');
    const ringdown = formatFitText(sampleFit({ transitions: { ...sampleTransitions(), reason: 'no step', model: null, measured: null } }));
    expect(ringdown).toContain('  transitions      not measured: no step\n');
    expect(ringdown).not.toContain('rise time');
  });

  it('a transition metric that is not defined reads as a dash', () => {
    const t = sampleTransitions();
    const rows = fitTransitionRows(sampleFit({ transitions: { ...t, model: { ...t.model!, peakTime: null }, measured: { ...t.measured!, peakTime: null } } }));
    expect(rows.map((r) => r.name)).toEqual(TRANSITION_ROWS.map((r) => r.name));
    expect(rows.find((r) => r.name === 'peakTime')).toMatchObject({ modelText: '–', measuredText: '–' });
  });

  it('the Markdown report: a table line per row', () => {
    const md = renderReportMarkdown([sampleRecord({ fit: withComponents })]);
    for (const row of rows) expect(md).toContain(`| ${escapeMarkdown(row.symbol)} | ${escapeMarkdown(row.text)} |`);
  });

  it('the CSV: a value and an uncertainty column per row, empty where the fit has no such row', () => {
    const [header, line] = renderReportCsv([sampleRecord({ fit: overdamped, note: null })]).split('\r\n');
    const cells = line.split(',');
    const columns = header.split(',');
    for (const spec of RESULT_ROWS) expect(columns).toContain(`${spec.column}_stderr`);
    expect(cells[columns.indexOf('omega_d_rad_per_s')]).toBe('');
    expect(Number(cells[columns.indexOf('f0_hz_stderr')])).toBeCloseTo(2.1e5 / (2 * Math.PI), 6);
  });

  it('the log table: f0 and zeta as brief values', () => {
    expect(formatLogTable([sampleRecord({ fit: overdamped })])).toMatch(/overdamped\s+32 MHz\s+0\.119\s/);
  });
});

describe('a failed fit has no regime in any report', () => {
  it("is a converged fit's only, and the state reads the status alone otherwise (comparisons, Markdown)", () => {
    expect(regimeTag(withComponents)).toBe('underdamped');
    expect(regimeTag(stopped)).toBeNull();
    expect(fitStateText(withComponents)).toBe('converged, underdamped');
    expect(fitStateText(stopped)).toBe('max-iterations');
  });

  it('the command line text: the status with its message, no regime line', () => {
    const text = formatFitText(stopped);
    expect(text).toContain('  status           max-iterations: stopped after 60 iterations without meeting the tolerance\n');
    expect(text).not.toMatch(/regime|underdamped/);
  });

  it('the log table and the CSV: an empty regime', () => {
    expect(formatLogTable([sampleRecord({ fit: stopped })])).toMatch(/SN042\s+-\s+32 MHz/);
    const [header, line] = renderReportCsv([sampleRecord({ fit: stopped, note: null })]).split('\r\n');
    const cells = line.split(',');
    const columns = header.split(',');
    expect(cells[columns.indexOf('status')]).toBe('max-iterations');
    expect(cells[columns.indexOf('regime')]).toBe('');
  });

  it('the Markdown and HTML reports: the status, no regime', () => {
    const records = [sampleRecord({ fit: stopped })];
    expect(renderReportMarkdown(records)).toContain('Fit: max-iterations.');
    expect(renderReportMarkdown(records)).not.toContain('underdamped');
    const html = renderReportHtml(records, { logPath: '/bench/bench.jsonl', generatedAt: '2025-03-14T12:00:00.000Z', software: { name: 'ringbench', version: '0.1.0' } });
    expect(html).toContain('<h4>Fit: max-iterations</h4>');
    expect(html).not.toContain('underdamped');
  });
});
