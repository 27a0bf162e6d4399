// The bundled sample captures: stated circuits, scope settings and file layouts of our own bench scenarios.

import type { StatedCircuit } from './circuitResponse';
import type { ScopeSettings } from './scopeModel';

/**
 * File layouts written by captureText.ts:
 * plain: 'Time (s),CH1 (V)' header and comma rows;
 * preamble-comma: key,value preamble lines, then the plain header and rows;
 * semicolon-decimal-comma: key;value preamble, 'Time [ns];CH1 [V];CH2 [mV]' header, decimal commas;
 * interval-only: preamble stating the sample interval and a single value column, no time column;
 * tab-microseconds: 'Time [us]<TAB>CH3 [A]' header, tab-separated rows.
 */
export type SampleLayout = 'plain' | 'preamble-comma' | 'semicolon-decimal-comma' | 'interval-only' | 'tab-microseconds';

export interface SampleScenario {
  file: string;
  scenario: string;
  circuit: StatedCircuit;
  /** The component to pass as known (its stated value) when deriving the other two. */
  known: 'R' | 'L' | 'C';
  /** Name of the channel holding the response. */
  channel: string;
  sampleInterval: number;
  points: number;
  /** Samples before the trigger; the trigger is at t = 0 on files with a time column. */
  preTrigger: number;
  /** Event time relative to the trigger, s. */
  eventTime: number;
  scope: ScopeSettings;
  layout: SampleLayout;
  seed: number;
  /** A second channel recording the source step (driver output) with a linear edge of this duration, s. */
  drive?: { channel: string; edge: number };
  /** For the added-capacitor set: C = parasitic + added (F). */
  addedCapacitor?: { group: string; parasitic: number; added: number };
}

/** The switch-node loop of the added-capacitor set. */
export const SWITCH_NODE_LOOP = { R: 0.28, L: 6.5e-9, C: 390e-12 };

function switchNode(file: string, added: number, label: string, seed: number): SampleScenario {
  return {
    file,
    scenario: `48 V synchronous buck, switch node at high-side turn-on (loop L_p, C_p, R_p): ${label}`,
    circuit: {
      topology: 'series',
      R: SWITCH_NODE_LOOP.R,
      L: SWITCH_NODE_LOOP.L,
      C: SWITCH_NODE_LOOP.C + added,
      source: { kind: 'step', initialLevel: 0, amplitude: 48 },
      probe: 'capacitor-voltage',
    },
    known: 'C',
    channel: 'CH1',
    sampleInterval: 0.2e-9,
    points: 1500,
    preTrigger: 150,
    eventTime: -0.35e-9,
    scope: { perDivision: 20, center: 40, noiseRms: 0.6 },
    layout: 'preamble-comma',
    seed,
    addedCapacitor: { group: 'switch-node', parasitic: SWITCH_NODE_LOOP.C, added },
  };
}

export const sampleScenarios: SampleScenario[] = [
  {
    file: 'input-filter-step.csv',
    scenario: '48 V bus LC input filter: hot-plug step, filter capacitor voltage',
    circuit: {
      topology: 'series',
      R: 0.15,
      L: 6.8e-6,
      C: 47e-6,
      source: { kind: 'step', initialLevel: 0, amplitude: 48 },
      probe: 'capacitor-voltage',
    },
    known: 'C',
    channel: 'CH1',
    sampleInterval: 0.4e-6,
    points: 2500,
    preTrigger: 250,
    eventTime: -1.1e-6,
    scope: { perDivision: 10, center: 40, noiseRms: 0.3 },
    layout: 'plain',
    seed: 101,
  },
  {
    file: 'gate-drive-turn-on.csv',
    scenario: 'gate-drive loop: 15 V driver edge into a power MOSFET gate, gate voltage at the Kelvin pins',
    circuit: {
      topology: 'series',
      R: 3.8,
      L: 12e-9,
      C: 3.3e-9,
      source: { kind: 'step', initialLevel: 0, amplitude: 15 },
      probe: 'capacitor-voltage',
    },
    known: 'C',
    channel: 'CH2',
    sampleInterval: 0.05e-9,
    points: 2000,
    preTrigger: 200,
    eventTime: -0.6e-9,
    scope: { perDivision: 2, center: 8, noiseRms: 0.06 },
    layout: 'semicolon-decimal-comma',
    seed: 202,
    drive: { channel: 'CH1', edge: 1e-9 },
  },
  {
    file: 'pulse-jig-discharge.csv',
    scenario: 'pulse-forming test jig: 400 V storage capacitor dumped into the load resistor and its wiring inductance',
    circuit: {
      topology: 'series',
      R: 4.7,
      L: 5e-6,
      C: 2e-6,
      source: { kind: 'natural', capacitorVoltage: 400, inductorCurrent: 0 },
      probe: 'capacitor-voltage',
    },
    known: 'C',
    channel: 'CH1',
    sampleInterval: 40e-9,
    points: 2000,
    preTrigger: 750,
    eventTime: -25e-9,
    scope: { perDivision: 50, center: 200, noiseRms: 1.5 },
    layout: 'interval-only',
    seed: 303,
  },
  {
    file: 'resonant-tank-coil-current.csv',
    scenario: 'wireless-charging test pad: tank capacitor charged to 24 V and released into the coil, coil current on a current probe',
    circuit: {
      topology: 'parallel',
      R: 150,
      L: 10e-6,
      C: 220e-9,
      source: { kind: 'natural', capacitorVoltage: 24, inductorCurrent: 0 },
      probe: 'inductor-current',
    },
    known: 'L',
    channel: 'CH3',
    sampleInterval: 0.1e-6,
    points: 2000,
    preTrigger: 200,
    eventTime: -0.04e-6,
    scope: { perDivision: 1, center: 0, noiseRms: 0.03 },
    layout: 'tab-microseconds',
    seed: 404,
  },
  {
    file: 'burden-current-step.csv',
    scenario: 'current-transformer burden: 50 mA secondary current step into burden resistor, magnetising inductance and winding capacitance',
    circuit: {
      topology: 'parallel',
      R: 390,
      L: 2e-3,
      C: 1e-9,
      source: { kind: 'step', initialLevel: 0, amplitude: 0.05 },
      probe: 'capacitor-voltage',
    },
    known: 'R',
    channel: 'CH1',
    sampleInterval: 20e-9,
    points: 1500,
    preTrigger: 150,
    eventTime: -12e-9,
    scope: { perDivision: 5, center: 10, noiseRms: 0.15 },
    layout: 'plain',
    seed: 505,
  },
  {
    file: 'half-bridge-clipped.csv',
    scenario: '12 V half-bridge motor driver: switch-node ring with the scope range set too tight, first overshoot clipped',
    circuit: {
      topology: 'series',
      R: 0.4,
      L: 6e-9,
      C: 680e-12,
      source: { kind: 'step', initialLevel: 0, amplitude: 12 },
      probe: 'capacitor-voltage',
    },
    known: 'C',
    channel: 'CH1',
    sampleInterval: 0.2e-9,
    points: 1000,
    preTrigger: 100,
    eventTime: -0.3e-9,
    scope: { perDivision: 2, center: 9, noiseRms: 0.06 },
    layout: 'plain',
    seed: 606,
  },
  switchNode('switch-node-before.csv', 0, 'bare loop, before adding a capacitor', 707),
  switchNode('switch-node-after-470p.csv', 470e-12, '470 pF added across the low-side switch', 808),
  switchNode('switch-node-after-1n.csv', 1e-9, '1 nF added across the low-side switch', 909),
];
