// The parameter layouts of the response fit, one descriptor each: which parameters are free, how the
// linear part's basis is filled, and how a fitted vector becomes ResponseParams.
//
// Adding a model or a layout: write one descriptor with defineLayout below and add it to LAYOUTS, then
// add its recovery cases to the tests (test/core/fitResponse.test.ts). A descriptor names its nonlinear
// parameters (found by the solver; 't0' among them means the event time is fitted) and its linear ones
// (solved exactly for every trial of the nonlinear ones), says when it applies to a record, fills the
// basis column of each linear parameter from the damped basis, and unpacks a fitted vector. Everything
// reads parameters by name, so no other module depends on where a parameter sits in the vector.
// The steps around the descriptors (refine.ts scales the solver by omega0, candidateRanking.ts and
// halfPeriodShift.ts work on a ring) expect 'alpha' and 'omega0' among the nonlinear parameters of a
// second-order layout. A first-order layout has 'alpha' (1 / tau) alone: its model is the critically
// damped basis with omega0 = alpha and no slope term, and firstOrderFit.ts fits it.

import { evaluateResponse, fillDampedBasis, type BlockAverage, type ResponseParams } from '../response/secondOrder';
import type { Continuity } from './responseFit';

/** What is known about a record before any layout is fitted. */
export interface RecordShape {
  /** Whether flat samples precede the event, so that t0 and the level before it can be fitted. */
  hasPreEvent: boolean;
  continuity: Continuity;
}

/** What the fit needs to know about one layout. */
export interface LayoutDescriptor {
  /** 2 for a ring's layouts (alpha and omega0), 1 for a single decay (alpha = 1 / tau, omega0 held equal to it). */
  readonly order: 1 | 2;
  /** Parameters the solver varies, in the order of the parameter vector. */
  readonly nonlinear: readonly string[];
  /** Parameters solved by linear least squares for given nonlinear ones; they follow the nonlinear ones. */
  readonly linear: readonly string[];
  /** Every parameter: the nonlinear ones, then the linear ones (the parameter vector's order). */
  readonly names: readonly string[];
  /** Position of each parameter in the parameter vector, by name. */
  readonly index: Readonly<Record<string, number>>;
  /** Whether t0 is fitted; otherwise it is held at the start the caller gives. */
  readonly fitsT0: boolean;
  /**
   * Column of the level before the event among the linear parameters, or null when the layout has
   * none: then the values with samples before t0 are left out of the fit.
   */
  readonly preLevelColumn: number | null;
  appliesTo(record: RecordShape): boolean;
  /**
   * The basis of the response after t0, one column per linear parameter (in `linear` order), from the
   * damped basis ec, es at each value; the level before the event is mixed in by the caller.
   */
  fillColumns(columns: readonly Float64Array[], alpha: number, ec: Float64Array, es: Float64Array): void;
  /** ResponseParams from a full parameter vector; fixedT0 is used when t0 is not fitted. */
  unpack(values: readonly number[], fixedT0: number): ResponseParams;
}

interface LayoutSpec<N extends string, L extends string> {
  order?: 1 | 2;
  nonlinear: readonly N[];
  linear: readonly L[];
  appliesTo(record: RecordShape): boolean;
  /** Writes the basis column of every linear parameter, by name, for every value of ec and es. */
  fillColumns(column: Readonly<Record<L, Float64Array>>, alpha: number, ec: Float64Array, es: Float64Array): void;
  unpack(value: (name: N | L) => number, fixedT0: number): ResponseParams;
}

/** A descriptor from its parameter names and functions; the maps from names to positions are built here. */
function defineLayout<const N extends string, const L extends string>(spec: LayoutSpec<N, L>): LayoutDescriptor {
  const names: string[] = [...spec.nonlinear, ...spec.linear];
  const index = Object.fromEntries(names.map((name, i) => [name, i])) as Record<N | L, number>;
  const preLevel = (spec.linear as readonly string[]).indexOf('yPre');
  let named = {} as Record<L, Float64Array>;
  return {
    order: spec.order ?? 2,
    nonlinear: spec.nonlinear,
    linear: spec.linear,
    names,
    index,
    fitsT0: (spec.nonlinear as readonly string[]).includes('t0'),
    preLevelColumn: preLevel >= 0 ? preLevel : null,
    appliesTo: spec.appliesTo,
    fillColumns: (columns, alpha, ec, es) => {
      // A solve's workspace hands the same columns every time: their map by name is made once for them.
      if (!spec.linear.every((name, i) => named[name] === columns[i])) named = Object.fromEntries(spec.linear.map((name, i) => [name, columns[i]])) as Record<L, Float64Array>;
      spec.fillColumns(named, alpha, ec, es);
    },
    unpack: (values, fixedT0) => spec.unpack((name) => values[index[name]], fixedT0),
  };
}

