// Trust table rows on top of the numbered cases: steps driven through a finite edge (a gate driver's or a pulse
// generator's ramp), whose first samples bend away from an instant step's, end right.

import { fitResponse } from '../../../../core/fit/fitResponse';
import { coefficientsFromInitial, evaluateResponse } from '../../../../core/response/secondOrder';
import { outcomeOfFit, type TrustCase } from '../trustCase';
import { generatedTrace, type RecordSpec } from '../responseRecords';

/** Points of the edge the response is averaged over: the ramp's response as the mean of steps spread across it. */
const EDGE_POINTS = 201;

interface EdgeRow {
  name: string;
  spec: RecordSpec;
  zeta: number;
  /** Ring frequency, Hz. */
  frequency: number;
  /** The step's height, from 0. */
  height: number;
  /** The edge's duration (0 to 100 % linearly), s. */
  edge: number;
  pre: number;
}

/**
 * A second-order step response driven by a linear ramp of the input over `edge`: by superposition, the mean of the
 * instant step's responses started across the ramp (an input that rises linearly is a row of equal small steps).
 */
function edgeRow(row: EdgeRow): TrustCase {
  const t0 = row.pre * row.spec.samples * row.spec.dt;
  const omega0 = (2 * Math.PI * row.frequency) / Math.sqrt(1 - row.zeta * row.zeta);
  const alpha = row.zeta * omega0;
  const { a, b } = coefficientsFromInitial(0, 0, row.height, alpha);
  const shape = (time: Float64Array) => {
    const sum = new Float64Array(time.length);
    for (let j = 0; j < EDGE_POINTS; j++) {
      const step = evaluateResponse({ t0: t0 + (row.edge * j) / (EDGE_POINTS - 1), yPre: 0, yFinal: row.height, alpha, omega0, a, b }, time);
      for (let i = 0; i < time.length; i++) sum[i] += step[i] / EDGE_POINTS;
    }
    return sum;
  };
  return {
    issueCase: 0,
    name: row.name,
    expect: 'right',
    truth: { alpha, omega0 },
    regime: 'underdamped',
    run: () => outcomeOfFit(fitResponse(generatedTrace(row.spec, shape))),
  };
}

const RING = { zeta: 0.08, frequency: 5e6, height: 10, pre: 0.125 };
const SPEC = { samples: 4000, dt: 1e-9, noise: 0.1 };

export const finiteEdgeCases: TrustCase[] = [
  // Held to an instant step's start, the first and third read alpha 6.0 and 6.8 standard errors high, with no warning.
  edgeRow({ name: 'a 10 V step through a 20 ns edge (a tenth of the ring period), 37 dB', spec: { ...SPEC, seed: 701 }, ...RING, edge: 20e-9 }),
  edgeRow({ name: 'the same through a 20 ns edge, another noise', spec: { ...SPEC, seed: 702 }, ...RING, edge: 20e-9 }),
  edgeRow({ name: 'the same through a 20 ns edge, a third noise', spec: { ...SPEC, seed: 703 }, ...RING, edge: 20e-9 }),
  edgeRow({ name: 'a 10 V step through a 40 ns edge (a fifth of the ring period), 37 dB', spec: { ...SPEC, seed: 704 }, ...RING, edge: 40e-9 }),
  edgeRow({ name: 'a 10 V step through a 10 ns edge (a twentieth of the ring period), 37 dB', spec: { ...SPEC, seed: 705 }, ...RING, edge: 10e-9 }),
  edgeRow({ name: 'the same through a 10 ns edge, another noise', spec: { ...SPEC, seed: 706 }, ...RING, edge: 10e-9 }),
  edgeRow({ name: 'the same through a 10 ns edge, a third noise', spec: { ...SPEC, seed: 707 }, ...RING, edge: 10e-9 }),
  edgeRow({ name: 'the same through a 10 ns edge, a fourth noise', spec: { ...SPEC, seed: 708 }, ...RING, edge: 10e-9 }),
];
