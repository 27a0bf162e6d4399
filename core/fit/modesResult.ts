// The modes part of a ResponseFit: each ringing mode with its standard errors, and the table of orders tried.

import { quantity, type Quantity } from '../quantity';
import type { ModelOrder, ModeTerms, ResponseFit, ResponseMode } from './responseFit';
import type { ResponseParams } from '../response/secondOrder';
import type { FitStatus } from './types';
import type { ModesFit } from './modesFit';
import { termValues } from './modesModel';
import { fullVector, linearOf, modesCovariance, stepFloors } from './modesCovariance';
import type { Attempt } from './attempt';
import type { FitSet } from './fitSet';
import type { ResponseCovariance } from './responseCovariance';
import { LAYOUTS, unpackParams } from './responseModel';

/** A smooth function of a parameter vector, to have its value and first-order standard error. */
export type VectorFunction = (values: readonly number[]) => number;

/** Relative step of the central differences that carry the covariance to derived quantities. */
const DERIVATIVE_STEP = 1e-6;

/**
 * Value and standard error of f(values) to first order: g^T C g with g the central-difference gradient
 * (steps relative to each value, floored at `floors`). No standard error without a covariance.
 */
export function derivedQuantity(f: VectorFunction, values: readonly number[], cov: number[][] | null, floors: readonly number[], unit: string): Quantity {
  const value = f(values);
  if (!cov) return quantity(value, null, unit);
  const gradient = values.map((v, j) => {
    const h = DERIVATIVE_STEP * Math.max(Math.abs(v), floors[j]);
    const up = [...values];
    const down = [...values];
    up[j] += h;
    down[j] -= h;
    return (f(up) - f(down)) / (2 * h);
  });
  let variance = 0;
  for (let a = 0; a < gradient.length; a++) {
    if (gradient[a] === 0) continue;
    for (let b = 0; b < gradient.length; b++) variance += gradient[a] * cov[a][b] * gradient[b];
  }
  return quantity(value, variance >= 0 ? Math.sqrt(variance) : null, unit);
}

/**
 * The envelope at t0 of e^(-alpha tau) (a C + b S): sqrt(a^2 + (b / omega_d)^2) for a ring (the amplitude of
 * a cos(omega_d tau) + (b / omega_d) sin(omega_d tau)); |a|, the natural part at t0, where there is no ring.
 */
export function envelopeAtStart(a: number, b: number, alpha: number, omega0: number): number {
  const q = omega0 * omega0 - alpha * alpha;
  return q > 0 ? Math.hypot(a, b / Math.sqrt(q)) : Math.abs(a);
}

/**
 * An amplitude at t0 where t0 is held at a detected event, not fitted: the event lies somewhere between the
 * samples either side of it (uniform over one sample interval, standard deviation dt / sqrt(12)), and the
 * envelope e^(-rate tau) read at a t0 off by delta is off by rate delta of itself; that spread is added to
 * the standard error in quadrature.
 */
function withHeldT0(amplitude: Quantity, rate: number, set: FitSet, held: boolean): Quantity {
  if (!held || amplitude.stderr === null) return amplitude;
  const spread = Math.abs(amplitude.value) * rate * ((set.block?.spacing ?? set.dt) / Math.sqrt(12));
  return quantity(amplitude.value, Math.hypot(amplitude.stderr, spread), amplitude.unit);
}

/** The ring quantities of a mode, as ResponseFit reports them at its top level. */
export type RingQuantities = Pick<ResponseMode, 'alpha' | 'omega0' | 'omegaD' | 'zeta' | 'Q'>;

/** A mode from its ring quantities, its envelope at t0 and its share of the response's energy. */
export function responseMode(ring: RingQuantities, amplitude: Quantity, energyShare: number): ResponseMode {
  return { ...ring, amplitude, energyShare };
}

