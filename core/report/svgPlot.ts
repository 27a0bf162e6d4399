// The overlay plot of a report as inline SVG: measured envelope, fitted curve, design prediction and band.
// Plain axes with engineering-notation ticks; measured data as a wide neutral-grey trace under the
// curves (visible around them), the fit in Okabe-Ito blue (solid) and the prediction in Okabe-Ito
// vermillion (dashed), which also differ in greyscale.

import type { ColumnEnvelope } from './decimate';
import { escapeHtml } from './escape';
import { axisTitle, scaleAxis, type AxisScale } from './plotScale';

export interface PlotCurve {
  x: ArrayLike<number>;
  y: ArrayLike<number>;
}

export interface PlotBand {
  x: ArrayLike<number>;
  lower: ArrayLike<number>;
  upper: ArrayLike<number>;
}

export interface OverlayPlotInput {
  /** Unique within the document (letters, digits, '-'): names the plot's clip path. */
  id: string;
  /** Accessible name of the figure. */
  title: string;
  /** Plot size in CSS pixels. */
  width: number;
  height: number;
  xRange: [number, number];
  yUnit: string;
  yLabel: string;
  measured?: ColumnEnvelope;
  fit?: PlotCurve;
  prediction?: PlotCurve;
  band?: PlotBand;
}

export const PLOT_COLORS = { measured: '#8a8a8a', fit: '#0072B2', prediction: '#D55E00', axis: '#3a3a3a' } as const;

/** Margins around the plotting area, px. */
const MARGIN = { left: 62, right: 14, top: 30, bottom: 40 };

/** Columns of the plotting area for a plot `width` px wide: one envelope column per pixel. */
export function plotColumns(width: number): number {
  return Math.max(1, Math.round(width - MARGIN.left - MARGIN.right));
}

export function renderOverlayPlot(input: OverlayPlotInput): string {
  const { width, height } = input;
  const area = { x0: MARGIN.left, x1: width - MARGIN.right, y0: MARGIN.top, y1: height - MARGIN.bottom };
  const [xMin, xMax] = input.xRange;
  const [yMin, yMax] = yRangeOf(input);
  const sx = (x: number) => area.x0 + ((x - xMin) / (xMax - xMin)) * (area.x1 - area.x0);
  const sy = (y: number) => area.y1 - ((y - yMin) / (yMax - yMin)) * (area.y1 - area.y0);
  const xScale = scaleAxis(xMin, xMax, 's', 8, true);
  const yScale = scaleAxis(yMin, yMax, input.yUnit, 5, true);

  const clip = `plot-area-${input.id.replace(/[^A-Za-z0-9-]/g, '-')}`;
  const parts: string[] = [];
  parts.push(
    `<svg xmlns="http://www.w3.org/2000/svg" class="overlay-plot" role="img" aria-label="${escapeHtml(input.title)}" ` +
      `width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="inherit" font-size="11">`,
  );
  parts.push(`<title>${escapeHtml(input.title)}</title>`);
  parts.push(`<defs><clipPath id="${clip}"><rect x="${area.x0}" y="${area.y0}" width="${area.x1 - area.x0}" height="${area.y1 - area.y0}"/></clipPath></defs>`);
  parts.push(`<g clip-path="url(#${clip})">`);
  if (input.band) parts.push(bandPath(input.band, sx, sy));
  if (input.measured) parts.push(envelopePath(input.measured, sx, sy));
  if (input.prediction) parts.push(curvePath(input.prediction, sx, sy, 'prediction', PLOT_COLORS.prediction, '7 4'));
  if (input.fit) parts.push(curvePath(input.fit, sx, sy, 'fit', PLOT_COLORS.fit, null));
  parts.push('</g>');
  parts.push(axes(area, xScale, yScale, sx, sy, input.yLabel));
  parts.push(legend(input, area));
  parts.push('</svg>');
  return parts.join('');
}

function yRangeOf(input: OverlayPlotInput): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  const take = (values: ArrayLike<number>, xs: ArrayLike<number>) => {
    for (let i = 0; i < values.length; i++) {
      const v = values[i];
      if (!Number.isFinite(v) || xs[i] < input.xRange[0] || xs[i] > input.xRange[1]) continue;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  };
  if (input.measured) {
    take(input.measured.min, input.measured.x);
    take(input.measured.max, input.measured.x);
  }
  if (input.fit) take(input.fit.y, input.fit.x);
  if (input.prediction) take(input.prediction.y, input.prediction.x);
  if (input.band) {
    take(input.band.lower, input.band.x);
    take(input.band.upper, input.band.x);
  }
  if (!(lo <= hi)) return [-1, 1];
  if (lo === hi) return [lo - 1, hi + 1];
  const pad = (hi - lo) * 0.06;
  return [lo - pad, hi + pad];
}

function point(x: number, y: number): string {
  return `${x.toFixed(1)},${y.toFixed(1)}`;
}

