// The lot report as Markdown: yields, per-quantity capability, failures by likely cause, the units to look at (no plots).

import { DEFERRAL } from '../safety/standingAdvice';
import { CAPABILITY_RULE } from './capability';
import { escapeMarkdown as m } from './escape';
import { DECISION_ZONES } from '../circuit/decisionRule';
import { LOT_YIELD_RULE, type LotSummary } from './lotSummary';
import { NOT_COUNTED_MARK, NOT_COUNTED_NOTE, ZONE_LABELS, decisionRuleText, indexText, lotCounts, rowScale, scaledText, spreadText, yieldText } from './lotText';

export interface LotMarkdownOptions {
  title?: string;
  /** Lines under the title (the logs, when the report was made, notes about the logs). */
  meta?: readonly string[];
}

export function renderLotMarkdown(summary: LotSummary, options: LotMarkdownOptions = {}): string {
  const out: string[] = [`# ${m(options.title ?? 'Lot report')}`, '', `${m(lotCounts(summary))}  `];
  for (const line of [...(options.meta ?? []), ...summary.notes]) out.push(`${m(line)}  `);
  out.push('', '## Yield', '');
  out.push(`- First-pass yield: ${m(yieldText(summary.firstPass, summary.checkedUnits))}`);
  out.push(`- Final yield: ${m(yieldText(summary.final, summary.checkedUnits))}`);
  out.push(`- Units not checked against a design: ${summary.notCheckedUnits}`);
  out.push(`- Latest decisions: ${DECISION_ZONES.map((zone) => `${ZONE_LABELS[zone]} ${summary.zones[zone]}`).join(', ')}`);
  out.push('', m(LOT_YIELD_RULE), '', m(decisionRuleText(summary.rules)));
  for (const group of summary.groups) {
    out.push('', summary.groups.length > 1 ? `## Quantities against ${m(group.design)}` : '## Quantities', '', `${group.units} units against ${m(group.design)}.`, '');
    out.push(
      `| Quantity | Unit | n | Mean | Std dev | Min | Max | LSL | USL | Design | Cp | Cpk | ${DECISION_ZONES.map((z) => ZONE_LABELS[z]).join(' | ')} |`,
      `| --- | --- | ${new Array(10 + DECISION_ZONES.length).fill('---:').join(' | ')} |`,
    );
    for (const q of group.quantities) {
      const s = q.stats;
      const scale = rowScale(q);
      const cells = [
        q.counted ? q.name : `${q.name} ${NOT_COUNTED_MARK}`, scale.unit || '–', String(s?.n ?? 0), scaledText(s?.mean, scale), spreadText(s?.sd, scale), scaledText(s?.min, scale), scaledText(s?.max, scale),
        scaledText(q.limits?.lower, scale), scaledText(q.limits?.upper, scale), scaledText(q.design, scale), indexText(q.capability.cp), indexText(q.capability.cpk),
        ...DECISION_ZONES.map((zone) => String(q.zones[zone])),
      ];
      out.push(`| ${cells.map(m).join(' | ')} |`);
    }
    if (group.quantities.some((q) => !q.counted)) out.push('', m(NOT_COUNTED_NOTE));
    out.push('', m(CAPABILITY_RULE));
  }
  out.push('', '## Failures by likely cause', '');
  if (summary.causes.length) {
    out.push('| Likely cause | Units | Which |', '| --- | ---: | --- |');
    for (const bin of summary.causes) out.push(`| ${m(bin.cause)} | ${bin.units.length} | ${bin.units.map(m).join(', ')} |`);
  } else {
    out.push('No unit fails at its latest measurement.');
  }
  out.push('', '## Units to look at', '');
  if (summary.flagged.length) {
    out.push('| Unit | Latest decision | Accepted | First pass | Measurements | Quantities outside pass | Likely cause |', '| --- | --- | --- | --- | ---: | --- | --- |');
    for (const u of summary.flagged) {
      const outside = u.outside.map((q) => `${q.name} (${ZONE_LABELS[q.zone]})`).join(', ') || '–';
      out.push(`| ${m(u.unit)} | ${ZONE_LABELS[u.decision]} | ${u.finalPass ? 'yes' : 'no'} | ${u.firstPass ? 'yes' : 'no'} | ${u.measurements} | ${m(outside)} | ${m(u.likelyCause ?? '–')} |`);
    }
  } else {
    out.push('Every unit checked passed at its first measurement.');
  }
  out.push('', `*${m(DEFERRAL)}*`, '');
  return out.join('\n');
}
