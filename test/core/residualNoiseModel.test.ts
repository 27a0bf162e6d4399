// The residuals' noise model reads the noise's own correlation, not that of the residuals the fit has taken its share of.

import { describe, expect, it } from 'vitest';
import { inverse, Matrix } from 'ml-matrix';
import { residualNoiseModel } from '../../core/fit/responseCovariance';
import { createRandom } from '../../core/random';

const SAMPLES = 1000;
const RHO = 0.8;
const TRIALS = 200;

/** Columns of a slow linear model (a level, a step's decay and a slow ring): where low-pass noise has its power. */
function slowColumns(): Float64Array[] {
  return Array.from({ length: SAMPLES }, (_, i) => {
    const t = i / SAMPLES;
    const decay = Math.exp(-3 * t);
    return Float64Array.from([1, decay, decay * Math.cos(12 * t), decay * Math.sin(12 * t)]);
  });
}

/** The Yule-Walker reading of the neighbour correlation: sum e[i] e[i + 1] over sum e[i]^2. */
function lagOneCorrelation(e: Float64Array): number {
  let [lag0, lag1] = [0, 0];
  e.forEach((v, i) => {
    lag0 += v * v;
    if (i + 1 < e.length) lag1 += v * e[i + 1];
  });
  return lag1 / lag0;
}

describe('residualNoiseModel', () => {
  it('first-order low-pass noise: after a least-squares fit of slow columns the neighbour correlation reads as from the noise itself', () => {
    // Read from the residuals (I - P) e as they are, the correlation comes out 0.0077 below the same reading of the
    // noise e itself, over these 200 seeded records (the projection takes some 36 samples' worth of slow power);
    // the noise model must agree with the noise's own reading to well within that (paired, so the records' own
    // scatter of about 0.0013 in the mean largely cancels).
    const J = slowColumns();
    const p = J[0].length;
    const normal = new Matrix(J.map((row) => Array.from(row))).transpose().mmul(new Matrix(J.map((row) => Array.from(row))));
    const bread = inverse(normal).to2DArray();
    const random = createRandom(11);
    const innovation = Math.sqrt(1 - RHO * RHO);
    let difference = 0;
    for (let trial = 0; trial < TRIALS; trial++) {
      const e = new Float64Array(SAMPLES);
      e[0] = random.normal();
      for (let i = 1; i < SAMPLES; i++) e[i] = RHO * e[i - 1] + innovation * random.normal();
      const projection = new Array<number>(p).fill(0);
      J.forEach((row, i) => row.forEach((v, a) => (projection[a] += v * e[i])));
      const beta = bread.map((row) => row.reduce((s, v, k) => s + v * projection[k], 0));
      const residuals = e.map((v, i) => v - J[i].reduce((s, x, a) => s + x * beta[a], 0));
      const model = residualNoiseModel(residuals, J, bread);
      expect(model).not.toBeNull();
      difference += model!.coefficients[0] - lagOneCorrelation(e);
    }
    expect(Math.abs(difference / TRIALS)).toBeLessThan(0.0025);
  });

  it('white noise: no model (the residuals look white)', () => {
    const random = createRandom(12);
    const J = slowColumns();
    const bread = inverse(new Matrix(J.map((row) => Array.from(row))).transpose().mmul(new Matrix(J.map((row) => Array.from(row))))).to2DArray();
    expect(residualNoiseModel(Float64Array.from({ length: SAMPLES }, () => random.normal()), J, bread)).toBeNull();
  });
});
