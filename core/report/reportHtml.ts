// The bench report as one self-contained, printable HTML file: summary and yield, then every unit.
// No scripts, no network: inline CSS and inline SVG only. Every string from a record is escaped here.

import { formatEngineering, formatMeasured, formatTimeRange } from '../units/format';
import { DEFERRAL, STANDING_ADVICE, STANDING_ADVICE_SOURCE } from '../safety/standingAdvice';
import type { BenchRecord } from './benchRecord';
import type { FitSummary } from './fitSummary';
import type { Verdict } from '../circuit/verdict';
import { escapeHtml as e } from './escape';
import { ZONE_WORDS, decisionText, expandedUncertaintyText, isCounted, limitsText, quantityZoneOf, ruleText } from './verdictText';
import { importRows } from './importText';
import { renderMeasurementPlot, type ReportTrace } from './overlay';
import { briefValue, fitResultRows, fitTransitionRows, marginText, modelOrderText, regimeTag, showTime, transitionNote } from './resultRows';
import { reproduceCommand } from './reproduce';
import { setupChecksHtml } from './setupChecksText';
import { REPORT_CSS } from './reportStyle';
import { YIELD_RULE, recordStatus, summarizeYield, type UnitStatus, type UnitSummary, type YieldSummary } from './yieldSummary';

export interface ReportOptions {
  /** Heading of the report. Default 'Bench report'. */
  title?: string;
  /** Where the records came from, as shown to the reader. */
  logPath: string;
  /** ISO time the report was made. */
  generatedAt: string;
  software: { name: string; version: string };
  /** Reloaded capture samples by record id; a record without one is reported without its plot. */
  traces?: Record<string, ReportTrace>;
  /** Notes per record id (capture missing, capture changed since it was logged). */
  recordNotes?: Record<string, string[]>;
  /** Notes about the log as a whole (a cut-off last line). */
  logNotes?: string[];
}

/**
 * What the report may load, stated in the file itself so it holds wherever the file is opened: nothing but its
 * inline styles (and data: images); no script at all, no base URL to rewrite its links, no form to send.
 */
export const REPORT_CSP = "default-src 'none'; style-src 'unsafe-inline'; img-src data:; base-uri 'none'; form-action 'none'";

export function renderReportHtml(records: readonly BenchRecord[], options: ReportOptions): string {
  const summary = summarizeYield(records);
  const title = options.title ?? 'Bench report';
  const body = [
    header(title, records, summary, options),
    ...(options.logNotes ?? []).map((note) => `<p class="notice">${e(note)}</p>`),
    summarySection(summary),
    safetySection(records),
    ...summary.units.map((unit, u) => unitSection(unit, u, options)),
    `<footer><p class="fineprint">${e(DEFERRAL)}</p><p class="fineprint">Made by ${e(options.software.name)} ${e(options.software.version)} on ${e(showTime(options.generatedAt))} from <code>${e(options.logPath)}</code>.</p></footer>`,
  ];
  return htmlPage(title, REPORT_CSS, body, options.software);
}

