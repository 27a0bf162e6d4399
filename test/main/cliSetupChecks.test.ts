// The setup checks on the command line: --scope-bandwidth, --probe-capacitance and --ground-lead, the "setup" block,
// setupChecks in --json, a preamble's acquisition mode, and exit 1 on a refusal (a sustained oscillation).
import { copyFileSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCliIn } from './cliHarness';
import { createRandom } from '../../core/random';
import type { SetupCheck } from '../../core/workflow/setupChecks';

let folder: string;
const run = (args: string[]) => runCliIn(folder, args);
const SAMPLE = path.resolve(__dirname, '../../sample-captures/switch-node-before.csv');

/** A 5 V step ringing at 2 MHz with damping ratio zeta (0: a tone that never decays), 1 % noise, seeded; invented data. */
function writeRing(file: string, zeta: number, preamble = ''): void {
  const random = createRandom(11);
  const omegaD = 2 * Math.PI * 2e6;
  const alpha = (zeta * omegaD) / Math.sqrt(1 - zeta * zeta);
  let text = preamble ? `${preamble}\n\n` : '';
  text += 'Time (s),CH1 (V)\n';
  for (let i = 0; i < 1200; i++) {
    const t = (i - 100) * 25e-9;
    const y = t < 0 ? 0 : 5 * (1 - Math.exp(-alpha * t) * Math.cos(omegaD * t));
    text += `${t.toExponential(6)},${(y + 0.05 * random.normal()).toFixed(5)}\n`;
  }
  writeFileSync(file, text);
}

