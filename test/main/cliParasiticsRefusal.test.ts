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
    const r = await run(['parasitics', BEFORE, BEFORE, '--added', 'C=470p']);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/cannot separate L_p and C_p/);
    expect(r.err.match(/switch-node-before\.csv \(added [^)]*, f0 99\.94\d* MHz/g)).toHaveLength(2);
  });

  it('captures given in the wrong order (f0 rises with the added capacitance) exit 2 naming both', async () => {
    const r = await run(['parasitics', AFTER, BEFORE, '--added', 'C=1n', '--json']);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toMatch(/does not fall as capacitance is added: switch-node-before\.csv \(added 1 nF, f0 99\.94\d* MHz.*switch-node-after-470p\.csv \(added 0 F, f0 67\.3\d* MHz/);
  });
});

describe('parasitics: an added capacitance no bench circuit holds', () => {
  it('a value typed without its prefix (470 read as 470 F) exits 2 naming the capture and the value, and prints nothing', async () => {
    const r = await run(['parasitics', BEFORE, AFTER, '--added', 'C=470']);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/switch-node-after-470p\.csv: the added capacitance 470 F is outside what a bench circuit holds \(1e-15 to 1 F\); a value without a prefix is in farads \(470 pF is 470p\)/);
  });

  it('one far below a femtofarad is refused the same way', async () => {
    const r = await run(['parasitics', BEFORE, AFTER, '--added', 'C=1e-30']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/the added capacitance 1\.00e-30 F is outside what a bench circuit holds/);
  });

  it('an added value that makes L_p or C_p implausible (0.47 read as 0.47 F) says so as the first warning', async () => {
    const r = await run(['parasitics', BEFORE, AFTER, '--added', 'C=0.47', '--json']);
    expect(r.code).toBe(0);
    const { warnings, L } = JSON.parse(r.out);
    // L_p = 1 / ((2 pi f1)^2 C_p) with C_p about 0.39 F at 99.94 MHz: about 6.5e-18 H, below the femtohenry of any bench loop.
    expect(L.value).toBeLessThan(1e-15);
    expect(warnings[0]).toMatch(/^implausible: L_p = 6\.50e-18 H is outside what a bench circuit holds/);
  });
});

describe('parasitics takes the probe and bandwidth options by the names fit uses', () => {
  it('--probe-capacitance and --scope-bandwidth give what --probe-c and --bandwidth give', async () => {
    const common = ['parasitics', BEFORE, AFTER, '--added', 'C=470p', '--json'];
    const named = await run([...common, '--probe-capacitance', '12p', '--scope-bandwidth', '500M']);
    const earlier = await run([...common, '--probe-c', '12p', '--bandwidth', '500M']);
    const bare = await run(common);
    expect(named.code).toBe(0);
    expect(named.out).toBe(earlier.out);
    // The probe's capacitance is taken off C_p: the options are read, not ignored.
    expect(named.out).not.toBe(bare.out);
  });

  it('both spellings of one option at once exit 2 naming both', async () => {
    const r = await run(['parasitics', BEFORE, AFTER, '--added', 'C=470p', '--probe-capacitance', '12p', '--probe-c', '10p']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/--probe-capacitance and --probe-c are the same option/);
  });
});
