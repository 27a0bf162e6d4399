// Reported uncertainties under bandwidth-limited (low-pass filtered) noise against the spread over seeded records.

import { describe, expect, it } from 'vitest';
import { fitResponse } from '../../core/fit/fitResponse';
import { createRandom } from '../../core/random';

const SAMPLES = 600;
const DT = 1e-8;
/** 20 samples per ring period: the ring sits where a first-order low-pass of neighbour correlation 0.8 is down 4.7 dB from DC. */
const OMEGA_D = (2 * Math.PI) / (20 * DT);
const ALPHA = 0.05 * OMEGA_D;
const NOISE_RMS = 0.02;
const RECORDS = 60;

/** A unit ringdown from t = 0 plus first-order low-pass noise (AR(1), neighbour correlation rho) of stationary rms NOISE_RMS. */
function ringdown(seed: number, rho: number) {
  const random = createRandom(seed);
  const time = Float64Array.from({ length: SAMPLES }, (_, i) => i * DT);
  const values = new Float64Array(SAMPLES);
  let noise = NOISE_RMS * random.normal();
  for (let i = 0; i < SAMPLES; i++) {
    if (i > 0) noise = rho * noise + NOISE_RMS * Math.sqrt(1 - rho * rho) * random.normal();
    values[i] = Math.exp(-ALPHA * time[i]) * Math.cos(OMEGA_D * time[i]) + noise;
  }
  return { time, values, unit: 'V' };
}

/** Mean reported stderr over the RMS error, for omega_d and alpha, over RECORDS seeded fits; and how many fits were widened. */
function calibration(rho: number, seed: number) {
  const squares = [0, 0];
  const stderrs = [0, 0];
  let widened = 0;
  for (let run = 0; run < RECORDS; run++) {
    const fit = fitResponse(ringdown(seed + run, rho), { window: { start: 0 } });
    const pairs: [number, number | null, number][] = [
      [fit.omegaD?.value ?? NaN, fit.omegaD?.stderr ?? null, OMEGA_D],
      [fit.alpha.value, fit.alpha.stderr, ALPHA],
    ];
    pairs.forEach(([value, stderr, truth], k) => {
      squares[k] += (value - truth) ** 2;
      stderrs[k] += stderr ?? NaN;
    });
    if (fit.warnings.some((w) => w.includes('residuals are correlated'))) widened++;
  }
  return { ratios: stderrs.map((s, k) => s / RECORDS / Math.sqrt(squares[k] / RECORDS)), widened };
}

describe('uncertainties under correlated noise', () => {
  // 60 records give the RMS error to about 9 % (1 sigma), so 0.75..1.33 is a band of about 3 sigma. Treating
  // the noise as white gives about 0.6 here, and widening every parameter by the noise's DC excess about 1.7.
  it('low-pass noise: the reported stderr of omega_d and alpha matches the spread of the estimates', () => {
    const { ratios, widened } = calibration(0.8, 1000);
    for (const r of ratios) {
      expect(r).toBeGreaterThan(0.75);
      expect(r).toBeLessThan(1.33);
    }
    expect(widened).toBe(RECORDS);
  }, 20_000);

  it('white noise: the stderr is left as for white residuals and still matches the spread', () => {
    const { ratios, widened } = calibration(0, 2000);
    for (const r of ratios) {
      expect(r).toBeGreaterThan(0.75);
      expect(r).toBeLessThan(1.33);
    }
    expect(widened).toBe(0);
  }, 20_000);
});
