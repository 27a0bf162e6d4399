// R, L and C from a fit and one known part, and the one way the known part is written for people.

import { componentsFromResponse, type KnownComponent, type Topology } from '../circuit/components';
import { COMPONENT_UNITS } from '../circuit/relations';
import { CircuitInputError } from '../circuit/errors';
import { toleranceToRelativeUncertainty } from '../circuit/tolerance';
import { alphaOmega0Correlation } from '../fit/correlation';
import type { ResponseFit, ResponseMode } from '../fit/responseFit';
import { UsageError } from '../inputError';
import type { Quantity } from '../quantity';
import { hertz } from '../report/resultRows';
import type { ComponentMode, FitSummary } from '../report/fitSummary';
import { formatEngineering } from '../units/format';

/** What the user states about the circuit: its topology and one part whose value is known. */
export interface KnownPartRequest {
  topology: Topology;
  known: KnownComponent;
}

/**
 * 'C = 47 µF ± 5 % (rectangular half-width: u = tol/√3 = 2.89 %, GUM 4.3.7)', or for a part given without a tolerance
 * 'C = 47 µF, taken as exact (...)': the known part as every face writes it, saying how its tolerance enters the
 * uncertainties. A part's tolerance most often dominates those of the two derived, so a part taken as exact says so
 * where its value is read.
 */
export function describeKnownPart(known: KnownComponent): string {
  const percent = (fraction: number) => `${+(fraction * 100).toPrecision(3)} %`;
  const tolerance = known.tolerance
    ? ` ± ${percent(known.tolerance)} (rectangular half-width: u = tol/√3 = ${percent(toleranceToRelativeUncertainty(known.tolerance))}, GUM 4.3.7)`
    : `, taken as exact (no tolerance given: ${(['R', 'L', 'C'] as const).filter((name) => name !== known.name).join(' and ')} carry the fit's uncertainty only)`;
  return `${knownPartValue(known)}${tolerance}`;
}

/** 'C = 47 µF': the known part's name and value alone. */
export function knownPartValue(known: KnownComponent): string {
  return `${known.name} = ${formatEngineering(known.value, COMPONENT_UNITS[known.name])}`;
}

/**
 * The other two parts from alpha, omega0 and the known one (a CircuitInputError when the rates are not
 * positive, or when the response is first order: one time constant cannot give two parts). With several
 * ringing modes they are derived for `mode` (1-based, default 1: the dominant one), and say which.
 */
export function deriveComponents(
  fit: Pick<ResponseFit, 'alpha' | 'omega0' | 'correlation'> & { regime?: string; modes?: readonly ResponseMode[] },
  request: KnownPartRequest,
  mode = 1,
): NonNullable<FitSummary['components']> {
  if (fit.regime === 'first-order') {
    throw new CircuitInputError('known', 'the response is first order (one time constant, tau): R, L and C need a second-order response, so only tau is reported');
  }
  const rates = ratesOfMode(fit, mode);
  return {
    topology: request.topology,
    known: describeKnownPart(request.known),
    ...componentsFromResponse(rates.alpha, rates.omega0, request.topology, request.known, rates.correlation),
    ...(rates.mode ? { mode: rates.mode } : {}),
  };
}

/**
 * The alpha and omega0 of one ringing mode (1-based) with their correlation, and which mode of how many
 * when the fit has several. A mode beyond those fitted is bad input, as --event beyond the events found.
 */
export function ratesOfMode(
  fit: Pick<ResponseFit, 'alpha' | 'omega0' | 'correlation'> & { modes?: readonly ResponseMode[] },
  mode = 1,
): { alpha: Quantity; omega0: Quantity; correlation: number; mode: ComponentMode | null } {
  const modes = fit.modes ?? [];
  const count = Math.max(1, modes.length);
  if (mode > count) throw new UsageError(`--mode ${mode}: the fit found ${count} ringing mode${count === 1 ? '' : 's'}`);
  if (modes.length < 2) return { alpha: fit.alpha, omega0: fit.omega0, correlation: alphaOmega0Correlation(fit.correlation), mode: null };
  const chosen = modes[mode - 1];
  return {
    alpha: chosen.alpha,
    omega0: chosen.omega0,
    correlation: modeCorrelation(fit.correlation, mode),
    mode: { index: mode, of: modes.length, f0: hertz(chosen.omega0) },
  };
}

/**
 * The correlation of one mode's alpha and omega0 in a fit of several modes, as the fit names them: the dominant
 * mode's 'alpha' and 'omega0', the k-th mode's 'alpha_k' and 'omega0_k' (0 when the fit gives no correlation).
 */
function modeCorrelation(correlation: ResponseFit['correlation'], mode: number): number {
  if (!correlation || mode === 1) return alphaOmega0Correlation(correlation);
  const ia = correlation.names.indexOf(`alpha_${mode}`);
  const iw = correlation.names.indexOf(`omega0_${mode}`);
  const rho = ia >= 0 && iw >= 0 ? correlation.matrix[ia][iw] : 0;
  return Number.isFinite(rho) ? Math.max(-1, Math.min(1, rho)) : 0;
}
