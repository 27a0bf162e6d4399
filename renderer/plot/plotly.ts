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
  on(event: string, listener: (data: unknown) => void): void;
  layout?: PlotlyLayout;
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
