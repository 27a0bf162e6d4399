// Isolated single-sample spikes: found where they were put, never in noise, steps, fast rings or quantised records,
// and left out of the fit so that the ring they sit on is measured within its stated uncertainty.
import { readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { isolatedSpikes } from '../../core/fit/isolatedSpikes';
import { createRandom } from '../../core/random';
import { parseCapture } from '../../core/capture/parseCapture';
import { measureCapture } from '../../core/workflow/measure';
import type { Channel } from '../../core/capture/types';

const SAMPLES = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../sample-captures');

/** A ringdown from a step at sample `start`: amplitude 1, `perPeriod` samples a period, white noise `sigma`. */
function ring(n: number, perPeriod: number, sigma: number, seed: number, start = n / 10): Float64Array {
  const random = createRandom(seed);
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const k = i - start;
    y[i] = (k >= 0 ? Math.exp(-k / (8 * perPeriod)) * Math.cos((2 * Math.PI * k) / perPeriod) : 0) + sigma * random.normal();
  }
  return y;
}

/**
 * `count` spike positions at least `gap` samples apart and from the ends and the step at `step` (a spike beside a step
 * is not isolated), with heights of `low` to `high` either sign.
 */
function addSpikes(y: Float64Array, count: number, gap: number, low: number, high: number, seed: number, step = y.length / 10): number[] {
  const random = createRandom(seed);
  const at: number[] = [];
  while (at.length < count) {
    const i = 3 + Math.floor(random.uniform() * (y.length - 6));
    if (Math.abs(i - step) >= gap && at.every((j) => Math.abs(j - i) >= gap)) at.push(i);
  }
  for (const i of at) y[i] += (random.uniform() < 0.5 ? -1 : 1) * (low + (high - low) * random.uniform());
  return at.sort((a, b) => a - b);
}

/**
 * Noise about 0, then a jump to -0.49 into a ring that falls on to -0.66 (about 30 samples a period). The sample before
 * the jump stands 3.3 noise deviations above the one before it, yet the jump and the ring's start leave a spike's
 * pattern of fourth differences there, 24 deviations high: these samples once were taken for one.
 */
function jumpIntoSteepRing(): Float64Array {
  const random = createRandom(11);
  const y = Float64Array.from({ length: 400 }, () => 0.01 * random.normal());
  const around = [0.00285, 0.00685, -0.02344, 0.01006, -0.48741, -0.61976, -0.65714, -0.65005, -0.62379];
  const jump = 200;
  y.set(around, jump - 4);
  const decay = Math.exp(-0.028);
  const turn = (2 * Math.PI) / 30.4;
  for (let k = around.length - 4; jump + k < y.length; k++) {
    y[jump + k] += -0.66 * decay ** (k - 3) * Math.cos(turn * (k - 3));
  }
  return y;
}

describe('isolated spikes', () => {
  it.each([8, 20, 100])('finds every spike of 20 to 60 noise deviations, and only those, on a ring of %i samples a period', (perPeriod) => {
    const sigma = 0.005;
    const y = ring(5000, perPeriod, sigma, perPeriod);
    const at = addSpikes(y, 25, 6, 20 * sigma, 60 * sigma, perPeriod + 1);
    expect(isolatedSpikes(y)).toEqual(at);
  });

  it.each([
    ['white noise', Float64Array.from({ length: 5000 }, ((r) => () => r.normal())(createRandom(1)))],
    ['a clean ring of 5 samples a period', ring(5000, 5, 0, 2)],
    ['a ring of 5 samples a period at 80 dB', ring(5000, 5, 1e-4, 3)],
    ['a ring of 12 samples a period at 60 dB', ring(5000, 12, 1e-3, 4)],
    ['a noiseless step', Float64Array.from({ length: 2000 }, (_, i) => (i < 700 ? 0 : 5))],
    ['a square wave with noise', Float64Array.from(ring(4000, 40, 0.01, 5), (v, i) => v + (Math.floor(i / 37) % 2 ? 3 : -3))],
    ['an 8-bit record of a slow step (mostly one code)', Float64Array.from({ length: 3000 }, (_, i) => Math.round(127 * (i < 1500 ? 0.1 : 0.9) + (i % 97 === 0 ? 1 : 0)) / 127)],
    ['the last sample before a jump into a steep ring', jumpIntoSteepRing()],
  ])('finds none in %s', (_, values) => {
    expect(isolatedSpikes(values)).toEqual([]);
  });

  it('finds none in any sample capture', () => {
    for (const file of readdirSync(SAMPLES).filter((f) => f.endsWith('.csv'))) {
      const capture = parseCapture(readFileSync(path.join(SAMPLES, file), 'utf8'));
      for (const channel of capture.channels) expect(isolatedSpikes(channel.values), `${file} ${channel.name}`).toEqual([]);
    }
  });

  it('a ring with 1 % of its samples spiked is measured within its stated uncertainty, the spikes named (they split it into events before, and a misfit between two was reported)', () => {
    const dt = 2e-9;
    const perPeriod = 100;
    const n = 5000;
    const values = ring(n, perPeriod, 0.005, 7, 500);
    addSpikes(values, 50, 6, 2, 4, 8, 500);
    const time = Float64Array.from({ length: n }, (_, i) => (i - 500) * dt);
    const channel: Channel = { name: 'CH1', unit: 'V', time, values, clipped: new Uint8Array(n), dropped: 0 };
    const { summary } = measureCapture({ file: 'spiked.csv', channel });
    expect(summary.status).toBe('converged');
    expect(summary.warnings[0]).toMatch(/^50 isolated spikes left out of the fit \(the first at .*\): single samples standing 10 or more noise deviations/);
    const alpha = 1 / (8 * perPeriod * dt);
    const omegaD = (2 * Math.PI) / (perPeriod * dt);
    const omega0 = Math.hypot(alpha, omegaD);
    expect(Math.abs(summary.alpha.value - alpha)).toBeLessThan(3 * summary.alpha.stderr!);
    expect(Math.abs(summary.omega0.value - omega0)).toBeLessThan(3 * summary.omega0.stderr!);
  });
});
