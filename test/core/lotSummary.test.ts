// The lot summary and its three forms: yields with a unit measured again, per-quantity statistics with
// Cp/Cpk and decision zones, failures by likely cause, flagged units; records with and without zones.
import { describe, expect, it } from 'vitest';
import type { Verdict } from '../../core/circuit/verdict';
import type { BenchRecord } from '../../core/report/benchRecord';
import type { DecisionZone } from '../../core/circuit/decisionRule';
import { summarizeLot } from '../../core/report/lotSummary';
import { renderLotHtml } from '../../core/report/lotHtml';
import { REPORT_CSP } from '../../core/report/reportHtml';
import { renderLotMarkdown } from '../../core/report/lotMarkdown';
import { renderLotCsv } from '../../core/report/lotCsv';
import { NOT_COUNTED_NOTE } from '../../core/report/lotText';
import { sampleRecord } from '../fixtures/benchLog/sampleRecord';

const q = (value: number, stderr: number | null, unit: string) => ({ value, stderr, unit });
const DESIGN = { path: '/bench/gate-loop.json', name: 'gate loop rev C', sha256: 'cd'.repeat(32), spec: undefined as never };
/** Resonance limits of the fixed set, rad/s (as capability.test.ts: 9.5 to 10.6, here in Mrad/s). */
const OMEGA0_LIMITS = { lower: 9.5e6, upper: 10.6e6 };

interface RowSpec {
  omega0: number;
  zone?: DecisionZone;
  cause?: 'R' | 'L' | 'C' | 'source';
  pass: boolean;
  decision?: DecisionZone;
}

let serial = 0;
/** A record of `unit` with a verdict on omega0 (and zeta, which has no limits); zones given only when `zoned`. */
function record(unit: string, spec: RowSpec, zoned = true): BenchRecord {
  serial++;
  const omega0 = {
    name: 'omega0',
    design: q(10e6, 0.3e6, 'rad/s'),
    measured: q(spec.omega0, 0.01e6, 'rad/s'),
    marginSigma: 1,
    inTolerance: spec.pass,
    ...(zoned ? { zone: spec.zone ?? (spec.pass ? 'pass' : 'fail'), limits: OMEGA0_LIMITS } : {}),
  };
  const zeta = { name: 'zeta', design: q(0.2, 0.01, ''), measured: q(0.2 + (spec.omega0 - 10e6) / 1e8, 0.001, ''), marginSigma: 0.1, inTolerance: true, ...(zoned ? { zone: 'pass', limits: null } : {}) };
  // R derived with C at its design value: shown with its zone, not counted in the decision.
  const R = { name: 'R', design: q(1.5, 0.04, 'ohm'), measured: q(1.5, 0.05, 'ohm'), marginSigma: 0, inTolerance: true, ...(zoned ? { zone: 'conditional-pass', limits: { lower: 1.425, upper: 1.575 }, counted: false } : {}) };
  const verdict = {
    pass: spec.pass,
    quantities: [omega0, zeta, R],
    rmsDifference: 0.01,
    likelyCause: spec.cause ? { component: spec.cause, change: spec.cause === 'L' ? -0.12 : 0.2, impliedValue: q(1, null, 'H'), explains: 0.9 } : null,
    sensitivities: { alpha: { R: 1, L: -1, C: 0 }, omega0: { R: 0, L: -0.5, C: -0.5 } },
    notes: [],
    ...(zoned
      ? { decision: spec.decision ?? spec.zone ?? (spec.pass ? 'pass' : 'fail'), rule: { name: 'guarded-acceptance', guardBandFactor: 1, coverageFactor: 2, source: 'default', reference: 'ILAC-G8:09/2019 4.2.2' } }
      : {}),
  } as unknown as Verdict;
  return sampleRecord({
    id: serial.toString(16).padStart(12, '0'),
    time: new Date(Date.UTC(2026, 11, 1, 8, 0, serial)).toISOString(),
    unit,
    verdict,
    design: DESIGN,
  });
}

// The fixed set of capability.test.ts as the units' final omega0: 9.8, 10.1, 10.0, 9.9, 10.2 Mrad/s.
function lot(zoned = true): BenchRecord[] {
  return [
    record('SN01', { omega0: 9.8e6, pass: true }, zoned),
    record('SN02', { omega0: 11.0e6, pass: false, cause: 'L' }, zoned), // fails first, reworked
    record('SN03', { omega0: 10.0e6, pass: true, zone: 'conditional-pass' }, zoned),
    record('SN02', { omega0: 10.1e6, pass: true }, zoned),
    record('SN04', { omega0: 9.9e6, pass: false, cause: 'R', zone: 'conditional-fail' }, zoned),
    record('SN05', { omega0: 10.2e6, pass: false, cause: 'R' }, zoned),
    sampleRecord({ id: 'ffffffffff01', unit: 'SN06', verdict: null, design: null }),
  ];
}

