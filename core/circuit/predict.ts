// The response a design should give (closed form from its nominal values) and its tolerance band.
import { createRandom } from '../random';
import { coefficientsFromInitial, evaluateResponse, type ResponseParams } from '../response/secondOrder';
import type { Design } from './design';
import { COMPONENT_NAMES, evaluatePowerLaw, responseRelations, type ComponentName } from './relations';

type Values = Record<ComponentName, number>;

/** SI unit of what the design's probe measures. */
export function probeUnit(design: Design): 'V' | 'A' {
  return design.probe === 'inductor-current' ? 'A' : 'V';
}

/** The closed-form response of the design at its nominal values, event at t0 (s). */
export function predictResponse(design: Design, t0 = 0): ResponseParams {
  return responseForValues(design, nominalValues(design), t0);
}

/**
 * Response parameters for given component values. The state just after the event follows from the
 * source: a step finds the circuit settled at the old source level (series: v_C = old level, i = 0;
 * parallel: i_L = old level, v = 0); a natural response starts from the stated v_C and i_L with the
 * source at zero. The probed value and its slope at t0+ then come from KVL (series) or KCL (parallel):
 *   series:   L di/dt = v_s - R i - v_C,   C dv_C/dt = i
 *   parallel: C dv/dt = i_s - v / R - i_L, L di_L/dt = v
 */
export function responseForValues(design: Design, values: Values, t0 = 0): ResponseParams {
  const relations = responseRelations(design.topology);
  const alpha = evaluatePowerLaw(relations.alpha, values);
  const omega0 = evaluatePowerLaw(relations.omega0, values);
  const { y0, slope, yFinal } = initialState(design, values);
  const { a, b } = coefficientsFromInitial(y0, slope, yFinal, alpha);
  return { t0, yPre: y0, yFinal, alpha, omega0, a, b };
}

/**
 * The design's two decay rates (s^-1, positive) when it is overdamped: alpha -+ sqrt(alpha^2 - omega0^2),
 * the slow one as omega0^2 / fast (their product), free of the cancellation of the difference at large
 * damping. Null when the design rings or is critically damped (no two real roots apart).
 */
export function decayRates(design: Design, values: Values = nominalValues(design)): { slow: number; fast: number } | null {
  const relations = responseRelations(design.topology);
  const alpha = evaluatePowerLaw(relations.alpha, values);
  const omega0 = evaluatePowerLaw(relations.omega0, values);
  if (!(alpha > omega0)) return null;
  const fast = alpha + Math.sqrt(alpha * alpha - omega0 * omega0);
  return { slow: (omega0 * omega0) / fast, fast };
}

/** The levels a design states for its probe: before the event, at the end, and the size of the response between. */
export interface DesignLevels {
  preLevel: number;
  finalValue: number;
  /** sqrt((y(t0+) - y_final)^2 + (y'(t0+) / omega0)^2): the amplitude a lossless ring from that start would have. */
  swing: number;
}

/** The design's levels at its nominal values (the circuit settles at the old source level before a step). */
export function designLevels(design: Design): DesignLevels {
  const values = nominalValues(design);
  const { y0, slope, yFinal } = initialState(design, values);
  return { preLevel: y0, finalValue: yFinal, swing: responseSwing(y0 - yFinal, slope, evaluatePowerLaw(responseRelations(design.topology).omega0, values)) };
}

/** The swing of a response from its natural part at t0+ and its slope there (see DesignLevels). */
export function responseSwing(natural: number, slope: number, omega0: number): number {
  return Math.hypot(natural, slope / omega0);
}

