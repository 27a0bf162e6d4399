// The caution result as the plain text the command line prints after a fit.

import { formatEngineering } from '../units/format';
import type { CautionResult } from './evaluateCautions';

/**
 * The fired cautions with their sources, the stored energies, and the deferral line (always).
 * The standing advice is printed only when a caution fired, so that a low-voltage fit stays short.
 */
export function formatCautionsText(result: CautionResult): string {
  let text = result.fired.length ? `cautions (${result.fired.length})\n` : 'cautions: no threshold reached\n';
  if (result.peakNotWeighed) text += `  not weighed: ${result.peakNotWeighed}\n`;
  for (const caution of result.fired) {
    const comparison = `${formatEngineering(caution.measured.value, caution.measured.unit)} (threshold ${formatEngineering(caution.threshold.value, caution.threshold.unit)})`;
    text += `  ! ${caution.checks} ${comparison}\n`;
    text += `    ${caution.message}\n`;
    text += `    source: ${caution.source} [${caution.certainty}]\n`;
  }
  const stored = storedLine(result);
  if (stored) text += `  ${stored}\n`;
  if (result.fired.length) {
    text += `  standing advice (${result.adviceSource}):\n`;
    for (const line of result.advice) text += `  - ${line}\n`;
  }
  text += `  ${result.deferral}\n`;
  return text;
}

/** 'stored: capacitor 3.6 J, inductor 12 mJ, charge 19 uC; bleeder to 50 V in 12 s', or '' when nothing is known. */
export function storedLine(result: CautionResult): string {
  const parts: string[] = [];
  if (result.energies.capacitor) parts.push(`capacitor ${formatEngineering(result.energies.capacitor.value, 'J')}`);
  if (result.energies.inductor) parts.push(`inductor ${formatEngineering(result.energies.inductor.value, 'J')}`);
  if (result.charge) parts.push(`charge ${formatEngineering(result.charge.value, 'C')}`);
  let line = parts.length ? `stored: ${parts.join(', ')}` : '';
  if (result.discharge) {
    const discharge = `bleeder to ${formatEngineering(result.discharge.toVoltage, 'V')} in ${formatEngineering(result.discharge.time.value, 's')}`;
    line = line ? `${line}; ${discharge}` : discharge;
  }
  return line;
}
