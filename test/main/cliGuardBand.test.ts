// check's exit code under each decision rule, with f0 limits stated in a design file placed so the sample
// input filter's f0 falls in each zone; the zones and rules after ISO 14253-1:2017, ILAC-G8:09/2019 4.2 and
// JCGM 106:2012 8.3. Bad limits in a design file: exit 2, one line naming the file and the field.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCliIn } from './cliHarness';
import { createRandom } from '../../core/random';
import { evaluateResponse } from '../../core/response/secondOrder';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const CAPTURE = path.join(ROOT, 'sample-captures', 'input-filter-step.csv');
const BASE_DESIGN = path.join(ROOT, 'sample-captures', 'designs', 'input-filter-step.json');
const LIMITS_DESIGN = path.join(ROOT, 'sample-captures', 'designs', 'input-filter-step-limits.json');

let folder: string;
/** The capture's measured f0 and its expanded uncertainty U (k = 2), Hz, read from a check with wide f0 limits. */
let f0: number;
let U: number;

function writeDesign(name: string, extra: Record<string, unknown>): string {
  const file = path.join(folder, name);
  writeFileSync(file, JSON.stringify({ ...JSON.parse(readFileSync(BASE_DESIGN, 'utf8')), ...extra }, null, 2));
  return file;
}

const check = (design: string, json = true) => runCliIn(ROOT, ['check', CAPTURE, '--design', design, ...(json ? ['--json'] : [])]);

beforeAll(async () => {
  folder = mkdtempSync(path.join(tmpdir(), 'ringbench-guard-band-'));
  const { code, out } = await check(writeDesign('wide.json', { limits: { f0: { lower: 1, upper: 1e6 } } }));
  expect(code).toBe(0);
  const row = JSON.parse(out).verdict.quantities.find((q: { name: string }) => q.name === 'f0');
  f0 = row.measured.value;
  U = row.expandedUncertainty;
  expect(U).toBeCloseTo(2 * row.measured.stderr, 12);
}, 60_000);

afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('check: the exit code under each decision rule', () => {
  // The f0 upper limit placed at f0 + offset × U; every other quantity of this capture is well inside its limits.
  it.each([
    { offset: 2, zone: 'pass', exits: { 'simple-acceptance': 0, 'guarded-acceptance': 0, 'guarded-rejection': 0 } },
    { offset: 0.5, zone: 'conditional-pass', exits: { 'simple-acceptance': 0, 'guarded-acceptance': 3, 'guarded-rejection': 0 } },
    { offset: -0.5, zone: 'conditional-fail', exits: { 'simple-acceptance': 3, 'guarded-acceptance': 3, 'guarded-rejection': 0 } },
    { offset: -2, zone: 'fail', exits: { 'simple-acceptance': 3, 'guarded-acceptance': 3, 'guarded-rejection': 3 } },
  ])('f0 limit at f0 + $offset U: $zone', async ({ offset, zone, exits }) => {
    for (const [name, exit] of Object.entries(exits)) {
      const design = writeDesign(`${name}-${offset}.json`, { limits: { f0: { lower: 1, upper: f0 + offset * U } }, decisionRule: { name } });
      const { code, out } = await check(design);
      const verdict = JSON.parse(out).verdict;
      expect([name, code]).toEqual([name, exit]);
      expect(verdict.decision).toBe(zone);
      expect(verdict.pass).toBe(exit === 0);
      expect(verdict.rule).toMatchObject({ name, source: 'design', coverageFactor: 2 });
      const row = verdict.quantities.find((q: { name: string }) => q.name === 'f0');
      expect(row).toMatchObject({ zone, limits: { lower: 1, upper: f0 + offset * U }, limitsFrom: 'design' });
    }
  }, 120_000);

  it('without a decisionRule the default (guarded acceptance, w = U, k = 2) decides, and the text says it is the default', async () => {
    const design = writeDesign('default-rule.json', { limits: { f0: { lower: 1, upper: f0 + 0.5 * U } } });
    const json = await check(design);
    expect(json.code).toBe(3);
    expect(JSON.parse(json.out).verdict.rule).toMatchObject({ name: 'guarded-acceptance', guardBandFactor: 1, coverageFactor: 2, source: 'default' });
    const text = await check(design, false);
    expect(text.code).toBe(3);
    expect(text.out).toMatch(/ {2}verdict {10}FAIL against '48 V bus LC input filter' \(rejected: conditional pass\)\n {4}rule {11}guarded-acceptance, guard band w = 1 U, U = k u with k = 2 \(the default, a design may set decisionRule\)/);
    expect(text.out).toMatch(/\n {4}f0 {13}CONDITIONAL PASS .*limits 1 Hz to /);
  });

  it('the sample design with production limits passes its capture (exit 0), each limited quantity decided against the stated limits', async () => {
    const { code, out } = await check(LIMITS_DESIGN);
    expect(code).toBe(0);
    const verdict = JSON.parse(out).verdict;
    expect(verdict).toMatchObject({ pass: true, decision: 'pass', rule: { name: 'guarded-acceptance', guardBandFactor: 1, coverageFactor: 2, source: 'design' } });
    const byName = Object.fromEntries(verdict.quantities.map((q: { name: string }) => [q.name, q]));
    expect(byName.f0.limits).toEqual({ lower: 8000, upper: 9800 });
    expect(byName.zeta.limits).toEqual({ lower: 0.15, upper: 0.25 });
    expect(byName.overshoot.limits).toEqual({ lower: null, upper: 60 });
    expect(byName.settlingTime2.limits.upper).toBeCloseTo(400e-6, 15);
    expect(byName.Q.limitsFrom).toBe('tolerances');
  });
});

