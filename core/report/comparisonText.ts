// A before/after comparison of two captures: its result (made by core/workflow/compare) and the readable
// table the command line prints.

import { formatCautionsText } from '../safety/cautionText';
import { formatMeasured, formatWithUncertainty } from '../units/format';
import type { Quantity } from '../quantity';
import type { CautionResult } from '../safety/evaluateCautions';
import type { FitSummary } from './fitSummary';
import { fitStateText } from './resultRows';

export interface QuantityChange {
  name: string;
  before: Quantity;
  after: Quantity;
  /** after - before, with the combined standard uncertainty sqrt(u_before^2 + u_after^2) (independent captures). */
  difference: Quantity;
  /** difference / |before|; null when before is zero. */
  relative: number | null;
  /** |difference| / its standard uncertainty; null when an uncertainty is unknown. */
  sigmas: number | null;
  /** sigmas > the coverage factor; null when unknown. */
  significant: boolean | null;
}

export type ChangeVerdict = 'changed' | 'no significant change' | 'undetermined';

export interface Comparison {
  before: FitSummary;
  after: FitSummary;
  beforeCautions: CautionResult;
  afterCautions: CautionResult;
  quantities: QuantityChange[];
  /** The joint chi-square of the (alpha, omega0) change, 2 degrees of freedom; null when it cannot be formed. */
  jointChiSquare: number | null;
  verdict: ChangeVerdict;
  /** One sentence: why this verdict. */
  reason: string;
  coverageFactor: number;
  notes: string[];
}

export function formatComparisonText(c: Comparison): string {
  let text = `before  ${c.before.file} (${c.before.channel}): ${fitStateText(c.before)}\n`;
  text += `after   ${c.after.file} (${c.after.channel}): ${fitStateText(c.after)}\n`;
  const width = Math.max(24, ...c.quantities.flatMap((q) => [formatMeasured(q.before).length, formatMeasured(q.after).length])) + 2;
  if (c.quantities.length) text += `  ${'quantity'.padEnd(8)} ${'before'.padEnd(width)} ${'after'.padEnd(width)} change (relative), in combined standard uncertainties\n`;
  for (const q of c.quantities) {
    const relative = q.relative === null ? '' : ` (${q.relative >= 0 ? '+' : ''}${(100 * q.relative).toFixed(2)} %)`;
    const sigmas = q.sigmas === null ? 'uncertainty unknown' : `${q.sigmas.toFixed(1)} σ${q.significant ? ', significant' : ''}`;
    text += `  ${q.name.padEnd(8)} ${formatMeasured(q.before).padEnd(width)} ${formatMeasured(q.after).padEnd(width)} ${formatWithUncertainty(q.difference)}${relative}, ${sigmas}\n`;
  }
  text += `verdict: ${c.verdict}: ${c.reason}\n`;
  for (const note of c.notes) text += `  note: ${note}\n`;
  for (const w of c.before.warnings) text += `  warning (before): ${w}\n`;
  for (const w of c.after.warnings) text += `  warning (after): ${w}\n`;
  return text + formatCautionsText(strongerCautions(c));
}

/** The side whose cautions fired more (the same node, so the worse capture speaks for both). */
function strongerCautions(c: Comparison): Comparison['beforeCautions'] {
  return c.afterCautions.fired.length > c.beforeCautions.fired.length ? c.afterCautions : c.beforeCautions;
}
