// The fit plot: measured samples, fitted curve, design prediction with its tolerance band, and the residuals in a linked
// panel below (one shared time axis; each ringing mode's contribution in a strip between them when the fit has several);
// the fit window with edge handles, measurement cursors and the step's markers.

import { evaluateResponse } from '../../core/response/secondOrder';
import { predictResponse, toleranceBand } from '../../core/circuit/predict';
import type { Design } from '../../core/circuit/design';
import type { ResponseParams } from '../../core/response/secondOrder';
import { lowerBound, reduceMinMax } from '../../core/report/decimate';
import type { TransitionSummary } from '../../core/circuit/transitionSummary';
import type { ModeCurve, TraceData } from '../workerProtocol';
import { h } from '../dom';
import { palette, type Palette } from './plotPalette';
import { axisTicks, quantityName, type AxisTicks } from './axes';
import { cursorReadouts, levelSymbol, placeCursors, type CursorId, type CursorPositions } from './cursors';
import { HandleLayer, type HandleGeometry, type HandleSpec } from './handles';
import { HoverTip } from './hoverTip';
import { transitionMarks } from './markers';
import { axisGeometry, fromPixel, plotly, type AxisGeometry, type PlotlyElement, type PlotlyTrace } from './plotly';
import { keepWithin, paddedExtent, panBy, zoomAbout, type Range } from './viewRange';

export interface PlotInput {
  /** Changes when another capture or channel is shown (the zoom is reset then). */
  key: string;
  trace: TraceData;
  params: ResponseParams | null;
  window: { start: number; end: number } | null;
  design: Design | null;
  /** Where the design's response starts, s; null when no event time is known (then no prediction is drawn). */
  eventTime: number | null;
  /** The events of a record holding several (empty otherwise): each marked at its onset, the one fitted picked out. */
  events: PlotEvent[];
  /** The fit's step metrics, marked on the plot (overshoot, peak time, settling time); null without a fit. */
  transitions: TransitionSummary | null;
  /**
   * Each ringing mode's (and the slow term's) contribution at every sample, when one ring is not the whole fit:
   * the fitted model is then their sum on the fit's levels, and each is drawn under the fit. Empty otherwise.
   */
  modeCurves: ModeCurve[];
}

/** What the plot asks of the page. */
export interface PlotCallbacks {
  /** An edge of the fit window was dragged to a new place (only ever by its handle). */
  onWindowChange(window: { start: number; end: number }): void;
  /** An event's label was clicked. */
  onEventChoice(index: number): void;
  /** The list of keys and gestures was asked for. */
  onShowShortcuts(): void;
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
  /** Each mode's contribution about zero, drawn in a strip of its own between the fit and the residual. */
  modes: ModeCurve[];
}

const NOTHING_DERIVED: Derived = { model: null, residual: null, prediction: null, modes: [] };

/** Points of the band per plot column: the band is computed on a grid, not at every sample. */
const BAND_POINTS_PER_COLUMN = 1.5;
const MARKER_LIMIT = 3000;
/** Zoom per 100 px of wheel travel (one notch of most mice); a trackpad's small steps zoom in proportion. */
const WHEEL_ZOOM_PER_NOTCH = 1.25;
const WHEEL_NOTCH_PX = 100;
/** A key press moves the view by this share of its width, and zooms by this factor. */
const KEY_PAN_SHARE = 0.1;
const KEY_ZOOM = 1.5;
/** Room above and below the curves when the level range is chosen automatically, as a share of their extent. */
const LEVEL_PAD = 0.05;
const RESIDUAL_PAD = 0.1;
/** Domains of the main and residual panels on the plot's height. */
const MAIN_DOMAIN: Range = [0.3, 1];
const RESIDUAL_DOMAIN: Range = [0, 0.22];
/** With the modes shown, the main panel gives up room to their strip, drawn between it and the residual. */
const MAIN_DOMAIN_WITH_MODES: Range = [0.52, 1];
const MODES_DOMAIN: Range = [0.27, 0.46];

