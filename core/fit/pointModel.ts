// The fitted response at every sample of a long record, computed a chunk at a time into two reused buffers.

import { fillDampedBasis, RECURRENCE_RUN, type ResponseParams } from '../response/secondOrder';
import { unpackParams, type ParameterLayout } from './responseModel';

/**
 * Samples computed at a time: 64 KiB a buffer stays in the cache. Holding the model of a 10^6-sample record whole
 * took 16 MB of fresh memory, whose first touch cost 40 ms where each 4 KiB page faults (a virtual machine). A
 * multiple of the basis's recurrence run, so that every chunk's runs fall where a whole-span fill puts them and the
 * values are the same to the bit.
 */
export const POINT_CHUNK = 512 * RECURRENCE_RUN;
/**
 * Relative room added to a chunk's bound on the model: the values come from a recurrence on each run's line, within
 * 1e-6 of a step of the recorded times (so within 1e-6 of e^(alpha h) of the bound at them) and a few ulps of rounding.
 */
const BOUND_ROOM = 1e-5;

/** Lowest and highest value the model can take over a chunk's samples. */
export interface ModelRange {
  lo: number;
  hi: number;
}

/** The model of a layout's parameter vector at the samples of a time axis (in rising order), read chunk by chunk. */
export class PointModel {
  private readonly params: ResponseParams;
  private readonly ec = new Float64Array(POINT_CHUNK);
  private readonly es = new Float64Array(POINT_CHUNK);

  constructor(
    layout: ParameterLayout,
    values: readonly number[],
    fixedT0: number,
    private readonly time: Float64Array,
  ) {
    this.params = unpackParams(layout, values, fixedT0);
  }

  /**
   * Calls visit(first, y) over consecutive chunks of the samples [from, to): y[k] is the model at time[first + k], valid
   * only during the call. A chunk for which `skip` (given a range the model stays in over it) returns true is neither
   * computed nor visited.
   */
  forEachChunk(from: number, to: number, visit: (first: number, y: Float64Array) => void, skip?: (range: ModelRange) => boolean): void {
    const { alpha, omega0, t0, yPre, yFinal, a, b } = this.params;
    for (let first = from; first < to; first += POINT_CHUNK) {
      const count = Math.min(to, first + POINT_CHUNK) - first;
      const time = this.time.subarray(first, first + count);
      if (skip && skip(this.rangeOver(time[0], time[count - 1]))) continue;
      const y = this.ec.subarray(0, count);
      if (time[count - 1] < t0) y.fill(yPre);
      else {
        const es = this.es.subarray(0, count);
        fillDampedBasis(alpha, omega0, t0, time, y, es);
        for (let k = 0; k < count; k++) y[k] = time[k] < t0 ? yPre : yFinal + a * y[k] + b * es[k];
      }
      visit(first, y);
    }
  }

  /** A range the model stays in between the times `start` and `end`: the level before t0, and yFinal within the natural part's envelope after it. */
  private rangeOver(start: number, end: number): ModelRange {
    const { t0, yPre, yFinal } = this.params;
    if (end < t0) return { lo: yPre, hi: yPre };
    const reach = this.naturalBound(Math.max(0, start - t0), end - t0) * (1 + BOUND_ROOM);
    const range = { lo: yFinal - reach, hi: yFinal + reach };
    return start < t0 ? { lo: Math.min(range.lo, yPre), hi: Math.max(range.hi, yPre) } : range;
  }

  /**
   * A bound on |e^(-alpha tau) (a C(tau) + b S(tau))| for tau in [from, to] (see secondOrder.ts): underdamped,
   * a cos + (b / w) sin never exceeds hypot(a, b / w); overdamped, the two poles' terms (a +- b / w) / 2 e^(s tau)
   * are each monotonic. Infinity at critical damping exactly, where neither form holds.
   */
  private naturalBound(from: number, to: number): number {
    const { alpha, omega0, a, b } = this.params;
    const q = omega0 * omega0 - alpha * alpha;
    const w = Math.sqrt(Math.abs(q));
    if (!(w > 0)) return Infinity;
    if (q > 0) return Math.hypot(a, b / w) * Math.max(Math.exp(-alpha * from), Math.exp(-alpha * to));
    const slow = (Math.abs(a + b / w) / 2) * Math.max(Math.exp((w - alpha) * from), Math.exp((w - alpha) * to));
    const fast = (Math.abs(a - b / w) / 2) * Math.max(Math.exp(-(w + alpha) * from), Math.exp(-(w + alpha) * to));
    return slow + fast;
  }
}
