// Writes the ngspice netlist of one reference circuit: elements, accurate transient settings, uniform output.

import { circuitDamping } from '../../../sample-captures/circuitResponse';
import type { ReferenceCircuit } from './circuits';

/** Source edge duration as a fraction of the output interval: the step is ideal on the fixture's grid. */
export const EDGE_FRACTION = 1e-5;
/** Largest internal ngspice step as a fraction of the fastest time scale (ring period or fast pole). */
const STEPS_PER_PERIOD = 10_000;

/** Shortest spelling SPICE reads back exactly: plain between 1e-3 and 1e4, else exponential (2.2e-5). */
function spiceNumber(x: number): string {
  const rounded = Number(x.toPrecision(12));
  const size = Math.abs(rounded);
  return size === 0 || (size >= 1e-3 && size < 1e4) ? String(rounded) : rounded.toExponential();
}

/** Event time of the closed form: the middle of the source edge, or 0 for initial conditions. */
export function eventTime(c: ReferenceCircuit): number {
  if (c.eventIndex === 0) return 0;
  return Number((c.eventIndex * c.sampleInterval + (EDGE_FRACTION * c.sampleInterval) / 2).toPrecision(12));
}

/** The ngspice output vector that holds the probed quantity. */
export function probedVector(c: ReferenceCircuit): string {
  if (c.probe === 'inductor-current') return 'l1#branch';
  if (c.topology === 'parallel') return 'v(top)';
  return c.probe === 'resistor-voltage' ? 'v(sense)' : 'v(out)';
}

function sourceValue(c: ReferenceCircuit): string {
  const s = c.source;
  if (s.kind === 'natural') {
    if (c.eventIndex !== 0) throw new Error(`${c.name}: a natural response starts from initial conditions at index 0`);
    return 'DC 0';
  }
  if (c.eventIndex === 0) throw new Error(`${c.name}: a step needs samples before the event (eventIndex > 0)`);
  const edge = spiceNumber(EDGE_FRACTION * c.sampleInterval);
  const td = spiceNumber(c.eventIndex * c.sampleInterval);
  return `PULSE(${spiceNumber(s.initialLevel)} ${spiceNumber(s.initialLevel + s.amplitude)} ${td} ${edge} ${edge} 1e3 2e3)`;
}

/** Element lines; natural responses carry their state as element initial conditions (used with uic). */
function elementLines(c: ReferenceCircuit): string[] {
  const natural = c.source.kind === 'natural' ? c.source : null;
  const capIc = natural ? ` ic=${spiceNumber(natural.capacitorVoltage)}` : '';
  const indIc = natural ? ` ic=${spiceNumber(natural.inductorCurrent)}` : '';
  const capacitors = (plus: string, minus: string): string[] => {
    const added = c.addedCapacitor;
    if (!added || added.added === 0) return [`C1 ${plus} ${minus} ${spiceNumber(c.C)}${capIc}`];
    return [
      `C1 ${plus} ${minus} ${spiceNumber(added.parasitic)}${capIc}`,
      `C2 ${plus} ${minus} ${spiceNumber(added.added)}${capIc}`,
    ];
  };
  if (c.topology === 'parallel') {
    return [
      `I1 0 top ${sourceValue(c)}`,
      `R1 top 0 ${spiceNumber(c.R)}`,
      `L1 top 0 ${spiceNumber(c.L)}${indIc}`,
      ...capacitors('top', '0'),
    ];
  }
  if (c.probe === 'resistor-voltage') {
    // Resistor at the ground end so that v(sense) = R i.
    return [
      `V1 in 0 ${sourceValue(c)}`,
      `L1 in n1 ${spiceNumber(c.L)}${indIc}`,
      ...capacitors('n1', 'sense'),
      `R1 sense 0 ${spiceNumber(c.R)}`,
    ];
  }
  return [
    `V1 in 0 ${sourceValue(c)}`,
    `R1 in n1 ${spiceNumber(c.R)}`,
    `L1 n1 out ${spiceNumber(c.L)}${indIc}`,
    ...capacitors('out', '0'),
  ];
}

/** Largest internal time step: a small fraction of the fastest natural time scale, never above the output step. */
function maxStep(c: ReferenceCircuit): number {
  const { alpha, omega0 } = circuitDamping(c);
  const fastest = Math.max(omega0, alpha + Math.sqrt(Math.max(0, alpha * alpha - omega0 * omega0)));
  return Math.min(c.sampleInterval, Number(((2 * Math.PI) / fastest / STEPS_PER_PERIOD).toPrecision(3)));
}

/** Netlist text; ngspice writes the probed waveform to `outputFile` (relative to its working folder). */
export function writeNetlist(c: ReferenceCircuit, outputFile: string): string {
  const stop = (c.points - 1) * c.sampleInterval;
  const uic = c.source.kind === 'natural' ? ' uic' : '';
  const vector = probedVector(c);
  return [
    `ringbench reference circuit ${c.name}`,
    `* ${c.scenario}`,
    '* Written by test/reference/ngspice/generate.ts from circuits.ts: edit there, then regenerate.',
    ...elementLines(c),
    '.options reltol=1e-7 abstol=1e-15 vntol=1e-12 chgtol=1e-20',
    `.tran ${spiceNumber(c.sampleInterval)} ${spiceNumber(stop)} 0 ${spiceNumber(maxStep(c))}${uic}`,
    '.control',
    'run',
    `linearize ${vector}`,
    'set wr_singlescale',
    'set numdgt=12',
    `wrdata ${outputFile} ${vector}`,
    'quit',
    '.endc',
    '.end',
    '',
  ].join('\n');
}
