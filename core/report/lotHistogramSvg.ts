// A lot histogram as inline SVG: the units' values in bars, the limits as dashed vermillion lines and the
// design value as a solid blue line (Okabe-Ito colours, told apart in greyscale by the dash).

import { escapeHtml } from './escape';
import type { LotQuantity } from './lotSummary';
import { takesPrefix } from './lotText';
import { scaleAxis, type AxisScale } from './plotScale';
import { PLOT_COLORS } from './svgPlot';

/** Plot size in CSS pixels: two fit side by side in the report's 980 px column. */
export const HISTOGRAM_SIZE = { width: 460, height: 210 } as const;

const MARGIN = { left: 44, right: 14, top: 26, bottom: 38 };
/** Room either side of the drawn range, as a share of it, so a limit on the edge stays visible. */
const X_PAD = 0.06;
const BAR_COLOR = '#9aa7b4';
/** Narrowest bar drawn, px: wider than the 2 px design line drawn over it. */
const MIN_BAR = 5;

/** The histogram of one quantity, or '' when it has no values. */
export function renderLotHistogram(q: LotQuantity, designName: string): string {
  if (!q.histogram) return '';
  const { width, height } = HISTOGRAM_SIZE;
  const area = { x0: MARGIN.left, x1: width - MARGIN.right, y0: MARGIN.top, y1: height - MARGIN.bottom };
  const { edges, counts } = q.histogram;
  const marks = [q.design, q.limits?.lower, q.limits?.upper].filter((v): v is number => typeof v === 'number' && Number.isFinite(v));
  const lo = Math.min(edges[0], ...marks);
  const hi = Math.max(edges[edges.length - 1], ...marks);
  const pad = (hi - lo) * X_PAD;
  const [xMin, xMax] = [lo - pad, hi + pad];
  const yMax = Math.max(1, ...counts);
  const sx = (x: number) => area.x0 + ((x - xMin) / (xMax - xMin)) * (area.x1 - area.x0);
  const sy = (y: number) => area.y1 - (y / yMax) * (area.y1 - area.y0);
  const title = `${q.name} of ${q.stats?.n ?? 0} units against ${designName}`;
  const parts = [
    `<svg xmlns="http://www.w3.org/2000/svg" class="lot-histogram" role="img" aria-label="${escapeHtml(title)}" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="inherit" font-size="11">`,
    `<title>${escapeHtml(title)}</title>`,
  ];
  counts.forEach((count, k) => {
    if (!count) return;
    // A bin narrower than MIN_BAR px is widened about its middle, so a tight lot still shows beside the design line.
    const [left, right] = [sx(edges[k]), sx(edges[k + 1]) - 1];
    const middle = (left + right) / 2;
    const [x0, x1] = right - left >= MIN_BAR ? [left, right] : [middle - MIN_BAR / 2, middle + MIN_BAR / 2];
    parts.push(`<rect class="bar" x="${x0.toFixed(1)}" y="${sy(count).toFixed(1)}" width="${(x1 - x0).toFixed(1)}" height="${(area.y1 - sy(count)).toFixed(1)}" fill="${BAR_COLOR}"/>`);
  });
  const line = (x: number, cls: string, color: string, dash: string | null, label: string) =>
    `<line class="${cls}" x1="${sx(x).toFixed(1)}" x2="${sx(x).toFixed(1)}" y1="${area.y0 - 4}" y2="${area.y1}" stroke="${color}" stroke-width="2"${dash ? ` stroke-dasharray="${dash}"` : ''}/>` +
    `<text x="${sx(x).toFixed(1)}" y="${area.y0 - 8}" text-anchor="middle" fill="${color}">${label}</text>`;
  if (q.limits?.lower != null) parts.push(line(q.limits.lower, 'limit', PLOT_COLORS.prediction, '6 3', 'LSL'));
  if (q.limits?.upper != null) parts.push(line(q.limits.upper, 'limit', PLOT_COLORS.prediction, '6 3', 'USL'));
  parts.push(line(q.design, 'design', PLOT_COLORS.fit, null, 'design'));
  parts.push(axes(area, valueAxis(xMin, xMax, q.unit), yMax, sx, sy, q.name));
  parts.push('</svg>');
  return parts.join('');
}

/** Ticks for the value axis; a ratio or a percentage keeps plain numbers (0.32, not 320 m). */
function valueAxis(min: number, max: number, unit: string): AxisScale {
  const scale = scaleAxis(min, max, unit, 6);
  if (takesPrefix(unit)) return scale;
  return { ticks: scale.ticks, labels: scale.ticks.map((t) => String(Number(t.toPrecision(6)))), unit, origin: null };
}

function axes(
  area: { x0: number; x1: number; y0: number; y1: number },
  xScale: AxisScale,
  yMax: number,
  sx: (x: number) => number,
  sy: (y: number) => number,
  name: string,
): string {
  const axis = PLOT_COLORS.axis;
  const parts = [`<path d="M${area.x0},${area.y0}V${area.y1}H${area.x1}" fill="none" stroke="${axis}" stroke-width="1"/>`];
  xScale.ticks.forEach((t, i) => {
    const x = sx(t).toFixed(1);
    parts.push(`<line x1="${x}" x2="${x}" y1="${area.y1}" y2="${area.y1 + 4}" stroke="${axis}"/><text x="${x}" y="${area.y1 + 16}" text-anchor="middle" fill="${axis}">${escapeHtml(xScale.labels[i])}</text>`);
  });
  // Whole counts only: at most about 4 ticks up to the tallest bar.
  const step = Math.max(1, Math.ceil(yMax / 4));
  for (let c = 0; c <= yMax; c += step) {
    const y = sy(c).toFixed(1);
    parts.push(`<line x1="${area.x0 - 4}" x2="${area.x0}" y1="${y}" y2="${y}" stroke="${axis}"/><text x="${area.x0 - 7}" y="${y}" dy="0.32em" text-anchor="end" fill="${axis}">${c}</text>`);
  }
  const unit = xScale.unit ? ` (${xScale.unit})` : '';
  parts.push(`<text x="${(area.x0 + area.x1) / 2}" y="${area.y1 + 32}" text-anchor="middle" fill="${axis}">${escapeHtml(name + unit)}</text>`);
  parts.push(`<text x="12" y="${(area.y0 + area.y1) / 2}" text-anchor="middle" fill="${axis}" transform="rotate(-90 12 ${(area.y0 + area.y1) / 2})">units</text>`);
  return parts.join('');
}
