// The fit plot: measured samples, fitted curve, design prediction with its tolerance band, and the
// residuals in a linked panel below (one shared time axis); the fit window as a draggable region.

import { evaluateResponse } from '../../core/response/secondOrder';
import { predictResponse, toleranceBand } from '../../core/circuit/predict';
import type { Design } from '../../core/circuit/design';
import type { ResponseParams } from '../../core/response/secondOrder';
import { lowerBound, reduceMinMax } from '../../core/report/decimate';
import type { TraceData } from '../workerProtocol';
import { themeColor } from '../theme';
import { plotly, type PlotlyElement, type PlotlyTrace } from './plotly';

export interface PlotInput {
  /** Changes when another capture or channel is shown (the zoom is reset then). */
  key: string;
  trace: TraceData;
  params: ResponseParams | null;
  window: { start: number; end: number } | null;
  design: Design | null;
  /** Where the design's response starts, s. */
  eventTime: number;
  /** The events of a record holding several (empty otherwise): each marked at its onset, the one fitted picked out. */
  events: PlotEvent[];
}

/** One event of a record as the plot marks it. */
export interface PlotEvent {
  /** 1-based, as the fit panel and --event count them. */
  index: number;
  onset: number;
  end: number;
  fitted: boolean;
}

interface Derived {
  model: Float64Array | null;
  residual: Float64Array | null;
  prediction: ResponseParams | null;
}

/** Points of the band per plot column: the band is computed on a grid, not at every sample. */
const BAND_POINTS_PER_COLUMN = 1.5;
const WINDOW_DEBOUNCE_MS = 350;
const MARKER_LIMIT = 3000;

export class FitPlot {
  private input: PlotInput | null = null;
  private derived: Derived = { model: null, residual: null, prediction: null };
  private xRange: [number, number] | null = null;
  private yRange: [number, number] | null = null;
  private windowTimer: ReturnType<typeof setTimeout> | null = null;
  private drawing: Promise<void> = Promise.resolve();
  private bound = false;
  /** The events labelled on the plot, in the order of its annotations. */
  private shownEvents: PlotEvent[] = [];

  constructor(
    private readonly root: HTMLElement,
    private readonly onWindowChange: (window: { start: number; end: number }) => void,
    private readonly onEventChoice: (index: number) => void,
  ) {}

  /** Show new data; the zoom is kept while the capture and channel stay the same. */
  show(input: PlotInput): Promise<void> {
    if (this.input?.key !== input.key) {
      this.xRange = null;
      this.yRange = null;
    }
    this.input = input;
    const { trace, params } = input;
    const model = params ? evaluateResponse(params, trace.time) : null;
    const residual = model ? Float64Array.from(trace.values, (v, i) => v - model[i]) : null;
    const prediction = input.design ? predictResponse(input.design, input.eventTime) : null;
    this.derived = { model, residual, prediction };
    return this.redraw();
  }

  /** Show nothing (a capture that could not be read): no samples of the previous one stay on screen. */
  clear(): Promise<void> {
    this.input = null;
    this.derived = { model: null, residual: null, prediction: null };
    this.bound = false;
    this.drawing = this.drawing.then(() => plotly().purge(this.root)).catch(() => undefined);
    return this.drawing;
  }

  /** Redraw with the current theme and size. */
  redraw(): Promise<void> {
    this.drawing = this.drawing.then(() => this.draw()).catch(() => undefined);
    return this.drawing;
  }

  async exportImage(format: 'png' | 'svg'): Promise<string> {
    const { width, height } = this.root.getBoundingClientRect();
    return plotly().toImage(this.root, { format, width: Math.round(width), height: Math.round(height), scale: format === 'png' ? 2 : 1 });
  }

