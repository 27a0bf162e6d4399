// The two small plots of the work over several captures: 1/(2π f0)² against the added capacitance with the
// extraction's line, and the before / after captures overlaid at their fitted event times. Both draw what the use
// cases returned; nothing is fitted here.

import type { Comparison } from '../../core/report/comparisonText';
import type { ParasiticsResult } from '../../core/report/parasiticsText';
import { evaluateResponse } from '../../core/response/secondOrder';
import { palette, type Palette } from './plotPalette';
import type { OverlayTrace } from '../workerProtocol';
import { axisTicks } from './axes';
import { plotly, type PlotlyTrace } from './plotly';

/** Points on each fitted curve: smooth at any zoom of these small plots. */
const CURVE_POINTS = 600;
/** Time prefixes for the 1/(2π f0)² axis, whose unit is a time squared: the one that puts sqrt(y) between 1 and 1000. */
const TIME_PREFIXES = [
  [1, 's'],
  [1e-3, 'ms'],
  [1e-6, 'µs'],
  [1e-9, 'ns'],
  [1e-12, 'ps'],
] as const;
/** The line is drawn back to where it meets zero (at minus the node and probe capacitance) and a little past the last capture. */
const LINE_MARGIN = 0.08;

/** y = 1/(2π f0)² of each capture with its 1σ from f0's, and the extraction's line y = L_p (C_added + C_probe + C_p). */
export function drawCapacitanceLine(root: HTMLElement, result: ParasiticsResult, probeC: number): Promise<void> {
  const points = result.captures.map((c) => {
    const f = c.frequency.value;
    const y = 1 / (2 * Math.PI * f) ** 2;
    // u(y) / y = 2 u(f) / f
    return { x: c.addedC, y, u: c.frequency.stderr === null ? 0 : (2 * y * c.frequency.stderr) / f };
  });
  const slope = result.L.value;
  const offset = result.C.value + probeC;
  const lastAdded = Math.max(...points.map((p) => p.x));
  const xRange: [number, number] = [-offset * (1 + LINE_MARGIN), lastAdded + (lastAdded + offset) * LINE_MARGIN];
  const lineX = [-offset, xRange[1]];
  const colors = palette();
  const yMax = slope * (xRange[1] + offset) * (1 + LINE_MARGIN);
  const [timeScale, timeUnit] = TIME_PREFIXES.find(([scale]) => Math.sqrt(yMax) >= scale) ?? TIME_PREFIXES[TIME_PREFIXES.length - 1];
  const shown = (y: number) => y / timeScale ** 2;
  const traces: PlotlyTrace[] = [
    {
      x: lineX,
      y: lineX.map((x) => shown(slope * (x + offset))),
      mode: 'lines',
      name: `line: slope L_p, meets zero at ${probeC > 0 ? '−(C_p + C_probe)' : '−C_p'}`,
      line: { color: colors.fit, width: 2 },
      hoverinfo: 'skip',
    },
    {
      x: points.map((p) => p.x),
      y: points.map((p) => shown(p.y)),
      error_y: { type: 'data', array: points.map((p) => shown(p.u)), visible: true, color: colors.text, thickness: 1, width: 4 },
      mode: 'markers',
      name: 'captures: 1/(2π f₀)²',
      marker: { color: colors.text, size: 8, symbol: 'circle-open', line: { width: 2 } },
      text: result.captures.map((c) => c.file),
      hovertemplate: '%{text}<extra></extra>',
    },
  ];
  root.dataset.points = String(points.length);
  root.dataset.slope = String(slope);
  return draw(root, traces, {
    xaxis: axisStyle(colors, axisTicks(xRange, 'F', 'Added capacitance', root.clientWidth, 'x'), xRange),
    yaxis: { ...axisStyle(colors, null, [0, shown(yMax)]), title: { text: `1/(2π f₀)² (${timeUnit}²)`, font: { size: 12, color: colors.muted } } },
  });
}

