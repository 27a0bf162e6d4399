// The plots' colours and font, read from the page's theme each time a plot is drawn.

import { themeColor } from '../theme';

/** Every colour a plot of the bench uses. */
export interface Palette {
  data: string;
  fit: string;
  prediction: string;
  band: string;
  window: string;
  windowEdge: string;
  clipped: string;
  axis: string;
  text: string;
  muted: string;
  surface: string;
  accent: string;
  marker: string;
  /** Each ringing mode's contribution, dominant first, then the slow term's. */
  modes: string[];
  slowTerm: string;
  font: string;
}

export function palette(): Palette {
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
    muted: themeColor('ink-muted'),
    surface: themeColor('surface'),
    accent: themeColor('accent'),
    marker: themeColor('plot-marker'),
    modes: [themeColor('plot-mode-1'), themeColor('plot-mode-2'), themeColor('plot-mode-3')],
    slowTerm: themeColor('plot-slow-term'),
    font: themeColor('font-sans'),
  };
}
