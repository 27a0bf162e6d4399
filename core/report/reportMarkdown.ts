// The bench report as Markdown: the summary, the yield and every measurement's numbers, no plots.

import { formatEngineering, formatMeasured } from '../units/format';
import { DEFERRAL, STANDING_ADVICE, STANDING_ADVICE_SOURCE } from '../safety/standingAdvice';
import type { BenchRecord } from './benchRecord';
import { escapeMarkdown as m, markdownCode } from './escape';
import { importRows } from './importText';
import { decisionText, expandedUncertaintyText, limitsText, ruleText, zoneText } from './verdictText';
import { fitResultRows, fitStateText, fitTransitionRows, marginText, modelOrderText, showTime, transitionNote } from './resultRows';
import { reproduceCommand } from './reproduce';
import { setupChecksMarkdown } from './setupChecksText';
import { YIELD_RULE, recordStatus, summarizeYield } from './yieldSummary';

export interface MarkdownOptions {
  title?: string;
  /** Lines under the title (where the log is, when the report was made). */
  meta?: string[];
  /** Notes per record id (capture missing or changed). */
  recordNotes?: Record<string, string[]>;
}

export function renderReportMarkdown(records: readonly BenchRecord[], options: MarkdownOptions = {}): string {
  const summary = summarizeYield(records);
  const out: string[] = [`# ${m(options.title ?? 'Bench report')}`, ''];
  for (const line of options.meta ?? []) out.push(`${m(line)}  `);
  out.push('', '## Summary', '');
  if (summary.units.length) {
    out.push('| Unit | Measurements | Latest | Design | Status |', '| --- | ---: | --- | --- | --- |');
    for (const unit of summary.units) {
      const latest = unit.records[unit.records.length - 1];
      out.push(`| ${m(unit.unit)} | ${unit.records.length} | ${m(showTime(latest.time))} | ${unit.design === null ? '–' : m(unit.design)} | ${unit.status} |`);
    }
    const yieldText = summary.yieldPercent === null ? '–' : `${summary.yieldPercent.toFixed(1)} %`;
    out.push('', `**Yield ${yieldText}**: ${summary.pass} pass, ${summary.fail} fail, ${summary.notChecked} not checked. ${m(YIELD_RULE)}`);
  } else {
    out.push('No measurements are logged yet.');
  }
  if (records.some((r) => r.cautions.fired.length)) {
    out.push('', '## Cautions', '', `Standing advice (${m(STANDING_ADVICE_SOURCE)}):`, '');
    for (const advice of STANDING_ADVICE) out.push(`- ${m(advice)}`);
  }
  out.push('', `*${m(DEFERRAL)}*`);
  for (const unit of summary.units) {
    out.push('', `## ${m(unit.unit)}: ${unit.status}`);
    for (const record of unit.records) out.push('', ...measurement(record, options.recordNotes?.[record.id] ?? []));
  }
  out.push('');
  return out.join('\n');
}

function measurement(record: BenchRecord, notes: string[]): string[] {
  const fit = record.fit;
  const lines = [`### ${m(fit.file)} (${m(fit.channel)}), ${m(showTime(record.time))}: ${recordStatus(record)}`, ''];
  const byline = [record.operator && `operator ${record.operator}`, record.station && `station ${record.station}`, record.note].filter((x): x is string => Boolean(x));
  if (byline.length) lines.push(m(byline.join(' · ')), '');
  for (const note of notes) lines.push(`> ${m(note)}`, '');
  lines.push(`Fit: ${m(fitStateText(fit))}.`, '');
  const order = modelOrderText(fit);
  if (order) lines.push(`Order: ${m(order)}.`, '');
  lines.push('| Quantity | Value |', '| --- | --- |');
  for (const row of fitResultRows(fit)) lines.push(`| ${m(row.symbol)} | ${m(row.text)} |`);
  const transitions = fitTransitionRows(fit);
  const note = transitionNote(fit);
  if (note !== null) lines.push('', `Transitions, ${m(note)}.`);
  if (transitions.length) {
    lines.push('', '| Quantity | Model (fit) | Measured (samples) |', '| --- | --- | --- |');
    for (const row of transitions) lines.push(`| ${m(row.symbol)} | ${m(row.modelText)} | ${m(row.measuredText)} |`);
  }
  for (const warning of fit.transitions?.warnings ?? []) lines.push('', `Warning (transitions): ${m(warning)}`);
  // How the capture file was read, when the record keeps it (records logged before it was kept have none).
  if (fit.import) {
    lines.push('', 'How the file was read:', '');
    for (const row of importRows(fit.import)) lines.push(`- ${m(row.label)}: ${m(row.text)}`);
  }
  if (record.verdict) {
    lines.push('', `Verdict against ${m(record.design?.name ?? 'design')}: ${m(decisionText(record.verdict))}.`, '');
    const rule = ruleText(record.verdict);
    if (rule) lines.push(m(rule), '');
    lines.push('| Quantity | Design | Measured | Limits | U | Margin | Zone |', '| --- | --- | --- | --- | --- | ---: | --- |');
    for (const q of record.verdict.quantities) {
      lines.push(
        `| ${m(q.name)} | ${m(formatMeasured(q.design))} | ${m(formatMeasured(q.measured))} | ${m(limitsText(q))} | ${m(expandedUncertaintyText(q))} | ${m(marginText(q))} | ${m(zoneText(q))} |`,
      );
    }
    const cause = record.verdict.likelyCause;
    if (cause) {
      lines.push('', `Likely cause: ${cause.component} about ${(Math.abs(cause.change) * 100).toFixed(1)} % ${cause.change >= 0 ? 'high' : 'low'} (${m(formatEngineering(cause.impliedValue.value, cause.impliedValue.unit))}).`);
    }
  }
  lines.push(...setupChecksMarkdown(record.setupChecks));
  for (const warning of fit.warnings) lines.push('', `Warning: ${m(warning)}`);
  if (record.cautions.peakNotWeighed) lines.push('', `Not weighed for the cautions: ${m(record.cautions.peakNotWeighed)}.`);
  for (const c of record.cautions.fired) {
    lines.push('', `**Caution**, ${m(c.checks)} ${m(formatEngineering(c.measured.value, c.measured.unit))}: ${m(c.message)} (${m(c.source)}, ${c.certainty})`);
  }
  lines.push('', `Reproduce: ${markdownCode(reproduceCommand(record))} (capture sha256 ${m(record.capture.sha256)}, ${m(record.software.name)} ${m(record.software.version)}, record ${m(record.id)})`);
  return lines;
}
