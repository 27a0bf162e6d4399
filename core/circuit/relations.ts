// The series and parallel RLC relations, written as power laws of R, L, C so that values,
// sensitivities d ln(y)/d ln(X) and first-order uncertainty propagation share one table.

export type Topology = 'series' | 'parallel';
export type ComponentName = 'R' | 'L' | 'C';
export type ResponseQuantityName = 'alpha' | 'omega0' | 'zeta' | 'Q';

export const COMPONENT_NAMES: readonly ComponentName[] = ['R', 'L', 'C'];
export const COMPONENT_UNITS: Record<ComponentName, string> = { R: 'ohm', L: 'H', C: 'F' };
export const RESPONSE_UNITS: Record<ResponseQuantityName, string> = { alpha: 's^-1', omega0: 'rad/s', zeta: '', Q: '' };

/** y = factor * R^eR * L^eL * C^eC. */
export interface PowerLaw {
  factor: number;
  exponents: Record<ComponentName, number>;
}

/**
 * Series loop: alpha = R / (2 L); parallel tank: alpha = 1 / (2 R C); both: omega0 = 1 / sqrt(L C),
 * zeta = alpha / omega0, Q = omega0 / (2 alpha) = 1 / (2 zeta).
 */
export function responseRelations(topology: Topology): Record<ResponseQuantityName, PowerLaw> {
  const alpha: PowerLaw =
    topology === 'series'
      ? { factor: 0.5, exponents: { R: 1, L: -1, C: 0 } }
      : { factor: 0.5, exponents: { R: -1, L: 0, C: -1 } };
  const omega0: PowerLaw = { factor: 1, exponents: { R: 0, L: -0.5, C: -0.5 } };
  const zetaExponents = combineExponents(alpha.exponents, omega0.exponents, -1);
  const zeta: PowerLaw = { factor: alpha.factor, exponents: zetaExponents };
  const Q: PowerLaw = { factor: 1 / (2 * alpha.factor), exponents: scaleExponents(zetaExponents, -1) };
  return { alpha, omega0, zeta, Q };
}

/** The power law at the given component values. */
export function evaluatePowerLaw(law: PowerLaw, values: Record<ComponentName, number>): number {
  let y = law.factor;
  for (const name of COMPONENT_NAMES) {
    const e = law.exponents[name];
    if (e !== 0) y *= Math.pow(values[name], e);
  }
  return y;
}

/** Relative standard uncertainty of a power law from independent relative uncertainties of R, L, C. */
export function powerLawRelativeUncertainty(law: PowerLaw, relative: Record<ComponentName, number>): number {
  let variance = 0;
  for (const name of COMPONENT_NAMES) variance += (law.exponents[name] * relative[name]) ** 2;
  return Math.sqrt(variance);
}

function combineExponents(
  x: Record<ComponentName, number>,
  y: Record<ComponentName, number>,
  ySign: number,
): Record<ComponentName, number> {
  return { R: x.R + ySign * y.R, L: x.L + ySign * y.L, C: x.C + ySign * y.C };
}

function scaleExponents(x: Record<ComponentName, number>, k: number): Record<ComponentName, number> {
  return { R: k * x.R, L: k * x.L, C: k * x.C };
}
