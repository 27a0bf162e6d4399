// The F-test of nested least-squares models: whether the richer model's drop in residual is more than noise.

/** Largest number of continued-fraction terms of the incomplete beta function (converges in far fewer). */
const MAX_TERMS = 300;
/** Relative size of the last term at which the continued fraction has converged. */
const EPSILON = 1e-15;
/** Smallest magnitude the modified Lentz method lets a denominator reach (avoids a division by zero). */
const TINY = 1e-300;

/** ln Gamma(x) for x > 0 (Lanczos approximation, g = 7, 9 terms; Numerical Recipes 3rd ed. 6.1). */
function logGamma(x: number): number {
  const g = [
    0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059, 12.507343278686905,
    -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
  ];
  if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - logGamma(1 - x);
  const z = x - 1;
  let sum = g[0];
  for (let i = 1; i < g.length; i++) sum += g[i] / (z + i);
  const t = z + 7.5;
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(sum);
}

/** Continued fraction of the incomplete beta function, by the modified Lentz method (Numerical Recipes 6.4). */
function betaFraction(x: number, a: number, b: number): number {
  let c = 1;
  let d = 1 - ((a + b) * x) / (a + 1);
  d = 1 / (Math.abs(d) < TINY ? TINY : d);
  let h = d;
  for (let m = 1; m <= MAX_TERMS; m++) {
    const m2 = 2 * m;
    for (const coefficient of [(m * (b - m) * x) / ((a + m2 - 1) * (a + m2)), (-(a + m) * (a + b + m) * x) / ((a + m2) * (a + m2 + 1))]) {
      d = 1 + coefficient * d;
      d = 1 / (Math.abs(d) < TINY ? TINY : d);
      c = 1 + coefficient / c;
      if (Math.abs(c) < TINY) c = TINY;
      h *= d * c;
    }
    if (Math.abs(d * c - 1) < EPSILON) break;
  }
  return h;
}

/** The regularized incomplete beta function I_x(a, b) (Abramowitz and Stegun 26.5.8 with the symmetry 26.5.2). */
export function incompleteBeta(x: number, a: number, b: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const front = Math.exp(logGamma(a + b) - logGamma(a) - logGamma(b) + a * Math.log(x) + b * Math.log(1 - x));
  return x < (a + 1) / (a + b + 2) ? (front * betaFraction(x, a, b)) / a : 1 - (front * betaFraction(1 - x, b, a)) / b;
}

/** P(F > f) for F with d1 and d2 degrees of freedom: I_{d2 / (d2 + d1 f)}(d2 / 2, d1 / 2) (Abramowitz and Stegun 26.6.2). */
export function fTail(f: number, d1: number, d2: number): number {
  if (!(f > 0)) return 1;
  return incompleteBeta(d2 / (d2 + d1 * f), d2 / 2, d1 / 2);
}

/** Two nested least-squares fits over the same samples. */
export interface NestedFits {
  simpleSse: number;
  simpleParameters: number;
  richSse: number;
  richParameters: number;
  /** Independent samples among the ones fitted (fewer than their count when the noise is correlated). */
  effectiveSamples: number;
}

/**
 * The chance that noise alone lowers the residual by as much as the richer model does: the F-test of
 * nested linear models, F = ((S0 - S1) / (p1 - p0)) / (S1 / (n - p1)) (Seber and Wild, Nonlinear
 * Regression, 1989, 5.3, where it holds approximately for nonlinear models). With correlated noise the
 * drop in residual along smooth directions is larger by about n / n_eff, so F is scaled by n_eff / n and
 * the denominator's degrees of freedom are n_eff - p1.
 */
export function nestedFTestTail(fits: NestedFits, samples: number): number {
  const d1 = fits.richParameters - fits.simpleParameters;
  const d2 = fits.effectiveSamples - fits.richParameters;
  if (!(d1 > 0) || !(d2 > 0)) return 1;
  if (!(fits.richSse > 0)) return fits.simpleSse > 0 ? 0 : 1;
  const f = ((fits.simpleSse - fits.richSse) / d1 / (fits.richSse / (samples - fits.richParameters))) * (fits.effectiveSamples / samples);
  return fTail(f, d1, d2);
}