/** Names of the models in the order table: 'one ringing mode', 'two ringing modes on an exponential'... */
export function modelName(ringingModes: number, slowTerm: boolean): string {
  if (ringingModes === 0) return slowTerm ? 'a single decay' : 'no response';
  const count = ['no', 'one', 'two', 'three'][ringingModes] ?? String(ringingModes);
  return `${count} ringing mode${ringingModes === 1 ? '' : 's'}${slowTerm ? ' on an exponential' : ''}`;
}

/** Step floors for the derivatives of a response layout's parameters, by name (as its covariance is taken). */
export function parameterFloors(names: readonly string[], rate: number, range: number): number[] {
  return names.map((name) => (name === 't0' ? 1 / rate : name === 'b' ? range * rate : name.startsWith('y') || name === 'a' ? range : rate));
}

/** The criterion every order is ranked by (see modeOrder.ts for why). */
export const ORDER_CRITERION = 'BIC';

/**
 * The modes of a fit whose one ring is the whole model: that ring, its envelope at t0 with its standard
 * error (through the layout's covariance), all of the response's energy, and the order table modeOrder.ts made.
 */
export function singleModeFields(
  best: Attempt,
  t0Start: number,
  cov: ResponseCovariance,
  ring: RingQuantities,
  set: FitSet,
  unit: string,
  order: ModelOrder | null,
): Pick<ResponseFit, 'modes' | 'modelOrder'> & { warnings?: string[] } {
  const envelope = (values: readonly number[]) => {
    const p = unpackParams(best.layout, values, t0Start);
    return envelopeAtStart(p.a, p.b, p.alpha, p.omega0);
  };
  const { names } = LAYOUTS[best.layout];
  const floors = parameterFloors(names, ring.omega0.value, set.range);
  const held = !LAYOUTS[best.layout].fitsT0 && LAYOUTS[best.layout].preLevelColumn !== null;
  const amplitude = withHeldT0(derivedQuantity(envelope, best.values, cov.names.join() === names.join() ? cov.covariance : null, floors, unit), ring.alpha.value, set, held);
  return { modes: [responseMode(ring, amplitude, 1)], modelOrder: order };
}

/** A mode whose envelope at t0 is within this many standard errors of zero is not supported by the record. */
const UNSUPPORTED_SIGMAS = 2;

/** A chosen model with several rings or a slow term, as the result's assembly needs it. */
export interface MultiModeModel {
  /** The dominant ring with the levels and t0: top-level params, as for one ring. */
  params: ResponseParams;
  sse: number;
  status: FitStatus;
  message: string;
  iterations: number;
  /** Every parameter's covariance; the dominant ring's rates named 'alpha' and 'omega0', the k-th ring's 'alpha_k', 'omega0_k'. */
  covariance: ResponseCovariance;
  /** The modes (the dominant one with the top-level quantities given), the slow term and the terms to draw. */
  fields(dominant: RingQuantities, unit: string): Pick<ResponseFit, 'modes' | 'slowTerm' | 'modeTerms'> & { warnings: string[] };
}

