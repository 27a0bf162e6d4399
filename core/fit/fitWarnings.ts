// Warnings an engineer needs before trusting a response fit's numbers, each with the test behind it.

import { slowestDecayRate, type ResponseParams } from '../response/secondOrder';
import type { FitSet } from './fitSet';
import { noiseFloor, quantisationStep } from './noise';

/** At least this many samples per ring period is the usual working margin (common practice, no single source). */
const MIN_SAMPLES_PER_PERIOD = 10;
/** A residual beyond this many times the noise level is more than noise: the model does not match. */
const MISMATCH_RATIO = 2;
/** Relative 1-sigma uncertainty of omega0 beyond which 3 sigma exceed 2 %: L or C from it are not pinned down. */
const UNCERTAIN_OMEGA0 = 0.0067;
/** Noise below this share of a converter code does not dither the quantisation (see subCodeNoiseWarning). */
const DITHER_NOISE = 0.5;

/** Whether a fit warning is the thin-sampling one below (which the setup checks state again, with their level). */
export function isThinSamplingWarning(warning: string): boolean {
  return /^only [\d.]+ samples per ring period /.test(warning);
}

/** Thin sampling, short record, poor match. */
export function plausibilityWarnings(set: FitSet, p: ResponseParams, omegaD: number | null, rmsResidual: number, noise: number): string[] {
  const warnings: string[] = [];
  const dtRaw = set.block?.spacing ?? set.dt;
  if (omegaD !== null) {
    const perPeriod = (2 * Math.PI) / omegaD / dtRaw;
    if (perPeriod < MIN_SAMPLES_PER_PERIOD) {
      warnings.push(`only ${perPeriod.toFixed(1)} samples per ring period (${MIN_SAMPLES_PER_PERIOD} or more is the usual margin for a fit)`);
    }
  }
  const span = set.window.end - p.t0;
  if (span * slowestDecayRate(p.alpha, p.omega0) < 1) {
    warnings.push('the record ends before the response has decayed by 1/e: alpha and the final value are poorly determined');
  }
  const floor = noiseFloor(noise, set.range);
  if (rmsResidual > MISMATCH_RATIO * floor) {
    warnings.push(
      `the model leaves a residual of ${(rmsResidual / floor).toFixed(1)}x the noise level: the circuit may not be second order, or the window includes the excitation`,
    );
  }
  return warnings;
}

/** When the natural frequency's standard error is too large for L or C to be read from it. */
export function uncertainOmega0Warning(omega0: number, stderr: number | null): string | null {
  if (stderr === null || !(stderr > UNCERTAIN_OMEGA0 * omega0)) return null;
  return `omega0 is uncertain by ${((100 * stderr) / omega0).toFixed(1)} % (1 sigma): the record does not pin the natural frequency down`;
}

/**
 * With less noise than half a converter code to dither it, the quantisation error follows the signal
 * instead of averaging out: its mean ripples by about (q / pi) exp(-2 pi^2 sigma^2 / q^2), 0.06 q at
 * sigma = 0.3 q but under 0.01 q from sigma = q / 2 on (Widrow and Kollar, Quantization Noise, 2008,
 * Gaussian input; from memory). The fit's standard errors do not include that bias.
 */
export function subCodeNoiseWarning(values: ArrayLike<number>, noise: number): string | null {
  const q = quantisationStep(values);
  if (!(q > 0) || noise >= DITHER_NOISE * q) return null;
  return `the noise (${(noise / q).toFixed(2)} of a converter code) is too small to dither the quantisation: its error follows the signal and may bias the fit beyond its standard errors (more vertical resolution or averaging off helps)`;
}
