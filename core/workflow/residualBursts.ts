// Where a misfit's residual lies: spread along the window (a second ring, an event the search missed) or in a few
// samples standing apart (glitches or pickup wider than the one sample the spike filter leaves out).

import type { ResponseFit } from '../fit/responseFit';
import { MAD_TO_SIGMA, median } from '../fit/noise';
import { windowSpan } from '../fit/trace';
import { fittedModel } from '../report/fittedModel';

/** A sample whose residual stands this many robust deviations of the residuals apart is in a burst (our choice). */
const BURST_DEVIATIONS = 10;
/** The bursts explain a misfit when they hold at least this share of the residual's sum of squares... */
const BURST_SHARE = 0.5;
/** ...in at most this share of the window's samples (our choice). */
const BURST_SAMPLES = 0.02;

/**
 * The samples of the fit's window whose residuals stand BURST_DEVIATIONS robust deviations apart, with their share
 * of the residual's sum of squares, when they explain the misfit (BURST_SHARE of it in at most BURST_SAMPLES of the
 * samples); null otherwise.
 */
export function residualBursts(fit: Pick<ResponseFit, 'params' | 'modeTerms' | 'window'>, time: Float64Array, values: Float64Array): { samples: number; share: number } | null {
  const { from, to } = windowSpan(time, fit.window);
  if (to - from < 3) return null;
  const times = time.subarray(from, to);
  const model = fittedModel(fit, times);
  const residuals = Float64Array.from(times, (_, i) => values[from + i] - model[i]);
  const spread = MAD_TO_SIGMA * median(residuals.map(Math.abs));
  if (!(spread > 0)) return null;
  let total = 0;
  let inBursts = 0;
  let samples = 0;
  for (const r of residuals) {
    total += r * r;
    if (Math.abs(r) > BURST_DEVIATIONS * spread) {
      inBursts += r * r;
      samples++;
    }
  }
  const share = inBursts / total;
  return share >= BURST_SHARE && samples > 0 && samples <= BURST_SAMPLES * residuals.length ? { samples, share } : null;
}
