// `ringbench fit FILE`: fit one capture and print alpha, omega0, ... and the components.

import type { Command } from 'commander';
import type { CommandContext } from '../commandContext';
import { loadCapture, type LoadedCapture } from '../../io/captureFile';
import { fitResponse } from '../../../core/fit/fitResponse';
import { componentsFromResponse } from '../../../core/circuit/components';
import { summarizeFit, type FitSummary } from '../../../core/report/fitSummary';
import { formatFitText } from '../../../core/report/fitText';
import { parseChannel, parseKnown, parseSignedTime, parseTime, parseTopology } from '../../../core/workflow/userValues';
import { UsageError } from '../../../core/inputError';
import { formatEngineering } from '../../../core/units/format';
import { COMPONENT_UNITS as UNIT_OF_COMPONENT } from '../../../core/circuit/relations';
import { evaluateCautions } from '../../../core/safety/evaluateCautions';
import { cautionInputsFromCapture } from '../../../core/safety/cautionInputs';
import { formatCautionsText } from '../../../core/safety/cautionText';
import { basename } from 'node:path';
import { alphaOmega0Correlation } from '../../../core/fit/correlation';

export interface FitCommandOptions {
  topology?: string;
  known?: string;
  column?: string;
  sampleInterval?: string;
  from?: string;
  to?: string;
  sortTime?: boolean;
  json?: boolean;
}

/** Everything `fit` computes for one file; shared with `batch` and `log add`. */
export function fitFile(file: string, options: FitCommandOptions, cwd: string): FitSummary {
  return fitCapture(file, options, cwd).summary;
}

/** The fit summary with the capture it came from (for commands that also need the samples). */
export function fitCapture(file: string, options: FitCommandOptions, cwd: string): { summary: FitSummary; loaded: LoadedCapture } {
  if ((options.topology === undefined) !== (options.known === undefined)) {
    throw new UsageError('--topology and --known go together: give both to derive R, L and C');
  }
  const topology = options.topology === undefined ? undefined : parseTopology(options.topology);
  const known = options.known === undefined ? undefined : parseKnown(options.known);
  const loaded = loadCapture(file, {
    cwd,
    channel: options.column === undefined ? undefined : parseChannel(options.column),
    sampleInterval: options.sampleInterval === undefined ? undefined : parseTime(options.sampleInterval, '--sample-interval'),
    sortTime: options.sortTime,
  });
  const window = {
    start: options.from === undefined ? undefined : parseSignedTime(options.from, '--from'),
    end: options.to === undefined ? undefined : parseSignedTime(options.to, '--to'),
  };
  const { channel } = loaded;
  const fit = fitResponse(
    { time: channel.time, values: channel.values, clipped: channel.clipped, unit: channel.unit, name: channel.name },
    { window },
  );
  const components =
    topology && known
      ? {
          topology,
          known: `${known.name} = ${formatEngineering(known.value, UNIT_OF_COMPONENT[known.name])}${known.tolerance ? ` ± ${+(known.tolerance * 100).toPrecision(3)} %` : ''}`,
          ...componentsFromResponse(fit.alpha, fit.omega0, topology, known, alphaOmega0Correlation(fit.correlation)),
        }
      : undefined;
  return { summary: summarizeFit(basename(file), channel.name, fit, components, loaded.capture.warnings), loaded };
}

/** The options every fitting command takes: which channel, which window, how to read the axis. */
export function addCaptureOptions(command: Command): Command {
  return command
    .option('--column <name|index>', 'channel to fit: its name or 0-based index (default: the first)')
    .option('--sample-interval <time>', 'sample interval when the file has no time column, e.g. 2n')
    .option('--from <time>', 'start of the fit window (default: found from the data)')
    .option('--to <time>', 'end of the fit window (default: found from the data)')
    .option('--sort-time', 'sort out-of-order time stamps instead of failing');
}

/** --topology and --known: derive R, L and C from the fit. */
export function addComponentOptions(command: Command): Command {
  return command
    .option('--topology <kind>', 'series or parallel: derive R, L, C (needs --known)')
    .option('--known <NAME=VALUE[,TOL]>', 'one known component, tolerance in %, e.g. C=470n or L=2.2u,10 or L=2.2u,10%');
}

export function registerFitCommand(program: Command, ctx: CommandContext): void {
  const command = program
    .command('fit')
    .description('fit a ringdown or step response and report alpha, omega0, zeta, Q (and R, L, C)')
    .argument('<file>', 'capture file (CSV or text export of a scope)');
  addCaptureOptions(addComponentOptions(command))
    .option('--json', 'print one JSON object instead of the table')
    .action((file: string, options: FitCommandOptions) => {
      const { summary, loaded } = fitCapture(file, options, ctx.io.cwd);
      const { channel } = loaded;
      const cautions = evaluateCautions(cautionInputsFromCapture(channel.values, channel.unit, summary.components ?? {}));
      ctx.io.out(options.json ? `${JSON.stringify({ ...summary, cautions })}\n` : formatFitText(summary) + formatCautionsText(cautions));
      if (summary.status === 'failed') ctx.setExitCode(1);
    });
}
