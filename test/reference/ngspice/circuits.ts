// The bench circuits simulated with ngspice for the reference fixtures: stated values, timing, scenario.

import type { StatedCircuit } from '../../../sample-captures/circuitResponse';

export interface ReferenceCircuit extends StatedCircuit {
  /** File stem of the netlist and of the fixture. */
  name: string;
  /** One line: the bench situation this circuit stands for. */
  scenario: string;
  /** Uniform output interval of the fixture, s. */
  sampleInterval: number;
  /** Output samples, first at t = 0. */
  points: number;
  /** Index of the sample at which the source switches (0: the response starts from initial conditions). */
  eventIndex: number;
  /** For the added-capacitor set: C = parasitic + added (both F). */
  addedCapacitor?: { group: string; parasitic: number; added: number };
}

const SWITCH_NODE = { Rp: 0.5, Lp: 15e-9, Cp: 220e-12 };

function switchNode(added: number, suffix: string, label: string): ReferenceCircuit {
  return {
    name: `switch-node-${suffix}`,
    scenario: `48 V buck converter switch node: high-side turn-on rings loop L_p into C_p, ${label}`,
    topology: 'series',
    R: SWITCH_NODE.Rp,
    L: SWITCH_NODE.Lp,
    C: SWITCH_NODE.Cp + added,
    source: { kind: 'step', initialLevel: 0, amplitude: 48 },
    probe: 'capacitor-voltage',
    sampleInterval: 0.2e-9,
    points: 1001,
    eventIndex: 50,
    addedCapacitor: { group: 'switch-node', parasitic: SWITCH_NODE.Cp, added },
  };
}

export const referenceCircuits: ReferenceCircuit[] = [
  {
    name: 'series-step-underdamped',
    scenario: '48 V rail LC input filter, hot-plug step, filter capacitor voltage',
    topology: 'series',
    R: 0.2,
    L: 10e-6,
    C: 22e-6,
    source: { kind: 'step', initialLevel: 0, amplitude: 48 },
    probe: 'capacitor-voltage',
    sampleInterval: 0.8e-6,
    points: 1001,
    eventIndex: 50,
  },
  {
    name: 'series-step-near-critical',
    scenario: 'gate-drive loop, 12 V driver edge into the gate capacitance, gate voltage',
    topology: 'series',
    R: 5.6,
    L: 20e-9,
    C: 2.2e-9,
    source: { kind: 'step', initialLevel: 0, amplitude: 12 },
    probe: 'capacitor-voltage',
    sampleInterval: 0.1e-9,
    points: 1001,
    eventIndex: 50,
  },
  {
    name: 'series-step-overdamped',
    scenario: 'pulse-forming jig charging its storage capacitor through a damping resistor and choke',
    topology: 'series',
    R: 220,
    L: 50e-6,
    C: 10e-9,
    source: { kind: 'step', initialLevel: 0, amplitude: 100 },
    probe: 'capacitor-voltage',
    sampleInterval: 12e-9,
    points: 1001,
    eventIndex: 50,
  },
  {
    name: 'series-step-shunt-current',
    scenario: 'buck converter input loop, inrush current read as the voltage across a 0.1 ohm shunt',
    topology: 'series',
    R: 0.1,
    L: 1e-6,
    C: 4.7e-6,
    source: { kind: 'step', initialLevel: 0, amplitude: 24 },
    probe: 'resistor-voltage',
    sampleInterval: 0.1e-6,
    points: 1001,
    eventIndex: 50,
  },
  {
    name: 'parallel-current-off-underdamped',
    scenario: 'induction-heating test tank: the 2 A bias current feeding R || L || C is switched off',
    topology: 'parallel',
    R: 330,
    L: 47e-6,
    C: 10e-9,
    source: { kind: 'step', initialLevel: 2, amplitude: -2 },
    probe: 'capacitor-voltage',
    sampleInterval: 40e-9,
    points: 1001,
    eventIndex: 50,
  },
  {
    name: 'parallel-natural-overdamped',
    scenario: 'pulse-forming jig: storage capacitor charged to 50 V bleeds into a damping resistor and choke',
    topology: 'parallel',
    R: 1,
    L: 10e-6,
    C: 1e-6,
    source: { kind: 'natural', capacitorVoltage: 50, inductorCurrent: 0 },
    probe: 'capacitor-voltage',
    sampleInterval: 40e-9,
    points: 1001,
    eventIndex: 0,
  },
  {
    name: 'parallel-natural-coil-current',
    scenario: 'wireless-power test coil: resonant capacitor charged to 20 V, coil current probed',
    topology: 'parallel',
    R: 120,
    L: 24e-6,
    C: 100e-9,
    source: { kind: 'natural', capacitorVoltage: 20, inductorCurrent: 0 },
    probe: 'inductor-current',
    sampleInterval: 0.1e-6,
    points: 1001,
    eventIndex: 0,
  },
  {
    name: 'series-natural-overdamped',
    scenario: 'crowbar discharge of a 60 V hold-up capacitor through a dump resistor and its wiring inductance',
    topology: 'series',
    R: 4.7,
    L: 2e-6,
    C: 1e-6,
    source: { kind: 'natural', capacitorVoltage: 60, inductorCurrent: 0 },
    probe: 'capacitor-voltage',
    sampleInterval: 25e-9,
    points: 1001,
    eventIndex: 0,
  },
  switchNode(0, 'bare', 'bare loop'),
  switchNode(220e-12, 'add-220p', '220 pF added across the low-side switch'),
  switchNode(470e-12, 'add-470p', '470 pF added across the low-side switch'),
  switchNode(1e-9, 'add-1n', '1 nF added across the low-side switch'),
];