/** The chosen model's parameters with standard errors, its rings ranked by their share of the response's energy. */
export function multiModeModel(set: FitSet, fit: ModesFit): MultiModeModel {
  const cov = modesCovariance(set, fit);
  const terms = termValues(set, fit.spec, fit.rates, fit.linear);
  const energy = terms.map((term) => term.reduce((sum, v) => sum + v * v, 0));
  const total = energy.reduce((sum, e) => sum + e, 0) || 1;
  const rank = fit.rates.rings.map((_, k) => k).sort((x, y) => energy[y] - energy[x]);
  const rankOf = (k: number) => rank.indexOf(k) + 1;
  const renamed = cov.names.map((name) => {
    const match = /^(alpha|omega0|a|b)(\d)$/.exec(name);
    if (!match) return name;
    const r = rankOf(Number(match[2]) - 1);
    return r === 1 ? match[1] : `${match[1]}_${r}`;
  });
  const dominant = rank[0];
  const held = fit.spec.start === 'jump';
  const { rates, linear } = fit;
  const floors = stepFloors(cov.names, rates.rings[0].omega0, set.range);
  const derived = (f: VectorFunction, unit: string) => derivedQuantity(f, cov.values, cov.covariance, floors, unit);
  const ringOf = (k: number, v: readonly number[]) => fullVector(fit).unpack(v).rates.rings[k];
  return {
    params: { t0: rates.t0, yPre: linear.yPre, yFinal: linear.yFinal, alpha: rates.rings[dominant].alpha, omega0: rates.rings[dominant].omega0, a: linear.a[dominant], b: linear.b[dominant] },
    sse: fit.sse,
    status: fit.status,
    message: fit.message,
    iterations: fit.iterations,
    covariance: { names: renamed, covariance: cov.covariance, correlation: cov.correlation, inflation: 1, warnings: cov.warnings },
    fields: (top, unit) => {
      const warnings: string[] = [];
      const modes = rank.map((k, r) => {
        const ring: RingQuantities =
          r === 0
            ? top
            : {
                alpha: derived((v) => ringOf(k, v).alpha, 's^-1'),
                omega0: derived((v) => ringOf(k, v).omega0, 'rad/s'),
                omegaD: rates.rings[k].omega0 > rates.rings[k].alpha ? derived((v) => Math.sqrt(ringOf(k, v).omega0 ** 2 - ringOf(k, v).alpha ** 2), 'rad/s') : null,
                zeta: derived((v) => ringOf(k, v).alpha / ringOf(k, v).omega0, ''),
                Q: derived((v) => ringOf(k, v).omega0 / (2 * ringOf(k, v).alpha), ''),
              };
        const amplitude = withHeldT0(
          derived((v) => {
            const { rates: at, linear: lin } = linearOf(fit, v);
            return envelopeAtStart(lin.a[k], lin.b[k], at.rings[k].alpha, at.rings[k].omega0);
          }, unit),
          rates.rings[k].alpha,
          set,
          held,
        );
        if (amplitude.stderr !== null && amplitude.value < UNSUPPORTED_SIGMAS * amplitude.stderr) {
          warnings.push(`mode ${r + 1}'s amplitude is within ${UNSUPPORTED_SIGMAS} standard errors of zero: the record does not support that mode`);
        }
        return responseMode(ring, amplitude, energy[k] / total);
      });
      const modeTerms: ModeTerms = {
        rings: rank.map((k) => ({ alpha: rates.rings[k].alpha, omega0: rates.rings[k].omega0, a: linear.a[k], b: linear.b[k] })),
        slow: fit.spec.slow ? { rate: rates.slowRate, amplitude: linear.slow } : null,
      };
      const slowTerm = fit.spec.slow
        ? {
            tau: derived((v) => 1 / fullVector(fit).unpack(v).rates.slowRate, 's'),
            amplitude: withHeldT0(derived((v) => linearOf(fit, v).linear.slow, unit), rates.slowRate, set, held),
          }
        : undefined;
      return { modes, modeTerms, ...(slowTerm ? { slowTerm } : {}), warnings };
    },
  };
}

/**
 * Each term's amplitude at t0 with its standard error: every ring's envelope, then the slow term's amplitude
 * (what decides whether each term the richer model added is supported by the record).
 */
export function termAmplitudes(set: FitSet, fit: ModesFit): Quantity[] {
  const cov = modesCovariance(set, fit);
  const floors = stepFloors(cov.names, fit.rates.rings[0]?.omega0 ?? fit.rates.slowRate, set.range);
  const held = fit.spec.start === 'jump';
  const rings = fit.rates.rings.map((ring, k) =>
    withHeldT0(
      derivedQuantity(
        (v) => {
          const { rates: at, linear } = linearOf(fit, v);
          return envelopeAtStart(linear.a[k], linear.b[k], at.rings[k].alpha, at.rings[k].omega0);
        },
        cov.values,
        cov.covariance,
        floors,
        '',
      ),
      ring.alpha,
      set,
      held,
    ),
  );
  const slow = fit.spec.slow ? [withHeldT0(derivedQuantity((v) => linearOf(fit, v).linear.slow, cov.values, cov.covariance, floors, ''), fit.rates.slowRate, set, held)] : [];
  return [...rings, ...slow];
}
