// The constraint layouts of the response model: which parameters are free, and the basis of its linear part.

import { fillDampedBasis, type BlockAverage, type ResponseParams } from '../response/secondOrder';

/**
 * 'smooth': continuous at t0 with zero initial slope (a capacitor voltage or inductor current that
 *   starts from rest: a step response, or a ringdown from a charged capacitor with no current).
 * 'step': continuous at t0 with any initial slope (the state variable jumps in slope only).
 * 'free-pre': the natural part starts anywhere (a measured quantity that jumps), t0 held.
 * 'free': no pre-event samples; t0 held at the start of the window, the pre-event level is y(t0+).
 */
export type ParameterLayout = 'smooth' | 'step' | 'free-pre' | 'free';

/** Names of every parameter of a layout: the nonlinear ones first, then the linear ones. */
export const LAYOUT_NAMES: Record<ParameterLayout, string[]> = {
  smooth: ['alpha', 'omega0', 't0', 'yPre', 'yFinal'],
  step: ['alpha', 'omega0', 't0', 'yPre', 'yFinal', 'b'],
  'free-pre': ['alpha', 'omega0', 'yPre', 'yFinal', 'a', 'b'],
  free: ['alpha', 'omega0', 'yFinal', 'a', 'b'],
};

/** How many leading names are nonlinear (fitted by the solver; the rest follow by linear least squares). */
export function nonlinearCount(layout: ParameterLayout): number {
  return layout === 'smooth' || layout === 'step' ? 3 : 2;
}

export function fitsT0(layout: ParameterLayout): boolean {
  return layout === 'smooth' || layout === 'step';
}

/** ResponseParams from the full parameter vector of a layout. */
export function unpackParams(layout: ParameterLayout, v: readonly number[], fixedT0: number): ResponseParams {
  switch (layout) {
    case 'smooth':
      return { alpha: v[0], omega0: v[1], t0: v[2], yPre: v[3], yFinal: v[4], a: v[3] - v[4], b: v[0] * (v[3] - v[4]) };
    case 'step':
      return { alpha: v[0], omega0: v[1], t0: v[2], yPre: v[3], yFinal: v[4], a: v[3] - v[4], b: v[5] };
    case 'free-pre':
      return { alpha: v[0], omega0: v[1], t0: fixedT0, yPre: v[2], yFinal: v[3], a: v[4], b: v[5] };
    case 'free':
      return { alpha: v[0], omega0: v[1], t0: fixedT0, yPre: v[2] + v[3], yFinal: v[2], a: v[3], b: v[4] };
  }
}

/** Model values over a time axis for the full parameter vector v; means over each block's samples for a block average. */
export function layoutValues(
  layout: ParameterLayout,
  v: readonly number[],
  fixedT0: number,
  time: ArrayLike<number>,
  block: BlockAverage | null = null,
): Float64Array {
  const p = unpackParams(layout, v, fixedT0);
  const ec = new Float64Array(time.length);
  const es = new Float64Array(time.length);
  const after = new Float64Array(time.length);
  fillDampedBasis(p.alpha, p.omega0, p.t0, time, ec, es, block, after);
  const y = new Float64Array(time.length);
  for (let i = 0; i < time.length; i++) y[i] = (1 - after[i]) * p.yPre + after[i] * (p.yFinal + p.a * ec[i] + p.b * es[i]);
  return y;
}