describe('check: a limit on a part is decided, never passed unchecked', () => {
  it('C limited to 40-44 uF with the tightest tolerance (10 %): C is derived, not taken at its 47 uF, and the unit is rejected', async () => {
    const { code, out } = await check(writeDesign('limited-c.json', { limits: { C: { lower: '40u', upper: '44u' } } }));
    expect(code).toBe(3);
    const verdict = JSON.parse(out).verdict;
    const row = verdict.quantities.find((q: { name: string }) => q.name === 'C');
    expect(row).toMatchObject({ counted: true, limitsFrom: 'design', inTolerance: false });
    expect(row.measured.value).toBeGreaterThan(44e-6);
    expect(verdict.pass).toBe(false);
  });
});

describe('check: a limit the capture cannot decide gives no verdict (exit 1), not a design error', () => {
  it('a ringdown about one level (no step metrics) against a settling-time limit: verdict none, noVerdict names the limit and why', async () => {
    // A natural ringdown of the filter's own L and C (invented bench data, seeded noise): 10 V released at t = 0, 0.05 V rms.
    const alpha = 0.15 / (2 * 6.8e-6);
    const time = Float64Array.from({ length: 4200 }, (_, i) => (i - 200) * 0.5e-6);
    const clean = evaluateResponse({ t0: 0, yPre: 0, yFinal: 0, a: 10, b: 10 * alpha, alpha, omega0: 1 / Math.sqrt(6.8e-6 * 47e-6) }, time);
    const random = createRandom(5);
    const capture = path.join(folder, 'ringdown.csv');
    writeFileSync(capture, `Time (s),CH1 (V)\n${Array.from(time, (t, i) => `${t.toExponential(7)},${(clean[i] + 0.05 * random.normal()).toFixed(5)}`).join('\n')}\n`);
    const design = writeDesign('settling-limit.json', { limits: { settlingTime2: { upper: '400u' } } });
    const { code, out, err } = await runCliIn(ROOT, ['check', capture, '--design', design, '--json']);
    expect(err).toBe('');
    expect(code).toBe(1);
    const result = JSON.parse(out);
    expect(result.verdict).toBeNull();
    expect(result.noVerdict).toMatch(/^this capture does not decide the design limits settlingTime2 \(.*ringdown about one level.*\), so nothing was checked against '48 V bus LC input filter'$/);

    // The same capture against a design of the inductor current: the wrong design for the file, bad input before the capture's no verdict.
    const current = writeDesign('settling-limit-current.json', { probe: 'inductor-current', limits: { settlingTime2: { upper: '400u' } } });
    const wrong = await runCliIn(ROOT, ['check', capture, '--design', current, '--json']);
    expect(wrong.code).toBe(2);
    expect(wrong.out).toBe('');
    expect(wrong.err.trim()).toMatch(/the design probes inductor-current \(A\) but channel 'CH1' of .*ringdown\.csv is in V$/);
  });
});

describe('check: bad limits in a design file', () => {
  it.each([
    [{ limits: { f0: { lower: '9k', upper: '8k' } } }, 'limits.f0', 'lower (9000) must be below upper (8000)'],
    [{ limits: { zeta: { upper: 'low' } } }, 'limits.zeta.upper', "could not read 'low'"],
    [{ decisionRule: { name: 'guarded-acceptance', coverageFactor: -2 } }, 'decisionRule.coverageFactor', 'must be a number, 1 or more'],
    [{ decisionRule: { name: 'guarded-acceptance', coverageFactor: 0.95 } }, 'decisionRule.coverageFactor', 'not the coverage probability'],
    [{ limits: { R: { upper: '1' }, L: { upper: '10u' }, C: { upper: '60u' } } }, 'limits', 'a design may limit at most two'],
    [{ source: { kind: 'natural', capacitorVoltage: 48 }, limits: { settlingTime2: { upper: '400u' } } }, 'limits.settlingTime2', 'needs a step source'],
  ])('%j: exit 2 naming the file and %s', async (extra, field, problem) => {
    const design = writeDesign('bad-limits.json', extra);
    const { code, out, err } = await check(design);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err.trim().split('\n')).toHaveLength(1);
    expect(err).toContain('bad-limits.json');
    expect(err).toContain(`design ${field}: `);
    expect(err).toContain(problem);
  });
});
