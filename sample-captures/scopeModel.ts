// A simple 8-bit scope front end for the sample captures: analog noise, then 256 codes over 10 divisions.

import type { Random } from '../core/random';

/** 8-bit converter: 256 codes spread over 10 vertical divisions (common practice for bench scopes). */
export const CODES = 256;
export const DIVISIONS = 10;

export interface ScopeSettings {
  /** Vertical scale per division, in the channel's unit. */
  perDivision: number;
  /** Level at the middle of the screen (code 128). */
  center: number;
  /** Standard deviation of the analog noise added before conversion. */
  noiseRms: number;
}

/** Quantisation step (one code) in the channel's unit. */
export function codeStep(scope: ScopeSettings): number {
  return (scope.perDivision * DIVISIONS) / CODES;
}

/** Lowest and highest levels the converter can report (codes 0 and 255). */
export function rails(scope: ScopeSettings): { min: number; max: number } {
  const q = codeStep(scope);
  return { min: scope.center - (CODES / 2) * q, max: scope.center + (CODES / 2 - 1) * q };
}

/** Adds noise, converts to codes (saturating at the rails) and returns levels plus how many samples hit a rail. */
export function digitise(
  analog: ArrayLike<number>,
  scope: ScopeSettings,
  random: Random,
): { values: Float64Array; railSamples: number } {
  const q = codeStep(scope);
  const values = new Float64Array(analog.length);
  let railSamples = 0;
  for (let i = 0; i < analog.length; i++) {
    const noisy = analog[i] + scope.noiseRms * random.normal();
    const raw = Math.round((noisy - scope.center) / q) + CODES / 2;
    const code = Math.min(CODES - 1, Math.max(0, raw));
    if (code !== raw) railSamples++;
    values[i] = scope.center + (code - CODES / 2) * q;
  }
  return { values, railSamples };
}
