// A fit summary as the readable table the command line prints.

import { formatEngineering, formatMeasured } from '../units/format';
import type { FitSummary } from './fitSummary';
import type { Quantity } from '../quantity';

function row(label: string, q: Quantity | undefined): string {
  return q ? `  ${label.padEnd(16)} ${formatMeasured(q)}\n` : '';
}

export function formatFitText(s: FitSummary): string {
  let text = `${s.file} (${s.channel})\n`;
  text += `  status           ${s.status}${s.status === 'converged' ? '' : `: ${s.message}`}\n`;
  text += `  regime           ${s.regime} (${s.regimeEvidence})\n`;
  text += row('alpha', s.alpha);
  text += row('omega0', s.omega0);
  text += row('omega_d', s.omegaD);
  text += row('f0', hertz(s.omega0));
  text += row('zeta', s.zeta);
  text += row('Q', s.Q);
  text += row('final value', s.finalValue);
  text += row('t0', s.t0);
  if (s.components) {
    text += `  components       ${s.components.topology}, known ${s.components.known}\n`;
    text += row('R', s.components.R);
    text += row('L', s.components.L);
    text += row('C', s.components.C);
  }
  text += `  residual rms     ${formatEngineering(s.rmsResidual, s.finalValue.unit)} (noise ${formatEngineering(s.noiseRms, s.finalValue.unit)})\n`;
  text += `  samples used     ${s.samplesUsed}${s.decimation ? ` (${s.decimation.note})` : ''}\n`;
  text += `  fit window       ${formatEngineering(s.window.start, 's')} to ${formatEngineering(s.window.end, 's')}\n`;
  for (const w of s.warnings) text += `  warning: ${w}\n`;
  return text;
}

function hertz(omega: Quantity): Quantity {
  return { value: omega.value / (2 * Math.PI), stderr: omega.stderr === null ? null : omega.stderr / (2 * Math.PI), unit: 'Hz' };
}
