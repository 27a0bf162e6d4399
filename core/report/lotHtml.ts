// The lot report as one self-contained HTML file: yields, per-quantity capability with histograms,
// failures by likely cause and the units to look at. No scripts: inline CSS and SVG, every record string escaped.

import { DEFERRAL } from '../safety/standingAdvice';
import { CAPABILITY_RULE, type CapabilityIndex } from './capability';
import { escapeHtml as e } from './escape';
import { renderLotHistogram } from './lotHistogramSvg';
import { DECISION_ZONES, type DecisionZone } from '../circuit/decisionRule';
import { LOT_YIELD_RULE, NO_CAUSE, type LotGroup, type LotSummary } from './lotSummary';
import { NOT_COUNTED_MARK, NOT_COUNTED_NOTE, ZONE_LABELS, decisionRuleText, indexValueText, intervalText, lotCounts, rowScale, scaledText, spreadText, yieldText } from './lotText';
import { REPORT_CSS } from './reportStyle';
import { htmlPage } from './reportHtml';
import { showTime } from './resultRows';

export interface LotReportOptions {
  /** Heading. Default 'Lot report'. */
  title?: string;
  /** The logs the records came from, as shown to the reader. */
  logPaths: readonly string[];
  /** ISO time the report was made. */
  generatedAt: string;
  software: { name: string; version: string };
  /** Notes about the logs (duplicate records, a cut-off last line). */
  logNotes?: readonly string[];
}

/** Styles of the lot report beyond the bench report's sheet: zone badges, the histogram grid. */
const LOT_CSS = `
.badge.conditional-pass { color: #6b5300; background: #fbf3d5; }
.badge.conditional-fail { color: #8a2d00; background: #fde3cc; }
.histograms { display: grid; grid-template-columns: repeat(auto-fill, minmax(440px, 1fr)); gap: 8px 16px; }
.histograms figure { margin: 6px 0; }
table.capability { font-size: 12.5px; }
table.capability td, table.capability th { padding-right: 6px; }
table.capability thead th { vertical-align: bottom; font-size: 11px; letter-spacing: 0; }
table.capability td.undefined { color: var(--muted); font-style: italic; white-space: normal; }
.legend-line { display: inline-block; width: 22px; height: 0; vertical-align: middle; margin: 0 4px 0 10px; border-top: 2px solid; }
`;

export function renderLotHtml(summary: LotSummary, options: LotReportOptions): string {
  const title = options.title ?? 'Lot report';
  const logs = options.logPaths.map((p) => `<code>${e(p)}</code>`).join(', ');
  const body = [
    `<header><h1>${e(title)}</h1><p class="meta">${e(lotCounts(summary))} · log${options.logPaths.length === 1 ? '' : 's'} ${logs} · made ${e(showTime(options.generatedAt))} · ${e(options.software.name)} ${e(options.software.version)}</p></header>`,
    ...[...(options.logNotes ?? []), ...summary.notes].map((note) => `<p class="notice">${e(note)}</p>`),
    yieldSection(summary),
    ...summary.groups.map((group, g) => groupSection(group, g, summary.groups.length)),
    causeSection(summary),
    flaggedSection(summary),
    `<footer><p class="fineprint">${e(DEFERRAL)}</p><p class="fineprint">Made by ${e(options.software.name)} ${e(options.software.version)} on ${e(showTime(options.generatedAt))} from ${logs}.</p></footer>`,
  ];
  return htmlPage(title, `${REPORT_CSS}${LOT_CSS}`, body, options.software);
}

function zoneBadge(zone: DecisionZone): string {
  return `<span class="badge ${zone}">${e(ZONE_LABELS[zone])}</span>`;
}

function yieldSection(summary: LotSummary): string {
  const tile = (value: string, label: string) => `<div class="tile"><div class="value">${e(value)}</div><div class="label">${e(label)}</div></div>`;
  const percent = (p: number | null) => (p === null ? '–' : `${p.toFixed(1)} %`);
  const zoneTiles = DECISION_ZONES.map((zone) => tile(String(summary.zones[zone]), ZONE_LABELS[zone])).join('');
  return (
    '<section class="summary" id="yield"><h2>Yield</h2>' +
    `<div class="tiles">${tile(percent(summary.firstPass.percent), 'first-pass yield')}${tile(percent(summary.final.percent), 'final yield')}` +
    `${tile(String(summary.checkedUnits), 'units checked')}${tile(String(summary.notCheckedUnits), 'not checked')}</div>` +
    `<div class="tiles">${zoneTiles}</div>` +
    `<p>First pass ${e(yieldText(summary.firstPass, summary.checkedUnits))}; final ${e(yieldText(summary.final, summary.checkedUnits))}.</p>` +
    `<p class="rule">${e(LOT_YIELD_RULE)}</p><p class="rule">${e(decisionRuleText(summary.rules))}</p></section>`
  );
}

