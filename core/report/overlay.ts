// The overlay plot of one logged measurement: its capture, the logged fit and the design prediction.

import { evaluateResponse } from '../response/secondOrder';
import { predictResponse, probeUnit, toleranceBand } from '../circuit/predict';
import type { BenchRecord } from './benchRecord';
import { eventTimeOf } from './fitSummary';
import { decimateMinMax } from './decimate';
import { fittedModel } from './fittedModel';
import { plotColumns, renderOverlayPlot, type OverlayPlotInput } from './svgPlot';

/** The samples of a capture channel as reloaded for a report (SI units). */
export interface ReportTrace {
  time: Float64Array;
  values: Float64Array;
  unit: string;
  name: string;
}

export const PLOT_SIZE = { width: 880, height: 320 } as const;

/**
 * The SVG plot and notes about what could not be drawn. The plot spans the fit window with some
 * context before it. The fitted curve is redrawn from the logged model: one ring's params, or every mode's terms (fittedModel.ts).
 */
export function renderMeasurementPlot(record: BenchRecord, trace: ReportTrace, id: string): { svg: string; notes: string[] } {
  const notes: string[] = [];
  const fit = record.fit;
  const first = trace.time[0];
  const last = trace.time[trace.time.length - 1];
  const span = fit.window.end - fit.window.start;
  const xRange: [number, number] = [Math.max(first, fit.window.start - 0.15 * span), Math.min(last, fit.window.end + 0.03 * span)];
  if (!(xRange[1] > xRange[0])) xRange.splice(0, 2, first, last);
  const columns = plotColumns(PLOT_SIZE.width);
  const input: OverlayPlotInput = {
    id,
    title: `${record.unit}: ${trace.name} measured, fitted${record.design ? ' and predicted' : ''}`,
    ...PLOT_SIZE,
    xRange,
    yUnit: trace.unit,
    yLabel: trace.name,
    measured: decimateMinMax(trace.time, trace.values, xRange[0], xRange[1], columns),
  };

  const fitted = fittedCurve(record, xRange, 2 * columns);
  if (fitted) input.fit = fitted;
  else notes.push('The fitted curve could not be redrawn from the logged values.');

  const design = record.design?.spec;
  const t0 = eventTimeOf(fit);
  if (design) {
    if (probeUnit(design) !== trace.unit) {
      notes.push(`The design predicts ${probeUnit(design)} but the channel is in ${trace.unit || 'no unit'}: prediction not drawn.`);
    } else if (t0 === null) {
      notes.push('The fit saw no samples before the event, so no event time places the prediction: prediction not drawn.');
    } else {
      const time = grid(xRange[0], xRange[1], columns);
      input.prediction = { x: time, y: evaluateResponse(predictResponse(design, t0), time) };
      const band = toleranceBand(design, time, { t0 });
      input.band = { x: time, lower: band.lower, upper: band.upper };
      notes.push(`Tolerance band: ${band.method}.`);
    }
  }
  return { svg: renderOverlayPlot(input), notes };
}

function fittedCurve(record: BenchRecord, xRange: [number, number], points: number) {
  const { params, t0, window } = record.fit;
  if (!params || !Number.isFinite(params.alpha)) return null;
  const start = Math.max(xRange[0], Math.min(window.start, t0.value));
  const end = Math.min(xRange[1], window.end);
  if (!(end > start)) return null;
  const x = grid(start, end, points);
  return { x, y: fittedModel(record.fit, x) };
}

function grid(start: number, end: number, count: number): Float64Array {
  const x = new Float64Array(count);
  for (let i = 0; i < count; i++) x[i] = start + ((end - start) * i) / (count - 1);
  return x;
}