/** A self-contained page: no script may run (the policy), styles inline, the software named. */
export function htmlPage(title: string, css: string, body: readonly string[], software: { name: string; version: string }): string {
  return [
    '<!DOCTYPE html>',
    '<html lang="en">',
    '<head>',
    '<meta charset="utf-8">',
    `<meta http-equiv="Content-Security-Policy" content="${REPORT_CSP}">`,
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<meta name="generator" content="${e(software.name)} ${e(software.version)}">`,
    `<title>${e(title)}</title>`,
    `<style>${css}</style>`,
    '</head>',
    '<body>',
    '<main>',
    ...body,
    '</main>',
    '</body>',
    '</html>',
    '',
  ].join('\n');
}

function header(title: string, records: readonly BenchRecord[], summary: YieldSummary, options: ReportOptions): string {
  const counts = `${records.length} measurement${records.length === 1 ? '' : 's'} of ${summary.units.length} unit${summary.units.length === 1 ? '' : 's'}`;
  return (
    `<header><h1>${e(title)}</h1>` +
    `<p class="meta">${counts} · log <code>${e(options.logPath)}</code> · made ${e(showTime(options.generatedAt))} · ${e(options.software.name)} ${e(options.software.version)}</p></header>`
  );
}

function summarySection(summary: YieldSummary): string {
  const tile = (value: string, label: string) => `<div class="tile"><div class="value">${value}</div><div class="label">${label}</div></div>`;
  const yieldText = summary.yieldPercent === null ? '–' : `${summary.yieldPercent.toFixed(1)} %`;
  const rows = summary.units
    .map((unit, u) => {
      const latest = unit.records[unit.records.length - 1];
      return (
        `<tr><td><a href="#unit-${u + 1}">${e(unit.unit)}</a></td><td class="num">${unit.records.length}</td>` +
        `<td class="num">${e(showTime(latest.time))}</td><td>${unit.design === null ? '–' : e(unit.design)}</td>` +
        `<td class="num">${e(briefValue(latest.fit, 'f0'))}</td><td>${badge(unit.status)}</td></tr>`
      );
    })
    .join('');
  const table = summary.units.length
    ? `<table class="yield-table"><thead><tr><th>Unit</th><th>Measurements</th><th>Latest</th><th>Design</th><th>f0 (latest)</th><th>Status</th></tr></thead>` +
      `<tbody>${rows}</tbody><tfoot><tr><td colspan="5">${summary.pass} pass · ${summary.fail} fail · ${summary.notChecked} not checked</td><td>${yieldText}</td></tr></tfoot></table>`
    : '<p>No measurements are logged yet.</p>';
  return (
    `<section class="summary" id="summary"><h2>Summary</h2>` +
    `<div class="tiles">${tile(yieldText, 'yield')}${tile(String(summary.pass), 'pass')}${tile(String(summary.fail), 'fail')}${tile(String(summary.notChecked), 'not checked')}</div>` +
    `${table}<p class="rule">${e(YIELD_RULE)}</p></section>`
  );
}

function safetySection(records: readonly BenchRecord[]): string {
  const flagged = records.filter((r) => r.cautions.fired.length > 0);
  let html = '<section class="safety" id="safety"><h2>Cautions</h2>';
  if (flagged.length) {
    html += `<p>${flagged.length} measurement${flagged.length === 1 ? '' : 's'} reached a caution threshold: ${[...new Set(flagged.map((r) => r.unit))].map(e).join(', ')}. Details are with each measurement.</p>`;
    html += `<h4>Standing advice (${e(STANDING_ADVICE_SOURCE)})</h4><ul>${STANDING_ADVICE.map((a) => `<li>${e(a)}</li>`).join('')}</ul>`;
  } else {
    html += '<p>No measurement reached a caution threshold.</p>';
  }
  return `${html}<p class="deferral">${e(DEFERRAL)}</p></section>`;
}

function unitSection(unit: UnitSummary, u: number, options: ReportOptions): string {
  const measurements = unit.records.map((record, m) => measurement(record, `u${u + 1}-m${m + 1}`, options)).join('');
  return `<section class="unit" id="unit-${u + 1}"><h2>${e(unit.unit)} ${badge(unit.status)}</h2>${measurements}</section>`;
}

function measurement(record: BenchRecord, id: string, options: ReportOptions): string {
  const fit = record.fit;
  const notes = [...(options.recordNotes?.[record.id] ?? [])];
  const trace = options.traces?.[record.id];
  let figure = '';
  if (trace) {
    const plot = renderMeasurementPlot(record, trace, id);
    figure = `<figure>${plot.svg}${plot.notes.length ? `<figcaption>${plot.notes.map(e).join(' ')}</figcaption>` : ''}</figure>`;
  }
  const byline = [record.operator && `operator ${record.operator}`, record.station && `station ${record.station}`, record.note].filter((x): x is string => Boolean(x));
  let html = `<article class="measurement" id="${e(id)}">`;
  html += `<div class="measurement-head"><h3>${e(fit.file)} <span class="byline">(${e(fit.channel)})</span></h3><span>${e(showTime(record.time))} ${badge(recordStatus(record))}</span></div>`;
  if (byline.length) html += `<p class="byline">${byline.map(e).join(' · ')}</p>`;
  for (const note of notes) html += `<p class="notice">${e(note)}</p>`;
  if (fit.status !== 'converged') html += `<p class="notice">Fit status ${e(fit.status)}: ${e(fit.message)}</p>`;
  html += figure;
  html += `<div class="block"><h4>Fit: ${e(regimeTag(fit) ?? fit.status)}</h4>${resultsTable(record)}</div>`;
  html += transitionsBlock(fit);
  html += importBlock(fit);
  html += `<div class="block">${record.verdict ? verdictBlock(record.verdict, record.design?.name ?? 'design', fit.finalValue.unit) : '<h4>Verdict</h4><p class="fineprint">Not checked against a design.</p>'}</div>`;
  if (fit.warnings.length) html += `<div class="block"><h4>Warnings</h4><ul>${fit.warnings.map((w) => `<li class="warning">${e(w)}</li>`).join('')}</ul></div>`;
  html += setupChecksHtml(record.setupChecks);
  html += cautionsBlock(record);
  html += reproduceBlock(record);
  return `${html}</article>`;
}

/** How the capture file was read, when the record keeps it (records logged before it was kept have none). */
function importBlock(fit: FitSummary): string {
  if (!fit.import) return '';
  const rows = importRows(fit.import).map((row) => `<tr><th scope="row">${e(row.label)}</th><td>${e(row.text)}</td></tr>`);
  return `<div class="block"><h4>How the file was read</h4><table class="import"><tbody>${rows.join('')}</tbody></table></div>`;
}

function resultsTable(record: BenchRecord): string {
  const fit = record.fit;
  const cells = fitResultRows(fit).map((row) => [row.symbol, row.text]);
  cells.push(['residual rms', `${formatEngineering(fit.rmsResidual, fit.finalValue.unit)} (noise ${formatEngineering(fit.noiseRms, fit.finalValue.unit)})`]);
  // Two label/value pairs per row, read down the left pair first.
  const half = Math.ceil(cells.length / 2);
  let rows = '';
  for (let i = 0; i < half; i++) {
    const right = cells[i + half];
    rows += `<tr><th scope="row">${e(cells[i][0])}</th><td class="num">${e(cells[i][1])}</td>`;
    rows += right ? `<th scope="row">${e(right[0])}</th><td class="num">${e(right[1])}</td></tr>` : '<td></td><td></td></tr>';
  }
  const order = modelOrderText(fit);
  const orderLine = order ? `<p class="fineprint">Order: ${e(order)}.</p>` : '';
  const components = fit.components ? `<p class="fineprint">R, L, C: ${e(fit.components.topology)}, known ${e(fit.components.known)}.</p>` : '';
  return `<table class="results"><tbody>${rows}</tbody></table>${orderLine}${components}`;
}

function transitionsBlock(fit: FitSummary): string {
  const note = transitionNote(fit);
  if (note === null) return '';
  const rows = fitTransitionRows(fit)
    .map((row) => `<tr><th scope="row">${e(row.symbol)}</th><td class="num">${e(row.modelText)}</td><td class="num">${e(row.measuredText)}</td></tr>`)
    .join('');
  let html = '<div class="block"><h4>Transitions</h4>';
  if (rows) html += `<table class="transitions"><thead><tr><th>Quantity</th><th>Model (fit)</th><th>Measured (samples)</th></tr></thead><tbody>${rows}</tbody></table>`;
  html += `<p class="fineprint">${e(sentence(note))}</p>`;
  const warnings = fit.transitions?.warnings ?? [];
  if (warnings.length) html += `<ul class="fineprint">${warnings.map((w) => `<li>${e(w)}</li>`).join('')}</ul>`;
  return `${html}</div>`;
}

/** 'State levels: ...' from 'state levels: ...'. */
function sentence(text: string): string {
  return `${text.charAt(0).toUpperCase()}${text.slice(1)}.`;
}

/** A number kept on one line with its unit (a no-break space after the digits), while ' ± ' and ' to ' may still wrap. */
function unitsKept(text: string): string {
  return text.replace(/(\d) (?!± |to )/g, '$1\u00a0');
}

function verdictBlock(verdict: Verdict, designName: string, unit: string): string {
  const rows = verdict.quantities
    .map(
      (q) =>
        // Value cells may wrap (at ' ± ', ' to ') so that seven columns fit the page; the zone's badge stays whole.
        `<tr><td>${e(q.name)}</td><td>${e(unitsKept(formatMeasured(q.design)))}</td><td>${e(unitsKept(formatMeasured(q.measured)))}</td>` +
        `<td>${e(unitsKept(limitsText(q)))}</td><td>${e(unitsKept(expandedUncertaintyText(q)))}</td><td class="num">${e(marginText(q))}</td>` +
        `<td>${badge(!isCounted(q) ? 'not checked' : q.inTolerance ? 'pass' : 'fail', ZONE_WORDS[quantityZoneOf(q)])}${isCounted(q) ? '' : ' <span class="fineprint">not counted</span>'}</td></tr>`,
    )
    .join('');
  let html = `<h4>Verdict against ${e(designName)}: ${e(decisionText(verdict))}</h4>`;
  html += `<table class="verdict"><thead><tr><th>Quantity</th><th>Design</th><th>Measured</th><th>Limits</th><th>U</th><th>Margin</th><th>Zone</th></tr></thead><tbody>${rows}</tbody></table>`;
  const rule = ruleText(verdict);
  if (rule) html += `<p class="fineprint">${e(rule)}</p>`;
  if (verdict.rmsDifference !== null) {
    html += `<p class="fineprint">RMS difference from the prediction over the fit window: ${e(formatEngineering(verdict.rmsDifference, unit))}.</p>`;
  }
  if (verdict.likelyCause) {
    const c = verdict.likelyCause;
    const direction = c.change >= 0 ? 'high' : 'low';
    html += `<p>Likely cause: ${e(c.component)} about ${e((Math.abs(c.change) * 100).toFixed(1))} % ${direction} (${e(formatEngineering(c.impliedValue.value, c.impliedValue.unit))}), explaining ${e((c.explains * 100).toFixed(0))} % of the deviation.</p>`;
  }
  if (verdict.notes.length) html += `<ul class="fineprint">${verdict.notes.map((n) => `<li>${e(n)}</li>`).join('')}</ul>`;
  return html;
}

function cautionsBlock(record: BenchRecord): string {
  const { fired, energies, charge, discharge, peakNotWeighed } = record.cautions;
  const stored = [
    energies.capacitor && `capacitor ${formatEngineering(energies.capacitor.value, 'J')}`,
    energies.inductor && `inductor ${formatEngineering(energies.inductor.value, 'J')}`,
    charge && `charge ${formatEngineering(charge.value, 'C')}`,
    discharge && `bleeder to ${formatEngineering(discharge.toVoltage, 'V')} in ${formatEngineering(discharge.time.value, 's')}`,
  ].filter((x): x is string => Boolean(x));
  if (!fired.length && !stored.length && !peakNotWeighed) return '';
  let html = '<div class="block"><h4>Cautions</h4>';
  if (peakNotWeighed) html += `<p class="fineprint">Not weighed: ${e(peakNotWeighed)}.</p>`;
  // One box per measure (a 400 V node crosses several voltage thresholds at once).
  for (const checks of [...new Set(fired.map((c) => c.checks))]) {
    const group = fired.filter((c) => c.checks === checks);
    const measured = group[0].measured;
    html += `<div class="caution"><strong>${e(checks)} ${e(formatEngineering(measured.value, measured.unit))}</strong><ul>`;
    for (const c of group) {
      html += `<li><span class="threshold">${e(formatEngineering(c.threshold.value, c.threshold.unit))}</span><span>${e(c.message)}<span class="source">${e(c.source)} [${e(c.certainty)}]</span></span></li>`;
    }
    html += '</ul></div>';
  }
  if (stored.length) html += `<p class="fineprint">Stored: ${stored.map(e).join(', ')}.</p>`;
  return `${html}</div>`;
}

function reproduceBlock(record: BenchRecord): string {
  const c = record.capture;
  const design = record.design
    ? `<br>Design <code>${e(record.design.path)}</code> (“${e(record.design.name)}”, sha256 <code>${e(record.design.sha256)}</code>).`
    : '';
  return (
    `<div class="reproduce">Reproduce: <code>${e(reproduceCommand(record))}</code><br>` +
    `Capture sha256 <code>${e(c.sha256)}</code>, ${e(String(c.bytes))} bytes, channel ${e(c.channel)}; ` +
    `fit window ${e(formatTimeRange(record.fit.window.start, record.fit.window.end))}, ${e(String(record.fit.samplesUsed))} samples.` +
    `${design}<br>Logged by ${e(record.software.name)} ${e(record.software.version)}, record <code>${e(record.id)}</code>.</div>`
  );
}

function badge(status: UnitStatus, text?: string): string {
  const mark = status === 'pass' ? '✓' : status === 'fail' ? '✗' : '–';
  const cls = status === 'not checked' ? 'not-checked' : status;
  return `<span class="badge ${cls}">${mark} ${e(text ?? status)}</span>`;
}
