// What a passive voltage probe does to the ring it measures: its capacitance loads the node, and its ground lead rings with it.

import type { Quantity } from '../quantity';

/** Inductance of a passive probe's ground lead per metre: about 25 nH per inch (common practice; 25 nH / 25.4 mm). */
export const GROUND_LEAD_HENRY_PER_METRE = 25e-9 / 0.0254;
/** Ground-lead length assumed when none is given: the long clip lead that comes with a passive probe, 6 inches (common practice). */
export const DEFAULT_GROUND_LEAD = 6 * 0.0254;
/** Input capacitance assumed when none is given: a 10:1 passive probe's, about 10 pF (from memory; its data sheet says). */
export const DEFAULT_PROBE_CAPACITANCE = 10e-12;
/**
 * A ring within this fraction of the lead's estimated resonance is flagged: the 25 nH per inch and the probe's
 * capacitance are each known to a few tens of percent, so a closer match cannot be told apart (our choice).
 */
export const GROUND_LEAD_MATCH = 0.2;

/** Resonance of a ground lead of `length` m against a probe input capacitance `capacitance` F, Hz: 1 / (2 pi sqrt(L C)). */
export function groundLeadResonance(length: number, capacitance: number): number {
  return 1 / (2 * Math.PI * Math.sqrt(GROUND_LEAD_HENRY_PER_METRE * length * capacitance));
}

/** True when `frequency` Hz is within GROUND_LEAD_MATCH of `resonance` Hz. */
export function matchesGroundLead(frequency: number, resonance: number): boolean {
  return Math.abs(frequency / resonance - 1) <= GROUND_LEAD_MATCH;
}

export interface ProbeCorrection {
  /** The loop's capacitance with the probe on it, and without, F. */
  loadedC: Quantity;
  unloadedC: Quantity;
  /** The natural frequency as measured (probe on), and without the probe, Hz. */
  loadedF0: Quantity;
  unloadedF0: Quantity;
}

/**
 * C and f0 without the probe, the probe's capacitance in parallel with the ring's capacitance (a probe across
 * the capacitor or switch node that rings). With C the known part, the loop held C + Cp while measured; otherwise
 * the C derived from the fit holds the probe and the board's is C - Cp. f0 = 1 / (2 pi sqrt(L C)) with L as
 * measured. The standard errors are first-order propagations of f0's, C's and the probe's (`probeRel`, its
 * relative standard uncertainty; 0 takes it as exact), taken as independent (exact when C is the known part; with L
 * known, C comes from f0 and L and the unloaded f0 is propagated from those two). Null when the probe's capacitance
 * is not below the loop's.
 */
export function probeCorrection(f0: Quantity, c: Quantity, knownName: 'R' | 'L' | 'C', probeC: number, probeRel: number): ProbeCorrection | null {
  const cRel = c.stderr === null ? null : c.stderr / c.value;
  const f0Rel = f0.stderr === null ? null : f0.stderr / f0.value;
  const probeStderr = probeC * probeRel;
  if (knownName === 'C') {
    const loaded = c.value + probeC;
    const ratio = Math.sqrt(loaded / c.value);
    // d ln(f0') / d ln(C) = -Cp / (2 (C + Cp)) and d ln(f0') / d ln(Cp) = Cp / (2 (C + Cp)).
    const share = probeC / (2 * loaded);
    const rel = f0Rel === null || cRel === null ? null : Math.hypot(f0Rel, share * cRel, share * probeRel);
    return {
      loadedC: { value: loaded, stderr: c.stderr === null ? null : Math.hypot(c.stderr, probeStderr), unit: 'F' },
      unloadedC: c,
      loadedF0: f0,
      unloadedF0: { value: f0.value * ratio, stderr: rel === null ? null : rel * f0.value * ratio, unit: 'Hz' },
    };
  }
  const unloaded = c.value - probeC;
  if (!(unloaded > 0)) return null;
  const ratio = Math.sqrt(c.value / unloaded);
  // C = 1 / (w0^2 L): f0' = f0 sqrt(C / (C - Cp)); d ln f0' / d ln f0 = C / (C - Cp), d ln f0' / d ln L = Cp / (2 (C - Cp)).
  // L's relative uncertainty is read back from C's and f0's (C_rel^2 = 4 f0_rel^2 + L_rel^2), no less than zero.
  let rel: number | null = null;
  if (f0Rel !== null && cRel !== null) {
    const lRel = Math.sqrt(Math.max(0, cRel * cRel - 4 * f0Rel * f0Rel));
    // d ln f0' / d ln Cp = Cp / (2 (C - Cp)).
    rel = Math.hypot((c.value / unloaded) * f0Rel, (probeC / (2 * unloaded)) * lRel, (probeC / (2 * unloaded)) * probeRel);
  }
  return {
    loadedC: c,
    unloadedC: { value: unloaded, stderr: c.stderr === null ? null : Math.hypot(c.stderr, probeStderr), unit: 'F' },
    loadedF0: f0,
    unloadedF0: { value: f0.value * ratio, stderr: rel === null ? null : rel * f0.value * ratio, unit: 'Hz' },
  };
}