  private async draw(): Promise<void> {
    const input = this.input;
    if (!input) return;
    const started = performance.now();
    const { trace, window } = input;
    const full: [number, number] = [trace.time[0], trace.time[trace.time.length - 1]];
    const [x0, x1] = this.xRange ?? full;
    const width = Math.max(200, Math.round(this.root.clientWidth - 90));
    const traces: PlotlyTrace[] = [];
    const colors = palette();

    // Drawn bottom to top: the design (band, prediction), the samples over it, the fit over all.
    const { model, residual, prediction } = this.derived;
    if (input.design && prediction) traces.push(...this.designTraces(input.design, prediction.t0, x0, x1, width, colors));
    const measured = reduceMinMax(trace.time, trace.values, x0, x1, width);
    traces.push({ ...line('Measured', measured.x, measured.y, colors.data, 1, 'solid', 'y'), legendrank: 1 });
    if (model && residual && window) {
      const w0 = Math.max(x0, window.start);
      const w1 = Math.min(x1, window.end);
      const columns = Math.max(1, Math.round((width * (w1 - w0)) / (x1 - x0 || 1)));
      if (w1 > w0) {
        const fit = reduceMinMax(trace.time, model, w0, w1, columns);
        traces.push({ ...line('Fit', fit.x, fit.y, colors.fit, 2, 'solid', 'y'), legendrank: 2 });
        const res = reduceMinMax(trace.time, residual, w0, w1, columns);
        traces.push({ ...line('Residual', res.x, res.y, colors.data, 1, 'solid', 'y2'), showlegend: false });
      }
    }
    traces.push(...markerTraces(trace, x0, x1, colors));
    const events = input.events.filter((e) => e.onset >= x0 && e.onset <= x1).slice(0, MARKER_LIMIT);
    this.shownEvents = events;
    if (events.length) traces.push(eventLines(events, measured.y, colors));

    const layout = {
      paper_bgcolor: 'rgba(0,0,0,0)',
      plot_bgcolor: 'rgba(0,0,0,0)',
      font: { family: colors.font, size: 12, color: colors.text },
      margin: { l: 72, r: 18, t: 34, b: 46 },
      showlegend: true,
      legend: { orientation: 'h', x: 0, y: 1.02, yanchor: 'bottom', traceorder: 'normal', bgcolor: 'rgba(0,0,0,0)', font: { size: 12 } },
      hovermode: 'closest',
      dragmode: 'zoom',
      xaxis: {
        anchor: 'y2',
        range: [x0, x1],
        title: { text: 'Time', standoff: 6 },
        ...axisStyle(colors, 's'),
      },
      yaxis: {
        domain: [0.3, 1],
        title: { text: quantityName(trace.unit), standoff: 4 },
        ...axisStyle(colors, trace.unit),
        ...(this.yRange ? { range: this.yRange, autorange: false } : { autorange: true }),
      },
      yaxis2: {
        domain: [0, 0.22],
        title: { text: 'Residual', standoff: 4 },
        ...axisStyle(colors, trace.unit),
        zeroline: true,
        zerolinecolor: colors.axis,
        zerolinewidth: 1,
        autorange: true,
        nticks: 4,
      },
      // The window: a shaded region below the traces, and its two edges above them as draggable lines.
      shapes: window
        ? [
            { type: 'rect', xref: 'x', yref: 'paper', x0: window.start, x1: window.end, y0: 0, y1: 1, fillcolor: colors.window, line: { width: 0 }, layer: 'below' },
            edgeLine(window.start, colors.windowEdge),
            edgeLine(window.end, colors.windowEdge),
          ]
        : [],
      // Each event's number above its onset: a click on it fits that event.
      annotations: events.map((e) => ({
        x: e.onset,
        xref: 'x',
        y: 1,
        yref: 'paper',
        yanchor: 'top',
        text: e.fitted ? `<b>${e.index}</b>` : String(e.index),
        showarrow: false,
        captureevents: true,
        bgcolor: colors.window,
        bordercolor: e.fitted ? colors.fit : colors.axis,
        borderwidth: 1,
        font: { color: e.fitted ? colors.fit : colors.text, size: 11 },
        hovertext: e.fitted ? `event ${e.index}: the one fitted` : `event ${e.index}: click to fit it`,
      })),
    };
    const root = await plotly().react(this.root, traces, layout, {
      displayModeBar: false,
      responsive: true,
      edits: { shapePosition: true },
      doubleClick: 'reset',
      showTips: false,
    });
    this.bindEvents(root);
    const elapsed = performance.now() - started;
    this.root.dataset.redrawMs = elapsed.toFixed(1);
    this.root.dataset.redraws = String(Number(this.root.dataset.redraws ?? '0') + 1);
    this.root.dataset.points = String(measured.x.length);
  }

