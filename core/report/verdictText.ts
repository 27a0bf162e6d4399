// A design verdict as the lines the command line prints under the fit table.

import type { Verdict } from '../circuit/verdict';
import { formatEngineering, formatMeasured } from '../units/format';
import { marginText } from './resultRows';

/** The verdict line when the fit gets none (verdictRefusal, core/workflow/measure.ts: a failed fit, or a single decay where the design rings). */
export function formatNoVerdictText(reason: string): string {
  return `  verdict          none: ${reason}\n`;
}

export function formatVerdictText(verdict: Verdict, designName: string): string {
  let text = `  verdict          ${verdict.pass ? 'PASS' : 'FAIL'} against '${designName}'\n`;
  for (const q of verdict.quantities) {
    const state = q.inTolerance ? 'in' : 'OUT';
    text += `    ${q.name.padEnd(14)} ${state.padEnd(4)}${marginText(q).padStart(9)}   measured ${formatMeasured(q.measured)}, design ${formatMeasured(q.design)}\n`;
  }
  const cause = verdict.likelyCause;
  if (cause) {
    const direction = cause.change >= 0 ? 'high' : 'low';
    text += `    likely cause   ${cause.component} about ${(Math.abs(cause.change) * 100).toFixed(1)} % ${direction} (${formatEngineering(cause.impliedValue.value, cause.impliedValue.unit)}), explains ${(cause.explains * 100).toFixed(0)} % of the deviation\n`;
  }
  return text;
}