/** The two captures, each shifted so its fitted event is at zero, with their fitted curves. */
export function drawOverlay(root: HTMLElement, comparison: Comparison, overlay: { before: OverlayTrace; after: OverlayTrace }): Promise<void> {
  const colors = palette();
  const sides = [
    { name: 'before', summary: comparison.before, trace: overlay.before, color: colors.data, fitColor: colors.muted },
    { name: 'after', summary: comparison.after, trace: overlay.after, color: colors.prediction, fitColor: colors.fit },
  ];
  const starts = sides.map((s) => s.summary.window.start - s.summary.t0.value);
  const ends = sides.map((s) => s.summary.window.end - s.summary.t0.value);
  const xRange: [number, number] = [Math.min(...starts), Math.max(...ends)];
  const traces: PlotlyTrace[] = sides.flatMap((side) => {
    const t0 = side.summary.t0.value;
    const time = Float64Array.from(side.trace.time, (t) => t - t0);
    const measured: PlotlyTrace = { x: time, y: side.trace.values, mode: 'lines', name: `${side.name}: ${side.summary.file}`, line: { color: side.color, width: 1 }, hoverinfo: 'skip' };
    const step = (xRange[1] - xRange[0]) / (CURVE_POINTS - 1);
    const fitTime = Float64Array.from({ length: CURVE_POINTS }, (_, i) => xRange[0] + i * step);
    const model = evaluateResponse(side.summary.params, Float64Array.from(fitTime, (t) => t + t0));
    const fitted: PlotlyTrace = { x: fitTime, y: model, mode: 'lines', name: `${side.name}: fit`, line: { color: side.fitColor, width: 2, dash: side.name === 'before' ? 'dash' : 'solid' }, hoverinfo: 'skip' };
    return [measured, fitted];
  });
  const values = sides.flatMap((s) => Array.from(s.trace.values));
  const low = Math.min(...values);
  const high = Math.max(...values);
  const pad = (high - low) * 0.05 || 1;
  const yRange: [number, number] = [low - pad, high + pad];
  root.dataset.traces = String(traces.length);
  const unit = overlay.before.unit;
  return draw(root, traces, {
    xaxis: axisStyle(colors, axisTicks(xRange, 's', 'Time from each fitted event', root.clientWidth, 'x'), xRange),
    yaxis: axisStyle(colors, axisTicks(yRange, unit, unit === 'A' ? 'Current' : unit === 'V' ? 'Voltage' : 'Value', root.clientHeight, 'y'), yRange),
  });
}

/** An axis in the bench's colours; with `ticks`, labelled in the prefix its title names, else plotly's own plain ticks. */
function axisStyle(colors: Palette, ticks: ReturnType<typeof axisTicks> | null, range: [number, number]): Record<string, unknown> {
  return {
    range,
    ...(ticks ? { title: { text: ticks.title, font: { size: 12, color: colors.muted } }, tickmode: 'array', tickvals: ticks.tickvals, ticktext: ticks.ticktext } : {}),
    tickfont: { size: 11, color: colors.text },
    showgrid: false,
    zeroline: false,
    showline: true,
    linecolor: colors.axis,
    ticks: 'outside',
    tickcolor: colors.axis,
    automargin: true,
  };
}

async function draw(root: HTMLElement, traces: PlotlyTrace[], axes: Record<string, unknown>): Promise<void> {
  const colors = palette();
  await plotly().react(
    root,
    traces,
    {
      ...axes,
      margin: { l: 64, r: 16, t: 36, b: 48 },
      paper_bgcolor: 'rgba(0,0,0,0)',
      plot_bgcolor: 'rgba(0,0,0,0)',
      font: { family: colors.font, size: 12, color: colors.text },
      showlegend: true,
      legend: { orientation: 'h', x: 0, y: 1.02, yanchor: 'bottom', bgcolor: 'rgba(0,0,0,0)', font: { size: 11 } },
      dragmode: false,
    },
    { displayModeBar: false, responsive: true },
  );
}