function groupSection(group: LotGroup, g: number, groups: number): string {
  const heading = groups > 1 ? `Quantities against ${e(group.design)}` : 'Quantities';
  // The interval on a line of its own under the index keeps the table within the text column.
  const index = (q: CapabilityIndex) => {
    const interval = intervalText(q);
    return `<td class="num${q.value === null ? ' undefined' : ''}">${e(indexValueText(q))}${interval === null ? '' : `<span class="interval">${e(interval)}</span>`}</td>`;
  };
  const rows = group.quantities
    .map((q) => {
      const s = q.stats;
      const scale = rowScale(q);
      const cell = (text: string) => `<td class="num">${e(text)}</td>`;
      return (
        `<tr><th scope="row">${e(q.name)}${q.counted ? '' : ` ${NOT_COUNTED_MARK}`}</th><td>${e(scale.unit || '–')}</td>${cell(String(s?.n ?? 0))}${cell(scaledText(s?.mean, scale))}` +
        `${cell(spreadText(s?.sd, scale))}${cell(scaledText(s?.min, scale))}${cell(scaledText(s?.max, scale))}` +
        `${cell(scaledText(q.limits?.lower, scale))}${cell(scaledText(q.limits?.upper, scale))}${cell(scaledText(q.design, scale))}` +
        index(q.capability.cp) +
        index(q.capability.cpk) +
        DECISION_ZONES.map((zone) => `<td class="num">${q.zones[zone]}</td>`).join('') +
        '</tr>'
      );
    })
    .join('');
  const zoneHeads = DECISION_ZONES.map((zone) => `<th>${e(ZONE_LABELS[zone])}</th>`).join('');
  const table =
    `<table class="capability"><thead><tr><th>Quantity</th><th>Unit</th><th>n</th><th>Mean</th><th>Std dev</th><th>Min</th><th>Max</th><th>LSL</th><th>USL</th><th>Design</th><th>Cp</th><th>Cpk</th>${zoneHeads}</tr></thead>` +
    `<tbody>${rows}</tbody></table>`;
  const figures = group.quantities
    .map((q) => renderLotHistogram(q, group.design))
    .filter(Boolean)
    .map((svg) => `<figure>${svg}</figure>`)
    .join('');
  const legend =
    '<p class="fineprint">Bars: units per bin (Sturges\' rule);' +
    '<span class="legend-line" style="border-color:#0072B2"></span>design value;' +
    '<span class="legend-line" style="border-color:#D55E00;border-top-style:dashed"></span>limits (LSL, USL) where the verdicts give them.</p>';
  return (
    `<section class="lot-group" id="quantities-${g + 1}"><h2>${heading}</h2><p class="meta">${group.units} unit${group.units === 1 ? '' : 's'} against ${e(group.design)}</p>` +
    `${table}${group.quantities.some((q) => !q.counted) ? `<p class="rule">${e(NOT_COUNTED_NOTE)}</p>` : ''}<p class="rule">${e(CAPABILITY_RULE)}</p>${legend}<div class="histograms">${figures}</div></section>`
  );
}

function causeSection(summary: LotSummary): string {
  let html = '<section id="causes"><h2>Failures by likely cause</h2>';
  if (!summary.causes.length) return `${html}<p>No unit fails at its latest measurement.</p></section>`;
  const rows = summary.causes
    .map((bin) => `<tr><th scope="row">${bin.cause === NO_CAUSE ? e(NO_CAUSE) : e(bin.cause)}</th><td class="num">${bin.units.length}</td><td>${bin.units.map(e).join(', ')}</td></tr>`)
    .join('');
  html += `<table class="causes"><thead><tr><th>Likely cause</th><th>Units</th><th>Which</th></tr></thead><tbody>${rows}</tbody></table>`;
  return `${html}<p class="rule">Units not accepted at their latest measurement, by the component (or the source) their verdict names as the likely cause.</p></section>`;
}

function flaggedSection(summary: LotSummary): string {
  let html = '<section id="flagged"><h2>Units to look at</h2>';
  if (!summary.flagged.length) return `${html}<p>Every unit checked passed at its first measurement.</p></section>`;
  const rows = summary.flagged
    .map((u) => {
      const outside = u.outside.map((q) => `${q.name} (${ZONE_LABELS[q.zone]})`).join(', ') || '–';
      return (
        `<tr><th scope="row">${e(u.unit)}</th><td>${zoneBadge(u.decision)}</td><td>${u.finalPass ? 'yes' : 'no'}</td><td>${u.firstPass ? 'yes' : 'no'}</td><td class="num">${u.measurements}</td>` +
        `<td>${e(outside)}</td><td>${e(u.likelyCause ?? '–')}</td></tr>`
      );
    })
    .join('');
  html += `<table class="flagged"><thead><tr><th>Unit</th><th>Latest decision</th><th>Accepted</th><th>First pass</th><th>Measurements</th><th>Quantities outside pass</th><th>Likely cause</th></tr></thead><tbody>${rows}</tbody></table>`;
  return `${html}<p class="rule">Units that failed or fell in a conditional zone at their latest measurement, or failed their first. Accepted: the latest decision under the rule (a conditional zone is accepted or not as the rule says).</p></section>`;
}