/** The probed value and its slope just after the event, and the final value, by KVL or KCL (see responseForValues). */
function initialState(design: Design, values: Values): { y0: number; slope: number; yFinal: number } {
  const { R, L, C } = values;
  const s = design.source;
  const drive = s.kind === 'step' ? s.initialLevel + s.amplitude : 0;
  let vC: number;
  let iL: number;
  if (s.kind === 'natural') {
    vC = s.capacitorVoltage;
    iL = s.inductorCurrent;
  } else if (design.topology === 'series') {
    vC = s.initialLevel;
    iL = 0;
  } else {
    vC = 0;
    iL = s.initialLevel;
  }
  if (design.topology === 'series') {
    const diDt = (drive - R * iL - vC) / L;
    if (design.probe === 'capacitor-voltage') return { y0: vC, slope: iL / C, yFinal: drive };
    if (design.probe === 'inductor-current') return { y0: iL, slope: diDt, yFinal: 0 };
    return { y0: R * iL, slope: R * diDt, yFinal: 0 };
  }
  if (design.probe === 'inductor-current') return { y0: iL, slope: vC / L, yFinal: drive };
  // The resistor shares the node voltage with the capacitor.
  return { y0: vC, slope: (drive - vC / R - iL) / C, yFinal: 0 };
}

export interface ToleranceBandOptions {
  /** 'corners': the 2^3 tolerance corners and the nominal; 'corners+monte-carlo' (default) adds random draws. */
  method?: 'corners' | 'corners+monte-carlo';
  /** Monte Carlo draws, uniform within each tolerance. Default 200. */
  draws?: number;
  /** Seed of the draws. Default 1. */
  seed?: number;
  /** Event time, s. Default 0. */
  t0?: number;
}

export interface ToleranceBand {
  nominal: Float64Array;
  lower: Float64Array;
  upper: Float64Array;
  /** How many responses the envelope covers: the nominal, the 8 corners and the draws. */
  responses: number;
  method: string;
}

/**
 * The envelope (min and max at each instant) of the responses over the tolerance corners plus the
 * nominal, and by default over seeded Monte Carlo draws too. Corners alone do not bound the band:
 * at late times the response oscillates, and the extreme at one instant sits where the ring phase
 * omega_d t passes a peak, inside the tolerance box rather than at a corner. The draws (uniform,
 * matching the rectangular reading of a tolerance) fill the interior; the band is still an
 * estimate of the true envelope from inside, not a guaranteed bound.
 */
export function toleranceBand(design: Design, time: ArrayLike<number>, options: ToleranceBandOptions = {}): ToleranceBand {
  const method = options.method ?? 'corners+monte-carlo';
  const draws = method === 'corners' ? 0 : options.draws ?? 200;
  const t0 = options.t0 ?? 0;
  const base = nominalValues(design);
  const nominal = evaluateResponse(responseForValues(design, base, t0), time);
  const lower = Float64Array.from(nominal);
  const upper = Float64Array.from(nominal);
  const scratch = new Float64Array(time.length);
  const include = (values: Values) => {
    evaluateResponse(responseForValues(design, values, t0), time, scratch);
    for (let i = 0; i < scratch.length; i++) {
      if (scratch[i] < lower[i]) lower[i] = scratch[i];
      if (scratch[i] > upper[i]) upper[i] = scratch[i];
    }
  };
  const scaled = (factor: (name: ComponentName, index: number) => number): Values => {
    const v = {} as Values;
    COMPONENT_NAMES.forEach((name, k) => (v[name] = design.components[name].value * (1 + design.components[name].tolerance * factor(name, k))));
    return v;
  };
  for (let corner = 0; corner < 8; corner++) include(scaled((_, k) => ((corner >> k) & 1 ? 1 : -1)));
  const random = createRandom(options.seed ?? 1);
  for (let d = 0; d < draws; d++) include(scaled(() => 2 * random.uniform() - 1));
  return {
    nominal,
    lower,
    upper,
    responses: 9 + draws,
    method:
      draws === 0
        ? 'envelope of the nominal and the 8 tolerance corners'
        : `envelope of the nominal, the 8 tolerance corners and ${draws} seeded uniform draws within the tolerances`,
  };
}

function nominalValues(design: Design): Values {
  return { R: design.components.R.value, L: design.components.L.value, C: design.components.C.value };
}
