// The limits a design's component tolerances give a quantity: its extremes over the tolerance corners.

import type { QuantityLimits } from './decisionRule';
import type { Design } from './design';
import { COMPONENT_NAMES } from './relations';

/** The three parts of a design: 2^3 corners with each at one end of its tolerance. */
const CORNERS = 1 << COMPONENT_NAMES.length;

/**
 * Lower and upper limit of `evaluate` over the nominal design and the 8 corners with every part at an end of
 * its tolerance (worst case, an arithmetic stack-up of the tolerances). For a power law of R, L and C
 * (alpha, omega0, zeta, Q, f0) that is exact: each is monotonic in each part, so its extremes sit at corners.
 * For a time constant or a level it is the corner estimate, as the tolerance band's corners are. A corner
 * where the quantity is not defined (null or not finite: a design that rings at that corner has no single
 * decay) is left out.
 */
export function toleranceLimits(design: Design, evaluate: (corner: Design) => number | null): QuantityLimits {
  let lower = Infinity;
  let upper = -Infinity;
  const include = (corner: Design) => {
    const v = evaluate(corner);
    if (v === null || !Number.isFinite(v)) return;
    lower = Math.min(lower, v);
    upper = Math.max(upper, v);
  };
  include(design);
  for (let corner = 0; corner < CORNERS; corner++) {
    const components = { ...design.components };
    COMPONENT_NAMES.forEach((name, k) => {
      const spec = design.components[name];
      components[name] = { ...spec, value: spec.value * (1 + ((corner >> k) & 1 ? 1 : -1) * spec.tolerance) };
    });
    include({ ...design, components });
  }
  return Number.isFinite(lower) ? { lower, upper } : { lower: null, upper: null };
}

/** Limits widened by `margin` on both sides (a level's own tolerance on top of the parts' spread). */
export function widenLimits(limits: QuantityLimits, margin: number): QuantityLimits {
  return { lower: limits.lower === null ? null : limits.lower - margin, upper: limits.upper === null ? null : limits.upper + margin };
}
