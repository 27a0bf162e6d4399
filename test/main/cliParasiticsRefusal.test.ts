// parasitics refuses captures that cannot give L_p and C_p (the same capture twice, frequencies rising with
// the added capacitance) as bad input: exit 2 and one line naming the files and their frequencies.
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runCliIn } from './cliHarness';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const BEFORE = path.join('sample-captures', 'switch-node-before.csv');
const AFTER = path.join('sample-captures', 'switch-node-after-470p.csv');

const run = (args: string[]) => runCliIn(ROOT, args);

describe('parasitics refusals', () => {
  it('the same capture twice exits 2 with one line naming the file and its f0, and prints no snubber', async () => {
    const r = await run(['parasitics', BEFORE, BEFORE, '--added', 'C=470p', '--added-tolerance', '0']);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/cannot separate L_p and C_p/);
    expect(r.err.match(/switch-node-before\.csv \(added [^)]*, f0 99\.94\d* MHz/g)).toHaveLength(2);
  });

  it('captures given in the wrong order (f0 rises with the added capacitance) exit 2 naming both', async () => {
    const r = await run(['parasitics', AFTER, BEFORE, '--added', 'C=1n', '--added-tolerance', '0', '--json']);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toMatch(/does not fall as capacitance is added: switch-node-before\.csv \(added 1 nF, f0 99\.94\d* MHz.*switch-node-after-470p\.csv \(added 0 F, f0 67\.3\d* MHz/);
  });
});

describe('parasitics: the added capacitors\' tolerance is always stated', () => {
  it('without --added-tolerance exits 2 before any capture is read, naming the option, and prints nothing', async () => {
    for (const tolerance of [[], ['--added-tolerance', ' ']]) {
      const r = await run(['parasitics', BEFORE, 'no-such-capture.csv', '--added', 'C=470p', ...tolerance]);
      expect(r.code).toBe(2);
      expect(r.out).toBe('');
      expect(r.err).toBe(
        'ringbench: --added-tolerance: give the tolerance of the added capacitors in %, e.g. 5 for 5 % parts (L_p and C_p are known no better than the parts; 0 takes them as exact)\n',
      );
    }
  });

  it('carries a 5 % tolerance into L_p and C_p: their uncertainty is then mostly the parts\'', async () => {
    const fit = async (tolerance: string) => JSON.parse((await run(['parasitics', BEFORE, AFTER, '--added', 'C=470p', '--added-tolerance', tolerance, '--json'])).out);
    const [exact, fivePercent] = [await fit('0'), await fit('5')];
    expect(fivePercent.L.value).toBeCloseTo(exact.L.value, 20);
    // A rectangular 5 % is 2.89 % standard (GUM 4.3.7); the added part fixes the line's scale, so L_p and C_p carry about as much.
    for (const q of [fivePercent.L, fivePercent.C]) expect(q.stderr / q.value).toBeGreaterThan(0.02);
    expect(exact.L.stderr / exact.L.value).toBeLessThan(0.005);
  });
});

describe('parasitics: an added capacitance no bench circuit holds', () => {
  it('a value typed without its prefix (470 read as 470 F) exits 2 naming the capture and the value, and prints nothing', async () => {
    const r = await run(['parasitics', BEFORE, AFTER, '--added', 'C=470', '--added-tolerance', '0']);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/switch-node-after-470p\.csv: the added capacitance 470 F is outside what a bench circuit holds \(1e-15 to 1 F\); a value without a prefix is in farads \(470 pF is 470p\)/);
  });

  it('one far below a femtofarad is refused the same way', async () => {
    const r = await run(['parasitics', BEFORE, AFTER, '--added', 'C=1e-30', '--added-tolerance', '0']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/the added capacitance 1\.00e-30 F is outside what a bench circuit holds/);
  });

  it('an added value that makes L_p or C_p implausible (0.47 read as 0.47 F) says so as the first warning', async () => {
    const r = await run(['parasitics', BEFORE, AFTER, '--added', 'C=0.47', '--added-tolerance', '0', '--json']);
    expect(r.code).toBe(0);
    const { warnings, L } = JSON.parse(r.out);
    // L_p = 1 / ((2 pi f1)^2 C_p) with C_p about 0.39 F at 99.94 MHz: about 6.5e-18 H, below the femtohenry of any bench loop.
    expect(L.value).toBeLessThan(1e-15);
    expect(warnings[0]).toMatch(/^implausible: L_p = 6\.50e-18 H is outside what a bench circuit holds/);
  });
});

describe('parasitics takes the probe and bandwidth options by the names fit uses', () => {
  it('--probe-capacitance and --scope-bandwidth give what --probe-c and --bandwidth give', async () => {
    const common = ['parasitics', BEFORE, AFTER, '--added', 'C=470p', '--added-tolerance', '0', '--json'];
    const named = await run([...common, '--probe-capacitance', '12p', '--probe-c-tolerance', '10', '--scope-bandwidth', '500M']);
    const earlier = await run([...common, '--probe-c', '12p', '--probe-c-tolerance', '10', '--bandwidth', '500M']);
    const bare = await run(common);
    expect(named.code).toBe(0);
    expect(named.out).toBe(earlier.out);
    // The probe's capacitance is taken off C_p: the options are read, not ignored.
    expect(named.out).not.toBe(bare.out);
  });

  it('a probe capacitance needs its tolerance (C_p is given with it taken off): exit 2 before a capture is read; 0 takes it as exact', async () => {
    const common = ['parasitics', BEFORE, AFTER, '--added', 'C=470p', '--added-tolerance', '0', '--probe-capacitance', '12p', '--json'];
    // A capture that does not exist: the refusal comes before any capture is read.
    const missing = await run(common.map((arg) => (arg === BEFORE ? 'no-such-capture.csv' : arg)));
    expect(missing.code).toBe(2);
    expect(missing.out).toBe('');
    expect(missing.err.trim().split('\n')).toEqual([expect.stringMatching(/^ringbench: --probe-c-tolerance: give the probe capacitance's tolerance in %, e\.g\. 10 .*0 takes it as exact\)$/)]);
    const exact = await run([...common, '--probe-c-tolerance', '0']);
    const tenPercent = await run([...common, '--probe-c-tolerance', '10']);
    expect(exact.code).toBe(0);
    const cp = (out: string) => JSON.parse(out).C as { value: number; stderr: number };
    expect(cp(tenPercent.out).value).toBe(cp(exact.out).value);
    expect(cp(tenPercent.out).stderr).toBeGreaterThan(cp(exact.out).stderr);
  });

  it('the tolerance may follow the value as on fit (12p,10), but not both ways at once', async () => {
    const common = ['parasitics', BEFORE, AFTER, '--added', 'C=470p', '--added-tolerance', '0', '--json'];
    const after = await run([...common, '--probe-capacitance', '12p,10']);
    const separate = await run([...common, '--probe-capacitance', '12p', '--probe-c-tolerance', '10']);
    expect(after.code).toBe(0);
    expect(after.out).toBe(separate.out);
    const twice = await run([...common, '--probe-capacitance', '12p,10', '--probe-c-tolerance', '10']);
    expect(twice.code).toBe(2);
    expect(twice.err).toMatch(/--probe-c-tolerance: the probe capacitance already carries its tolerance after the comma: give it once/);
  });

  it('both spellings of one option at once exit 2 naming both', async () => {
    const r = await run(['parasitics', BEFORE, AFTER, '--added', 'C=470p', '--added-tolerance', '0', '--probe-capacitance', '12p', '--probe-c', '10p', '--probe-c-tolerance', '10']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/--probe-capacitance and --probe-c are the same option/);
  });
});
