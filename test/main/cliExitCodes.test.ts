// Failures are failures on the command line: any fit status but 'converged' exits 1 with no regime and no
// verdict; batch fits every file, shows each one's status and warnings, and exits 1 when any fit failed or, with a
// design, any file got no verdict (shown as none, with the reason).
import { copyFileSync, existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { createRandom } from '../../core/random';
import type { FitStatus } from '../../core/fit/types';
import { runCliIn } from './cliHarness';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const SAMPLES = path.join(ROOT, 'sample-captures');

/** The status every response fit of a test ends in (null: the fit's own), to try the faces on each status. */
const forced = vi.hoisted(() => ({ status: null as string | null }));
vi.mock('../../core/fit/fitResponse', async (importOriginal) => {
  const real = await importOriginal<typeof import('../../core/fit/fitResponse')>();
  return {
    ...real,
    fitResponse: (...args: Parameters<typeof real.fitResponse>) => {
      const fit = real.fitResponse(...args);
      return forced.status === null ? fit : { ...fit, status: forced.status as FitStatus, message: `forced ${forced.status} by the test` };
    },
  };
});

/** Every status that is not an answer (core/fit/types.ts FitStatus); 'no-response' is the response fit's own. */
const FAILED_STATUSES = ['max-iterations', 'failed', 'no-response'];

let folder: string;

const run = (args: string[], cwd = ROOT) => runCliIn(cwd, args);

/** A flat 1 V level with 1 % noise, 2000 samples of 10 ns: nothing responds, so no fit of it is an answer. Invented, seeded data. */
function writeFlatLevel(file: string): void {
  const random = createRandom(11);
  let text = 'Time (s),CH1 (V)\n';
  for (let i = 0; i < 2000; i++) text += `${((i - 200) * 10e-9).toExponential(6)},${(1 + 0.01 * random.normal()).toFixed(6)}\n`;
  writeFileSync(file, text);
}

beforeAll(() => {
  folder = mkdtempSync(path.join(tmpdir(), 'ringbench-exit-'));
  writeFlatLevel(path.join(folder, 'flat-level.csv'));
  for (const name of ['half-bridge-clipped.csv', 'input-filter-step.csv']) copyFileSync(path.join(SAMPLES, name), path.join(folder, name));
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));
beforeEach(() => {
  forced.status = null;
});

describe('fit: exit 0 only for a converged fit', () => {
  it('a converged fit exits 0 with its regime', async () => {
    const { code, out } = await run(['fit', 'sample-captures/input-filter-step.csv', '--json']);
    expect(code).toBe(0);
    const json = JSON.parse(out);
    expect(json.status).toBe('converged');
    expect(json.regime).toBe('underdamped');
  });

  it.each(FAILED_STATUSES)('a fit ending in %s exits 1, with no regime in the JSON or the text', async (status) => {
    forced.status = status;
    const json = await run(['fit', 'sample-captures/input-filter-step.csv', '--json']);
    expect(json.code).toBe(1);
    const summary = JSON.parse(json.out);
    expect(summary.status).toBe(status);
    expect(summary).not.toHaveProperty('regime');
    expect(summary).not.toHaveProperty('regimeEvidence');
    const text = await run(['fit', 'sample-captures/input-filter-step.csv']);
    expect(text.code).toBe(1);
    expect(text.out).toContain(`  status           ${status}: forced ${status} by the test\n`);
    expect(text.out).not.toMatch(/^ {2}regime /m);
  });

  it('a generated flat level is no answer: status not converged, exit 1, no regime', async () => {
    const { code, out } = await run(['fit', 'flat-level.csv', '--json'], folder);
    const summary = JSON.parse(out);
    expect(summary.status).not.toBe('converged'); // 'no-response' when this test was written
    expect(code).toBe(1);
    expect(summary).not.toHaveProperty('regime');
  });
});

describe('check: a failed fit exits 1 before any verdict', () => {
  const design = path.join('sample-captures', 'designs', 'half-bridge-clipped.json');

  it('the board that passes its design (exit 0) gets no verdict when its fit stops at the iteration limit (exit 1)', async () => {
    const passed = await run(['check', 'sample-captures/half-bridge-clipped.csv', '--design', design, '--json']);
    expect(passed.code).toBe(0);
    expect(JSON.parse(passed.out).verdict.pass).toBe(true);

    forced.status = 'max-iterations';
    const json = await run(['check', 'sample-captures/half-bridge-clipped.csv', '--design', design, '--json']);
    expect(json.code).toBe(1);
    expect(JSON.parse(json.out)).toMatchObject({ status: 'max-iterations', verdict: null });
    const text = await run(['check', 'sample-captures/half-bridge-clipped.csv', '--design', design]);
    expect(text.code).toBe(1);
    expect(text.out).toContain("  verdict          none: the fit failed (max-iterations), so nothing was checked against '12 V half-bridge motor driver switch node'\n");
    expect(text.out).not.toMatch(/PASS|FAIL/);
  });

  it('a capture whose fit fails gets no verdict and exits 1', async () => {
    const { code, out } = await run(['check', 'flat-level.csv', '--design', path.join(ROOT, design), '--json'], folder);
    expect(code).toBe(1);
    expect(JSON.parse(out).verdict).toBeNull();
  });
});

describe('log add: nothing logged for a failed fit', () => {
  it.each(FAILED_STATUSES)('%s: exit 1, the log untouched', async (status) => {
    forced.status = status;
    const log = path.join(folder, `${status}.jsonl`);
    const { code, err } = await run(['log', 'add', 'half-bridge-clipped.csv', '--log', log, '--unit', 'SN1'], folder);
    expect(code).toBe(1);
    expect(err).toContain(`the fit failed (${status}), nothing was logged`);
    expect(existsSync(log)).toBe(false);
  });
});

describe('batch: every file fitted, each one shown with its status and warnings', () => {
  it('one failed fit among good ones: all fitted, a status and a warnings column, only the converged ones logged, exit 1', async () => {
    const log = path.join(folder, 'batch.jsonl');
    const { code, out, err } = await run(['batch', '.', '--log', log, '--jobs', '1'], folder);
    expect(err).toBe('');
    expect(code).toBe(1);
    const [header, ...rows] = out.trimEnd().split('\n');
    expect(header).toMatch(/^file\s+status\s+warnings\s+regime\s+f0\s+zeta\s+Q\s+verdict\s+cautions$/);
    expect(rows).toHaveLength(3);
    expect(rows[0]).toMatch(/^flat-level\.csv\s+(max-iterations|failed|no-response)\s+\d+\s+-\s/);
    expect(rows[1]).toMatch(/^half-bridge-clipped\.csv\s+converged\s+[1-9]\d*\s+underdamped\s/); // it warns of its clipped samples
    expect(rows[2]).toMatch(/^input-filter-step\.csv\s+converged\s+\d+\s+underdamped\s/);
    const units = readFileSync(log, 'utf8').trimEnd().split('\n').map((line) => JSON.parse(line).unit);
    expect(units).toEqual(['half-bridge-clipped', 'input-filter-step']);
  });

  it('its JSON carries the status and the warnings of each file', async () => {
    const { code, out } = await run(['batch', '.', '--json'], folder);
    expect(code).toBe(1);
    const entries = JSON.parse(out) as { file: string; status: string; warnings: string[]; regime?: string }[];
    expect(entries.map((e) => e.file)).toEqual(['flat-level.csv', 'half-bridge-clipped.csv', 'input-filter-step.csv']);
    for (const entry of entries) expect(Array.isArray(entry.warnings)).toBe(true);
    expect(entries[0].status).not.toBe('converged');
    expect(entries[0]).not.toHaveProperty('regime');
    expect(entries.slice(1).map((e) => [e.status, e.regime])).toEqual([
      ['converged', 'underdamped'],
      ['converged', 'underdamped'],
    ]);
  });

  it('every fit converged: exit 0', async () => {
    const good = mkdtempSync(path.join(folder, 'good-'));
    copyFileSync(path.join(SAMPLES, 'input-filter-step.csv'), path.join(good, 'a.csv'));
    expect((await run(['batch', good])).code).toBe(0);
  });

  it.each(FAILED_STATUSES)('every fit ending in %s: exit 1', async (status) => {
    forced.status = status;
    const { code, out } = await run(['batch', '.', '--json', '--jobs', '1'], folder); // in this thread: the fit mock reaches no worker
    expect(code).toBe(1);
    expect((JSON.parse(out) as { status: string }[]).map((e) => e.status)).toEqual([status, status, status]);
  });

  it('bad usage stays exit 2, before any fit', async () => {
    const { code, out } = await run(['batch', 'no-such-folder'], folder);
    expect(code).toBe(2);
    expect(out).toBe('');
  });
});

describe('compare: a failed fit on either side exits 1', () => {
  it.each(FAILED_STATUSES)('%s: verdict undetermined, exit 1', async (status) => {
    forced.status = status;
    const { code, out } = await run(['compare', 'half-bridge-clipped.csv', 'input-filter-step.csv', '--json'], folder);
    expect(code).toBe(1);
    const comparison = JSON.parse(out);
    expect(comparison.verdict).toBe('undetermined');
    expect(comparison.reason).toContain(`failed (${status})`);
  });
});

describe('batch with a design: a file the design gives no verdict is a failure', () => {
  /** Series L 10 uH, C 1 uF (omega0 316.2 krad/s), as in cliCheckFirstOrder.test.ts: R 1 ohm rings (zeta 0.158), R 20 ohm does not (zeta 3.16). */
  const [L, C, STEP] = [10e-6, 1e-6, 12];
  /** The slow time constant of the R 20 ohm design, 1 / (alpha - sqrt(alpha^2 - omega0^2)), alpha = R / 2L: 19.487 us. */
  const SLOW_TAU = 1 / (1e6 - Math.sqrt(1e12 - 1 / (L * C)));
  let captures: string;

  /** An RC step of 12 V with the design's slow time constant, 0.5 % noise (seeded), 100 ns samples from -20 us: invented data. */
  function writeRcStep(file: string): void {
    const random = createRandom(7);
    let text = 'Time (s),CH1 (V)\n';
    for (let i = 0; i < 2400; i++) {
      const t = (i - 200) * 100e-9;
      const y = t < 0 ? 0 : STEP * (1 - Math.exp(-t / SLOW_TAU));
      text += `${t.toExponential(6)},${(y + 0.005 * STEP * random.normal()).toFixed(5)}\n`;
    }
    writeFileSync(file, text);
  }

  function writeDesign(file: string, name: string, R: number): void {
    const components = { R: { value: R, tolerance: 0.05 }, L: { value: L, tolerance: 0.1 }, C: { value: C, tolerance: 0.02 } };
    const source = { kind: 'step', amplitude: STEP, initialLevel: 0 };
    writeFileSync(file, JSON.stringify({ format: 'ringbench-design', version: 1, name, topology: 'series', components, source, probe: 'capacitor-voltage' }));
  }

  beforeAll(() => {
    captures = mkdtempSync(path.join(folder, 'rc-'));
    writeRcStep(path.join(captures, 'rc-step.csv'));
    writeDesign(path.join(folder, 'ringing.json'), 'LC filter', 1);
    writeDesign(path.join(folder, 'overdamped.json'), 'damped filter', 20);
  });

  it('a single decay against a design that rings: verdict none, the reason below the table and in the JSON, exit 1', async () => {
    const text = await run(['batch', captures, '--design', 'ringing.json'], folder);
    expect(text.code).toBe(1);
    const [header, row, reason, ...rest] = text.out.trimEnd().split('\n');
    expect(header).toMatch(/\sverdict\s/);
    expect(row).toMatch(/^rc-step\.csv\s+converged\s+\d+\s+first-order\s.*\snone\s/);
    expect(reason).toMatch(/^rc-step\.csv: no verdict: the fit found a single decay \(first-order, tau [^)]*\) where 'LC filter' predicts a ring \(f0 50\.33 kHz, zeta 0\.158\)/);
    expect(rest).toEqual([]);
    expect(text.out).not.toMatch(/NaN|∞|pass|FAIL/);

    const json = await run(['batch', captures, '--design', 'ringing.json', '--json'], folder);
    expect(json.code).toBe(1);
    const [entry] = JSON.parse(json.out);
    expect(entry).toMatchObject({ file: 'rc-step.csv', status: 'converged', regime: 'first-order', verdict: null });
    expect(entry.noVerdict).toMatch(/^the fit found a single decay \(first-order/);
  });

  it('the same capture against a design whose slow root dominates gets its verdict: pass, exit 0, no noVerdict', async () => {
    const text = await run(['batch', captures, '--design', 'overdamped.json'], folder);
    expect(text.code).toBe(0);
    expect(text.out.trimEnd().split('\n')[1]).toMatch(/^rc-step\.csv\s+converged\s.*\spass\s/);
    const [entry] = JSON.parse((await run(['batch', captures, '--design', 'overdamped.json', '--json'], folder)).out);
    expect(entry.verdict.pass).toBe(true);
    expect(entry).not.toHaveProperty('noVerdict');
  });

  it('a failed fit with a design: verdict none, the fit failure as the reason, exit 1', async () => {
    forced.status = 'max-iterations';
    const { code, out } = await run(['batch', captures, '--design', 'overdamped.json'], folder);
    expect(code).toBe(1);
    expect(out).toMatch(/^rc-step\.csv\s+max-iterations\s+\d+\s+-\s.*\snone\s/m);
    expect(out).toContain("rc-step.csv: no verdict: the fit failed (max-iterations), so nothing was checked against 'damped filter'\n");
  });
});
