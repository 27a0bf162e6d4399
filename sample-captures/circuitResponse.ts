// The closed-form response of a stated series or parallel RLC bench circuit, shared by the sample
// captures' generator and the ngspice reference tests (which check this derivation against ngspice).
//
// Series loop: source v_s -> R -> L -> C -> back; i flows through the loop, v_C across C.
// Parallel tank: current source i_s into the node shared by R, L and C (to ground); v is that node,
// i_L flows from the node through L to ground.
// Sign conventions follow those two sentences; every value in SI base units.

import { coefficientsFromInitial, type ResponseParams } from '../core/response/secondOrder';

export type CircuitTopology = 'series' | 'parallel';

/** What the channel measures: the voltage across C, the current in L, or the voltage across R. */
export type CircuitProbe = 'capacitor-voltage' | 'inductor-current' | 'resistor-voltage';

/**
 * The event that starts the response.
 * step: the source (series: voltage, V; parallel: current, A) jumps from initialLevel to
 *   initialLevel + amplitude, with the circuit settled before it.
 * natural: the source is zero after the event and the state at the event is given (capacitor voltage,
 *   inductor current); the probed quantity is taken to hold its event value before the event.
 */
export type CircuitSource =
  | { kind: 'step'; initialLevel: number; amplitude: number }
  | { kind: 'natural'; capacitorVoltage: number; inductorCurrent: number };

export interface StatedCircuit {
  topology: CircuitTopology;
  /** Ohm, henry, farad. */
  R: number;
  L: number;
  C: number;
  source: CircuitSource;
  probe: CircuitProbe;
}

/** alpha and omega0 of the circuit: series alpha = R / (2L), parallel alpha = 1 / (2RC), omega0 = 1 / sqrt(LC). */
export function circuitDamping(c: StatedCircuit): { alpha: number; omega0: number } {
  const alpha = c.topology === 'series' ? c.R / (2 * c.L) : 1 / (2 * c.R * c.C);
  return { alpha, omega0: 1 / Math.sqrt(c.L * c.C) };
}

/** State just after the event and the source level after it. */
function stateAtEvent(c: StatedCircuit): { vC: number; iL: number; drive: number } {
  const s = c.source;
  if (s.kind === 'natural') return { vC: s.capacitorVoltage, iL: s.inductorCurrent, drive: 0 };
  const drive = s.initialLevel + s.amplitude;
  // Settled before the event: series has v_C = source and no current; parallel has i_L = source and v = 0.
  return c.topology === 'series' ? { vC: s.initialLevel, iL: 0, drive } : { vC: 0, iL: s.initialLevel, drive };
}

/** Probed value just after the event, its slope, and its final value. */
function probedStart(c: StatedCircuit): { y0: number; slope0: number; yFinal: number } {
  const { vC, iL, drive } = stateAtEvent(c);
  if (c.topology === 'series') {
    const di = (drive - vC - c.R * iL) / c.L;
    if (c.probe === 'capacitor-voltage') return { y0: vC, slope0: iL / c.C, yFinal: drive };
    const gain = c.probe === 'resistor-voltage' ? c.R : 1;
    return { y0: gain * iL, slope0: gain * di, yFinal: 0 };
  }
  if (c.probe === 'inductor-current') return { y0: iL, slope0: vC / c.L, yFinal: drive };
  // Capacitor and resistor share the node voltage in a parallel tank.
  return { y0: vC, slope0: (drive - iL - vC / c.R) / c.C, yFinal: 0 };
}

/** The model parameters of the probed waveform for an event at eventTime (s). */
export function circuitResponseParams(c: StatedCircuit, eventTime: number): ResponseParams {
  const { alpha, omega0 } = circuitDamping(c);
  const { y0, slope0, yFinal } = probedStart(c);
  const { a, b } = coefficientsFromInitial(y0, slope0, yFinal, alpha);
  return { t0: eventTime, yPre: y0, yFinal, alpha, omega0, a, b };
}

/** SI unit of the probed quantity. */
export function probeUnit(probe: CircuitProbe): 'V' | 'A' {
  return probe === 'inductor-current' ? 'A' : 'V';
}
