// `npm run bench:modes`: Monte Carlo RMS error of both modes of a two-mode capture against their Cramér-Rao bound, and coverage.
//
// Usage: tsx bench/modesAccuracy.ts [--runs 200] [--seed 1]
//
// The capture: a ring at 12 MHz (zeta 0.05) and one at 95 MHz (zeta 0.03) summed on a unit step, 1500 samples at
// 2 GS/s, white Gaussian noise at 40 dB of the step (invented for the benchmark). The bound is the inverse
// Fisher information of the two-ring model with the truth's structure (continuous at t0, t0 free) for the same
// record, J^T J / sigma^2 over every parameter (as bench/cramerRao.ts takes it for one ring).

import { cpus } from 'node:os';
import { parseArgs } from 'node:util';
import { inverse, Matrix } from 'ml-matrix';
import { fitResponse, type ResponseFit } from '../core/fit/fitResponse';
import { createRandom } from '../core/random';
import { modesValues, type ModeLinear, type ModeRates, type ModeSpec } from '../core/fit/modesModel';
import { fullVector } from '../core/fit/modesCovariance';
import type { FitSet } from '../core/fit/fitSet';
import { fixed, formatTable, goalLine, machineLine } from './table';

const RATIO_GOAL = 1.5;
const COVERAGE_GOAL: [number, number] = [0.92, 0.98];
/** Half-width of a 95 % interval in standard errors (normal). */
const Z95 = 1.96;

const RINGS = [
  { f0: 12e6, zeta: 0.05, cos: -0.7, sin: 0.2 },
  { f0: 95e6, zeta: 0.03, cos: -0.3, sin: 0.25 },
];
const SAMPLES = 1500;
const DT = 0.5e-9;
const T0 = 50e-9 + DT / 3;
const SIGMA = 0.01;

function truthRates(ring: (typeof RINGS)[0]) {
  const omega0 = 2 * Math.PI * ring.f0;
  const alpha = ring.zeta * omega0;
  return { alpha, omega0, omegaD: Math.sqrt(omega0 * omega0 - alpha * alpha) };
}

function capture(seed: number) {
  const random = createRandom(seed);
  const time = Float64Array.from({ length: SAMPLES }, (_, i) => i * DT);
  const values = time.map((t) => {
    const tau = t - T0;
    let y = 0;
    if (tau >= 0) {
      y = 1;
      for (const ring of RINGS) {
        const { alpha, omegaD } = truthRates(ring);
        y += Math.exp(-alpha * tau) * (ring.cos * Math.cos(omegaD * tau) + ring.sin * Math.sin(omegaD * tau));
      }
    }
    return y + SIGMA * random.normal();
  });
  return { time, values, unit: 'V', name: 'two modes' };
}

/** The bound on each ring's alpha and omega0: the inverse Fisher information of the two-ring model at the truth. */
function bound(time: Float64Array): { alpha: number; omega0: number }[] {
  const spec: ModeSpec = { rings: 2, slow: false, start: 'continuous', fitsT0: true };
  const rates: ModeRates = { rings: RINGS.map((r) => truthRates(r)), slowRate: 0, t0: T0 };
  // S(tau) = sin(omega_d tau) / omega_d: a sine amplitude s is b = s omega_d.
  const linear: ModeLinear = { yPre: 0, yFinal: 1, a: RINGS.map((r) => r.cos), b: RINGS.map((r) => r.sin * truthRates(r).omegaD), slow: 0 };
  const full = fullVector({ spec, rates, linear, sse: 0, status: 'converged', message: '', iterations: 0 });
  const set: FitSet = { time, values: new Float64Array(time.length), dt: DT, range: 2, samplesUsed: time.length, window: { start: 0, end: time[time.length - 1] }, decimation: null, block: null, warnings: [] };
  const model = (v: readonly number[]) => {
    const { rates: r, phi } = full.unpack(v);
    return modesValues(set, spec, r, phi);
  };
  const p = full.values.length;
  const columns = full.values.map((v, j) => {
    const h = 1e-6 * Math.max(Math.abs(v), full.names[j] === 't0' ? 1 / rates.rings[0].omega0 : 1e-3);
    const up = [...full.values];
    const down = [...full.values];
    up[j] += h;
    down[j] -= h;
    const hi = model(up);
    const lo = model(down);
    return Float64Array.from(hi, (x, i) => (x - lo[i]) / (2 * h));
  });
  const information = Matrix.zeros(p, p);
  for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) information.set(a, b, columns[a].reduce((s, x, i) => s + x * columns[b][i], 0) / (SIGMA * SIGMA));
  const covariance = inverse(information);
  return RINGS.map((_, k) => ({ alpha: Math.sqrt(covariance.get(2 * k, 2 * k)), omega0: Math.sqrt(covariance.get(2 * k + 1, 2 * k + 1)) }));
}

