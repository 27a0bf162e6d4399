// Trust table rows for the bench jobs on top (case 0): the snubbed loop's promised overshoot, parasitics
// from captures that cannot give them, and a design check whose source step differs from the capture's.

import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseCapture } from '../../../../core/capture/parseCapture';
import { selectChannel } from '../../../../core/capture/selectChannel';
import type { Channel } from '../../../../core/capture/types';
import { extractParasitics } from '../../../../core/circuit/addedCapacitor';
import { parseDesign } from '../../../../core/circuit/design';
import { suggestSnubber } from '../../../../core/circuit/snubber';
import { InputError } from '../../../../core/inputError';
import { quantity } from '../../../../core/quantity';
import { createRandom } from '../../../../core/random';
import { measureCapture } from '../../../../core/workflow/measure';
import { measureParasitics } from '../../../../core/workflow/parasitics';
import { integrateSnubbedStep, sampledStepMetrics } from '../../snubbedLoopIntegration';
import type { TrustCase, TrustOutcome } from '../trustCase';

const SAMPLES = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../../../sample-captures');

/** A sample capture's first channel (the sample captures are generated with a seed; their truth is in manifest.json). */
function sampleChannel(file: string): Channel {
  return selectChannel(parseCapture(readFileSync(path.join(SAMPLES, file), 'utf8')));
}

/**
 * Bad input refused (an InputError: exit 2 on the command line) is a declared failure, not an answer:
 * it maps to status 'refused'. Anything the use case returns is a claimed answer, 'converged'.
 */
function refusedOr(run: () => TrustOutcome['values']): TrustOutcome {
  try {
    return { status: 'converged', values: run() };
  } catch (error) {
    if (error instanceof InputError) return { status: 'refused', values: {} };
    throw error;
  }
}

/**
 * The README's switch-node loop as the sample captures state it (manifest.json: L_p 6.5 nH, C_p 390 pF,
 * R_p 0.28 ohm). The prediction is a deterministic function of the loop and the snubber parts, so its
 * standard error here is the numerical accuracy the step metrics promise: 1e-4 of the step.
 */
function snubbedOvershootRow(ratio: number): TrustCase {
  const loop = { Lp: 6.5e-9, Cp: 390e-12, Rp: 0.28 };
  const promised = suggestSnubber({ L: quantity(loop.Lp, null, 'H'), C: quantity(loop.Cp, null, 'F'), R: quantity(loop.Rp, null, 'ohm') }, { capacitanceRatio: ratio });
  const interval = Math.sqrt(loop.Lp * loop.Cp) / 200;
  // Truth: the circuit's state equations integrated by RK4 (snubbedLoopIntegration.ts), independent of the partial fractions.
  const numeric = sampledStepMetrics(integrateSnubbedStep({ ...loop, Rs: promised.R.value, Cs: promised.C.value }, 60 * Math.sqrt(loop.Lp * loop.Cp), interval), 0.02);
  return {
    issueCase: 0,
    name: `snubbed switch node, C = ${ratio} C_p: the promised overshoot is the third-order loop's (RK4 truth ${(numeric.overshoot * 100).toFixed(1)} %)`,
    expect: 'right',
    truth: { overshoot: numeric.overshoot },
    run: () => {
      const s = suggestSnubber({ L: quantity(loop.Lp, null, 'H'), C: quantity(loop.Cp, null, 'F'), R: quantity(loop.Rp, null, 'ohm') }, { capacitanceRatio: ratio });
      return { status: 'converged', values: { overshoot: quantity(s.predicted.step.overshoot, 1e-4, '') } };
    },
  };
}

const SWITCH_NODE = ['switch-node-before.csv', 'switch-node-after-470p.csv', 'switch-node-after-1n.csv'];
const SWITCH_NODE_ADDED = [0, 470e-12, 1e-9];

/**
 * The whole job: parasitics from the three switch-node captures, the snubber suggested for them, and its
 * promised overshoot with the error bar carried from L_p, C_p and R_p. Truth: the stated loop
 * (manifest.json) with the suggested parts fitted, integrated by RK4. The parts come from the run, so the
 * truth is filled in by it (the table reads it after the run).
 */
function measuredSnubberRow(): TrustCase {
  const truth: Record<string, number> = {};
  return {
    issueCase: 0,
    name: 'the snubber suggested from the switch-node captures: its promised overshoot against the stated loop with those parts (RK4)',
    expect: 'right',
    truth,
    run: () => {
      const { snubber } = measureParasitics({ captures: SWITCH_NODE.map((file, i) => ({ file, channel: sampleChannel(file), addedC: SWITCH_NODE_ADDED[i] })), addedTolerance: 0 });
      const stated = { Lp: 6.5e-9, Cp: 390e-12, Rp: 0.28 };
      const unit = Math.sqrt(stated.Lp * stated.Cp);
      truth.overshoot = sampledStepMetrics(integrateSnubbedStep({ ...stated, Rs: snubber.R.value, Cs: snubber.C.value }, 60 * unit, unit / 400), 0.02).overshoot;
      const { step, stepStderr } = snubber.predicted;
      return { status: 'converged', values: { overshoot: quantity(step.overshoot, stepStderr?.overshoot ?? null, '') } };
    },
  };
}

