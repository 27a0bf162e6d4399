// One worker of the accuracy benchmark: fits every run of the cases it is given and prints one JSON summary line per case.
//
// Usage: tsx bench/accuracyWorker.ts <samples> <runs> <seed> <case ids, comma-separated>

import { fitResponse } from '../core/fit/fitResponse';
import { accuracyCases, caseTruth, isOverdamped, LOW_PASS_RHO, slowestRate, synthesize, type AccuracyCase } from './accuracyCases';
import type { ResponseFit } from '../core/fit/fitResponse';
import { cramerRaoBound, type Bound } from './cramerRao';

/** Spread and calibration of one estimated quantity over the runs that gave it. */
export interface Spread {
  rms: number;
  bias: number;
  /** Fraction of all runs whose value ± 1.96 stderr contains the truth (a missing estimate or uncertainty counts as a miss). */
  coverage: number;
  meanStderr: number;
  /** Rms of error / reported stderr: 1 when the stated errors are the real spread, below 1 when they are wide. */
  zRms: number;
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
  /** An overdamped case's own figures (null for a ring). */
  overdamped: OverdampedSummary | null;
  msPerFit: number;
}

/** What an overdamped case is judged on: coverage among converged runs and no regime stated wrongly. */
export interface OverdampedSummary {
  /** Converged runs that reported a second-order response (a regime with zeta), and those that reported a single decay. */
  secondOrder: number;
  firstOrder: number;
  /** Coverage as fractions of the converged second-order runs. */
  alpha: Spread;
  omega0: Spread;
  zeta: Spread;
  /** The slow root (1 / tau of a single decay), over every converged run. */
  slowRoot: Spread;
  /** Converged runs stating a regime other than overdamped with zeta more than 2 standard errors from the truth. */
  wrongRegime: number;
  /** Runs by regime stated (converged runs only). */
  regimes: Record<string, number>;
}

/** The slow root of a converged fit with its standard error (from tau for a single decay), or null. */
function slowRootOf(fit: ResponseFit): { value: number; stderr: number } | null {
  if (fit.tau) return fit.tau.stderr === null ? null : { value: 1 / fit.tau.value, stderr: fit.tau.stderr / fit.tau.value ** 2 };
  const [alpha, omega0] = [fit.alpha, fit.omega0];
  if (alpha.stderr === null || omega0.stderr === null || !fit.correlation) return null;
  const names = fit.correlation.names;
  const rho = fit.correlation.matrix[names.indexOf('alpha')][names.indexOf('omega0')];
  const root = Math.sqrt(Math.max(alpha.value ** 2 - omega0.value ** 2, 0));
  if (!(root > 0)) return { value: alpha.value, stderr: alpha.stderr };
  // s = alpha - sqrt(alpha^2 - omega0^2): ds/dalpha = 1 - alpha / root, ds/domega0 = omega0 / root.
  const [ga, gw] = [1 - alpha.value / root, omega0.value / root];
  const variance = ga * ga * alpha.stderr ** 2 + 2 * ga * gw * rho * alpha.stderr * omega0.stderr + gw * gw * omega0.stderr ** 2;
  return { value: alpha.value - root, stderr: Math.sqrt(Math.max(variance, 0)) };
}

/** Tallies the overdamped figures of one case run by run. */
class OverdampedTally {
  private readonly alpha = new Tally();
  private readonly omega0 = new Tally();
  private readonly zeta = new Tally();
  private readonly slowRoot = new Tally();
  private converged = 0;
  private secondOrder = 0;
  private firstOrder = 0;
  private wrongRegime = 0;
  private readonly regimes: Record<string, number> = {};

  constructor(private readonly truth: { alpha: number; omega0: number }) {}

  add(fit: ResponseFit): void {
    if (fit.status !== 'converged') return;
    this.converged++;
    this.regimes[fit.regime] = (this.regimes[fit.regime] ?? 0) + 1;
    const { alpha, omega0 } = this.truth;
    const slow = slowRootOf(fit);
    if (slow) this.slowRoot.add(slow.value, slow.stderr, slowestRate(alpha, omega0));
    if (fit.regime === 'first-order') {
      this.firstOrder++;
      return;
    }
    this.secondOrder++;
    const zetaTruth = alpha / omega0;
    const se = fit.zeta.stderr;
    if (fit.regime !== 'overdamped' && (se === null || Math.abs(fit.zeta.value - zetaTruth) > 2 * se)) this.wrongRegime++;
    if (fit.alpha.stderr !== null) this.alpha.add(fit.alpha.value, fit.alpha.stderr, alpha);
    if (fit.omega0.stderr !== null) this.omega0.add(fit.omega0.value, fit.omega0.stderr, omega0);
    if (se !== null) this.zeta.add(fit.zeta.value, se, zetaTruth);
  }

  summary(): OverdampedSummary {
    return {
      secondOrder: this.secondOrder,
      firstOrder: this.firstOrder,
      alpha: this.alpha.spread(this.secondOrder),
      omega0: this.omega0.spread(this.secondOrder),
      zeta: this.zeta.spread(this.secondOrder),
      slowRoot: this.slowRoot.spread(this.converged),
      wrongRegime: this.wrongRegime,
      regimes: this.regimes,
    };
  }
}

class Tally {
  private sumSquares = 0;
  private sum = 0;
  private count = 0;
  private covered = 0;
  private stderrSum = 0;
  private zSquares = 0;
  worst = 0;

  add(value: number, stderr: number, truth: number): void {
    const error = value - truth;
    this.worst = Math.max(this.worst, Math.abs(error) / stderr);
    this.sumSquares += error * error;
    this.sum += error;
    this.count++;
    this.stderrSum += stderr;
    this.zSquares += (error / stderr) ** 2;
    if (Math.abs(error) <= 1.96 * stderr) this.covered++;
  }

  /** Over the runs that gave an estimate with an uncertainty. */
  spread(runs: number): Spread {
    return {
      rms: Math.sqrt(this.sumSquares / this.count),
      bias: this.sum / this.count,
      coverage: this.covered / runs,
      meanStderr: this.stderrSum / this.count,
      zRms: Math.sqrt(this.zSquares / this.count),
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
  const overdamped = isOverdamped(c) ? new OverdampedTally(truth) : null;
  const start = performance.now();
  for (let run = 0; run < runs; run++) {
    const fit = fitResponse(synthesize(c, samples, run, seed).trace);
    overdamped?.add(fit);
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
    overdamped: overdamped?.summary() ?? null,
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
