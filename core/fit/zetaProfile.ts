// The profile of the residual along zeta: where the data stop telling the damping apart, as parameter vectors.

import { LAYOUTS, type ParameterLayout } from './responseModel';
import type { FitSet } from './fitSet';
import { solveAmplitudes } from './amplitudes';
import { refine } from './refine';

/** Where the profile crosses a level: the full parameter vector there, and the level in standard errors. */
export interface ProfileCrossing {
  sigmas: number;
  values: number[];
}

export interface ZetaProfile {
  crossings: ProfileCrossing[];
  /** Zeta's interval at each level that the profile closed on both sides (the top of it may be Infinity). */
  interval: { sigmas: number; low: number; high: number }[];
  /** Whether some level was not reached towards high zeta: a single decay (the fast root gone) fits within it. */
  unbounded: boolean;
  /** The lowest residual met along the way (below the fit's own when the fit was not at the minimum). */
  lowestSse: number;
}

/**
 * The levels, in standard errors, at which the profile is read: a stated error must reach each crossing
 * at its level, so the 1, 2 and 3 sigma statements all hold where the profile is not a parabola.
 */
export const PROFILE_SIGMAS = [1, 2, 3];
/** First step in ln(zeta), then each step this much longer: the profile's far side can be very flat. */
const FIRST_STEP = 0.03;
const STEP_GROWTH = 1.6;
/** Beyond this zeta (or below its inverse) the profile is taken as open. */
const ZETA_LIMIT = 1000;
/** At most this many profile points a side: bounds the time (a step grows by STEP_GROWTH each time). */
const MAX_POINTS = 24;

interface Point {
  zeta: number;
  sse: number;
  values: number[];
}

/**
 * Walks zeta up and down from the fit, each point refitted with zeta held (everything else free), until the
 * residual has risen by 3^2 residual variances or zeta leaves [1/ZETA_LIMIT, ZETA_LIMIT]. Moving zeta, the
 * start keeps the slow root where both points are overdamped (the part the data fix best), omega0 otherwise.
 */
export function zetaProfile(set: FitSet, layout: ParameterLayout, values: readonly number[], t0Fixed: number, variance: number): ZetaProfile {
  const { index, fitsT0 } = LAYOUTS[layout];
  const [alpha, omega0] = [values[index.alpha], values[index.omega0]];
  const ownSse = solveAmplitudes(layout, set.time, set.values, alpha, omega0, fitsT0 ? values[index.t0] : t0Fixed, undefined, set.block).sse;
  const best: Point = { zeta: alpha / omega0, sse: ownSse, values: [...values] };
  const top = PROFILE_SIGMAS[PROFILE_SIGMAS.length - 1];
  const sides = [1, -1].map((direction) => {
    const points: Point[] = [best];
    let step = FIRST_STEP;
    let lnZeta = Math.log(best.zeta);
    while (points.length <= MAX_POINTS) {
      lnZeta += direction * step;
      step *= STEP_GROWTH;
      const zeta = Math.exp(lnZeta);
      if (zeta > ZETA_LIMIT || zeta < 1 / ZETA_LIMIT) break;
      const from = points[points.length - 1];
      const omega0 = startingOmega0(from, zeta, index);
      const t0 = fitsT0 ? from.values[index.t0] : t0Fixed;
      const attempt = refine(set, layout, { alpha: zeta * omega0, omega0, source: 'zeta profile' }, t0, { fixedZeta: zeta });
      if (!Number.isFinite(attempt.sse)) break;
      points.push({ zeta, sse: attempt.sse, values: attempt.values });
      if (attempt.sse - Math.min(...points.map((p) => p.sse)) > top * top * variance) break;
    }
    return points;
  });
  return readProfile(sides, variance);
}

/** The crossings of each level on both sides, measured from the lowest residual met. */
function readProfile(sides: Point[][], variance: number): ZetaProfile {
  const lowestSse = Math.min(...sides.flat().map((p) => p.sse));
  const crossings: ProfileCrossing[] = [];
  const ends: { sigmas: number; low: number; high: number }[] = [];
  let unbounded = false;
  for (const sigmas of PROFILE_SIGMAS) {
    const level = lowestSse + sigmas * sigmas * variance;
    const [up, down] = sides.map((side) => crossing(side, level, lowestSse));
    if (!up) unbounded = true;
    for (const c of [up, down]) if (c) crossings.push({ sigmas, values: c.values });
    ends.push({ sigmas, low: down ? down.zeta : 0, high: up ? up.zeta : Infinity });
  }
  return { crossings, interval: ends, unbounded, lowestSse };
}

/**
 * The first point where the side's residual reaches the level, interpolated between the points around it in
 * sqrt(residual - lowest): linear in zeta where the profile is a parabola, so a step far longer than the
 * interval (a zeta fixed to 0.2 % walked in 3 % steps) still places the crossing right, where interpolating
 * the residual itself would put it several times too close.
 */
function crossing(side: Point[], level: number, lowestSse: number): Point | null {
  const rise = (sse: number) => Math.sqrt(Math.max(0, sse - lowestSse));
  for (let k = 1; k < side.length; k++) {
    const [a, b] = [side[k - 1], side[k]];
    if (b.sse < level) continue;
    const share = a.sse >= level ? 0 : (rise(level) - rise(a.sse)) / (rise(b.sse) - rise(a.sse));
    return {
      zeta: a.zeta + share * (b.zeta - a.zeta),
      sse: level,
      values: a.values.map((v, j) => v + share * (b.values[j] - v)),
    };
  }
  return null;
}

/** omega0 for the next zeta: the slow root kept when both are overdamped, omega0 kept otherwise. */
function startingOmega0(from: Point, zeta: number, index: Readonly<Record<string, number>>): number {
  const omega0 = from.values[index.omega0];
  if (!(from.zeta > 1 && zeta > 1)) return omega0;
  const slowShare = (z: number) => z - Math.sqrt(z * z - 1);
  return (omega0 * slowShare(from.zeta)) / slowShare(zeta);
}
