// Trust table rows: see trustCase.ts. Case 5: heavily overdamped steps at 30 dB, where the fast root is barely in the record.

import { fitResponse, type ResponseFit } from '../../../../core/fit/fitResponse';
import { quantity } from '../../../../core/quantity';
import { accuracyCases, slowestRate, synthesize } from '../../../../bench/accuracyCases';
import { outcomeOfFit, type TrustCase, type TrustOutcome } from '../trustCase';

/** The accuracy benchmark's step (bench/accuracyCases.ts): omega0 = 2 pi 1 MHz, record 6 slow decay times after the event. */
const SAMPLES = 2000;
const SEED = 7;
const RUNS = [0, 1, 2, 3, 4, 5];
const ZETAS = [2, 5];

const fits = new Map<string, ResponseFit>();

/** The fit of one generated record, made once for the rows that read it. */
function fitOf(zeta: number, run: number): ResponseFit {
  const key = `${zeta}/${run}`;
  const known = fits.get(key);
  if (known) return known;
  const c = accuracyCases().find((k) => k.zeta === zeta && k.snrDb === 30 && k.noise === 'white' && !k.quantized);
  if (!c) throw new Error(`no accuracy case at zeta ${zeta}, 30 dB`);
  const fit = fitResponse(synthesize(c, SAMPLES, run, SEED).trace);
  fits.set(key, fit);
  return fit;
}

/**
 * The second-order claims alone: a fit that chose a single decay makes none (its slow root is the next
 * row's), so it stands here as declining to answer.
 */
function secondOrderOutcome(fit: ResponseFit): TrustOutcome {
  if (fit.regime === 'first-order') return { status: 'single decay chosen: no second-order claim', values: {} };
  return outcomeOfFit(fit);
}

/** The slow root, 1/s, with its standard error: 1/tau of a single decay, or alpha - sqrt(alpha^2 - omega0^2) of a ring fit. */
function slowRootOutcome(fit: ResponseFit): TrustOutcome {
  const base = outcomeOfFit(fit);
  const tau = fit.tau;
  if (tau) {
    return { ...base, regime: undefined, values: { slowRoot: quantity(1 / tau.value, tau.stderr === null ? null : tau.stderr / tau.value ** 2, 's^-1') } };
  }
  const { alpha, omega0, correlation } = fit;
  const root = Math.sqrt(Math.max(alpha.value ** 2 - omega0.value ** 2, 0));
  if (alpha.stderr === null || omega0.stderr === null || !correlation || !(root > 0)) {
    return { ...base, regime: undefined, values: { slowRoot: quantity(alpha.value - root, null, 's^-1') } };
  }
  const rho = correlation.matrix[correlation.names.indexOf('alpha')][correlation.names.indexOf('omega0')];
  // s = alpha - sqrt(alpha^2 - omega0^2): ds/dalpha = 1 - alpha / root, ds/domega0 = omega0 / root.
  const [ga, gw] = [1 - alpha.value / root, omega0.value / root];
  const variance = ga * ga * alpha.stderr ** 2 + 2 * ga * gw * rho * alpha.stderr * omega0.stderr + gw * gw * omega0.stderr ** 2;
  return { ...base, regime: undefined, values: { slowRoot: quantity(alpha.value - root, Math.sqrt(Math.max(variance, 0)), 's^-1') } };
}

const OMEGA0 = 2 * Math.PI * 1e6;

export const overdampedCases: TrustCase[] = ZETAS.flatMap((zeta) =>
  RUNS.flatMap((run): TrustCase[] => [
    {
      issueCase: 5,
      name: `zeta ${zeta} at 30 dB, record ${run}: a second-order answer holds alpha, omega0 and zeta, and says overdamped`,
      expect: 'right-or-failed',
      truth: { alpha: zeta * OMEGA0, omega0: OMEGA0, zeta },
      regime: 'overdamped',
      run: () => secondOrderOutcome(fitOf(zeta, run)),
    },
    {
      issueCase: 5,
      name: `zeta ${zeta} at 30 dB, record ${run}: the slow root, whichever model is chosen`,
      expect: 'right-or-failed',
      truth: { slowRoot: slowestRate(zeta * OMEGA0, OMEGA0) },
      run: () => slowRootOutcome(fitOf(zeta, run)),
    },
  ]),
);
