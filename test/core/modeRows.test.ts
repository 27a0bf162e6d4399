// Several ringing modes as every face shows them: the rows of each mode, the order line, R, L and C for the
// mode asked for, and the bench-log record check. The fits are built by hand (invented values).
import { describe, expect, it } from 'vitest';
import { componentModeText, fitResultRows, MODE_RESULT_ROWS, modelOrderText, RESULT_ROWS } from '../../core/report/resultRows';
import { formatFitText } from '../../core/report/fitText';
import { renderReportHtml } from '../../core/report/reportHtml';
import { renderReportMarkdown } from '../../core/report/reportMarkdown';
import { renderReportCsv } from '../../core/report/reportCsv';
import { fitCsv } from '../../core/report/fitCsv';
import { measurementShapeProblem } from '../../core/report/recordShape';
import type { Json } from '../../core/report/jsonShape';
import type { FitSummary } from '../../core/report/fitSummary';
import type { ResponseMode } from '../../core/fit/responseFit';
import { deriveComponents } from '../../core/workflow/measuredComponents';
import { fittedModel } from '../../core/report/fittedModel';
import { ofMode } from '../../core/workflow/measure';
import { UsageError } from '../../core/inputError';
import { sampleFit, sampleRecord } from '../fixtures/benchLog/sampleRecord';

const q = (value: number, stderr: number | null, unit: string) => ({ value, stderr, unit });

function mode(f0: number, zeta: number, amplitude: number, energyShare: number): ResponseMode {
  const omega0 = 2 * Math.PI * f0;
  const alpha = zeta * omega0;
  return {
    alpha: q(alpha, alpha * 0.01, 's^-1'),
    omega0: q(omega0, omega0 * 1e-4, 'rad/s'),
    omegaD: q(omega0 * Math.sqrt(1 - zeta * zeta), omega0 * 1e-4, 'rad/s'),
    zeta: q(zeta, zeta * 0.01, ''),
    Q: q(1 / (2 * zeta), 0.01 / (2 * zeta), ''),
    amplitude: q(amplitude, amplitude * 0.02, 'V'),
    energyShare,
  };
}

const dominant = mode(12e6, 0.05, 4, 0.8);
const second = mode(95e6, 0.03, 1.5, 0.2);
/** A two-mode fit: the top level is the dominant mode's, as the fit reports it. */
const twoModes: FitSummary = sampleFit({
  alpha: dominant.alpha,
  omega0: dominant.omega0,
  omegaD: dominant.omegaD!,
  zeta: dominant.zeta,
  Q: dominant.Q,
  modes: [dominant, second],
  modelOrder: {
    criterion: 'BIC',
    forced: false,
    reason: 'two ringing modes: lower than one mode by 412.0',
    table: [
      { model: 'one ringing mode', ringingModes: 1, slowTerm: false, parameters: 7, sse: 12.5, criterion: -1000.4, chosen: false },
      { model: 'two ringing modes', ringingModes: 2, slowTerm: false, parameters: 11, sse: 2.1, criterion: -1412.4, chosen: true },
    ],
  },
});

