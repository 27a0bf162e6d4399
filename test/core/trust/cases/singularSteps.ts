// Trust table rows: see trustCase.ts. Case 10: records that drive the fit's decompositions into singular or non-finite corners end, right or declared failed.

import { fitResponse } from '../../../../core/fit/fitResponse';
import { coefficientsFromInitial, evaluateResponse } from '../../../../core/response/secondOrder';
import { createRandom } from '../../../../core/random';
import { outcomeOfFit, type TrustCase } from '../trustCase';

const SAMPLES = 1000;
const DT = 1e-8;
/** A ring of the gate-drive kind: omega0 = 2 pi 1 MHz, zeta 0.1, the event at 1 us. */
const OMEGA0 = 2 * Math.PI * 1e6;
const ALPHA = 0.1 * OMEGA0;
const T0 = 1e-6 + 0.37 * DT;
const NEAR_MAX = 1e308;
const DENORMAL = 5e-324;

const time = Float64Array.from({ length: SAMPLES }, (_, i) => i * DT);

/** The 0 -> 1 step of the ring with seeded noise of rms `noise` (relative to the step). */
function ringStep(seed: number, noise: number): Float64Array {
  const { a, b } = coefficientsFromInitial(0, 0, 1, ALPHA);
  const clean = evaluateResponse({ t0: T0, yPre: 0, yFinal: 1, alpha: ALPHA, omega0: OMEGA0, a, b }, time);
  const random = createRandom(seed);
  return clean.map((v) => v + noise * random.normal());
}

function row(name: string, expect: TrustCase['expect'], values: () => ArrayLike<number>, truth: Record<string, number> = {}): TrustCase {
  return {
    issueCase: 10,
    name,
    expect,
    truth,
    run: () => outcomeOfFit(fitResponse({ time, values: Float64Array.from(values()), unit: 'V' })),
  };
}

const RING_TRUTH = { alpha: ALPHA, omega0: OMEGA0 };

export const singularStepsCases: TrustCase[] = [
  row('all samples equal (a rank-one Hankel matrix for the pencil)', 'failed', () => new Array(SAMPLES).fill(12.4)),
  row('a ring scaled past the largest double (Infinity after the event)', 'failed', () => ringStep(101, 0.01).map((v) => v * NEAR_MAX * 10)),
  row('a ring scaled near 1e308 (sums of squares overflow)', 'right-or-failed', () => ringStep(102, 0.01).map((v) => v * NEAR_MAX * 0.5), RING_TRUTH),
  row('a ring in denormal steps (sums of squares underflow)', 'right-or-failed', () => ringStep(103, 0.01).map((v) => DENORMAL * Math.round(8 * v)), RING_TRUTH),
  row('a ring with NaN samples every 100', 'right-or-failed', () => ringStep(104, 0.01).map((v, i) => (i % 100 === 7 ? NaN : v)), RING_TRUTH),
  // No truth to hold these to: they must end, and whatever they claim is not checked against a truth.
  row('a single spike on zeros', 'right-or-failed', () => Array.from({ length: SAMPLES }, (_, i) => (i === 500 ? 1 : 0))),
  row('alternating signs at the sample rate', 'right-or-failed', () => Array.from({ length: SAMPLES }, (_, i) => (i % 2 ? 1 : -1))),
  row('two flat levels with an instant step between them', 'right-or-failed', () => Array.from({ length: SAMPLES }, (_, i) => (i < 500 ? 0 : 1))),
];