/** Each true ring's fitted mode: the one nearest in omega0. */
function matched(fit: ResponseFit) {
  return RINGS.map((ring) => {
    const { omega0 } = truthRates(ring);
    return [...fit.modes].sort((x, y) => Math.abs(x.omega0.value - omega0) - Math.abs(y.omega0.value - omega0))[0];
  });
}

function main(): void {
  const { values: args } = parseArgs({ options: { runs: { type: 'string', default: '200' }, seed: { type: 'string', default: '1' } } });
  const runs = Number(args.runs);
  const seed = Number(args.seed);
  const errors = RINGS.map(() => ({ alpha: [] as number[], omega0: [] as number[], alphaIn: 0, omega0In: 0 }));
  let twoModes = 0;
  let totalMs = 0;
  for (let run = 0; run < runs; run++) {
    const trace = capture(seed * 100_000 + run);
    const started = performance.now();
    const fit = fitResponse(trace);
    totalMs += performance.now() - started;
    if (fit.status !== 'converged' || fit.modes.length !== 2) continue;
    twoModes++;
    matched(fit).forEach((mode, k) => {
      const truth = truthRates(RINGS[k]);
      const e = errors[k];
      e.alpha.push(mode.alpha.value - truth.alpha);
      e.omega0.push(mode.omega0.value - truth.omega0);
      if (mode.alpha.stderr !== null && Math.abs(mode.alpha.value - truth.alpha) <= Z95 * mode.alpha.stderr) e.alphaIn++;
      if (mode.omega0.stderr !== null && Math.abs(mode.omega0.value - truth.omega0) <= Z95 * mode.omega0.stderr) e.omega0In++;
    });
  }
  const crb = bound(capture(seed).time);
  const rms = (xs: number[]) => Math.sqrt(xs.reduce((s, x) => s + x * x, 0) / Math.max(1, xs.length));
  const rows: string[][] = [];
  const ratios: number[] = [];
  const coverages: number[] = [];
  RINGS.forEach((ring, k) => {
    const e = errors[k];
    for (const name of ['alpha', 'omega0'] as const) {
      const ratio = rms(e[name]) / crb[k][name];
      const coverage = (name === 'alpha' ? e.alphaIn : e.omega0In) / Math.max(1, twoModes);
      ratios.push(ratio);
      coverages.push(coverage);
      rows.push([`${ring.f0 / 1e6} MHz ${name}`, fixed(rms(e[name])), fixed(crb[k][name]), fixed(ratio), `${(100 * coverage).toFixed(1)} %`]);
    }
  });
  console.log(`Ringbench two-mode accuracy benchmark: ${machineLine(cpus(), process.version, new Date())}`);
  console.log(`${runs} records (seed ${seed}), ${SAMPLES} samples, 40 dB white noise; ${twoModes} fitted with two modes; ${(totalMs / runs).toFixed(0)} ms per fit`);
  console.log(formatTable(['parameter', 'RMS error', 'CRB', 'RMS/CRB', 'coverage 95 %'], rows));
  console.log(goalLine(twoModes === runs, 'two modes found in every record', `${twoModes} of ${runs}`));
  console.log(goalLine(ratios.every((r) => r <= RATIO_GOAL), `RMS error within ${RATIO_GOAL}x of the CRB`, `largest ${fixed(Math.max(...ratios))}`));
  console.log(
    goalLine(
      coverages.every((c) => c >= COVERAGE_GOAL[0] && c <= COVERAGE_GOAL[1]),
      `coverage of the 95 % intervals between ${100 * COVERAGE_GOAL[0]} % and ${100 * COVERAGE_GOAL[1]} %`,
      `${(100 * Math.min(...coverages)).toFixed(1)} % to ${(100 * Math.max(...coverages)).toFixed(1)} %`,
    ),
  );
}

main();
