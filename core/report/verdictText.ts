// A design verdict as text: the lines the command line prints under the fit table, and the zone, limits,
// decision and rule wording the HTML and Markdown reports put in their verdict tables.

import { describeDecisionRule, type DecisionZone } from '../circuit/decisionRule';
import type { Verdict, VerdictQuantity } from '../circuit/verdict';
import { formatEngineering, formatMeasured } from '../units/format';
import { marginText } from './resultRows';

/** The zones as words for a person. */
export const ZONE_WORDS: Record<DecisionZone, string> = { pass: 'pass', 'conditional-pass': 'conditional pass', 'conditional-fail': 'conditional fail', fail: 'fail' };

/** A quantity's zone; a record logged before decision zones has none: accepted reads as pass, else fail. */
export function quantityZoneOf(q: VerdictQuantity): DecisionZone {
  return (q as Partial<VerdictQuantity>).zone ?? (q.inTolerance ? 'pass' : 'fail');
}

/** The unit's zone; a record logged before decision zones: pass or fail. */
export function verdictDecisionOf(verdict: Verdict): DecisionZone {
  return (verdict as Partial<Verdict>).decision ?? (verdict.pass ? 'pass' : 'fail');
}

/** '10.2 ks^-1 to 12.1 ks^-1', 'at most 25 %', 'at least 3'; '–' for a record logged before limits. `format` writes one value (the window's own). */
export function limitsText(q: VerdictQuantity, format: (value: number, unit: string) => string = formatEngineering): string {
  const limits = (q as Partial<VerdictQuantity>).limits;
  if (!limits || (limits.lower === null && limits.upper === null)) return '–';
  const show = (v: number) => format(v, q.measured.unit);
  if (limits.lower !== null && limits.upper !== null) return `${show(limits.lower)} to ${show(limits.upper)}`;
  return limits.lower !== null ? `at least ${show(limits.lower)}` : `at most ${show(limits.upper!)}`;
}

/** The expanded uncertainty U of the row, or '–' when unknown (the value alone decided) or not recorded. */
export function expandedUncertaintyText(q: VerdictQuantity): string {
  const U = (q as Partial<VerdictQuantity>).expandedUncertainty;
  return U === undefined || U === null ? '–' : formatEngineering(U, q.measured.unit);
}

/** Whether the row entered the decision; a record logged before the flag counted every row. */
export function isCounted(q: VerdictQuantity): boolean {
  return (q as Partial<VerdictQuantity>).counted ?? true;
}

/** The row's zone in words, 'not counted' added for a derived part shown for diagnosis only. */
export function zoneText(q: VerdictQuantity): string {
  return `${ZONE_WORDS[quantityZoneOf(q)]}${isCounted(q) ? '' : ' (not counted)'}`;
}

/** 'accepted: pass' or 'rejected: conditional pass': the decision under the rule, then the unit's zone. */
export function decisionText(verdict: Verdict): string {
  return `${verdict.pass ? 'accepted' : 'rejected'}: ${ZONE_WORDS[verdictDecisionOf(verdict)]}`;
}

/** The rule the verdict was decided by, in one sentence; null for a record logged before decision rules. */
export function ruleText(verdict: Verdict): string | null {
  const rule = (verdict as Partial<Verdict>).rule;
  return rule ? `Decision rule: ${describeDecisionRule(rule)}.` : null;
}

/** The verdict line when the fit gets none (verdictRefusal, core/workflow/measure.ts: a failed fit, a capture a setup check refuses, or a single decay where the design rings). */
export function formatNoVerdictText(reason: string): string {
  return `  verdict          none: ${reason}\n`;
}

export function formatVerdictText(verdict: Verdict, designName: string): string {
  let text = `  verdict          ${verdict.pass ? 'PASS' : 'FAIL'} against '${designName}' (${decisionText(verdict)})\n`;
  const rule = ruleText(verdict);
  if (rule) text += `    rule           ${rule.replace(/^Decision rule: /, '')}\n`;
  for (const q of verdict.quantities) {
    // Capitals for a counted row the rule rejects; a row shown for diagnosis says so at the end.
    const zone = ZONE_WORDS[quantityZoneOf(q)];
    const state = q.inTolerance || !isCounted(q) ? zone : zone.toUpperCase();
    text +=
      `    ${q.name.padEnd(14)} ${state.padEnd(17)}${marginText(q).padStart(9)}   measured ${formatMeasured(q.measured)}, design ${formatMeasured(q.design)}, ` +
      `limits ${limitsText(q)}, U ${expandedUncertaintyText(q)}${isCounted(q) ? '' : ' (not counted)'}\n`;
  }
  const cause = verdict.likelyCause;
  if (cause) {
    const direction = cause.change >= 0 ? 'high' : 'low';
    text += `    likely cause   ${cause.component} about ${(Math.abs(cause.change) * 100).toFixed(1)} % ${direction} (${formatEngineering(cause.impliedValue.value, cause.impliedValue.unit)}), explains ${(cause.explains * 100).toFixed(0)} % of the deviation\n`;
  }
  return text;
}