export class FitPlot {
  /** The plot with its handles, hover readout, cursor readouts and tools: what the page places. */
  readonly view: HTMLElement;
  private readonly frame: HTMLElement;
  private readonly handles: HandleLayer;
  private readonly tip: HoverTip;
  private readonly readout = h('div', { class: 'plot-readout', id: 'cursor-readout', attrs: { 'aria-live': 'polite' } });
  /** How to use the plot, in a line; the cursors' readouts take its place while they are shown. */
  private readonly hints = h(
    'p',
    { class: 'plot-key' },
    h('span', { class: 'key window' }, 'fit window: drag its edge handles to refit'),
    h('span', {}, 'drag or wheel to zoom, double-click for the whole capture'),
  );
  private readonly cursorButton: HTMLButtonElement;
  private readonly markerButton: HTMLButtonElement;
  private readonly modesButton: HTMLButtonElement;
  private input: PlotInput | null = null;
  private derived: Derived = NOTHING_DERIVED;
  /** The views chosen by zooming; null shows the whole capture (time) or fits the curves shown (levels). */
  private xRange: Range | null = null;
  private yRange: Range | null = null;
  private y2Range: Range | null = null;
  /** The level range of the last draw (chosen or automatic): where the keys zoom from. */
  private shownY: Range | null = null;
  private cursors: CursorPositions | null = null;
  private cursorsShown = false;
  private markersShown = true;
  private modesShown = true;
  private drawing: Promise<void> = Promise.resolve();
  private drawQueued = false;
  private bound = false;
  /** The events labelled on the plot, in the order of its annotations. */
  private shownEvents: PlotEvent[] = [];

  constructor(
    private readonly root: HTMLElement,
    private readonly callbacks: PlotCallbacks,
  ) {
    const layer = h('div', { class: 'plot-overlay' });
    this.frame = h('div', { class: 'plot-frame', attrs: { tabindex: '0', 'aria-label': 'Plot: press ? for its keys' } }, root, layer);
    this.tip = new HoverTip(this.frame);
    this.frame.append(this.tip.element);
    this.handles = new HandleLayer(layer, (id, value, done) => this.handleMoved(id, value, done));
    const tool = (id: string, text: string, title: string, run: () => void) =>
      h('button', { class: 'quiet plot-tool', id, title, attrs: { type: 'button' }, on: { click: run } }, text);
    this.cursorButton = tool('plot-cursors', 'Cursors', 'Two time and two level cursors with Δt, 1/Δt and ΔV (C)', () => this.toggleCursors());
    this.markerButton = tool('plot-markers', 'Markers', 'Overshoot, peak time and settling time of the step (M)', () => this.toggleMarkers());
    this.modesButton = tool('plot-modes', 'Modes', "Each ringing mode's contribution, in a strip under the fit", () => this.toggleModes());
    this.view = h(
      'div',
      { class: 'plot-view' },
      this.frame,
      h(
        'div',
        { class: 'plot-bar' },
        this.hints,
        this.readout,
        h(
          'div',
          { class: 'plot-tools' },
          tool('plot-whole', 'Whole capture', 'Show the whole capture (0 or double-click)', () => this.showWhole()),
          this.cursorButton,
          this.markerButton,
          this.modesButton,
          tool('plot-keys', 'Keys ?', 'Keys and gestures (?)', () => this.callbacks.onShowShortcuts()),
        ),
      ),
    );
    this.readout.hidden = true;
    this.frame.addEventListener('pointerdown', () => this.frame.focus({ preventScroll: true }));
    this.frame.addEventListener('pointerleave', () => this.tip.hide());
    this.frame.addEventListener('wheel', (event) => this.wheel(event), { passive: false });
    this.showToolState();
  }