describe('summarizeLot', () => {
  const summary = summarizeLot(lot());

  it('counts first-pass yield on each unit\'s first checked measurement and final yield on its latest', () => {
    expect(summary.checkedUnits).toBe(5);
    expect(summary.notCheckedUnits).toBe(1);
    // First: SN01, SN03 accepted; SN02 failed first. Final: SN01, SN02, SN03.
    expect(summary.firstPass).toEqual({ count: 2, percent: 40 });
    expect(summary.final).toEqual({ count: 3, percent: 60 });
  });

  it('gives per quantity n, mean, sd, min, max and Cp/Cpk of the final values (hand computation of capability.test.ts)', () => {
    const omega0 = summary.groups[0].quantities.find((x) => x.name === 'omega0')!;
    expect(omega0.stats!.n).toBe(5);
    expect(omega0.stats!.mean).toBeCloseTo(10.0e6, 3);
    expect(omega0.stats!.sd).toBeCloseTo(0.15811388300841897e6, 3);
    expect([omega0.stats!.min, omega0.stats!.max]).toEqual([9.8e6, 10.2e6]);
    expect(omega0.capability.cp.value).toBeCloseTo(1.159502, 5);
    expect(omega0.capability.cpk.value).toBeCloseTo(1.054093, 5);
    expect(omega0.design).toBe(10e6);
    expect(omega0.zones).toEqual({ pass: 2, 'conditional-pass': 1, 'conditional-fail': 1, fail: 1 });
  });

  it('says Cp and Cpk are not defined for a quantity without limits', () => {
    const zeta = summary.groups[0].quantities.find((x) => x.name === 'zeta')!;
    expect(zeta.limits).toBeNull();
    expect(zeta.capability.cp).toEqual({ value: null, reason: 'no limits' });
    expect(zeta.capability.cpk).toEqual({ value: null, reason: 'no limits' });
  });

  it('marks a quantity the decisions do not count, and leaves it out of the units\' quantities outside pass', () => {
    const [omega0, , R] = summary.groups[0].quantities;
    expect([omega0.counted, R.counted]).toEqual([true, false]);
    expect(R.zones['conditional-pass']).toBe(5);
    expect(summary.flagged.find((u) => u.unit === 'SN03')!.outside).toEqual([{ name: 'omega0', zone: 'conditional-pass' }]);
    expect(summarizeLot(lot(false)).groups[0].quantities[2].counted).toBe(true);
  });

  it('bins the final failures by the likely cause, largest first, and lists failed and conditional units', () => {
    expect(summary.causes).toEqual([{ cause: 'R', units: ['SN04', 'SN05'] }]);
    expect(summary.flagged.map((u) => [u.unit, u.decision, u.firstPass])).toEqual([
      ['SN02', 'pass', false],
      ['SN03', 'conditional-pass', true],
      ['SN04', 'conditional-fail', false],
      ['SN05', 'fail', false],
    ]);
    expect(summary.flagged.find((u) => u.unit === 'SN05')!.likelyCause).toBe('R about 20.0 % high');
    expect(summary.zones).toEqual({ pass: 2, 'conditional-pass': 1, 'conditional-fail': 1, fail: 1 });
    expect(summary.rules.map((r) => r.name)).toEqual(['guarded-acceptance']);
  });

  it('reads records logged before decision zones: in tolerance is pass, out is fail, no limits', () => {
    const old = summarizeLot(lot(false));
    const omega0 = old.groups[0].quantities.find((x) => x.name === 'omega0')!;
    expect(omega0.zones).toEqual({ pass: 3, 'conditional-pass': 0, 'conditional-fail': 0, fail: 2 });
    expect(omega0.capability.cpk.reason).toBe('no limits');
    expect(old.zones).toEqual({ pass: 3, 'conditional-pass': 0, 'conditional-fail': 0, fail: 2 });
    expect(old.rules).toEqual([]);
    expect(old.final.count).toBe(3);
  });
});

