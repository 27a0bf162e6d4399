// Whether one response fitted to a whole record explains each event the search found in it as well as the event's own fit.

import type { ResponseFit } from '../fit/responseFit';
import { windowSpan } from '../fit/trace';
import { fittedModel } from '../report/fittedModel';

/**
 * Largest ratio of residual rms, the whole record's fit over an event's own, in the event's fit window for which the
 * events are taken for one response's swings. Where both describe the data the ratio is 1 within a few per cent
 * (the event's fit spends a few more parameters on its window: 1.00 to 1.07 over the corpus's single responses); an
 * event the whole fit cannot follow leaves it its ring: 4.8 times in three kicks at 20 dB, where the record's overall
 * residual stayed at 2.1 times the noise. Our choice between the two.
 */
export const WHOLE_FIT_AGREEMENT = 1.25;

/** A record's samples: time, values and the flags of the clipped ones (left out here, as by every fit). */
interface Samples {
  time: Float64Array;
  values: Float64Array;
  clipped?: Uint8Array;
}

/**
 * The largest ratio, over the events with a converged fit, of the whole fit's residual rms to the event fit's own, both
 * taken over the event fit's window from the unclipped samples (not from each fit's own fit set, which may be block
 * means); null when no event has a converged fit.
 */
export function wholeFitExcess(whole: ResponseFit, events: ReadonlyArray<ResponseFit | string>, samples: Samples): number | null {
  let worst: number | null = null;
  for (const event of events) {
    if (typeof event === 'string' || event.status !== 'converged') continue;
    const own = residualRms(event, event, samples);
    if (!(own > 0)) continue;
    worst = Math.max(worst ?? 0, residualRms(whole, event, samples) / own);
  }
  return worst;
}

/** Residual rms of `fit` over the unclipped samples inside `over`'s fit window (NaN when there is none). */
function residualRms(fit: Pick<ResponseFit, 'params' | 'modeTerms'>, over: Pick<ResponseFit, 'window'>, { time, values, clipped }: Samples): number {
  const { from, to } = windowSpan(time, over.window);
  const model = fittedModel(fit, time.subarray(from, to));
  let sum = 0;
  let count = 0;
  for (let i = from; i < to; i++) {
    if (clipped?.[i] || !Number.isFinite(values[i])) continue;
    sum += (values[i] - model[i - from]) ** 2;
    count++;
  }
  return Math.sqrt(sum / count);
}
