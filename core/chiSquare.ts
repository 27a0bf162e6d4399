// The chi-square distribution: the chance that a variable exceeds a value (a consistency test's p-value), and its quantiles.

/** Relative size of the last term at which the series and the continued fraction stop. */
const PRECISION = 1e-14;
const MAX_TERMS = 500;

/**
 * P(chi^2 > x) for `dof` degrees of freedom: the regularized upper incomplete gamma function
 * Q(dof/2, x/2), by its power series below a + 1 and by its continued fraction (modified Lentz) above it
 * (the usual split, W. H. Press et al., Numerical Recipes, section 6.2; from memory).
 */
/** A p-value as the fits' messages write it: two significant digits, or 'p < 1e-6' below that. */
export function pValueText(p: number): string {
  return p < 1e-6 ? 'p < 1e-6' : `p = ${p.toPrecision(2)}`;
}

export function chiSquareTail(x: number, dof: number): number {
  if (!(dof > 0) || !Number.isInteger(dof)) throw new RangeError(`chiSquareTail: dof must be a positive integer, got ${dof}`);
  if (!(x > 0)) return 1;
  const a = dof / 2;
  const z = x / 2;
  const front = Math.exp(-z + a * Math.log(z) - logGammaOfHalfInteger(dof));
  return z < a + 1 ? 1 - front * lowerSeries(a, z) : front * upperFraction(a, z);
}

/** sum_n z^n / (a (a+1) ... (a+n)): P(a, z) = front * this. */
function lowerSeries(a: number, z: number): number {
  let term = 1 / a;
  let sum = term;
  for (let n = 1; n < MAX_TERMS && Math.abs(term) > PRECISION * Math.abs(sum); n++) {
    term *= z / (a + n);
    sum += term;
  }
  return sum;
}

/** The continued fraction 1 / (z + 1 - a - 1 (1 - a) / (z + 3 - a - ...)): Q(a, z) = front * this. */
function upperFraction(a: number, z: number): number {
  const tiny = 1e-300;
  let b = z + 1 - a;
  let c = 1 / tiny;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < MAX_TERMS; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < tiny) d = tiny;
    c = b + an / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < PRECISION) break;
  }
  return h;
}

/** ln Gamma(dof / 2), exactly from Gamma(1/2) = sqrt(pi), Gamma(1) = 1 and Gamma(a + 1) = a Gamma(a). */
function logGammaOfHalfInteger(dof: number): number {
  let a = dof % 2 === 0 ? 1 : 0.5;
  let log = dof % 2 === 0 ? 0 : 0.5 * Math.log(Math.PI);
  for (; a < dof / 2; a += 1) log += Math.log(a);
  return log;
}

/** Bisection steps of chiSquareQuantile: each halves the bracket, so 200 reach the resolution of a double. */
const QUANTILE_STEPS = 200;

/** The p-quantile of chi^2 with `dof` degrees of freedom (P(chi^2 <= x) = p, 0 < p < 1), by bisection of chiSquareTail. */
export function chiSquareQuantile(p: number, dof: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`chiSquareQuantile: p must lie in (0, 1), got ${p}`);
  let lo = 0;
  let hi = Math.max(1, dof);
  while (1 - chiSquareTail(hi, dof) < p) hi *= 2;
  for (let i = 0; i < QUANTILE_STEPS && hi - lo > 1e-15 * hi; i++) {
    const mid = (lo + hi) / 2;
    if (1 - chiSquareTail(mid, dof) < p) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}
