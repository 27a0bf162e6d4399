// The top of a ring peak from a least-squares parabola over the samples about it: noise averaged, not picked.

export interface ParabolaPeak {
  /** Instant of the vertex, s. */
  time: number;
  value: number;
  /** Standard error of the vertex value from the scatter of the samples about the parabola. */
  stderr: number;
  samples: number;
}

/** Fewest samples for a parabola with a scatter estimate worth quoting. */
const MIN_SAMPLES = 7;

/**
 * Fits y = c0 + c1 u + c2 u^2 (u = (t - centre) / halfWidth) to the samples within halfWidth of
 * centre, re-centres once on the vertex, and returns the vertex; null when it is not a maximum or
 * has too few samples. `sign` -1 finds a minimum (a falling step's peak).
 */
export function parabolaPeak(
  time: ArrayLike<number>,
  values: ArrayLike<number>,
  centre: number,
  halfWidth: number,
  sign: 1 | -1 = 1,
): ParabolaPeak | null {
  let fit = fitParabola(time, values, centre, halfWidth, sign);
  if (fit && Math.abs(fit.time - centre) < halfWidth) fit = fitParabola(time, values, fit.time, halfWidth, sign);
  return fit && Math.abs(fit.time - centre) < halfWidth ? fit : null;
}

function fitParabola(time: ArrayLike<number>, values: ArrayLike<number>, centre: number, halfWidth: number, sign: 1 | -1): ParabolaPeak | null {
  // Normal equations in u, whose powers stay within [-1, 1].
  const m = [0, 0, 0, 0, 0];
  const r = [0, 0, 0];
  const picked: number[] = [];
  // The time axis is sorted (the importer sorts or refuses it): only the samples about the centre are visited.
  for (let i = firstAtOrAfter(time, centre - halfWidth); i < time.length && time[i] <= centre + halfWidth; i++) {
    const u = (time[i] - centre) / halfWidth;
    if (Math.abs(u) > 1) continue;
    picked.push(i);
    const y = sign * values[i];
    for (let k = 0, p = 1; k < 5; k++, p *= u) {
      m[k] += p;
      if (k < 3) r[k] += p * y;
    }
  }
  const n = picked.length;
  if (n < MIN_SAMPLES) return null;
  const inverse = invert3([
    [m[0], m[1], m[2]],
    [m[1], m[2], m[3]],
    [m[2], m[3], m[4]],
  ]);
  if (!inverse) return null;
  const c = inverse.map((row) => row[0] * r[0] + row[1] * r[1] + row[2] * r[2]);
  if (!(c[2] < 0)) return null;
  const uPeak = -c[1] / (2 * c[2]);
  let sse = 0;
  for (const i of picked) {
    const u = (time[i] - centre) / halfWidth;
    sse += (sign * values[i] - (c[0] + c[1] * u + c[2] * u * u)) ** 2;
  }
  const s2 = sse / (n - 3);
  // Gradient of the vertex value c0 - c1^2 / (4 c2) with respect to (c0, c1, c2).
  const g = [1, -c[1] / (2 * c[2]), (c[1] * c[1]) / (4 * c[2] * c[2])];
  let variance = 0;
  for (let j = 0; j < 3; j++) for (let k = 0; k < 3; k++) variance += g[j] * inverse[j][k] * g[k] * s2;
  return { time: centre + uPeak * halfWidth, value: sign * (c[0] - (c[1] * c[1]) / (4 * c[2])), stderr: Math.sqrt(Math.max(0, variance)), samples: n };
}

function invert3(a: number[][]): number[][] | null {
  const [[a00, a01, a02], [a10, a11, a12], [a20, a21, a22]] = a;
  const c00 = a11 * a22 - a12 * a21;
  const c01 = a12 * a20 - a10 * a22;
  const c02 = a10 * a21 - a11 * a20;
  const det = a00 * c00 + a01 * c01 + a02 * c02;
  if (!(Math.abs(det) > 0)) return null;
  return [
    [c00 / det, (a02 * a21 - a01 * a22) / det, (a01 * a12 - a02 * a11) / det],
    [c01 / det, (a00 * a22 - a02 * a20) / det, (a02 * a10 - a00 * a12) / det],
    [c02 / det, (a01 * a20 - a00 * a21) / det, (a00 * a11 - a01 * a10) / det],
  ];
}

/** Index of the first sample at or after t (time sorted ascending); time.length when there is none. */
export function firstAtOrAfter(time: ArrayLike<number>, t: number): number {
  let lo = 0;
  let hi = time.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (time[mid] < t) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
