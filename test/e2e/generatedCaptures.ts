// Capture texts generated for the window's tests (seeded, never a real instrument's file).

import { createRandom } from '../../core/random';

/** A DC level with white noise and nothing else: no response for the fit to find. */
export function flatNoiseCapture(seed = 11, samples = 2000): string {
  const random = createRandom(seed);
  const sampleInterval = 10e-9;
  const lines = ['Time (s),CH1 (V)'];
  for (let i = 0; i < samples; i++) lines.push(`${(i * sampleInterval).toExponential(6)},${(1.2 + 0.01 * random.normal()).toFixed(5)}`);
  return `${lines.join('\n')}\n`;
}
