// Plain warnings about how a ringdown was captured: bandwidth and samples per ring period, the one place their limits
// live for the added-capacitor method (checkRingCapture) and the setup checks of every measurement (core/workflow/setupChecks.ts).
// Both warning limits are common practice (no single source; see shared/reference/trade-facts.md).
import { formatEngineering } from '../units/format';

export interface RingCaptureSetup {
  /** Scope or probe bandwidth (the lower of the two), Hz. */
  bandwidth?: number;
  /** Sample interval of the capture, s. */
  sampleInterval?: number;
}

/** Ring frequency above this fraction of the bandwidth draws a warning (common practice). */
export const BANDWIDTH_FRACTION = 1 / 3;
/** Fewer samples than this per ring period draws a warning (common practice). */
export const MIN_SAMPLES_PER_PERIOD = 10;
/** Fewer samples than this per ring period and the frequency may be an alias: refused (2 is the Nyquist limit; the margin is our choice). */
export const REFUSED_SAMPLES_PER_PERIOD = 2.5;

/**
 * The slowest ring that sampling every `sampleInterval` s shows at `frequency` Hz (below half the sample rate): the
 * sample rate less the frequency, by the sampling theorem (Shannon 1949); null when the front end's `bandwidth` (Hz)
 * stops it, so that the ring seen can only be itself. A ring the front end passes aliases whatever the fit does.
 */
export function passedAlias(frequency: number, sampleInterval: number, bandwidth: number): number | null {
  const alias = 1 / sampleInterval - frequency;
  return alias > frequency && alias <= bandwidth ? alias : null;
}

/** Sample rate, in bandwidths, at which a front end's passband no longer aliases (common practice). */
const ALIAS_FREE_RATE = 2.5;

/** Samples per period of a ring at `frequency` Hz sampled every `sampleInterval` s. */
export function samplesPerRingPeriod(frequency: number, sampleInterval: number): number {
  return 1 / (frequency * sampleInterval);
}

/** Warnings for a ring at `frequency` (Hz) captured with `setup`; empty when nothing is amiss. */
export function checkRingCapture(frequency: number, setup: RingCaptureSetup, label = 'ring'): string[] {
  const warnings: string[] = [];
  const { bandwidth, sampleInterval } = setup;
  if (bandwidth !== undefined && frequency > bandwidth * BANDWIDTH_FRACTION) {
    warnings.push(
      `${label} frequency ${formatEngineering(frequency, 'Hz')} is above a third of the ${formatEngineering(bandwidth, 'Hz')} ` +
        'scope/probe bandwidth: the measurement attenuates and shifts it (common practice: keep the ring below bandwidth / 3).',
    );
  }
  if (sampleInterval !== undefined) {
    const perPeriod = samplesPerRingPeriod(frequency, sampleInterval);
    if (perPeriod < MIN_SAMPLES_PER_PERIOD) {
      warnings.push(
        `${label} period holds only ${perPeriod.toFixed(1)} samples (interval ${formatEngineering(sampleInterval, 's')}); ` +
          `at least ${MIN_SAMPLES_PER_PERIOD} per period is the usual working margin for a fit (common practice).`,
      );
    }
    const alias = bandwidth === undefined ? null : passedAlias(frequency, sampleInterval, bandwidth);
    if (bandwidth !== undefined && alias !== null) warnings.push(`${label} ${aliasWarning(frequency, alias, sampleInterval, bandwidth, 'the scope/probe bandwidth')}.`);
  }
  return warnings;
}

/** Why a ring at `frequency` may be the alias `alias` of a faster one, in words (see passedAlias). */
export function aliasWarning(frequency: number, alias: number, sampleInterval: number, bandwidth: number, source: string): string {
  const rate = 1 / sampleInterval;
  return (
    `${formatEngineering(bandwidth, 'Hz')} (${source}) passes rings above half the ${formatEngineering(rate, 'Sa/s')} sample rate: ` +
    `one at ${formatEngineering(alias, 'Hz')} would show as this ${formatEngineering(frequency, 'Hz')} ring; if the circuit can ring that fast, ` +
    `capture again at ${formatEngineering(ALIAS_FREE_RATE * bandwidth, 'Sa/s')} or more (the sampling theorem; ${ALIAS_FREE_RATE} times the bandwidth: common practice)`
  );
}
