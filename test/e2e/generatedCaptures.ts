// Capture texts generated for the window's tests (seeded, never a real instrument's file).

import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { createRandom } from '../../core/random';
import { evaluateResponse } from '../../core/response/secondOrder';
import { repoRoot } from './benchHarness';

/** A DC level with white noise and nothing else: no response for the fit to find. */
export function flatNoiseCapture(seed = 11, samples = 2000): string {
  const random = createRandom(seed);
  const sampleInterval = 10e-9;
  const lines = ['Time (s),CH1 (V)'];
  for (let i = 0; i < samples; i++) lines.push(`${(i * sampleInterval).toExponential(6)},${(1.2 + 0.01 * random.normal()).toFixed(5)}`);
  return `${lines.join('\n')}\n`;
}

/** A channel holding one value in every sample (a probe left off): 2000 samples of 0 V, 10 ns apart. */
export function flatLineCapture(samples = 2000): string {
  const lines = ['Time (s),CH1 (V)'];
  for (let i = 0; i < samples; i++) lines.push(`${(i * 10e-9).toExponential(6)},0.00000`);
  return `${lines.join('\n')}\n`;
}

/** The input filter sample with its time column in milliseconds under the ambiguous 'MS' (milli or mega?). */
export function ambiguousMillisecondsCapture(): string {
  const [header, ...rows] = readFileSync(join(repoRoot, 'sample-captures/input-filter-step.csv'), 'utf8').trim().split('\n');
  if (header !== 'Time (s),CH1 (V)') throw new Error(`input-filter-step.csv has another header now: ${header}`);
  const scaled = rows.map((row) => {
    const [t, v] = row.split(',');
    return `${(Number(t) * 1e3).toPrecision(12)},${v}`;
  });
  return `${['Time (MS),CH1 (V)', ...scaled].join('\n')}\n`;
}

/** The input filter sample with its time stamps written with two significant digits: they repeat (its 400 ns steps are lost). */
export function coarseTimeCapture(): string {
  const [header, ...rows] = readFileSync(join(repoRoot, 'sample-captures/input-filter-step.csv'), 'utf8').trim().split('\n');
  const coarse = rows.map((row) => {
    const [t, v] = row.split(',');
    return `${Number(t).toPrecision(2)},${v}`;
  });
  return `${[header, ...coarse].join('\n')}\n`;
}

/** The input filter sample twice in one file, as repeated acquisitions: the second at half the amplitude, after a blank line and the header. */
export function twoSegmentCapture(): string {
  const [header, ...rows] = readFileSync(join(repoRoot, 'sample-captures/input-filter-step.csv'), 'utf8').trim().split('\n');
  const halved = rows.map((row) => {
    const [t, v] = row.split(',');
    return `${t},${(Number(v) / 2).toFixed(6)}`;
  });
  return `${[header, ...rows, '', header, ...halved].join('\n')}\n`;
}

/** A ring of 1 MHz (zeta 0.05) driven by a square wave: four edges, each five time constants after the one before, with seeded noise. */
export function squareWaveCapture(seed = 5): string {
  const omega0 = 2 * Math.PI * 1e6;
  const alpha = 0.05 * omega0;
  const sampleInterval = 20e-9;
  const edges = [2e-6, 2e-6 + 5 / alpha, 2e-6 + 10 / alpha, 2e-6 + 15 / alpha];
  const samples = Math.round((edges[3] + 6 / alpha) / sampleInterval);
  const time = Float64Array.from({ length: samples }, (_, i) => i * sampleInterval);
  const values = new Float64Array(samples);
  edges.forEach((t0, k) => {
    // Alternate edges of 5 V up and down; each adds its own step response to what is left of the ones before.
    const size = k % 2 === 0 ? 5 : -5;
    const one = evaluateResponse({ t0, yPre: 0, yFinal: size, a: -size, b: -alpha * size, alpha, omega0 }, time);
    for (let i = 0; i < samples; i++) values[i] += one[i];
  });
  const random = createRandom(seed);
  const lines = ['Time (s),CH1 (V)'];
  for (let i = 0; i < samples; i++) lines.push(`${time[i].toExponential(6)},${(values[i] + 0.02 * random.normal()).toFixed(5)}`);
  return `${lines.join('\n')}\n`;
}

/**
 * 1.4 periods of a 0.5 MHz ring at zeta 0.01 released from 1 V after 150 ns at rest, a sample a ns, noise 10 mV: the
 * record turns twice, and the event search's swings alone would cut it into three events.
 */
export function slowRingCapture(seed = 1): string {
  const omega0 = 2 * Math.PI * 0.5e6;
  const alpha = 0.01 * omega0;
  const omegaD = Math.sqrt(omega0 ** 2 - alpha ** 2);
  const random = createRandom(seed);
  const lines = ['Time (s),CH1 (V)'];
  for (let i = 0; i < 3000; i++) {
    const tau = (i - 150) * 1e-9;
    const clean = tau < 0 ? 1 : Math.exp(-alpha * tau) * Math.cos(omegaD * tau);
    lines.push(`${(i * 1e-9).toExponential(6)},${(clean + 0.01 * random.normal()).toFixed(5)}`);
  }
  return `${lines.join('\n')}\n`;
}

/** An RC charging step (tau 10 µs, 5 V) with seeded noise: a first-order response, no ring. */
export function rcStepCapture(seed = 3): string {
  const random = createRandom(seed);
  const tau = 10e-6;
  const sampleInterval = 100e-9;
  const lines = ['Time (s),CH1 (V)'];
  for (let i = 0; i < 1500; i++) {
    const t = (i - 200) * sampleInterval;
    const clean = t < 0 ? 0 : 5 * (1 - Math.exp(-t / tau));
    lines.push(`${t.toExponential(6)},${(clean + 0.01 * random.normal()).toFixed(5)}`);
  }
  return `${lines.join('\n')}\n`;
}
