// The modes part of a ResponseFit: each ringing mode with its standard errors, and the table of orders tried.

import { quantity, type Quantity } from '../quantity';
import type { ModelOrder, ResponseFit, ResponseMode } from './responseFit';
import type { Attempt } from './attempt';
import type { FitSet } from './fitSet';
import type { ResponseCovariance } from './responseCovariance';
import { LAYOUTS, unpackParams } from './responseModel';
import { effectiveSamples, information } from './modelSelection';

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

/** The ring quantities of a mode, as ResponseFit reports them at its top level. */
export type RingQuantities = Pick<ResponseMode, 'alpha' | 'omega0' | 'omegaD' | 'zeta' | 'Q'>;

/** A mode from its ring quantities, its envelope at t0 and its share of the response's energy. */
export function responseMode(ring: RingQuantities, amplitude: Quantity, energyShare: number): ResponseMode {
  return { ...ring, amplitude, energyShare };
}

/** Names of the models in the order table: 'one ringing mode', 'two ringing modes on an exponential'... */
export function modelName(ringingModes: number, slowTerm: boolean): string {
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
 * error (through the layout's covariance), all of the response's energy; the order table holds its one row.
 */
export function singleModeFields(best: Attempt, t0Start: number, cov: ResponseCovariance, ring: RingQuantities, set: FitSet, unit: string): Pick<ResponseFit, 'modes' | 'modelOrder'> {
  const envelope = (values: readonly number[]) => {
    const p = unpackParams(best.layout, values, t0Start);
    return envelopeAtStart(p.a, p.b, p.alpha, p.omega0);
  };
  const { names } = LAYOUTS[best.layout];
  const floors = parameterFloors(names, ring.omega0.value, set.range);
  const amplitude = derivedQuantity(envelope, best.values, cov.names.join() === names.join() ? cov.covariance : null, floors, unit);
  return { modes: [responseMode(ring, amplitude, 1)], modelOrder: singleOrder(best, set, t0Start) };
}

/** The order table of a fit where only one ring was fitted. */
function singleOrder(best: Attempt, set: FitSet, t0Start: number): ModelOrder {
  const n = effectiveSamples([best], set, t0Start);
  return {
    criterion: ORDER_CRITERION,
    forced: false,
    reason: 'one ringing mode: no other order was fitted',
    table: [{ model: modelName(1, false), ringingModes: 1, slowTerm: false, parameters: best.values.length, sse: best.sse, criterion: information(best.sse, best.values.length, n), chosen: true }],
  };
}
