// One worker of the accuracy benchmark: fits every run of the cases it is given and prints one JSON summary line per case.
//
// Usage: tsx bench/accuracyWorker.ts <samples> <runs> <seed> <case ids, comma-separated>

import { fitResponse } from '../core/fit/fitResponse';
import { accuracyCases, caseTruth, LOW_PASS_RHO, synthesize, type AccuracyCase } from './accuracyCases';
import { cramerRaoBound, type Bound } from './cramerRao';

/** Spread and calibration of one estimated quantity over the runs that gave it. */
export interface Spread {
  rms: number;
  bias: number;
  /** Fraction of all runs whose value ± 1.96 stderr contains the truth (a missing estimate or uncertainty counts as a miss). */
  coverage: number;
  meanStderr: number;
}

export interface CaseSummary {
  id: number;
  runs: number;
  /** Runs whose status is not 'converged' (failed or stopped at the iteration limit). */
  notConverged: number;
  /** Runs without an omega_d and its uncertainty (the fit found the response not underdamped, or no covariance). */
  noOmegaD: number;
  /** Runs where the fit chose the layout with a free initial slope over the zero-slope one. */
  freeSlope: number;
  omegaD: Spread;
  alpha: Spread;
  /** The same over the runs whose status is 'converged' only (coverage a fraction of those runs). */
  convergedOmegaD: Spread;
  convergedAlpha: Spread;
  /** Converged runs that fitted t0 (the event was found, so the model matches the record), their count and spreads. */
  located: number;
  locatedOmegaD: Spread;
  locatedAlpha: Spread;
  /** Largest |error| / reported stderr among converged runs, omega_d and alpha (a confident outlier shows here). */
  worstSigmas: [number, number];
  /** The bound for white noise of the same rms, and for the case's own noise. */
  bound: { white: Bound; actual: Bound };
  msPerFit: number;
}

class Tally {
  private sumSquares = 0;
  private sum = 0;
  private count = 0;
  private covered = 0;
  private stderrSum = 0;
  worst = 0;

  add(value: number, stderr: number, truth: number): void {
    const error = value - truth;
    this.worst = Math.max(this.worst, Math.abs(error) / stderr);
    this.sumSquares += error * error;
    this.sum += error;
    this.count++;
    this.stderrSum += stderr;
    if (Math.abs(error) <= 1.96 * stderr) this.covered++;
  }

  /** Over the runs that gave an estimate with an uncertainty. */
  spread(runs: number): Spread {
    return {
      rms: Math.sqrt(this.sumSquares / this.count),
      bias: this.sum / this.count,
      coverage: this.covered / runs,
      meanStderr: this.stderrSum / this.count,
    };
  }
}

function runCase(c: AccuracyCase, samples: number, runs: number, seed: number): CaseSummary {
  const { time, truth, noiseRms } = caseTruth(c, samples);
  // The true response starts from rest: the fit's zero-slope layout, [alpha, omega0, t0, yPre, yFinal].
  const values = [truth.alpha, truth.omega0, truth.t0, truth.yPre, truth.yFinal];
  const rho = c.noise === 'low-pass' ? LOW_PASS_RHO : 0;
  const bound = {
    white: cramerRaoBound('smooth', values, truth.t0, time, { rms: noiseRms, rho: 0 }),
    actual: cramerRaoBound('smooth', values, truth.t0, time, { rms: noiseRms, rho }),
  };
  const omegaDTruth = Math.sqrt(truth.omega0 ** 2 - truth.alpha ** 2);
  const omegaD = new Tally();
  const alpha = new Tally();
  const convergedOmegaD = new Tally();
  const convergedAlpha = new Tally();
  const locatedOmegaD = new Tally();
  const locatedAlpha = new Tally();
  let located = 0;
  let notConverged = 0;
  let noOmegaD = 0;
  let freeSlope = 0;
  const start = performance.now();
  for (let run = 0; run < runs; run++) {
    const fit = fitResponse(synthesize(c, samples, run, seed).trace);
    if (fit.status !== 'converged') notConverged++;
    if (fit.correlation?.names.includes('b')) freeSlope++;
    const wd = fit.omegaD;
    const converged = fit.status === 'converged';
    const eventFound = converged && fit.correlation?.names.includes('t0') === true;
    if (eventFound) located++;
    if (wd && wd.stderr !== null) {
      omegaD.add(wd.value, wd.stderr, omegaDTruth);
      if (converged) convergedOmegaD.add(wd.value, wd.stderr, omegaDTruth);
      if (eventFound) locatedOmegaD.add(wd.value, wd.stderr, omegaDTruth);
    } else noOmegaD++;
    if (fit.alpha.stderr !== null) {
      alpha.add(fit.alpha.value, fit.alpha.stderr, truth.alpha);
      if (converged) convergedAlpha.add(fit.alpha.value, fit.alpha.stderr, truth.alpha);
      if (eventFound) locatedAlpha.add(fit.alpha.value, fit.alpha.stderr, truth.alpha);
    }
  }
  return {
    id: c.id,
    runs,
    notConverged,
    noOmegaD,
    freeSlope,
    omegaD: omegaD.spread(runs),
    alpha: alpha.spread(runs),
    convergedOmegaD: convergedOmegaD.spread(runs - notConverged),
    convergedAlpha: convergedAlpha.spread(runs - notConverged),
    located,
    locatedOmegaD: locatedOmegaD.spread(located),
    locatedAlpha: locatedAlpha.spread(located),
    worstSigmas: [convergedOmegaD.worst, convergedAlpha.worst],
    bound,
    msPerFit: (performance.now() - start) / runs,
  };
}

const [samples, runs, seed, ids] = process.argv.slice(2).map((s, i) => (i < 3 ? Number(s) : s)) as [number, number, number, string];
if (!Number.isInteger(samples) || !Number.isInteger(runs) || !Number.isInteger(seed) || typeof ids !== 'string') {
  process.stderr.write('usage: tsx bench/accuracyWorker.ts <samples> <runs> <seed> <case ids>\n');
  process.exit(2);
}
const cases = accuracyCases();
for (const id of ids.split(',').map(Number)) {
  process.stdout.write(`${JSON.stringify(runCase(cases[id], samples, runs, seed))}\n`);
}
