// Markers of the step's transition metrics on the plot: the overshoot at its peak, and where the response settles within 2 %.

import type { TransitionSummary } from '../../core/circuit/transitionSummary';
import { formatEngineering } from '../../core/units/format';

/** The settling band drawn: the 2 % one, as the fit panel's first settling time. */
const SETTLING_SHARE = 0.02;
/** The band's edges lie on the final level's noise and on the prediction: drawn faint, the settling line is what to read. */
const BAND_OPACITY = 0.55;

export interface MarkerColors {
  marker: string;
  surface: string;
  text: string;
}

export interface TransitionMarks {
  shapes: Record<string, unknown>[];
  annotations: Record<string, unknown>[];
  /** Where each mark sits in SI units (for a reader of the page): peak time and level, settling instant. */
  positions: { peakTime: number | null; peakLevel: number | null; settledAt: number | null };
}

/** Marks from the fitted model's metrics (the curve drawn), empty when the fit measured no step. */
export function transitionMarks(transitions: TransitionSummary | undefined, timeEnd: number, colors: MarkerColors): TransitionMarks {
  const marks: TransitionMarks = { shapes: [], annotations: [], positions: { peakTime: null, peakLevel: null, settledAt: null } };
  const model = transitions?.model;
  if (!transitions || transitions.reason !== null || !model) return marks;
  const { initial, final } = transitions.levels;
  const step = final - initial;
  const t0 = transitions.eventTime;
  const label = { bgcolor: colors.surface, bordercolor: colors.marker, borderwidth: 1, borderpad: 3, font: { color: colors.text, size: 11 } };
  if (model.peakTime && model.overshoot.value > 0) {
    const at = t0 + model.peakTime.value;
    const level = final + (model.overshoot.value / 100) * step;
    marks.positions.peakTime = at;
    marks.positions.peakLevel = level;
    marks.shapes.push({ type: 'line', xref: 'x', yref: 'y', x0: at, x1: at, y0: final, y1: level, line: { color: colors.marker, width: 1.5, dash: 'dot' } });
    marks.annotations.push({
      ...label,
      name: 'overshoot',
      x: at,
      y: level,
      xref: 'x',
      yref: 'y',
      showarrow: true,
      arrowcolor: colors.marker,
      arrowhead: 0,
      arrowwidth: 1.5,
      // The peak is the curve's extreme: its label goes beside it, towards the final level, inside the plot.
      ax: 34,
      ay: step > 0 ? 22 : -22,
      xanchor: 'left',
      yanchor: step > 0 ? 'top' : 'bottom',
      text: `overshoot ${model.overshoot.value.toFixed(1)} %<br>peak time ${formatEngineering(model.peakTime.value, 's', 3)}`,
    });
  }
  const settledAt = t0 + model.settlingTime2.value;
  if (Number.isFinite(settledAt)) {
    marks.positions.settledAt = settledAt;
    const band = Math.abs(step) * SETTLING_SHARE;
    const dashed = { color: colors.marker, width: 1, dash: 'dash' };
    marks.shapes.push(
      { type: 'line', xref: 'x', yref: 'y domain', x0: settledAt, x1: settledAt, y0: 0, y1: 1, line: { color: colors.marker, width: 1.5, dash: 'dot' } },
      { type: 'line', xref: 'x', yref: 'y', x0: settledAt, x1: Math.max(settledAt, timeEnd), y0: final + band, y1: final + band, line: dashed, opacity: BAND_OPACITY },
      { type: 'line', xref: 'x', yref: 'y', x0: settledAt, x1: Math.max(settledAt, timeEnd), y0: final - band, y1: final - band, line: dashed, opacity: BAND_OPACITY },
    );
    marks.annotations.push({
      ...label,
      name: 'settled',
      x: settledAt,
      y: step > 0 ? 0.04 : 0.96,
      xref: 'x',
      yref: 'y domain',
      showarrow: false,
      xanchor: 'left',
      yanchor: step > 0 ? 'bottom' : 'top',
      text: `settling time (2 %) ${formatEngineering(model.settlingTime2.value, 's', 3)}`,
    });
  }
  return marks;
}