  private designTraces(design: Design, t0: number, x0: number, x1: number, width: number, colors: Palette): PlotlyTrace[] {
    const n = Math.max(50, Math.round(width * BAND_POINTS_PER_COLUMN));
    const grid = Float64Array.from({ length: n }, (_, i) => x0 + ((x1 - x0) * i) / (n - 1));
    const band = toleranceBand(design, grid, { t0 });
    return [
      { ...line('Design tolerance band', grid, band.lower, 'rgba(0,0,0,0)', 0, 'solid', 'y'), showlegend: false, hoverinfo: 'skip' },
      {
        ...line('Design tolerance band', grid, band.upper, 'rgba(0,0,0,0)', 0, 'solid', 'y'),
        fill: 'tonexty',
        fillcolor: colors.band,
        hoverinfo: 'skip',
        legendrank: 4,
      },
      { ...line('Design prediction', grid, band.nominal, colors.prediction, 2, 'dash', 'y'), legendrank: 3 },
    ];
  }

  private bindEvents(root: PlotlyElement): void {
    if (this.bound) return;
    this.bound = true;
    root.on('plotly_relayout', (update) => this.handleRelayout(update));
    root.on('plotly_clickannotation', (data) => {
      const index = (data as { index?: number }).index;
      const event = index === undefined ? undefined : this.shownEvents[index];
      if (event && !event.fitted) this.onEventChoice(event.index);
    });
  }

  private handleRelayout(update: Record<string, unknown>): void {
    const keys = Object.keys(update);
    if (keys.some((k) => k.startsWith('shapes['))) {
      const shapes = (this.root as PlotlyElement).layout?.shapes as { x0: number; x1: number }[] | undefined;
      if (shapes?.length === 3) {
        const a = (shapes[1].x0 + shapes[1].x1) / 2;
        const b = (shapes[2].x0 + shapes[2].x1) / 2;
        this.queueWindow(Math.min(a, b), Math.max(a, b));
      }
      return;
    }
    let changed = false;
    if (update['xaxis.autorange'] === true || update.autosize === true) {
      this.xRange = null;
      this.yRange = null;
      changed = true;
    }
    const x = rangeOf(update, 'xaxis');
    if (x) {
      this.xRange = x;
      changed = true;
    }
    const y = rangeOf(update, 'yaxis');
    if (y) this.yRange = y;
    if (update['yaxis.autorange'] === true) this.yRange = null;
    if (changed) void this.redraw();
  }

  private queueWindow(start: number, end: number): void {
    if (this.windowTimer !== null) clearTimeout(this.windowTimer);
    this.windowTimer = setTimeout(() => {
      this.windowTimer = null;
      this.onWindowChange({ start, end });
    }, WINDOW_DEBOUNCE_MS);
  }
}

interface Palette {
  data: string;
  fit: string;
  prediction: string;
  band: string;
  window: string;
  windowEdge: string;
  clipped: string;
  axis: string;
  text: string;
  font: string;
}

function palette(): Palette {
  return {
    data: themeColor('plot-data'),
    fit: themeColor('plot-fit'),
    prediction: themeColor('plot-prediction'),
    band: themeColor('plot-band'),
    window: themeColor('plot-window'),
    windowEdge: themeColor('plot-window-edge'),
    clipped: themeColor('plot-clipped'),
    axis: themeColor('plot-axis'),
    text: themeColor('ink'),
    font: themeColor('font-sans'),
  };
}

