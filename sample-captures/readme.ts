// The README of the sample captures, written from their manifest so the table cannot drift from the files.

import type { SampleManifestEntry } from './sampleManifest';
import { displayText } from './prefixed';
import { SWITCH_NODE_LOOP } from './scenarios';

const PROBE_TEXT = {
  'capacitor-voltage': 'capacitor voltage',
  'inductor-current': 'inductor current',
  'resistor-voltage': 'resistor voltage',
} as const;

function sourceText(e: SampleManifestEntry): string {
  const s = e.source;
  if (s.kind === 'natural') {
    return `natural: C charged to ${displayText(s.capacitorVoltage, 'V')}, I_L = ${displayText(s.inductorCurrent, 'A')} at the event`;
  }
  const unit = e.topology === 'series' ? 'V' : 'A';
  const what = e.topology === 'series' ? 'voltage' : 'current';
  return `${what} step ${displayText(s.initialLevel, unit)} → ${displayText(s.initialLevel + s.amplitude, unit)}`;
}

function row(e: SampleManifestEntry): string {
  const cells = [
    `\`${e.file}\``,
    e.scenario,
    e.topology,
    displayText(e.R, 'Ω'),
    displayText(e.L, 'H'),
    displayText(e.C, 'F'),
    `zeta ${e.zeta.toPrecision(3)} (${e.regime})`,
    `${PROBE_TEXT[e.probe]}, ${e.channel} (${e.unit})`,
    sourceText(e),
    displayText(e.sampleInterval, 's'),
    `${displayText(e.noiseRms, e.unit)} rms, LSB ${displayText(e.scope.codeStep, e.unit)}`,
    `\`--known ${e.known.option}\``,
  ];
  return `| ${cells.join(' | ')} |`;
}

export function sampleReadme(captures: SampleManifestEntry[]): string {
  const f0 = (c: number) => displayText(1 / (2 * Math.PI * Math.sqrt(SWITCH_NODE_LOOP.L * c)), 'Hz');
  return [
    '# Sample captures',
    '',
    'Simulated oscilloscope exports of bench scenarios of our own, for trying Ringbench and for its tests.',
    'Each file is the closed-form second-order response (`core/response/secondOrder.ts`) of the stated',
    'R, L and C (derivation in `circuitResponse.ts`, checked against ngspice by',
    '`test/reference/ngspiceClosedForm.test.ts`), with seeded Gaussian noise added before an 8-bit',
    'converter of 256 codes over 10 divisions that saturates at its rails.',
    '',
    'This file, `manifest.json` (the same data, machine-readable) and the captures are written by',
    '`npx tsx sample-captures/generate.ts`; `test/core/sampleCaptures.test.ts` checks that the committed',
    'files are exactly what the generator writes. Edit `scenarios.ts`, not the outputs.',
    '',
    '| File | Scenario | Topology | R | L | C | Damping | Probed | Source | Sample interval | Noise | Known |',
    '| --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- |',
    ...captures.map(row),
    '',
    'Series: source → R → L → C, the event is the source switching. Parallel: a current source into',
    'R, L and C sharing one node; the inductor current flows from that node to ground. A natural response',
    'starts when a switch releases the charged capacitor; the level before the event is the held value.',
    '',
    'Example: `ringbench fit sample-captures/input-filter-step.csv --topology series --known C=47u`.',
    '`gate-drive-turn-on.csv` has two channels: CH1 is the driver output (the step, with a 1 ns edge),',
    'CH2 the gate; fit CH2 (`--column CH2`).',
    '',
    '## Layouts',
    '',
    '- `plain`: header `Time (s),CH1 (V)`, comma-separated rows, time in s with a two-digit exponent.',
    '- `preamble-comma`: key,value lines (title, sample interval, record length), a blank line, then the plain header.',
    '- `semicolon-decimal-comma`: key;value preamble, header `Time [ns];CH1 [V];CH2 [mV]`, decimal commas.',
    '- `interval-only`: a comment line and a key,value preamble stating `Sample Interval`; one value column, no time column (the axis starts at 0).',
    '- `tab-microseconds`: header `Time [us]<TAB>CH3 [A]`, tab-separated.',
    '',
    '## Added-capacitor set',
    '',
    `\`switch-node-before.csv\`, \`switch-node-after-470p.csv\` and \`switch-node-after-1n.csv\` ring one loop of`,
    `L_p = ${displayText(SWITCH_NODE_LOOP.L, 'H')}, C_p = ${displayText(SWITCH_NODE_LOOP.C, 'F')} and R_p = ${displayText(SWITCH_NODE_LOOP.R, 'Ω')}`,
    `with 0, 470 pF and 1 nF added across C_p: f0 = ${f0(SWITCH_NODE_LOOP.C)}, ${f0(SWITCH_NODE_LOOP.C + 470e-12)} and ${f0(SWITCH_NODE_LOOP.C + 1e-9)}.`,
    'The added-capacitor method should recover L_p and C_p from them without a known component; the',
    '`--known` column gives the total node capacitance for fitting one file on its own.',
    '',
  ].join('\n');
}
