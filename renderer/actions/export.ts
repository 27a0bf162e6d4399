// Saving and copying what the window shows: the bench log as a report, the plot as PNG or SVG (captioned, on the
// theme's background), the results as text or a CSV row (core/report's forms, as the command line prints them).

import { fitCsv } from '../../core/report/fitCsv';
import type { FitSummary } from '../../core/report/fitSummary';
import { formatFitText } from '../../core/report/fitText';
import { plotCaption } from '../../core/report/plotCaption';
import type { BenchState } from '../benchState';
import type { ReportFormat } from '../bridgeTypes';
import { captionedSvg, svgToPngBase64, svgToPngBlob } from '../plotImage';
import { themeColor } from '../theme';
import { runStep, type ActionContext } from './context';

export async function exportReport(ctx: ActionContext, format: ReportFormat): Promise<void> {
  const mime = { html: 'text/html', md: 'text/markdown', csv: 'text/csv' }[format];
  const report = await runStep(ctx, 'making the report', () => ctx.bridge.renderReport(format));
  if (!report) return;
  const saved = await runStep(ctx, 'saving the report', () => ctx.bridge.saveFile({ suggestedName: report.name, content: report.text, encoding: 'utf8' }, mime));
  ctx.store.update((s) => (s.logMessage = saved ? `Report saved to ${saved}.` : `Report ${report.name} made.`));
}

export async function exportPlot(ctx: ActionContext, format: 'png' | 'svg'): Promise<void> {
  const state = ctx.store.state;
  if (!state.trace) return;
  const base = (state.capture?.opened.name ?? 'capture').replace(/\.[^.]+$/, '');
  const svg = await runStep(ctx, `exporting the plot as ${format.toUpperCase()}`, () => plotSvg(ctx));
  if (!svg) return;
  const content = format === 'png' ? await runStep(ctx, 'drawing the PNG', () => svgToPngBase64(svg)) : svg;
  if (content === null) return;
  await runStep(ctx, 'saving the plot', () =>
    ctx.bridge.saveFile({ suggestedName: `${base}-fit.${format}`, content, encoding: format === 'png' ? 'base64' : 'utf8' }, format === 'png' ? 'image/png' : 'image/svg+xml'),
  );
}

/** The plot as a PNG on the clipboard, captioned as the exported one. */
export async function copyPlot(ctx: ActionContext): Promise<void> {
  if (!ctx.store.state.trace) return;
  const done = await runStep(ctx, 'copying the plot', async () => {
    const svg = await plotSvg(ctx);
    await navigator.clipboard.write([new ClipboardItem({ 'image/png': svgToPngBlob(svg) })]);
    return true;
  });
  if (done) ctx.store.update((s) => (s.copied = 'Plot copied as an image.'));
}

/** The results on the clipboard: the command line's text, or a CSV header and row in SI base units. */
export async function copyResults(ctx: ActionContext, form: 'text' | 'csv'): Promise<void> {
  const summary = shownSummary(ctx.store.state);
  if (!summary) return;
  const text = form === 'text' ? formatFitText(summary) : fitCsv(summary);
  const done = await runStep(ctx, 'copying the results', async () => {
    await navigator.clipboard.writeText(text);
    return true;
  });
  if (done) ctx.store.update((s) => (s.copied = form === 'text' ? 'Results copied as text.' : 'Results copied as a CSV header and row.'));
}

/** The fit on screen with the parts shown now (a known part typed after the fit derived them anew). */
function shownSummary(state: BenchState): FitSummary | null {
  return state.summary ? { ...state.summary, components: state.components ?? undefined } : null;
}

/** The plot drawn now, on the current theme's background, under its caption: file, channel, fit. */
async function plotSvg(ctx: ActionContext): Promise<string> {
  const { capture } = ctx.store.state;
  const url = await ctx.plot.exportImage('svg');
  const plot = decodeURIComponent(url.slice(url.indexOf(',') + 1));
  const channel = capture?.info.channels[capture.channel];
  const channelText = channel ? `${channel.name}${channel.unit ? ` (${channel.unit})` : ''}` : '';
  const caption = plotCaption(capture?.opened.name ?? 'capture', channelText, shownSummary(ctx.store.state));
  return captionedSvg(plot, caption, { background: themeColor('surface'), ink: themeColor('ink'), muted: themeColor('ink-muted'), font: themeColor('font-sans') });
}