function parasiticsOf(files: string[], added: number[]): TrustOutcome {
  return refusedOr(() => {
    const r = measureParasitics({ captures: files.map((file, i) => ({ file, channel: sampleChannel(file), addedC: added[i] })), addedTolerance: 0 });
    return { L: r.L, C: r.C, R: r.R };
  });
}

/**
 * Two generated natural frequencies (seeded noise at their stated standard error) whose drop from the
 * added capacitor is `sigmas` combined standard uncertainties: below 3 the set cannot separate L_p and C_p.
 */
function closeFrequenciesRow(sigmas: number, expect: TrustCase['expect']): TrustCase {
  const Lp = 15e-9;
  const Cp = 220e-12;
  const u = 20e3;
  const f1 = 1 / (2 * Math.PI * Math.sqrt(Lp * Cp));
  const addedC = Cp * ((f1 / (f1 - sigmas * Math.SQRT2 * u)) ** 2 - 1);
  return {
    issueCase: 0,
    name: `parasitics from two captures whose f0 differ by ${sigmas} combined sigma`,
    expect,
    truth: { L: Lp, C: Cp },
    run: () =>
      refusedOr(() => {
        const random = createRandom(1100 + sigmas);
        const f = [f1, 1 / (2 * Math.PI * Math.sqrt(Lp * (Cp + addedC)))].map((v) => quantity(v + u * random.normal(), u, 'Hz'));
        const alpha = quantity(1e7, 1e5, 's^-1');
        const r = extractParasitics([
          { addedC: 0, frequency: f[0], alpha },
          { addedC, frequency: f[1], alpha },
        ]);
        return { L: r.L, C: r.C };
      }),
  };
}

/**
 * The half-bridge capture (a 12 V step, manifest.json) checked against its design with the step set to
 * `amplitude`. The verdict maps onto the table as: in tolerance = 'converged' (the check claims the board
 * matches, and its final value must then be the true 12 V within its standard error); out of tolerance =
 * 'out of tolerance' (a declared failure of the board to match: exit 3), which is the only right answer
 * when the design's step is not the capture's.
 */
function designStepRow(amplitude: number, expect: TrustCase['expect']): TrustCase {
  const file = 'half-bridge-clipped.csv';
  const text = readFileSync(path.join(SAMPLES, 'designs', 'half-bridge-clipped.json'), 'utf8');
  const design = parseDesign(text);
  const stepped = { ...design, source: { kind: 'step' as const, initialLevel: 0, amplitude } };
  return {
    issueCase: 0,
    name: `a ${amplitude} V design checked against the 12 V half-bridge capture`,
    expect,
    truth: { finalValue: 12 },
    run: () => {
      const { summary, verdict } = measureCapture({ file, channel: sampleChannel(file), design: stepped });
      if (!verdict) return { status: `no verdict (${summary.status})`, values: {} };
      return { status: verdict.pass ? 'converged' : 'out of tolerance', values: { finalValue: summary.finalValue } };
    },
  };
}

export const benchJobsCases: TrustCase[] = [
  snubbedOvershootRow(4),
  snubbedOvershootRow(3),
  measuredSnubberRow(),
  {
    issueCase: 0,
    name: 'parasitics from the three switch-node captures (truth: the stated loop, manifest.json)',
    expect: 'right',
    truth: { L: 6.5e-9, C: 390e-12, R: 0.28 },
    run: () => parasiticsOf(SWITCH_NODE, SWITCH_NODE_ADDED),
  },
  {
    issueCase: 0,
    name: 'parasitics with the same capture twice: refused, no megafarad snubber',
    expect: 'failed',
    truth: {},
    run: () => parasiticsOf([SWITCH_NODE[0], SWITCH_NODE[0]], [0, 470e-12]),
  },
  {
    issueCase: 0,
    name: 'parasitics with the captures in the wrong order (f0 rises with the added capacitance): refused',
    expect: 'failed',
    truth: {},
    run: () => parasiticsOf([SWITCH_NODE[1], SWITCH_NODE[0]], [0, 470e-12]),
  },
  closeFrequenciesRow(1, 'failed'),
  closeFrequenciesRow(10, 'right-or-failed'),
  designStepRow(48, 'failed'),
  designStepRow(12, 'right'),
];