describe('the rows of a fit with several ringing modes', () => {
  it('gives each mode f0, zeta, Q, amplitude and energy share, before the components and only with two modes or more', () => {
    const symbols = fitResultRows(twoModes).map((r) => r.symbol);
    expect(symbols).toContain('mode 2 f0');
    expect(symbols.indexOf('mode 1 f0')).toBeGreaterThan(symbols.indexOf('t0'));
    expect(symbols.filter((s) => s.startsWith('mode 2'))).toEqual(['mode 2 f0', 'mode 2 zeta', 'mode 2 Q', 'mode 2 amplitude', 'mode 2 energy']);
    expect(symbols.some((s) => s.startsWith('mode 3'))).toBe(false);
    const oneMode = sampleFit({ modes: [dominant] });
    expect(fitResultRows(oneMode).some((r) => r.symbol.startsWith('mode'))).toBe(false);
  });

  it('writes f0 in hertz with its error, the amplitude in the channel unit and the share in percent', () => {
    const row = (symbol: string) => fitResultRows(twoModes).find((r) => r.symbol === symbol)!;
    expect(row('mode 2 f0').quantity.value).toBeCloseTo(95e6, 0);
    expect(row('mode 2 f0').text).toMatch(/MHz ± .*Hz/);
    expect(row('mode 2 amplitude').text).toMatch(/V ± /);
    expect(row('mode 1 energy').text).toBe("80 % of the response's energy");
    expect(new Set([...RESULT_ROWS, ...MODE_RESULT_ROWS].map((r) => r.column)).size).toBe(RESULT_ROWS.length + MODE_RESULT_ROWS.length);
  });

  it('says in one line how many modes and why, and that --modes forced it', () => {
    expect(modelOrderText(twoModes)).toBe('two ringing modes (BIC -1412.4): lower than one mode by 412.0');
    const forced = { modelOrder: { ...twoModes.modelOrder!, forced: true, reason: 'forced: two ringing modes (lowers the residual by 81 % against one ringing mode)' } };
    expect(modelOrderText(forced)).toBe('two ringing modes (BIC -1412.4, order forced): lowers the residual by 81 % against one ringing mode');
    expect(modelOrderText(sampleFit())).toBeNull();
    expect(formatFitText(twoModes)).toMatch(/\n {2}order {12}two ringing modes \(BIC/);
  });

  it('is listed by the bench-log report (HTML and Markdown)', () => {
    const record = sampleRecord({ fit: twoModes });
    expect(renderReportHtml([record], { logPath: '/bench/bench.jsonl', generatedAt: '2025-03-14T12:00:00.000Z', software: { name: 'ringbench', version: '0.1.0' } })).toContain('mode 2 f0');
    expect(renderReportMarkdown([record])).toContain('mode 2 f0');
  });

  it('has its columns in the report CSV and the copied CSV row, empty where a fit has fewer modes', () => {
    for (const csv of [renderReportCsv([sampleRecord({ fit: twoModes, note: null }), sampleRecord({ fit: sampleFit(), note: null })]), fitCsv(twoModes)]) {
      const [header, ...rows] = csv.trim().split('\r\n').map((line) => line.split(','));
      const cell = (r: number, name: string) => rows[r][header.indexOf(name)];
      expect(Number(cell(0, 'mode2_f0_hz'))).toBeCloseTo(95e6, 0);
      expect(Number(cell(0, 'mode1_energy_pct'))).toBe(80);
      expect(header).toContain('mode3_zeta_stderr');
      if (rows.length > 1) expect(cell(1, 'mode1_f0_hz')).toBe('');
    }
  });
});

describe('R, L and C with several modes', () => {
  const known = { topology: 'series' as const, known: { name: 'C' as const, value: 1e-9 } };

  it('are derived for the dominant mode by default and for the mode named, saying which', () => {
    const first = deriveComponents(twoModes, known);
    const other = deriveComponents(twoModes, known, 2);
    // Series RLC: omega0 = 1 / sqrt(L C) (handbook relation), so L = 1 / (omega0^2 C).
    expect(first.L.value).toBeCloseTo(1 / (dominant.omega0.value ** 2 * 1e-9), 15);
    expect(other.L.value).toBeCloseTo(1 / (second.omega0.value ** 2 * 1e-9), 15);
    expect(other.mode).toMatchObject({ index: 2, of: 2 });
    expect(componentModeText(other)).toBe('for mode 2 of 2 (f0 95 MHz)');
    expect(formatFitText({ ...twoModes, components: other })).toContain("series, known C = 1 nF, taken as exact (no tolerance given: R and L carry the fit's uncertainty only), for mode 2 of 2 (f0 95 MHz)");
  });

  it('puts the mode named at the top level for a design check (the window checks a design loaded later this way)', () => {
    expect(ofMode(twoModes, 2)).toMatchObject({ alpha: second.alpha, omega0: second.omega0, zeta: second.zeta, Q: second.Q, omegaD: second.omegaD });
    expect(ofMode(twoModes)).toBe(twoModes);
    expect(() => ofMode(twoModes, 3)).toThrow('--mode 3: the fit found 2 ringing modes');
  });

  it("carry the named mode's own alpha-omega0 correlation into their uncertainty", () => {
    const names = ['alpha', 'omega0', 'alpha_2', 'omega0_2'];
    const matrix = [
      [1, 0, 0, 0],
      [0, 1, 0, 0],
      [0, 0, 1, 0.9],
      [0, 0, 0.9, 1],
    ];
    const correlated = deriveComponents({ ...twoModes, correlation: { names, matrix } }, known, 2);
    const independent = deriveComponents({ ...twoModes, correlation: { names, matrix: matrix.map((row, i) => row.map((_, j) => (i === j ? 1 : 0))) } }, known, 2);
    // Series, C known: R = 2 alpha L = 2 alpha / (omega0^2 C), so u(ln R)^2 = u_a^2 + 4 u_w^2 - 4 rho u_a u_w (first-order propagation).
    expect(correlated.R.stderr).not.toBeCloseTo(independent.R.stderr!, 12);
    const ua = second.alpha.stderr! / second.alpha.value;
    const uw = second.omega0.stderr! / second.omega0.value;
    expect(correlated.R.stderr! / correlated.R.value).toBeCloseTo(Math.sqrt(ua ** 2 + 4 * uw ** 2 - 4 * 0.9 * ua * uw), 6);
  });

  it('refuse a mode beyond those fitted, naming how many there are', () => {
    expect(() => deriveComponents(twoModes, known, 3)).toThrow(UsageError);
    expect(() => deriveComponents(twoModes, known, 3)).toThrow('--mode 3: the fit found 2 ringing modes');
    expect(deriveComponents(sampleFit({ modes: [dominant] }), known).mode).toBeUndefined();
  });
});

describe('the fitted model of several modes, as the report redraws it', () => {
  it('is the final level plus each ring from t0, the level before it; one ring is its params', () => {
    const params = { t0: 0, yPre: 0, yFinal: 0.5, alpha: 1e6, omega0: 2e7, a: 3, b: 0 };
    const modeTerms = { rings: [{ alpha: 1e6, omega0: 2e7, a: 3, b: 0 }, { alpha: 4e6, omega0: 9e7, a: 1, b: 0 }], slow: null };
    const times = Float64Array.from([-1e-7, 0, 5e-8, 2e-7]);
    const y = fittedModel({ params, modeTerms }, times);
    // Each ring a e^(-alpha t) cos(omega_d t), omega_d = sqrt(omega0^2 - alpha^2) (b = 0: the slope term is absent).
    const ring = (r: { alpha: number; omega0: number; a: number }, t: number) => r.a * Math.exp(-r.alpha * t) * Math.cos(Math.sqrt(r.omega0 ** 2 - r.alpha ** 2) * t);
    times.forEach((t, i) => expect(y[i]).toBeCloseTo(t < 0 ? 0 : 0.5 + ring(modeTerms.rings[0], t) + ring(modeTerms.rings[1], t), 9));
    expect(fittedModel({ params }, times)[2]).toBeCloseTo(0.5 + ring(modeTerms.rings[0], 5e-8), 9);
  });
});

describe('a logged record with modes', () => {
  const check = (fit: FitSummary) => measurementShapeProblem(JSON.parse(JSON.stringify(sampleRecord({ fit }))) as Json);

  it('is accepted with its modes, order table and components mode, and refused with a malformed mode', () => {
    expect(check({ ...twoModes, components: deriveComponents(twoModes, { topology: 'series', known: { name: 'C', value: 1e-9 } }, 2) })).toBeNull();
    expect(check({ ...twoModes, modes: [{ ...second, zeta: 0.03 } as never] })).toEqual({ field: 'fit', problem: expect.stringContaining('modes[0] must give') });
    expect(check({ ...twoModes, modelOrder: { ...twoModes.modelOrder!, table: [{ model: 'x' } as never] } })?.problem).toContain('modelOrder.table[0]');
    expect(check({ ...twoModes, modeTerms: { rings: [{ alpha: 1, omega0: 2, a: 3, b: 4 }], slow: null } })).toBeNull();
    expect(check({ ...twoModes, modeTerms: { rings: [{ alpha: 'fast' }], slow: null } as never })?.problem).toContain('modeTerms must give');
  });
});
