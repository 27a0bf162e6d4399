// The parasitic extraction and snubber suggestion as the readable table the command line prints.

import { formatEngineering, formatMeasured } from '../units/format';
import { formatCautionsText } from '../safety/cautionText';
import type { LinePoint, ParasiticExtraction } from '../circuit/addedCapacitor';
import { crossCheckLine, type EdgeInductance, type InductanceCrossCheck } from '../circuit/edgeInductance';
import type { SnubberSuggestion } from '../circuit/snubber';
import type { CautionResult } from '../safety/evaluateCautions';
import type { Quantity } from '../quantity';

export interface ParasiticsResult {
  L: Quantity;
  C: Quantity;
  R: Quantity;
  characteristicImpedance: Quantity;
  residual: ParasiticExtraction['residual'];
  /** Each capture: the nominal added C, its value at the operating voltage on the line, and its residual from the line. */
  captures: ({ file: string; addedC: number; frequency: Quantity; alpha: Quantity } & LinePoint)[];
  switchSplit: ParasiticExtraction['switchSplit'];
  /** L_p cross-checked on a turn-on edge; null when no current capture was given. */
  edgeCheck: EdgeCrossCheck | null;
  snubber: SnubberSuggestion;
  cautions: CautionResult;
  warnings: string[];
  notes: string[];
}

/** L from a turn-on edge beside the ring's L_p, with the verdict. */
export type EdgeCrossCheck = { file: string } & EdgeInductance & Omit<InductanceCrossCheck, 'edge'>;

export function formatParasiticsText(r: ParasiticsResult): string {
  let text = 'captures\n';
  for (const c of r.captures) {
    text += `  ${c.file.padEnd(28)} added ${formatEngineering(c.addedC, 'F').padEnd(10)} f0 ${formatMeasured(c.frequency)}, alpha ${formatMeasured(c.alpha)}\n`;
  }
  if (r.captures.some((c) => c.factorSource !== 'none') || r.residual) text += lineText(r);
  text += 'loop parasitics\n';
  text += `  L_p              ${formatMeasured(r.L)}\n`;
  text += `  C_p              ${formatMeasured(r.C)}\n`;
  text += `  R_p              ${formatMeasured(r.R)}\n`;
  text += `  sqrt(L_p/C_p)    ${formatMeasured(r.characteristicImpedance)}\n`;
  if (r.residual) text += `  consistency      chi^2 ${r.residual.chiSquare.toPrecision(3)} on ${r.residual.dof} degree(s) of freedom\n`;
  if (r.switchSplit) {
    const { switchC, rest } = r.switchSplit;
    text += `  C_switch         ${formatMeasured(switchC)} (as entered, at the operating voltage)\n`;
    text += `  C_p - C_switch   ${rest ? formatMeasured(rest) : 'not given (see the warning)'}\n`;
  }
  if (r.edgeCheck) text += edgeText(r.edgeCheck, r.L);
  const s = r.snubber;
  text += 'RC snubber: a starting point, to be verified on the bench\n';
  text += `  R                ${formatMeasured(s.R)}\n`;
  text += `  C                ${formatMeasured(s.C)} (usual range ${formatEngineering(s.capacitanceRange.min, 'F')} to ${formatEngineering(s.capacitanceRange.max, 'F')})\n`;
  text += s.powerAt
    ? `  dissipation      ${formatEngineering(s.powerAt.power, 'W')} at ${formatEngineering(s.powerAt.voltage, 'V')}, ${formatEngineering(s.powerAt.frequency, 'Hz')} (P = C V^2 f)\n`
    : `  dissipation      ${formatEngineering(s.powerPerVoltSquaredHertz, 'W')} per V^2 Hz (give --voltage and --switching-frequency)\n`;
  text += `  zeta             ${s.before.zeta.toPrecision(3)} without, ${s.predicted.zeta.toPrecision(3)} with the snubber (${s.predicted.method})\n`;
  const percent = (x: number) => `${(x * 100).toFixed(1)} %`;
  const settling = (t: number | null) => (t === null ? 'never' : formatEngineering(t, 's'));
  const spread = (u: number | null | undefined, show: (x: number) => string) => (u === null || u === undefined ? '' : ` ± ${show(u)}`);
  const u = s.predicted.stepStderr;
  text += `  step overshoot   ${percent(s.before.step.overshoot)} without, ${percent(s.predicted.step.overshoot)}${spread(u?.overshoot, (x) => `${(x * 100).toPrecision(2)} %`)} with the snubber (the whole loop's step response)\n`;
  text += `  settling (${Math.round(s.settlingBand * 100)} %)   ${settling(s.before.step.settlingTime)} without, ${settling(s.predicted.step.settlingTime)}${spread(u?.settlingTime, (x) => formatEngineering(x, 's', 2))} with the snubber\n`;
  for (const w of r.warnings) text += `  warning: ${w}\n`;
  for (const n of [...r.notes, ...s.notes]) text += `  note: ${n}\n`;
  return text + formatCautionsText(r.cautions);
}

/** The line 1/(2 pi f0)^2 against the added C at the operating voltage: each capture's value on it and its residual (relative to its 1/(2 pi f0)^2). */
function lineText(r: ParasiticsResult): string {
  let text = 'line 1/(2 pi f0)^2 = L_p (C_p + C_added at the operating voltage)\n';
  const source = { none: 'nominal', derating: 'own derating', 'dc-bias': 'DC-bias factor' } as const;
  for (const c of r.captures) {
    const factor = c.factorSource === 'none' ? '' : ` (x ${c.factor.toPrecision(3)}, ${source[c.factorSource]})`;
    const signed = (x: number, digits: number) => `${x >= 0 ? '+' : ''}${x.toFixed(digits)}`;
    const relative = c.residual * (2 * Math.PI * c.frequency.value) ** 2;
    const sigmas = c.residualSigmas === null ? '' : ` (${signed(c.residualSigmas, 2)} sigma)`;
    text += `  ${c.file.padEnd(28)} C ${formatMeasured(c.effectiveC)}${factor}, residual ${signed(relative * 100, 3)} %${sigmas}\n`;
  }
  return text;
}

function edgeText(e: EdgeCrossCheck, ringL: Quantity): string {
  let text = `L_p cross-check on the turn-on edge ${e.file}\n`;
  text += `  di/dt            ${formatMeasured(e.didt)} (10-90 % of a ${formatEngineering(Math.abs(e.edge.step), 'A')} step)\n`;
  text += `  V_L              ${formatMeasured(e.plateau)} (${e.plateauSource === 'given' ? 'plateau given' : 'mean drop of the switch voltage over the rise'})\n`;
  text += `  L                ${formatMeasured(e.L)} (V_L / (di/dt))\n`;
  return text + `  verdict          ${crossCheckLine(e.L, e, ringL)}\n`;
}