function axisStyle(colors: Palette, unit: string): Record<string, unknown> {
  return {
    showgrid: false,
    zeroline: false,
    showline: true,
    linecolor: colors.axis,
    linewidth: 1,
    mirror: false,
    ticks: 'outside',
    tickcolor: colors.axis,
    ticklen: 4,
    exponentformat: 'SI',
    // SI ticks read '200n' and '1.5µ': the unit joins the prefix ('200ns').
    ticksuffix: unit,
    automargin: true,
  };
}

/** One edge of the fit window: a vertical line across both panels that the user drags. */
function edgeLine(x: number, color: string): Record<string, unknown> {
  return { type: 'line', xref: 'x', yref: 'paper', x0: x, x1: x, y0: 0, y1: 1, line: { color, width: 3 }, layer: 'above' };
}

function line(name: string, x: ArrayLike<number>, y: ArrayLike<number>, color: string, width: number, dash: string, yaxis: 'y' | 'y2'): PlotlyTrace {
  return { type: 'scatter', mode: 'lines', name, x, y, yaxis, line: { color, width, dash, simplify: false }, hoverinfo: 'x+y+name' };
}

/** The events' onsets as dashed vertical lines over the samples' span (one trace, broken between events). */
function eventLines(events: PlotEvent[], values: ArrayLike<number>, colors: Palette): PlotlyTrace {
  let low = Infinity;
  let high = -Infinity;
  for (let i = 0; i < values.length; i++) {
    low = Math.min(low, values[i]);
    high = Math.max(high, values[i]);
  }
  const x = events.flatMap((e) => [e.onset, e.onset, Number.NaN]);
  const y = events.flatMap(() => [low, high, Number.NaN]);
  return { ...line('Events', x, y, colors.axis, 1, 'dot', 'y'), hoverinfo: 'skip', legendrank: 5 };
}

function markerTraces(trace: TraceData, x0: number, x1: number, colors: Palette): PlotlyTrace[] {
  const out: PlotlyTrace[] = [];
  const clipped = within(trace.clippedTimes, x0, x1);
  if (clipped.length) {
    const y = clipped.map((t) => trace.values[Math.min(trace.values.length - 1, lowerBound(trace.time, t))]);
    out.push({ type: 'scatter', mode: 'markers', name: 'Clipped samples (not fitted)', x: clipped, y, yaxis: 'y', marker: { symbol: 'x-thin', size: 7, color: colors.clipped, line: { width: 1.5, color: colors.clipped } } });
  }
  const gaps = within(trace.gapTimes, x0, x1);
  if (gaps.length) {
    const low = Math.min(...reduceMinMax(trace.time, trace.values, x0, x1, 50).y);
    out.push({ type: 'scatter', mode: 'markers', name: 'Dropped rows (gaps)', x: gaps, y: gaps.map(() => low), yaxis: 'y', marker: { symbol: 'triangle-up', size: 8, color: colors.clipped } });
  }
  return out;
}

function within(times: Float64Array, x0: number, x1: number): number[] {
  const from = lowerBound(times, x0);
  const out: number[] = [];
  for (let i = from; i < times.length && times[i] <= x1 && out.length < MARKER_LIMIT; i++) out.push(times[i]);
  return out;
}

function rangeOf(update: Record<string, unknown>, axis: string): [number, number] | null {
  const pair = update[`${axis}.range`];
  if (Array.isArray(pair) && pair.length === 2) return [Number(pair[0]), Number(pair[1])];
  const a = update[`${axis}.range[0]`];
  const b = update[`${axis}.range[1]`];
  return a !== undefined && b !== undefined ? [Number(a), Number(b)] : null;
}

function quantityName(unit: string): string {
  return unit === 'V' ? 'Voltage' : unit === 'A' ? 'Current' : 'Value';
}
