// Measured captures written by others (reference/real-captures) import as each folder's SOURCE.md describes them.

import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';
import type { Capture } from '../../core/capture/types';

const reference = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../../shared/reference');
const captures = path.join(reference, 'real-captures');
const present = existsSync(captures);
if (!present) console.warn(`realCapturesImport: ${captures} is missing; the real-capture import checks are skipped`);

function load(folder: string, file: string): Capture {
  return parseCapture(readFileSync(path.join(captures, folder, file), 'utf8'));
}

/** Every step equals `step` to 1e-9 relative, starting at `start`. */
function expectAxis(time: Float64Array, start: number, step: number, count: number): void {
  expect(time.length).toBe(count);
  expect(time[0]).toBeCloseTo(start, 15);
  for (let i = 1; i < time.length; i++) expect(Math.abs(time[i] - time[i - 1] - step)).toBeLessThan(1e-9 * step + 1e-15);
}

describe.skipIf(!present)('coli-benazzi-rlc-impulse (tab-separated time/value pairs, CRLF)', () => {
  const folder = 'coli-benazzi-rlc-impulse';

  // SOURCE.md: "Tab-separated, in pairs (time, value) for V_S, V_C and V_R. There are 500 rows (0 to 998 µs in 2 µs steps)."
  it.each(['Dati0511_1.txt', 'Dati1105_Maxati1.txt', 'Dati1105_waveformimpulse3.txt'])('%s: V_S, V_C, V_R, 500 rows, 0 to 998 µs', (file) => {
    const capture = load(folder, file);
    expect(capture.layout.delimiter).toBe('\t');
    expect(capture.layout.rows).toBe(500);
    expect(capture.channels.map((c) => c.name)).toEqual(['V_S', 'V_C', 'V_R']);
    for (const channel of capture.channels) {
      expect(channel.dropped).toBe(0);
      expectAxis(channel.time, 0, 2e-6, 500);
      expect(channel.time[499]).toBeCloseTo(998e-6, 15);
    }
    expect(capture.sampleInterval).toBeCloseTo(2e-6, 15);
  });

  // SOURCE.md: "Dati1105_Maxati.txt has a blank second line"; "the file starts at t = 14 µs, after a blank line".
  // The 493 rows follow from 14 µs to 998 µs in 2 µs steps (derived).
  it('Dati1105_Maxati.txt: blank second line, starts at 14 µs', () => {
    const capture = load(folder, 'Dati1105_Maxati.txt');
    expect(capture.layout.headerLine).toBe(1);
    expect(capture.layout.firstDataLine).toBe(3);
    expect(capture.channels.map((c) => c.name)).toEqual(['V_S', 'V_C', 'V_R']);
    for (const channel of capture.channels) expectAxis(channel.time, 14e-6, 2e-6, 493);
  });

  // SOURCE.md: "Noise1105.txt | noise record (constant 5 V) | 493 rows, `Time	Noise`".
  it('Noise1105.txt: one channel Noise, 493 rows near 5 V', () => {
    const capture = load(folder, 'Noise1105.txt');
    expect(capture.channels.map((c) => c.name)).toEqual(['Noise']);
    const [noise] = capture.channels;
    expect(noise.values.length).toBe(493);
    const mean = noise.values.reduce((a, b) => a + b, 0) / noise.values.length;
    expect(mean).toBeGreaterThan(4.9);
    expect(mean).toBeLessThan(5.1);
  });
});

describe.skipIf(!present)('montalti-rlc-pulse (lab-board CSV with wall-clock time stamps)', () => {
  // SOURCE.md: "4 header lines, then a column-name line, then 800 data rows"; "Rebuild time as t = i * delta_t
  // (delta t = 2.000000E-6 s). Do not parse the timestamps."; columns time, V_S, V_C.
  it.each(['Pulse_3.12-oscilloscope.csv', 'Pulse_3.13-oscilloscope.csv', 'Pulse_3.14-oscilloscope.csv'])(
    '%s: V_S and V_C, 800 rows, t = i * 2 µs',
    (file) => {
      const capture = load('montalti-rlc-pulse', file);
      expect(capture.layout).toEqual({ delimiter: ',', decimalComma: false, headerLine: 5, firstDataLine: 6, rows: 800 });
      expect(capture.channels.map((c) => c.name)).toEqual(['V_S', 'V_C']);
      expect(capture.metadata['delta t']).toBe('2.000000E-6,2.000000E-6');
      expect(capture.sampleInterval).toBe(2e-6);
      for (const channel of capture.channels) {
        expect(channel.values.length).toBe(800);
        for (let i = 0; i < 800; i++) expect(channel.time[i]).toBe(i * 2e-6);
      }
      expect(capture.warnings.some((w) => w.includes('wall-clock time stamps') && w.includes("'delta t' on line 3"))).toBe(true);
      // SOURCE.md: "V_S is the generator (the 5 V pulse sits in the first sample)".
      expect(capture.channels[0].values[0]).toBeGreaterThan(4);
    },
  );
});

describe.skipIf(!present)('salimbeni-rlc-ringdown-8bit (whitespace, headerless, 8-bit)', () => {
  // SOURCE.md: "Two whitespace-separated columns (time in s, voltage in V), no header, 2322 rows, evenly spaced at
  // 1.0e-7 s (t = 7e-7 … 2.328e-4 s)"; "The voltage sits on a grid of 0.1136 V".
  it('dati_oscilloscopio_001.txt: one channel, 2322 rows, 0.1 µs steps from 0.7 µs, on a 0.1136 V grid', () => {
    const capture = load('salimbeni-rlc-ringdown-8bit', 'dati_oscilloscopio_001.txt');
    expect(capture.layout.delimiter).toBe(' ');
    expect(capture.layout.headerLine).toBeNull();
    expect(capture.channels.map((c) => c.name)).toEqual(['channel 1']);
    const [channel] = capture.channels;
    expectAxis(channel.time, 7e-7, 1e-7, 2322);
    expect(channel.time[2321]).toBeCloseTo(2.328e-4, 15);
    expect(capture.sampleInterval).toBeCloseTo(1e-7, 18);
    for (const v of channel.values) expect(Math.abs(v / 0.1136 - Math.round(v / 0.1136))).toBeLessThan(1e-3);
    // SOURCE.md treats the file as a clean ringdown (fit residual about half an LSB): its repeated peak codes are not a rail.
    expect(channel.clipped.reduce((a, b) => a + b, 0)).toBe(0);
  });
});
