// Effective R, L, C from a fitted alpha and omega0 plus one known component, with first-order uncertainties.
import { quantity, type Quantity } from '../quantity';
import { CircuitInputError } from './errors';
import { COMPONENT_NAMES, COMPONENT_UNITS, responseRelations, type ComponentName, type Topology } from './relations';
import { toleranceToRelativeUncertainty } from './tolerance';

export type { Topology } from './relations';

export interface KnownComponent {
  name: ComponentName;
  /** Value in SI base units (ohm, H, F). */
  value: number;
  /** Relative tolerance, 0.05 = 5 %; read as a rectangular half-width (u = tol / sqrt(3), GUM 4.3.7). Default 0. */
  tolerance?: number;
}

/**
 * The two unknown components from alpha and omega0 and the known one.
 * Series: alpha = R / (2 L); parallel: alpha = 1 / (2 R C); both: omega0 = 1 / sqrt(L C).
 * Every answer is a power law of alpha, omega0 and the known value, so the relative uncertainty is
 * propagated to first order in log space, with the alpha-omega0 correlation of the fit when given.
 * A stderr is null when it needs an alpha or omega0 stderr that is null. The known component is
 * returned as given, its uncertainty from the tolerance.
 */
export function componentsFromResponse(
  alpha: Quantity,
  omega0: Quantity,
  topology: Topology,
  known: KnownComponent,
  correlationAlphaOmega0 = 0,
): { R: Quantity; L: Quantity; C: Quantity } {
  validateInputs(alpha, omega0, known, correlationAlphaOmega0);
  const relations = responseRelations(topology);
  const unknown = COMPONENT_NAMES.filter((n) => n !== known.name) as [ComponentName, ComponentName];
  const ea = relations.alpha.exponents;
  const ew = relations.omega0.exponents;
  // ln alpha = ln fa + sum eA_X ln X ; ln omega0 = sum eW_X ln X  ->  M (ln U1, ln U2) = rhs.
  const m11 = ea[unknown[0]];
  const m12 = ea[unknown[1]];
  const m21 = ew[unknown[0]];
  const m22 = ew[unknown[1]];
  const det = m11 * m22 - m12 * m21;
  const lnK = Math.log(known.value);
  const rhsA = Math.log(alpha.value) - Math.log(relations.alpha.factor) - ea[known.name] * lnK;
  const rhsW = Math.log(omega0.value) - ew[known.name] * lnK;
  // Rows of M^-1: d ln U_i / d (rhsA, rhsW).
  const inverse = [
    [m22 / det, -m12 / det],
    [-m21 / det, m11 / det],
  ];
  const uA = relativeOrNull(alpha);
  const uW = relativeOrNull(omega0);
  const uK = toleranceToRelativeUncertainty(known.tolerance ?? 0);
  const result = {} as Record<ComponentName, Quantity>;
  result[known.name] = quantity(known.value, known.value * uK, COMPONENT_UNITS[known.name]);
  unknown.forEach((name, i) => {
    const [dA, dW] = inverse[i];
    const value = Math.exp(dA * rhsA + dW * rhsW);
    const dK = -(dA * ea[known.name] + dW * ew[known.name]);
    const needA = dA !== 0;
    const needW = dW !== 0;
    let stderr: number | null = null;
    if ((!needA || uA !== null) && (!needW || uW !== null)) {
      const a = needA ? dA * (uA as number) : 0;
      const w = needW ? dW * (uW as number) : 0;
      const variance = a * a + w * w + 2 * correlationAlphaOmega0 * a * w + (dK * uK) ** 2;
      stderr = value * Math.sqrt(Math.max(variance, 0));
    }
    result[name] = quantity(value, stderr, COMPONENT_UNITS[name]);
  });
  return result;
}

function relativeOrNull(q: Quantity): number | null {
  return q.stderr === null ? null : q.stderr / q.value;
}

function validateInputs(alpha: Quantity, omega0: Quantity, known: KnownComponent, rho: number): void {
  if (!COMPONENT_NAMES.includes(known.name)) throw new CircuitInputError('known.name', "must be 'R', 'L' or 'C'");
  if (!Number.isFinite(known.value) || known.value <= 0) {
    throw new CircuitInputError('known.value', `must be a positive finite number of ${COMPONENT_UNITS[known.name]}, got ${known.value}`);
  }
  const tol = known.tolerance;
  if (tol !== undefined && (!Number.isFinite(tol) || tol < 0 || tol >= 1)) {
    throw new CircuitInputError('known.tolerance', `must be a relative tolerance in [0, 1), got ${tol}`);
  }
  if (!Number.isFinite(alpha.value) || alpha.value <= 0) {
    throw new CircuitInputError('alpha', `must be positive and finite for physical components (a decaying response), got ${alpha.value} s^-1`);
  }
  if (!Number.isFinite(omega0.value) || omega0.value <= 0) {
    throw new CircuitInputError('omega0', `must be positive and finite, got ${omega0.value} rad/s`);
  }
  if (!Number.isFinite(rho) || Math.abs(rho) > 1) {
    throw new CircuitInputError('correlationAlphaOmega0', `must lie in [-1, 1], got ${rho}`);
  }
}
