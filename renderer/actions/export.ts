// Saving what the window shows: the bench log as a report, the plot as PNG or SVG.

import type { ReportFormat } from '../bridgeTypes';
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
  const url = await runStep(ctx, `exporting the plot as ${format.toUpperCase()}`, () => ctx.plot.exportImage(format));
  if (!url) return;
  const comma = url.indexOf(',');
  const content = format === 'png' ? url.slice(comma + 1) : decodeURIComponent(url.slice(comma + 1));
  await runStep(ctx, 'saving the plot', () =>
    ctx.bridge.saveFile({ suggestedName: `${base}-fit.${format}`, content, encoding: format === 'png' ? 'base64' : 'utf8' }, format === 'png' ? 'image/png' : 'image/svg+xml'),
  );
}