describe('lot report forms', () => {
  const summary = summarizeLot(lot());
  const options = { logPaths: ['/lot/a.jsonl', '/lot/<b>.jsonl'], generatedAt: '2026-12-01T09:00:00.000Z', software: { name: 'ringbench', version: '0.1.0' } };

  it('HTML: self-contained, no script, yields, the table with Cp/Cpk, a histogram per quantity with limits and design', () => {
    const html = renderLotHtml(summary, options);
    expect(html).not.toMatch(/<script|https?:\/\/(?!www\.w3\.org)/);
    // The same policy as the bench report: nothing in the page may run a script.
    expect(html).toContain(`<meta http-equiv="Content-Security-Policy" content="${REPORT_CSP}">`);
    expect(html).toContain('&lt;b&gt;.jsonl');
    expect(html).toContain('<div class="value">40.0 %</div><div class="label">first-pass yield</div>');
    expect(html).toContain('<div class="value">60.0 %</div><div class="label">final yield</div>');
    expect(html).toContain('<td class="num">1.16<span class="interval">[0.40, 1.94]</span></td><td class="num">1.05<span class="interval">[0.27, 1.84]</span></td>');
    expect(html).toContain('not defined (no limits)');
    expect(html).not.toMatch(/NaN|Infinity/);
    expect(html.match(/<svg[^>]*class="lot-histogram"/g)).toHaveLength(3);
    expect(html.match(/class="limit"/g)).toHaveLength(4);
    expect(html.match(/class="design"/g)).toHaveLength(3);
    expect(html).toContain('<th scope="row">R †</th>');
    // A ratio's axis keeps plain numbers: 'zeta', ticks like 0.2, never 'zeta (m)' with 200.
    expect(html).toContain('>zeta</text>');
    expect(html).toMatch(/>0\.2<\/text>/);
    expect(html).not.toContain('zeta (m)');
    expect(html).toContain(`<p class="rule">${NOT_COUNTED_NOTE.replace(/'/g, '&#39;')}</p>`);
    expect(html).toContain('sample standard deviation');
    expect(html).toContain('Decision rule: guarded-acceptance, guard band w = 1 U, U = k u with k = 2 (the default');
  });

  it('Markdown: yields, the quantity table, cause bins and flagged units', () => {
    const md = renderLotMarkdown(summary);
    expect(md).toContain('- First-pass yield: 40.0 % (2 of 5)');
    // One prefix per row: the values in Mrad/s, the largest (USL 10.60) with 4 significant digits, s with its own 4.
    expect(md).toContain('| omega0 | Mrad/s | 5 | 10.00 | 0.1581 | 9.80 | 10.20 | 9.50 | 10.60 | 10.00 | 1.16 \\[0.40, 1.94\\] | 1.05 \\[0.27, 1.84\\] | 2 | 1 | 1 | 1 |');
    expect(md).toMatch(/\| zeta \| – \| 5 \| 0\.2000 \| 0\.001581 \| 0\.1980 \| 0\.2020 \| – \| – \| 0\.2000 \| not defined \(no limits\) \| not defined \(no limits\) \|/);
    expect(md).toContain('| R | 2 | SN04, SN05 |');
    expect(md).toMatch(/\| R † \| ohm \| 5 \|/);
    expect(md).toContain('| SN03 | conditional pass | yes | yes | 1 |');
    expect(md).toContain('| SN02 | pass | yes | no | 2 |');
  });

  it('CSV: one row per quantity, SI values, Cp and Cpk empty with the reason where not defined', () => {
    const [header, ...rows] = renderLotCsv(summary).trimEnd().split('\r\n').map((line) => line.split(','));
    expect(rows).toHaveLength(3);
    expect(rows.map((r) => r[header.indexOf('counted')])).toEqual(['yes', 'yes', 'no']);
    const omega0 = rows.find((r) => r[header.indexOf('quantity')] === 'omega0')!;
    expect(Number(omega0[header.indexOf('cpk')])).toBeCloseTo(1.054093, 5);
    expect(Number(omega0[header.indexOf('cpk_lower_95')])).toBeCloseTo(0.267389, 5);
    expect(Number(omega0[header.indexOf('cp_upper_95')])).toBeCloseTo(1.935299, 5);
    expect(Number(omega0[header.indexOf('lsl')])).toBe(9.5e6);
    expect(omega0[header.indexOf('units_conditional_fail')]).toBe('1');
    const zeta = rows.find((r) => r[header.indexOf('quantity')] === 'zeta')!;
    expect(zeta[header.indexOf('cp')]).toBe('');
    expect(zeta[header.indexOf('capability_note')]).toBe('Cp not defined: no limits; Cpk not defined: no limits');
  });
});
