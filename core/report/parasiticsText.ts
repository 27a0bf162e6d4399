// The parasitic extraction and snubber suggestion as the readable table the command line prints.

import { formatEngineering, formatMeasured } from '../units/format';
import { formatCautionsText } from '../safety/cautionText';
import type { ParasiticExtraction } from '../circuit/addedCapacitor';
import type { SnubberSuggestion } from '../circuit/snubber';
import type { CautionResult } from '../safety/evaluateCautions';
import type { Quantity } from '../quantity';

export interface ParasiticsResult {
  L: Quantity;
  C: Quantity;
  R: Quantity;
  characteristicImpedance: Quantity;
  residual: ParasiticExtraction['residual'];
  captures: { file: string; addedC: number; frequency: Quantity; alpha: Quantity }[];
  snubber: SnubberSuggestion;
  cautions: CautionResult;
  warnings: string[];
  notes: string[];
}

export function formatParasiticsText(r: ParasiticsResult): string {
  let text = 'captures\n';
  for (const c of r.captures) {
    text += `  ${c.file.padEnd(28)} added ${formatEngineering(c.addedC, 'F').padEnd(10)} f0 ${formatMeasured(c.frequency)}, alpha ${formatMeasured(c.alpha)}\n`;
  }
  text += 'loop parasitics\n';
  text += `  L_p              ${formatMeasured(r.L)}\n`;
  text += `  C_p              ${formatMeasured(r.C)}\n`;
  text += `  R_p              ${formatMeasured(r.R)}\n`;
  text += `  sqrt(L_p/C_p)    ${formatMeasured(r.characteristicImpedance)}\n`;
  if (r.residual) text += `  consistency      chi^2 ${r.residual.chiSquare.toPrecision(3)} on ${r.residual.dof} degree(s) of freedom\n`;
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