/**
 * Continuous at t0 with zero initial slope: a capacitor voltage or inductor current that starts from
 * rest (a step response, or a ringdown from a charged capacitor with no current).
 */
const smooth = defineLayout({
  nonlinear: ['alpha', 'omega0', 't0'],
  linear: ['yPre', 'yFinal'],
  appliesTo: ({ hasPreEvent, continuity }) => hasPreEvent && continuity === 'continuous',
  fillColumns: ({ yPre, yFinal }, alpha, ec, es) => {
    for (let i = 0; i < ec.length; i++) {
      const shape = ec[i] + alpha * es[i];
      yPre[i] = shape;
      yFinal[i] = 1 - shape;
    }
  },
  unpack: (value) => ({
    alpha: value('alpha'),
    omega0: value('omega0'),
    t0: value('t0'),
    yPre: value('yPre'),
    yFinal: value('yFinal'),
    a: value('yPre') - value('yFinal'),
    b: value('alpha') * (value('yPre') - value('yFinal')),
  }),
});

/** Continuous at t0 with any initial slope (the state variable jumps in slope only). */
const step = defineLayout({
  nonlinear: ['alpha', 'omega0', 't0'],
  linear: ['yPre', 'yFinal', 'b'],
  appliesTo: ({ hasPreEvent, continuity }) => hasPreEvent && continuity === 'continuous',
  fillColumns: ({ yPre, yFinal, b }, _alpha, ec, es) => {
    for (let i = 0; i < ec.length; i++) {
      yPre[i] = ec[i];
      yFinal[i] = 1 - ec[i];
      b[i] = es[i];
    }
  },
  unpack: (value) => ({
    alpha: value('alpha'),
    omega0: value('omega0'),
    t0: value('t0'),
    yPre: value('yPre'),
    yFinal: value('yFinal'),
    a: value('yPre') - value('yFinal'),
    b: value('b'),
  }),
});

/** The natural part starts anywhere (a measured quantity that jumps); t0 held at the detected event. */
const freePre = defineLayout({
  nonlinear: ['alpha', 'omega0'],
  linear: ['yPre', 'yFinal', 'a', 'b'],
  appliesTo: ({ hasPreEvent, continuity }) => hasPreEvent && continuity === 'free',
  fillColumns: ({ yPre, yFinal, a, b }, _alpha, ec, es) => {
    yPre.fill(0);
    yFinal.fill(1);
    a.set(ec);
    b.set(es);
  },
  unpack: (value, fixedT0) => ({
    alpha: value('alpha'),
    omega0: value('omega0'),
    t0: fixedT0,
    yPre: value('yPre'),
    yFinal: value('yFinal'),
    a: value('a'),
    b: value('b'),
  }),
});

/** No pre-event samples: t0 held at the start of the window, the pre-event level reported is y(t0+). */
const free = defineLayout({
  nonlinear: ['alpha', 'omega0'],
  linear: ['yFinal', 'a', 'b'],
  appliesTo: ({ hasPreEvent }) => !hasPreEvent,
  fillColumns: ({ yFinal, a, b }, _alpha, ec, es) => {
    yFinal.fill(1);
    a.set(ec);
    b.set(es);
  },
  unpack: (value, fixedT0) => ({
    alpha: value('alpha'),
    omega0: value('omega0'),
    t0: fixedT0,
    yPre: value('yFinal') + value('a'),
    yFinal: value('yFinal'),
    a: value('a'),
    b: value('b'),
  }),
});

/**
 * A first-order step, continuous at t0: y = yFinal + (yPre - yFinal) e^(-alpha tau), tau = 1 / alpha the
 * time constant (an RC or RL circuit's capacitor voltage or inductor current).
 */
