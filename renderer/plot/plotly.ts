// The part of plotly's API the bench uses; plotly itself is loaded as its own script (window.Plotly).

export interface PlotlyTrace {
  [key: string]: unknown;
  x?: ArrayLike<number>;
  y?: ArrayLike<number>;
}

export type PlotlyLayout = Record<string, unknown>;

export interface PlotlyElement extends HTMLDivElement {
  on(event: 'plotly_relayout', listener: (update: Record<string, unknown>) => void): void;
  /** A click on an annotation made with captureevents: its index among the layout's annotations. */
  on(event: 'plotly_clickannotation', listener: (data: { index: number }) => void): void;
  /** The points under the pointer (hovermode 'x': one per trace) and the mouse event. */
  on(event: 'plotly_hover', listener: (data: PlotlyHover) => void): void;
  on(event: string, listener: (data: unknown) => void): void;
  layout?: PlotlyLayout;
}

export interface PlotlyHover {
  points: { x: number; y: number; data: { name?: string; yaxis?: string } }[];
  event: MouseEvent;
}

/** Where an axis lies on the plot element, in pixels from its top left, and the range it shows. */
export interface AxisGeometry {
  offset: number;
  length: number;
  range: [number, number];
}

/** The drawn geometry of one axis (plotly's laid-out axis: offset and length in pixels), or null before the first draw. */
export function axisGeometry(root: HTMLElement, name: 'xaxis' | 'yaxis' | 'yaxis2'): AxisGeometry | null {
  const axis = (root as unknown as { _fullLayout?: Record<string, { _offset?: number; _length?: number; range?: unknown[] }> })._fullLayout?.[name];
  if (!axis || typeof axis._offset !== 'number' || typeof axis._length !== 'number' || !Array.isArray(axis.range)) return null;
  return { offset: axis._offset, length: axis._length, range: [Number(axis.range[0]), Number(axis.range[1])] };
}

/** A value to its pixel along the axis (a vertical axis grows upwards). */
export function toPixel(axis: AxisGeometry, value: number, vertical: boolean): number {
  const share = (value - axis.range[0]) / (axis.range[1] - axis.range[0]);
  return axis.offset + axis.length * (vertical ? 1 - share : share);
}

/** A pixel along the axis to its value. */
export function fromPixel(axis: AxisGeometry, pixel: number, vertical: boolean): number {
  const share = (pixel - axis.offset) / axis.length;
  return axis.range[0] + (axis.range[1] - axis.range[0]) * (vertical ? 1 - share : share);
}

export interface PlotlyApi {
  react(root: HTMLElement, data: PlotlyTrace[], layout: PlotlyLayout, config?: Record<string, unknown>): Promise<PlotlyElement>;
  toImage(root: HTMLElement, options: { format: 'png' | 'svg'; width: number; height: number; scale?: number }): Promise<string>;
  relayout(root: HTMLElement, update: Record<string, unknown>): Promise<PlotlyElement>;
  purge(root: HTMLElement): void;
  Plots: { resize(root: HTMLElement): void };
}

export function plotly(): PlotlyApi {
  const api = (window as unknown as { Plotly?: PlotlyApi }).Plotly;
  if (!api) throw new Error('the plotting library did not load (plotly.min.js)');
  return api;
}