function envelopePath(env: ColumnEnvelope, sx: (x: number) => number, sy: (y: number) => number): string {
  const points: string[] = [];
  for (let i = 0; i < env.x.length; i++) {
    const x = sx(env.x[i]);
    // Alternate the order so that each column is joined to the next at the nearer end.
    const [first, second] = i % 2 === 0 ? [env.min[i], env.max[i]] : [env.max[i], env.min[i]];
    points.push(point(x, sy(first)), point(x, sy(second)));
  }
  if (!points.length) return '';
  return `<polyline class="measured" points="${points.join(' ')}" fill="none" stroke="${PLOT_COLORS.measured}" stroke-width="2.4" stroke-linejoin="round"/>`;
}

function curvePath(
  curve: PlotCurve,
  sx: (x: number) => number,
  sy: (y: number) => number,
  name: string,
  color: string,
  dash: string | null,
): string {
  const points: string[] = [];
  for (let i = 0; i < curve.x.length; i++) if (Number.isFinite(curve.y[i])) points.push(point(sx(curve.x[i]), sy(curve.y[i])));
  if (!points.length) return '';
  const dashAttribute = dash ? ` stroke-dasharray="${dash}"` : '';
  return `<polyline class="${name}" points="${points.join(' ')}" fill="none" stroke="${color}" stroke-width="1.8"${dashAttribute} stroke-linejoin="round"/>`;
}

function bandPath(band: PlotBand, sx: (x: number) => number, sy: (y: number) => number): string {
  const upper: string[] = [];
  const lower: string[] = [];
  for (let i = 0; i < band.x.length; i++) {
    if (!Number.isFinite(band.lower[i]) || !Number.isFinite(band.upper[i])) continue;
    upper.push(point(sx(band.x[i]), sy(band.upper[i])));
    lower.unshift(point(sx(band.x[i]), sy(band.lower[i])));
  }
  if (!upper.length) return '';
  return `<polygon class="band" points="${[...upper, ...lower].join(' ')}" fill="${PLOT_COLORS.prediction}" fill-opacity="0.14" stroke="none"/>`;
}

function axes(
  area: { x0: number; x1: number; y0: number; y1: number },
  xScale: AxisScale,
  yScale: AxisScale,
  sx: (x: number) => number,
  sy: (y: number) => number,
  yLabel: string,
): string {
  const c = PLOT_COLORS.axis;
  let svg = `<g class="axes" stroke="${c}" stroke-width="1" fill="none">`;
  svg += `<path d="M${area.x0},${area.y0} V${area.y1} H${area.x1}"/>`;
  for (const t of xScale.ticks) svg += `<path d="M${sx(t).toFixed(1)},${area.y1} v5"/>`;
  for (const t of yScale.ticks) svg += `<path d="M${area.x0},${sy(t).toFixed(1)} h-5"/>`;
  svg += '</g>';
  svg += `<g class="tick-labels" fill="${c}">`;
  xScale.ticks.forEach((t, i) => {
    svg += `<text x="${sx(t).toFixed(1)}" y="${area.y1 + 18}" text-anchor="middle">${escapeHtml(xScale.labels[i])}</text>`;
  });
  yScale.ticks.forEach((t, i) => {
    svg += `<text x="${area.x0 - 8}" y="${(sy(t) + 4).toFixed(1)}" text-anchor="end">${escapeHtml(yScale.labels[i])}</text>`;
  });
  svg += '</g>';
  const midY = (area.y0 + area.y1) / 2;
  svg += `<text class="axis-title" x="${(area.x0 + area.x1) / 2}" y="${area.y1 + 34}" text-anchor="middle" fill="${c}">${escapeHtml(axisTitle('time', xScale))}</text>`;
  const yTitle = axisTitle(yLabel, yScale);
  svg += `<text class="axis-title" transform="translate(14,${midY}) rotate(-90)" text-anchor="middle" fill="${c}">${escapeHtml(yTitle)}</text>`;
  return svg;
}

function legend(input: OverlayPlotInput, area: { x0: number; x1: number; y0: number }): string {
  const entries: { label: string; swatch: string }[] = [];
  const line = (color: string, width: number, dash: string | null) =>
    `<path d="M0,0 h22" stroke="${color}" stroke-width="${width}" fill="none"${dash ? ` stroke-dasharray="${dash}"` : ''}/>`;
  if (input.measured) entries.push({ label: 'measured', swatch: line(PLOT_COLORS.measured, 2.4, null) });
  if (input.fit) entries.push({ label: 'fit', swatch: line(PLOT_COLORS.fit, 1.8, null) });
  if (input.prediction) entries.push({ label: 'design prediction', swatch: line(PLOT_COLORS.prediction, 1.8, '7 4') });
  if (input.band) {
    entries.push({
      label: 'tolerance band',
      swatch: `<rect x="0" y="-5" width="22" height="10" fill="${PLOT_COLORS.prediction}" fill-opacity="0.14"/>`,
    });
  }
  let x = area.x0;
  let svg = `<g class="legend" fill="${PLOT_COLORS.axis}">`;
  for (const entry of entries) {
    svg += `<g transform="translate(${x},${area.y0 - 14})">${entry.swatch}<text x="28" y="4">${escapeHtml(entry.label)}</text></g>`;
    x += 52 + entry.label.length * 6.2;
  }
  return `${svg}</g>`;
}