  /** Show new data; the zoom and the cursors are kept while the capture and channel stay the same. */
  show(input: PlotInput): Promise<void> {
    if (this.input?.key !== input.key) {
      this.xRange = null;
      this.yRange = null;
      this.y2Range = null;
      this.cursors = null;
    }
    this.input = input;
    const { trace, params } = input;
    const curves = params ? input.modeCurves : [];
    const model = params ? (curves.length ? modelOfModes(params, trace.time, curves) : evaluateResponse(params, trace.time)) : null;
    const residual = model ? Float64Array.from(trace.values, (v, i) => v - model[i]) : null;
    const prediction = input.design && input.eventTime !== null ? predictResponse(input.design, input.eventTime) : null;
    const modes = curves;
    this.derived = { model, residual, prediction, modes };
    this.showToolState();
    return this.redraw();
  }

  /** Show nothing (a capture that could not be read): no samples of the previous one stay on screen. */
  clear(): Promise<void> {
    this.input = null;
    this.derived = NOTHING_DERIVED;
    this.showToolState();
    this.bound = false;
    this.handles.place([], null);
    this.tip.hide();
    this.readout.hidden = true;
    this.hints.hidden = false;
    this.drawing = this.drawing.then(() => plotly().purge(this.root)).catch(() => undefined);
    return this.drawing;
  }

  /** Redraw with the current theme, size and view; calls while a draw waits share it. */
  redraw(): Promise<void> {
    if (this.drawQueued) return this.drawing;
    this.drawQueued = true;
    this.drawing = this.drawing
      .then(() => {
        this.drawQueued = false;
        return this.draw();
      })
      .catch(() => undefined);
    return this.drawing;
  }

  async exportImage(format: 'png' | 'svg'): Promise<string> {
    const { width, height } = this.root.getBoundingClientRect();
    return plotly().toImage(this.root, { format, width: Math.round(width), height: Math.round(height), scale: format === 'png' ? 2 : 1 });
  }

  /** Move the time view a step earlier (-1) or later (1), inside the capture. */
  panTime(direction: -1 | 1): void {
    const span = this.span();
    if (!span) return;
    this.xRange = keepWithin(panBy(this.xRange ?? span, direction * KEY_PAN_SHARE), span);
    void this.redraw();
  }

  /** Zoom time in or out about the middle of the view. */
  zoomTime(direction: 'in' | 'out'): void {
    const span = this.span();
    if (!span) return;
    const view = this.xRange ?? span;
    this.xRange = keepWithin(zoomAbout(view, (view[0] + view[1]) / 2, keyZoom(direction), span), span);
    void this.redraw();
  }

  /** Zoom the level (vertical) in or out about the middle of the main panel. */
  zoomLevel(direction: 'in' | 'out'): void {
    const view = this.yRange ?? this.shownY;
    if (!view) return;
    this.yRange = zoomAbout(view, (view[0] + view[1]) / 2, keyZoom(direction));
    void this.redraw();
  }

  /** The whole capture in time, the levels fitted to it again. */
  showWhole(): void {
    this.xRange = null;
    this.yRange = null;
    this.y2Range = null;
    void this.redraw();
  }

  toggleCursors(): void {
    this.cursorsShown = !this.cursorsShown;
    const span = this.span();
    if (this.cursorsShown && span && this.shownY) {
      const x = this.xRange ?? span;
      const inView = (p: CursorPositions) => [p.t1, p.t2].every((t) => t >= x[0] && t <= x[1]);
      if (!this.cursors || !inView(this.cursors)) this.cursors = placeCursors(x, this.yRange ?? this.shownY);
    }
    this.showToolState();
    this.placeHandles();
  }

  toggleMarkers(): void {
    this.markersShown = !this.markersShown;
    this.showToolState();
    void this.redraw();
  }

  /** Show or hide each mode's contribution under the fit (the button is there only when the fit has several). */
  toggleModes(): void {
    this.modesShown = !this.modesShown;
    this.showToolState();
    void this.redraw();
  }

  private span(): Range | null {
    const time = this.input?.trace.time;
    return time && time.length > 0 ? [time[0], time[time.length - 1]] : null;
  }

  private showToolState(): void {
    this.cursorButton.setAttribute('aria-pressed', String(this.cursorsShown));
    this.markerButton.setAttribute('aria-pressed', String(this.markersShown));
    this.modesButton.setAttribute('aria-pressed', String(this.modesShown));
    this.modesButton.hidden = this.derived.modes.length === 0;
  }

