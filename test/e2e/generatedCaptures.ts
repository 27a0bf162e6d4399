// Capture texts generated for the window's tests (seeded, never a real instrument's file).

import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { createRandom } from '../../core/random';
import { repoRoot } from './benchHarness';

/** A DC level with white noise and nothing else: no response for the fit to find. */
export function flatNoiseCapture(seed = 11, samples = 2000): string {
  const random = createRandom(seed);
  const sampleInterval = 10e-9;
  const lines = ['Time (s),CH1 (V)'];
  for (let i = 0; i < samples; i++) lines.push(`${(i * sampleInterval).toExponential(6)},${(1.2 + 0.01 * random.normal()).toFixed(5)}`);
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

/** The input filter sample twice in one file, as repeated acquisitions: the second at half the amplitude, after a blank line and the header. */
export function twoSegmentCapture(): string {
  const [header, ...rows] = readFileSync(join(repoRoot, 'sample-captures/input-filter-step.csv'), 'utf8').trim().split('\n');
  const halved = rows.map((row) => {
    const [t, v] = row.split(',');
    return `${t},${(Number(v) / 2).toFixed(6)}`;
  });
  return `${[header, ...rows, '', header, ...halved].join('\n')}\n`;
}