const firstOrder = defineLayout({
  order: 1,
  nonlinear: ['alpha', 't0'],
  linear: ['yPre', 'yFinal'],
  appliesTo: ({ hasPreEvent, continuity }) => hasPreEvent && continuity === 'continuous',
  fillColumns: ({ yPre, yFinal }, _alpha, ec) => {
    for (let i = 0; i < ec.length; i++) {
      yPre[i] = ec[i];
      yFinal[i] = 1 - ec[i];
    }
  },
  unpack: (value) => ({
    alpha: value('alpha'),
    omega0: value('alpha'),
    t0: value('t0'),
    yPre: value('yPre'),
    yFinal: value('yFinal'),
    a: value('yPre') - value('yFinal'),
    b: 0,
  }),
});

/** A first-order decay that jumps at the event (a capacitor's current, an inductor's voltage); t0 held at the detected event. */
const firstOrderJump = defineLayout({
  order: 1,
  nonlinear: ['alpha'],
  linear: ['yPre', 'yFinal', 'a'],
  appliesTo: ({ hasPreEvent, continuity }) => hasPreEvent && continuity === 'free',
  fillColumns: ({ yPre, yFinal, a }, _alpha, ec) => {
    yPre.fill(0);
    yFinal.fill(1);
    a.set(ec);
  },
  unpack: (value, fixedT0) => ({
    alpha: value('alpha'),
    omega0: value('alpha'),
    t0: fixedT0,
    yPre: value('yPre'),
    yFinal: value('yFinal'),
    a: value('a'),
    b: 0,
  }),
});

/** A first-order decay already under way at the first sample; t0 held at the start of the window. */
const firstOrderFree = defineLayout({
  order: 1,
  nonlinear: ['alpha'],
  linear: ['yFinal', 'a'],
  appliesTo: ({ hasPreEvent }) => !hasPreEvent,
  fillColumns: ({ yFinal, a }, _alpha, ec) => {
    yFinal.fill(1);
    a.set(ec);
  },
  unpack: (value, fixedT0) => ({
    alpha: value('alpha'),
    omega0: value('alpha'),
    t0: fixedT0,
    yPre: value('yFinal') + value('a'),
    yFinal: value('yFinal'),
    a: value('a'),
    b: 0,
  }),
});

/**
 * Every layout, simpler before richer: among the layouts that apply to a record, a later one also
 * starts from the first one's solution.
 */
export const LAYOUTS = {
  smooth,
  step,
  'free-pre': freePre,
  free,
  'first-order': firstOrder,
  'first-order-jump': firstOrderJump,
  'first-order-free': firstOrderFree,
} satisfies Record<string, LayoutDescriptor>;

export type ParameterLayout = keyof typeof LAYOUTS;

/** The second-order layouts that apply to a record, in the order they are tried. */
export function layoutsFor(record: RecordShape): ParameterLayout[] {
  return layoutsOfOrder(2, record);
}

/** The first-order layout that applies to a record (one for each record shape). */
export function firstOrderLayoutFor(record: RecordShape): ParameterLayout {
  return layoutsOfOrder(1, record)[0];
}

function layoutsOfOrder(order: 1 | 2, record: RecordShape): ParameterLayout[] {
  return (Object.keys(LAYOUTS) as ParameterLayout[]).filter((layout) => LAYOUTS[layout].order === order && LAYOUTS[layout].appliesTo(record));
}

/** Names of every parameter of each layout, in the order of its parameter vector. */
export const LAYOUT_NAMES = Object.fromEntries(
  (Object.keys(LAYOUTS) as ParameterLayout[]).map((layout) => [layout, LAYOUTS[layout].names]),
) as Record<ParameterLayout, readonly string[]>;

/** ResponseParams from the full parameter vector of a layout. */
export function unpackParams(layout: ParameterLayout, values: readonly number[], fixedT0: number): ResponseParams {
  return LAYOUTS[layout].unpack(values, fixedT0);
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
  // Point values (a fit set not averaged in blocks): no share array to fill and read.
  if (!block || block.samples <= 1) return evaluateResponse(p, time);
  const ec = new Float64Array(time.length);
  const es = new Float64Array(time.length);
  const after = new Float64Array(time.length);
  fillDampedBasis(p.alpha, p.omega0, p.t0, time, ec, es, block, after);
  const y = new Float64Array(time.length);
  for (let i = 0; i < time.length; i++) y[i] = (1 - after[i]) * p.yPre + after[i] * (p.yFinal + p.a * ec[i] + p.b * es[i]);
  return y;
}
