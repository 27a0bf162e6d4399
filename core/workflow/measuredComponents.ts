// R, L and C from a fit and one known part, and the one way the known part is written for people.

import { componentsFromResponse, type KnownComponent, type Topology } from '../circuit/components';
import { COMPONENT_UNITS } from '../circuit/relations';
import { CircuitInputError } from '../circuit/errors';
import { toleranceToRelativeUncertainty } from '../circuit/tolerance';
import { alphaOmega0Correlation } from '../fit/correlation';
import type { ResponseFit } from '../fit/fitResponse';
import type { FitSummary } from '../report/fitSummary';
import { formatEngineering } from '../units/format';

/** What the user states about the circuit: its topology and one part whose value is known. */
export interface KnownPartRequest {
  topology: Topology;
  known: KnownComponent;
}

/**
 * 'C = 47 µF' or 'C = 47 µF ± 5 % (rectangular half-width: u = tol/√3 = 2.89 %, GUM 4.3.7)': the known part
 * as every face writes it, saying how its tolerance enters the uncertainties.
 */
export function describeKnownPart(known: KnownComponent): string {
  const percent = (fraction: number) => `${+(fraction * 100).toPrecision(3)} %`;
  const tolerance = known.tolerance
    ? ` ± ${percent(known.tolerance)} (rectangular half-width: u = tol/√3 = ${percent(toleranceToRelativeUncertainty(known.tolerance))}, GUM 4.3.7)`
    : '';
  return `${known.name} = ${formatEngineering(known.value, COMPONENT_UNITS[known.name])}${tolerance}`;
}

/**
 * The other two parts from alpha, omega0 and the known one (a CircuitInputError when the rates are not
 * positive, or when the response is first order: one time constant cannot give two parts).
 */
export function deriveComponents(
  fit: Pick<ResponseFit, 'alpha' | 'omega0' | 'correlation'> & { regime?: string },
  request: KnownPartRequest,
): NonNullable<FitSummary['components']> {
  if (fit.regime === 'first-order') {
    throw new CircuitInputError('known', 'the response is first order (one time constant, tau): R, L and C need a second-order response, so only tau is reported');
  }
  return {
    topology: request.topology,
    known: describeKnownPart(request.known),
    ...componentsFromResponse(fit.alpha, fit.omega0, request.topology, request.known, alphaOmega0Correlation(fit.correlation)),
  };
}