beforeAll(() => {
  folder = mkdtempSync(path.join(tmpdir(), 'ringbench-setup-'));
  copyFileSync(SAMPLE, path.join(folder, 'switch-node-before.csv'));
  writeRing(path.join(folder, 'tone.csv'), 0);
  writeRing(path.join(folder, 'hires.csv'), 0.05, 'Title,hires\nAcquisition Mode,High Res');
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('fit: setup checks', () => {
  it('prints "setup: nothing to report" for a capture that raises none, and an empty setupChecks in --json', async () => {
    const text = await run(['fit', 'switch-node-before.csv']);
    expect(text.code).toBe(0);
    expect(text.out).toContain('setup: nothing to report\n');
    const json = await run(['fit', 'switch-node-before.csv', '--json']);
    expect(JSON.parse(json.out).setupChecks).toEqual([]);
  });

  it('--scope-bandwidth warns of the bias on alpha (text and JSON), exit 0', async () => {
    const text = await run(['fit', 'switch-node-before.csv', '--scope-bandwidth', '500M']);
    expect(text.code).toBe(0);
    expect(text.out).toMatch(/setup \(1\)\n {2}warning: a first-order front end at 500 MHz \(the stated bandwidth\) moves the fitted alpha by about/);
    const json = await run(['fit', 'switch-node-before.csv', '--scope-bandwidth', '500M', '--json']);
    const checks = JSON.parse(json.out).setupChecks as SetupCheck[];
    expect(checks.map((c) => [c.id, c.level])).toEqual([['bandwidth', 'warning']]);
    expect(checks[0].values?.bandwidth).toBe(500e6);
  });

  it('--probe-capacitance with a known part gives C and f0 without the probe; --ground-lead moves the resonance checked', async () => {
    const out = await run(['fit', 'switch-node-before.csv', '--topology', 'series', '--known', 'C=390p', '--probe-capacitance', '10p', '--ground-lead', '15cm']);
    expect(out.code).toBe(0);
    expect(out.out).toMatch(/note: without the probe's 10 pF across C \(the loop rang with C \+ Cp = 400 pF\): f0 = 101\.\d+ MHz/);
    expect(out.out).toMatch(/the probe's capacitance taken as exact \(give its tolerance as 10p,TOL in %\)/);
    // A 20 % probe (rectangular, 11.5 % standard) moves f0 by Cp / (2 (C + Cp)) of that: 0.14 %, some 150 kHz.
    const toleranced = await run(['fit', 'switch-node-before.csv', '--topology', 'series', '--known', 'C=390p', '--probe-capacitance', '10p,20', '--json']);
    const note = (JSON.parse(toleranced.out).setupChecks as SetupCheck[]).find((c) => c.id === 'probe-loading')!;
    expect(note.message).toMatch(/the probe's 20 % tolerance included$/);
    const f0 = note.values!.unloadedF0 as { value: number; stderr: number };
    expect(f0.stderr / f0.value).toBeCloseTo((10 / 800) * (0.2 / Math.sqrt(3)), 4);
    // 10 inches against 10 pF resonate at 100.7 MHz (25 nH per inch, common practice): the 99.9 MHz ring matches it.
    const lead = await run(['fit', 'switch-node-before.csv', '--ground-lead', '10in', '--json']);
    expect((JSON.parse(lead.out).setupChecks as SetupCheck[]).map((c) => c.id)).toEqual(['ground-lead']);
  });

  it('a tone that does not decay is refused: exit 1, the message in the setup block and in --json', async () => {
    const text = await run(['fit', 'tone.csv']);
    expect(text.code).toBe(1);
    expect(text.out).toMatch(/ {2}REFUSED: the 2 MHz ring (does not decay|grows .*) over \d+ periods .*: a sustained oscillation, so alpha, zeta and Q cannot be given\n/);
    const json = await run(['fit', 'tone.csv', '--json']);
    expect(json.code).toBe(1);
    expect((JSON.parse(json.out).setupChecks as SetupCheck[]).find((c) => c.level === 'refusal')?.id).toBe('sustained-oscillation');
  });

  it("reads the preamble's acquisition mode", async () => {
    const out = await run(['fit', 'hires.csv']);
    expect(out.code).toBe(0);
    expect(out.out).toContain("warning: the preamble's 'Acquisition Mode: High Res' averages samples or acquisitions");
  });

  for (const [option, value, says] of [
    ['--scope-bandwidth', 'wide', "--scope-bandwidth 'wide'"],
    ['--scope-bandwidth', '-20M', "--scope-bandwidth '-20M': must be a positive value"],
    ['--probe-capacitance', '0', "--probe-capacitance '0': must be a positive value"],
    ['--probe-capacitance', '10p,x', "--probe-capacitance '10p,x': tolerance 'x' must be a percentage"],
    ['--ground-lead', '6', "--ground-lead '6': expected a positive length with its unit, e.g. 6in, 15cm or 25mm"],
  ] as const) {
    it(`${option} ${value} is bad input: exit 2 naming the option`, async () => {
      const out = await run(['fit', 'switch-node-before.csv', option, value]);
      expect(out.code).toBe(2);
      expect(out.err).toContain(says);
      expect(out.out).toBe('');
    });
  }
});

describe('check: setup checks', () => {
  it('carries setupChecks in --json and exits 1 on a refusal', async () => {
    const design = {
      format: 'ringbench-design',
      version: 1,
      name: 'tone board',
      topology: 'series',
      components: { R: { value: 0.1, tolerance: 0.05 }, L: { value: 1e-6, tolerance: 0.1 }, C: { value: 1 / ((2 * Math.PI * 2e6) ** 2 * 1e-6), tolerance: 0.05 } },
      source: { kind: 'step', amplitude: 5, initialLevel: 0 },
      probe: 'capacitor-voltage',
    };
    writeFileSync(path.join(folder, 'tone.json'), JSON.stringify(design));
    const out = await run(['check', 'tone.csv', '--design', 'tone.json', '--json']);
    expect(out.code).toBe(1);
    expect((JSON.parse(out.out).setupChecks as SetupCheck[]).some((c) => c.id === 'sustained-oscillation' && c.level === 'refusal')).toBe(true);
  });
});

describe('batch: setup checks', () => {
  it('takes the options for every capture, carries setupChecks in --json, and a refusal fails the batch (exit 1)', async () => {
    const sub = mkdtempSync(path.join(folder, 'batch-'));
    copyFileSync(SAMPLE, path.join(sub, 'switch-node-before.csv'));
    writeRing(path.join(sub, 'tone.csv'), 0);
    const json = await run(['batch', path.basename(sub), '--jobs', '1', '--scope-bandwidth', '500M', '--json']);
    expect(json.code).toBe(1);
    const byFile = Object.fromEntries((JSON.parse(json.out) as { file: string; setupChecks: SetupCheck[] }[]).map((o) => [o.file, o.setupChecks.map((c) => [c.id, c.level])]));
    expect(byFile['switch-node-before.csv']).toEqual([['bandwidth', 'warning']]);
    expect(byFile['tone.csv']).toContainEqual(['sustained-oscillation', 'refusal']);
    const table = await run(['batch', path.basename(sub), '--jobs', '1']);
    expect(table.code).toBe(1);
    expect(table.out).toMatch(/^tone\.csv: setup refused: the 2 MHz ring .* sustained oscillation/m);
  });
});

describe('bench log and report: the setup checks of a logged measurement', () => {
  it('keeps them in the record and shows them in the Markdown and HTML reports', async () => {
    const logged = await run(['log', 'add', 'hires.csv', '--log', 'setup-log.jsonl', '--unit', 'U7']);
    expect(logged.code).toBe(0);
    const record = JSON.parse(readFileSync(path.join(folder, 'setup-log.jsonl'), 'utf8').trim().split('\n').pop()!);
    expect((record.setupChecks as SetupCheck[]).map((c) => [c.id, c.level])).toEqual([['acquisition-mode', 'warning']]);
    expect((await run(['report', 'setup-log.jsonl', '--out', 'setup.md'])).code).toBe(0);
    expect(readFileSync(path.join(folder, 'setup.md'), 'utf8')).toContain("Setup warning: the preamble's 'Acquisition Mode: High Res' averages samples or acquisitions");
    expect((await run(['report', 'setup-log.jsonl', '--out', 'setup.html'])).code).toBe(0);
    expect(readFileSync(path.join(folder, 'setup.html'), 'utf8')).toMatch(/<h4>Setup checks<\/h4><ul><li class="warning"><strong>warning<\/strong> the preamble&#39;s &#39;Acquisition Mode: High Res&#39;|<h4>Setup checks<\/h4><ul><li class="warning"><strong>warning<\/strong> the preamble's 'Acquisition Mode: High Res'/);
  });

  it('log add takes the setup options and keeps them in the record; a refused answer is not logged (exit 1)', async () => {
    const logged = await run(['log', 'add', 'switch-node-before.csv', '--log', 'options-log.jsonl', '--unit', 'U8', '--ground-lead', '10in', '--json']);
    expect(logged.code).toBe(0);
    const record = JSON.parse(logged.out).logged;
    expect(record.settings.groundLead).toBe('10in');
    expect((record.setupChecks as SetupCheck[]).map((c) => c.id)).toEqual(['ground-lead']);
    const refused = await run(['log', 'add', 'tone.csv', '--log', 'options-log.jsonl', '--unit', 'U9']);
    expect(refused.code).toBe(1);
    expect(refused.err).toMatch(/a setup check refused the answer, nothing was logged: the 2 MHz ring/);
    expect(readFileSync(path.join(folder, 'options-log.jsonl'), 'utf8').trim().split('\n')).toHaveLength(1);
  });
});
