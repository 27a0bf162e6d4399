// The options every fitting command takes, documented once: which channel and window, how to read the
// time axis, and the known part that gives R, L and C.

import type { Command } from 'commander';
import type { MeasureSettings } from '../../core/workflow/measureSettings';

/** The measuring options as commander hands them over, plus --json. */
export interface MeasureCommandOptions extends MeasureSettings {
  json?: boolean;
}

/** --column, --sample-interval, --time-unit, --value-unit, --from, --to, --sort-time, --event, --segment, --jump-start, --probe-ratio, --invert. */
export function addCaptureOptions(command: Command): Command {
  return command
    .option('--column <name|index>', 'channel to fit: its name, or else its 0-based index (default: the first)')
    .option('--sample-interval <time>', 'sample interval, e.g. 2n: builds the time axis of a file without a time column, or replaces the stamps of one (written with too few digits, say)')
    .option('--time-unit <unit>', "unit of the time column or of the file's sample interval, over the file's, e.g. us")
    .option('--value-unit <unit>', "unit of the channel's values, over the file's, e.g. mV")
    .option('--from <time>', 'start of the fit window (default: found from the data)')
    .option('--to <time>', 'end of the fit window (default: found from the data)')
    .option('--sort-time', 'sort out-of-order time stamps instead of failing')
    .option('--segment <n>', 'in a file of repeated acquisitions (segments), read segment n (1 = the first, the default)')
    .option('--event <n>', 'in a record holding several events, measure event n (1 = the first; default: the first complete one)')
    .option('--jump-start', 'the measured quantity jumps at the event (a capacitor current, an inductor voltage): fit its initial value freely (default: found from the data)')
    .option('--probe-ratio <ratio>', "probe attenuation the scope did not apply, e.g. 10 or 10:1: the channel's values are multiplied by it (default 1)")
    .option('--invert', "the probe was connected reversed: the channel's values change sign before the fit");
}

/** --topology and --known: derive R, L and C from the fit. */
export function addComponentOptions(command: Command): Command {
  return command
    .option('--topology <kind>', 'series or parallel: derive R, L, C (needs --known)')
    .option(
      '--known <NAME=VALUE[,TOL]>',
      'one known component, tolerance in % (5 and 5% both mean 5 %), read as a rectangular half-width (u = tol/√3, GUM 4.3.7), e.g. C=470n or L=2.2u,10',
    );
}

/** --modes and --mode: how many ringing modes to fit, and which one R, L and C (or a design's verdict) are for. */
export function addModeOptions(command: Command): Command {
  return command
    .option('--modes <n>', 'fit n ringing modes, 1 to 3 (default: the number the data support, chosen by an information criterion)')
    .option(
      '--mode <k>',
      'derive R, L, C (and check a design) for ringing mode k, 1 = the dominant one (the default); a mode beyond those fitted is refused (exit 2)',
    );
}

/** --scope-bandwidth, --probe-capacitance, --ground-lead: what the setup checks weigh the capture against. */
export function addSetupOptions(command: Command): Command {
  return command
    .option('--scope-bandwidth <freq>', "scope or probe bandwidth (the lower), e.g. 200M: warns when a first-order front end there biases alpha beyond its error, or passes a faster ring that would alias onto this one (default: the capture preamble's, else none)")
    .option('--probe-capacitance <C[,TOL]>', "voltage probe input capacitance with its tolerance in %, e.g. 10p,10: C and f0 without it beside the measured ones (with --topology/--known; without a tolerance it is taken as exact)")
    .option('--ground-lead <length>', "probe ground-lead length, e.g. 6in or 15cm, for the ground-lead resonance check (default 6in)");
}

/** The measuring settings alone, without --json and command-specific options. */
export function measureSettingsOf(options: MeasureCommandOptions): MeasureSettings {
  const { topology, known, column, sampleInterval, timeUnit, valueUnit, from, to, sortTime, event, segment, jumpStart, probeRatio, invert, scopeBandwidth, probeCapacitance, groundLead, modes, mode } = options;
  return { topology, known, column, sampleInterval, timeUnit, valueUnit, from, to, sortTime, event, segment, jumpStart, probeRatio, invert, scopeBandwidth, probeCapacitance, groundLead, modes, mode };
}