  private async draw(): Promise<void> {
    const input = this.input;
    if (!input) return;
    const started = performance.now();
    const { trace, window } = input;
    const full: Range = [trace.time[0], trace.time[trace.time.length - 1]];
    const [x0, x1] = this.xRange ?? full;
    const width = Math.max(200, Math.round(this.root.clientWidth - 90));
    const height = Math.max(200, this.root.clientHeight - 80);
    const traces: PlotlyTrace[] = [];
    const colors = palette();

    // Drawn bottom to top: the design (band, prediction), the samples over it, the fit over all.
    const { model, residual, prediction, modes } = this.derived;
    if (input.design && prediction) traces.push(...this.designTraces(input.design, prediction.t0, x0, x1, width, colors));
    const measured = reduceMinMax(trace.time, trace.values, x0, x1, width);
    traces.push({ ...line('Measured', measured.x, measured.y, colors.data, 1, 'solid', 'y'), legendrank: 1 });
    let residualShown: ArrayLike<number>[] = [];
    const modesShown: ArrayLike<number>[] = [];
    if (model && residual && window) {
      const w0 = Math.max(x0, window.start);
      const w1 = Math.min(x1, window.end);
      const columns = Math.max(1, Math.round((width * (w1 - w0)) / (x1 - x0 || 1)));
      if (w1 > w0) {
        // Under the fit, in a strip of their own: each mode's contribution, whose sum on the final level is the fit.
        if (this.modesShown) {
          modes.forEach((mode, k) => {
            const curve = reduceMinMax(trace.time, mode.values, w0, w1, columns);
            const color = mode.label === SLOW_TERM_LABEL ? colors.slowTerm : colors.modes[k % colors.modes.length];
            traces.push({ ...line(mode.label, curve.x, curve.y, color, 1.5, mode.label === SLOW_TERM_LABEL ? 'dash' : 'solid', 'y3'), legendrank: 5 + k });
            modesShown.push(curve.y);
          });
        }
        const fit = reduceMinMax(trace.time, model, w0, w1, columns);
        traces.push({ ...line('Fit', fit.x, fit.y, colors.fit, 2, 'solid', 'y'), legendrank: 2 });
        const res = reduceMinMax(trace.time, residual, w0, w1, columns);
        traces.push({ ...line('Residual', res.x, res.y, colors.data, 1, 'solid', 'y2'), showlegend: false });
        residualShown = [res.y];
      }
    }
    // Without a fit the residual panel stays, empty: its axis is drawn only for a trace on it, and the handles span it.
    if (residualShown.length === 0) traces.push({ ...line('Residual', [x0, x1], [0, 0], 'rgba(0,0,0,0)', 0, 'solid', 'y2'), showlegend: false, hoverinfo: 'skip' });
    traces.push(...markerTraces(trace, x0, x1, colors));
    const events = input.events.filter((e) => e.onset >= x0 && e.onset <= x1).slice(0, MARKER_LIMIT);
    this.shownEvents = events;
    if (events.length) traces.push(eventLines(events, measured.y, colors));

    const levels = this.yRange ?? paddedExtent(traces.filter((t) => t.yaxis === 'y' && t.y).map((t) => t.y as ArrayLike<number>), LEVEL_PAD) ?? [-1, 1];
    const residuals = this.y2Range ?? paddedExtent(residualShown, RESIDUAL_PAD) ?? [-1, 1];
    this.shownY = levels;
    const marks = this.markersShown ? transitionMarks(input.transitions ?? undefined, x1, colors) : null;
    const strip = modesShown.length > 0;
    const mainDomain = strip ? MAIN_DOMAIN_WITH_MODES : MAIN_DOMAIN;
    const mainHeight = height * (mainDomain[1] - mainDomain[0]);
    const modeLevels = paddedExtent(modesShown, RESIDUAL_PAD) ?? [-1, 1];
    const residualHeight = height * (RESIDUAL_DOMAIN[1] - RESIDUAL_DOMAIN[0]);

    const layout = {
      paper_bgcolor: 'rgba(0,0,0,0)',
      plot_bgcolor: 'rgba(0,0,0,0)',
      font: { family: colors.font, size: 12, color: colors.text },
      margin: { l: 72, r: 18, t: 34, b: 46 },
      showlegend: true,
      legend: { orientation: 'h', x: 0, y: 1.02, yanchor: 'bottom', traceorder: 'normal', bgcolor: 'rgba(0,0,0,0)', font: { size: 12 } },
      hovermode: 'x',
      // The few labels plotly still draws itself (an event's hint) in the bench's own look.
      hoverlabel: { bgcolor: colors.surface, bordercolor: colors.accent, font: { family: colors.font, size: 12, color: colors.text } },
      dragmode: 'zoom',
      xaxis: { anchor: 'y2', range: [x0, x1], ...axisStyle(colors, axisTicks([x0, x1], 's', 'Time', width, 'x'), 6) },
      yaxis: { domain: mainDomain, range: levels, autorange: false, ...axisStyle(colors, axisTicks(levels, trace.unit, quantityName(trace.unit), mainHeight, 'y'), 4) },
      yaxis2: {
        domain: RESIDUAL_DOMAIN,
        range: residuals,
        autorange: false,
        ...axisStyle(colors, axisTicks(residuals, trace.unit, 'Residual', residualHeight, 'y'), 4),
        zeroline: true,
        zerolinecolor: colors.axis,
        zerolinewidth: 1,
      },
      ...(strip
        ? {
            yaxis3: {
              domain: MODES_DOMAIN,
              range: modeLevels,
              autorange: false,
              ...axisStyle(colors, axisTicks(modeLevels, trace.unit, 'Modes', height * (MODES_DOMAIN[1] - MODES_DOMAIN[0]), 'y'), 4),
              zeroline: true,
              zerolinecolor: colors.axis,
              zerolinewidth: 1,
            },
          }
        : {}),
      // The window: a shaded region below the traces and its two edges above them; the step's marks after them.
      shapes: [
        ...(window
          ? [
              { type: 'rect', xref: 'x', yref: 'paper', x0: window.start, x1: window.end, y0: 0, y1: 1, fillcolor: colors.window, line: { width: 0 }, layer: 'below' },
              edgeLine(window.start, colors.windowEdge),
              edgeLine(window.end, colors.windowEdge),
            ]
          : []),
        ...(marks?.shapes ?? []),
      ],
      // Each event's number above its onset (a click on it fits that event), then the step's marks.
      annotations: [
        ...events.map((e) => ({
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
        ...(marks?.annotations ?? []),
      ],
    };
    const root = await plotly().react(this.root, traces, layout, {
      displayModeBar: false,
      responsive: true,
      // Shapes never move by a drag on the plot: a drag zooms, and only the window's edge handles move the window.
      edits: { shapePosition: false },
      scrollZoom: false,
      // A double-click shows the whole current capture (handled here: plotly's reset returns to the first one drawn).
      doubleClick: false,
      showTips: false,
    });
    this.bindEvents(root);
    this.placeHandles();
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

  private geometry(): { x: AxisGeometry; y: AxisGeometry; y2: AxisGeometry } | null {
    const x = axisGeometry(this.root, 'xaxis');
    const y = axisGeometry(this.root, 'yaxis');
    const y2 = axisGeometry(this.root, 'yaxis2');
    return x && y && y2 ? { x, y, y2 } : null;
  }

  /** The window's edge handles and, when shown, the cursors, where the last draw put the axes. */
  private placeHandles(): void {
    const input = this.input;
    const g = this.geometry();
    if (!input || !g) return this.handles.place([], null);
    const geometry: HandleGeometry = { x: g.x, y: g.y, top: g.y.offset, bottom: g.y2.offset + g.y2.length };
    const specs: HandleSpec[] = [];
    if (input.window) {
      specs.push(
        { id: 'window-start', axis: 'x', value: input.window.start, kind: 'window', label: '', title: 'Fit window start: drag to refit from here' },
        { id: 'window-end', axis: 'x', value: input.window.end, kind: 'window', label: '', title: 'Fit window end: drag to refit up to here' },
      );
    }
    // Cursors shown over a new capture start again inside its view.
    const span = this.span();
    if (this.cursorsShown && !this.cursors && span && this.shownY) this.cursors = placeCursors(this.xRange ?? span, this.yRange ?? this.shownY);
    const cursors = this.cursorsShown ? this.cursors : null;
    if (cursors) {
      const level = levelSymbol(input.trace.unit);
      specs.push(
        { id: 't1', axis: 'x', value: cursors.t1, kind: 'cursor', label: 'T1', title: 'Time cursor 1' },
        { id: 't2', axis: 'x', value: cursors.t2, kind: 'cursor', label: 'T2', title: 'Time cursor 2' },
        { id: 'v1', axis: 'y', value: cursors.v1, kind: 'cursor', label: `${level}1`, title: 'Level cursor 1' },
        { id: 'v2', axis: 'y', value: cursors.v2, kind: 'cursor', label: `${level}2`, title: 'Level cursor 2' },
      );
    }
    this.handles.place(specs, geometry);
    this.showReadouts();
  }

  private showReadouts(): void {
    const cursors = this.cursorsShown ? this.cursors : null;
    this.readout.hidden = !cursors || !this.input;
    this.hints.hidden = !this.readout.hidden;
    if (!cursors || !this.input) return;
    this.readout.replaceChildren(
      ...cursorReadouts(cursors, this.input.trace.unit).map((r) =>
        h('span', { class: 'readout', data: { readout: r.id, value: String(r.value) } }, h('span', { class: 'readout-label' }, r.label), h('span', { class: 'readout-value', id: `cursor-${r.id}` }, r.text)),
      ),
    );
  }

  private handleMoved(id: string, value: number, done: boolean): void {
    const window = this.input?.window;
    if (id === 'window-start' || id === 'window-end') {
      if (!done || !window) return;
      const other = id === 'window-start' ? window.end : window.start;
      this.callbacks.onWindowChange({ start: Math.min(value, other), end: Math.max(value, other) });
      return;
    }
    if (!this.cursors) return;
    this.cursors = { ...this.cursors, [id as CursorId]: value };
    this.showReadouts();
  }

  /** The wheel zooms time about the pointer; with Shift, or over the level axis, it zooms the level of the panel under it. */
  private wheel(event: WheelEvent): void {
    const g = this.geometry();
    const span = this.span();
    if (!g || !span) return;
    const box = this.root.getBoundingClientRect();
    const px = event.clientX - box.left;
    const py = event.clientY - box.top;
    const inside = (axis: AxisGeometry, pixel: number) => pixel >= axis.offset && pixel <= axis.offset + axis.length;
    const overTime = inside(g.x, px);
    const overLevelAxis = px < g.x.offset && (inside(g.y, py) || inside(g.y2, py));
    const delta = event.deltaY || event.deltaX;
    if ((!overTime && !overLevelAxis) || delta === 0) return;
    event.preventDefault();
    const factor = WHEEL_ZOOM_PER_NOTCH ** (delta / WHEEL_NOTCH_PX);
    if (event.shiftKey || overLevelAxis) {
      const residualPanel = inside(g.y2, py);
      const axis = residualPanel ? g.y2 : g.y;
      const zoomed = zoomAbout(axis.range, fromPixel(axis, py, true), factor);
      if (residualPanel) this.y2Range = zoomed;
      else this.yRange = zoomed;
    } else {
      this.xRange = keepWithin(zoomAbout(this.xRange ?? span, fromPixel(g.x, px, false), factor, span), span);
    }
    void this.redraw();
  }

  private bindEvents(root: PlotlyElement): void {
    if (this.bound) return;
    this.bound = true;
    root.on('plotly_relayout', (update) => this.handleRelayout(update));
    root.on('plotly_doubleclick', () => this.showWhole());
    // Plotly also redraws by itself (a resize of the window): the handles follow every drawing.
    root.on('plotly_afterplot', () => this.placeHandles());
    root.on('plotly_hover', (hover) => this.input && this.tip.show(hover, this.input.trace.unit));
    root.on('plotly_unhover', () => this.tip.hide());
    root.on('plotly_clickannotation', (data) => {
      const index = (data as { index?: number }).index;
      const event = index === undefined ? undefined : this.shownEvents[index];
      if (event && !event.fitted) this.callbacks.onEventChoice(event.index);
    });
  }

  /** A box zoom or an axis drag on the plot: the ranges it chose are kept and the plot redrawn for them. */
  private handleRelayout(update: Record<string, unknown>): void {
    const ranges: [string, (r: Range | null) => void][] = [
      ['xaxis', (r) => (this.xRange = r)],
      ['yaxis', (r) => (this.yRange = r)],
      ['yaxis2', (r) => (this.y2Range = r)],
    ];
    let changed = false;
    for (const [axis, keep] of ranges) {
      const range = rangeOf(update, axis);
      if (range) keep(range);
      if (update[`${axis}.autorange`] === true) keep(null);
      changed ||= range !== null || update[`${axis}.autorange`] === true;
    }
    if (changed) void this.redraw();
  }
}

/** The label modeContributions gives the slow term's contribution (drawn dashed, in its own colour). */
const SLOW_TERM_LABEL = 'slow term';

/**
 * The fitted model of several modes at each time: the level before t0, the final level plus every mode's
 * contribution after it (the contributions are zero before t0).
 */
function modelOfModes(params: ResponseParams, time: Float64Array, curves: ModeCurve[]): Float64Array {
  return Float64Array.from(time, (t, i) => (t < params.t0 ? params.yPre : curves.reduce((sum, c) => sum + c.values[i], params.yFinal)));
}

function keyZoom(direction: 'in' | 'out'): number {
  return direction === 'in' ? 1 / KEY_ZOOM : KEY_ZOOM;
}

/** An axis drawn in the bench's colours, its ticks labelled in the prefix its title names. */
function axisStyle(colors: Palette, ticks: AxisTicks, standoff: number): Record<string, unknown> {
  return {
    title: { text: ticks.title, standoff, font: { size: 12, color: colors.muted } },
    tickmode: 'array',
    tickvals: ticks.tickvals,
    ticktext: ticks.ticktext,
    tickfont: { size: 11, color: colors.text },
    showgrid: false,
    zeroline: false,
    showline: true,
    linecolor: colors.axis,
    linewidth: 1,
    mirror: false,
    ticks: 'outside',
    tickcolor: colors.axis,
    ticklen: 4,
    automargin: true,
  };
}

/** One edge of the fit window: a vertical line across both panels (its handle, over the plot, is what moves it). */
function edgeLine(x: number, color: string): Record<string, unknown> {
  return { type: 'line', xref: 'x', yref: 'paper', x0: x, x1: x, y0: 0, y1: 1, line: { color, width: 3 }, layer: 'above' };
}

function line(name: string, x: ArrayLike<number>, y: ArrayLike<number>, color: string, width: number, dash: string, yaxis: 'y' | 'y2' | 'y3'): PlotlyTrace {
  return { type: 'scatter', mode: 'lines', name, x, y, yaxis, line: { color, width, dash, simplify: false }, hoverinfo: 'none' };
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
    out.push({ type: 'scatter', mode: 'markers', name: 'Clipped samples (not fitted)', x: clipped, y, yaxis: 'y', hoverinfo: 'none', marker: { symbol: 'x-thin', size: 7, color: colors.clipped, line: { width: 1.5, color: colors.clipped } } });
  }
  const gaps = within(trace.gapTimes, x0, x1);
  if (gaps.length) {
    const low = Math.min(...reduceMinMax(trace.time, trace.values, x0, x1, 50).y);
    out.push({ type: 'scatter', mode: 'markers', name: 'Dropped rows (gaps)', x: gaps, y: gaps.map(() => low), yaxis: 'y', hoverinfo: 'skip', marker: { symbol: 'triangle-up', size: 8, color: colors.clipped } });
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
