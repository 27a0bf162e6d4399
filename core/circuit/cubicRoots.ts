// The three roots of a real cubic, for the poles of a snubbed loop.

export interface Complex {
  re: number;
  im: number;
}

/**
 * Roots of c3 z^3 + c2 z^2 + c1 z + c0 (c3 != 0, coefficients of moderate size: scale the variable
 * first). One real root by bisection inside the Cauchy bound, polished by Newton, then the deflated
 * quadratic by the cancellation-free formula. Real roots first, then a complex pair (im > 0 first).
 */
export function cubicRoots(c3: number, c2: number, c1: number, c0: number): Complex[] {
  const b = c2 / c3;
  const c = c1 / c3;
  const d = c0 / c3;
  const f = (z: number) => ((z + b) * z + c) * z + d;
  const bound = 1 + Math.max(Math.abs(b), Math.abs(c), Math.abs(d));
  let lo = -bound;
  let hi = bound;
  for (let i = 0; i < 200 && hi - lo > 1e-15 * bound; i++) {
    const mid = (lo + hi) / 2;
    if (f(mid) < 0) lo = mid;
    else hi = mid;
  }
  let r = (lo + hi) / 2;
  for (let i = 0; i < 3; i++) {
    const slope = (3 * r + 2 * b) * r + c;
    if (slope === 0) break;
    r -= f(r) / slope;
  }
  // z^3 + b z^2 + c z + d = (z - r)(z^2 + p z + q)
  const p = b + r;
  const q = c + r * p;
  return [{ re: r, im: 0 }, ...quadraticRoots(p, q)].sort((u, v) => Math.abs(u.im) - Math.abs(v.im) || v.im - u.im);
}

/** Roots of z^2 + p z + q, real ones without cancellation. */
export function quadraticRoots(p: number, q: number): Complex[] {
  const disc = p * p - 4 * q;
  if (disc >= 0) {
    const s = -(p + Math.sign(p || 1) * Math.sqrt(disc)) / 2;
    const other = s === 0 ? 0 : q / s;
    return [
      { re: s, im: 0 },
      { re: other, im: 0 },
    ];
  }
  const im = Math.sqrt(-disc) / 2;
  return [
    { re: -p / 2, im },
    { re: -p / 2, im: -im },
  ];
}
