// Several events in one record on the command line: --event N chooses the event measured, a bad N is bad input.

import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { pulseTrainChannel } from '../core/trust/cases/severalEvents';
import { runCliIn } from './cliHarness';

const F0 = 1e6;
const DT = 1 / (50 * F0);
let folder = '';

const run = (args: string[]) => runCliIn(folder, args);

beforeAll(() => {
  folder = mkdtempSync(path.join(tmpdir(), 'ringbench-events-'));
  // Three square-wave edges 900 samples (5.7 time constants) apart, generated with the truth known.
  const channel = pulseTrainChannel({ seed: 11, alpha: 0.05 * 2 * Math.PI * F0, omega0: 2 * Math.PI * F0, dt: DT, samples: 3500, events: [100, 1000, 1900].map((i) => i * DT), drive: 'square', amplitude: 5, noise: 0.05 });
  const rows = Array.from(channel.time, (t, i) => `${t.toExponential(6)},${channel.values[i].toFixed(5)}`);
  writeFileSync(path.join(folder, 'train.csv'), `Time (s),CH1 (V)\n${rows.join('\n')}\n`);
  // The same circuit as a design: L = 1 uH, C = 1 / (omega0^2 L), R = 2 alpha L.
  const components = { R: { value: '628.3m', tolerance: 0.05 }, L: { value: '1u', tolerance: 0.05 }, C: { value: '25.33n', tolerance: 0.05 } };
  const design = { format: 'ringbench-design', version: 1, name: 'train', topology: 'series', components, source: { kind: 'step', amplitude: '5', initialLevel: 0 }, probe: 'capacitor-voltage' };
  writeFileSync(path.join(folder, 'train.json'), JSON.stringify(design));
});

afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('fit on a record of several events', () => {
  it('lists the events and their combination under the fit of the first', async () => {
    const { code, out } = await run(['fit', 'train.csv']);
    expect(code).toBe(0);
    expect(out).toMatch(/events +3 in the record; the fit above is event 1/);
    expect(out).toMatch(/event 3 +.*complete/);
    expect(out).toMatch(/combined +events 1, 2, 3: converged/);
    expect(out).toMatch(/spread: alpha chi\^2 [\d.]+ \(2 dof, p /);
  });

  it('--event 2 measures the second event, in the JSON too', async () => {
    const { code, out } = await run(['fit', 'train.csv', '--event', '2', '--json']);
    expect(code).toBe(0);
    const summary = JSON.parse(out);
    expect(summary.events.chosen).toBe(2);
    expect(summary.events.chosenBy).toBe('request');
    expect(summary.events.list).toHaveLength(3);
    expect(summary.window.start).toBeGreaterThanOrEqual(summary.events.list[1].start);
    expect(summary.window.end).toBeLessThanOrEqual(summary.events.list[1].end);
  });

  it.each([['4', /--event 4: the record holds 3 events/], ['0', /--event: '0' is not an event number/], ['two', /--event: 'two' is not an event number/]])(
    '--event %s is bad input: one line, exit 2',
    async (n, message) => {
      const { code, out, err } = await run(['fit', 'train.csv', '--event', n]);
      expect(code).toBe(2);
      expect(out).toBe('');
      expect(err.trim().split('\n')).toHaveLength(1);
      expect(err).toMatch(message);
    },
  );

  it('check refuses a design against several events: one line, exit 2, asking for a window around one', async () => {
    const { code, out, err } = await run(['check', 'train.csv', '--design', 'train.json']);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err.trim().split('\n')).toHaveLength(1);
    expect(err).toMatch(/train\.csv holds 3 events: a design is checked against one; set the fit window \(--from, --to\) around it/);
  });
});
