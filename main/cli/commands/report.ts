// `ringbench report [LOG...] --log FILE --out REPORT [--lot]`: one bench log, or several merged, as an HTML,
// Markdown or CSV report of every measurement, or as the lot report.

import type { Command } from 'commander';
import { resolve } from 'node:path';
import type { CommandContext } from '../commandContext';
import { reportFormatFor, writeReport } from '../../app/reportFile';
import { UsageError } from '../../../core/inputError';
import { EXIT } from '../errors';

/** Commander's collector for an option given several times. */
function repeated(value: string, previous: string[]): string[] {
  return [...previous, value];
}

export function registerReportCommand(program: Command, ctx: CommandContext): void {
  program
    .command('report')
    .description('write a report of the bench log (several logs are merged, a record in two logs counted once): summary, yield, and every measurement with its plot, or with --lot the lot report')
    .argument('[logs...]', 'bench log files, as --log')
    .option('--log <path>', 'bench log file (repeat for several)', repeated, [] as string[])
    .requiredOption('--out <file>', 'report file; the format follows the extension: .html (with plots), .md or .csv')
    .option('--lot', 'the lot report: first-pass and final yield, per quantity n, mean, sd, min, max, Cp, Cpk and units per decision zone (histograms in .html), failures by likely cause, units to look at')
    .action((logs: string[], options: { log: string[]; out: string; lot?: boolean }) => {
      if (reportFormatFor(options.out) === null) {
        throw new UsageError(`--out '${options.out}': the name must end in .html, .md or .csv`);
      }
      const paths = [...options.log, ...logs];
      if (!paths.length) throw new UsageError('no bench log given: name one with --log FILE (repeat --log, or list the logs, for several)', '--log');
      const written = writeReport(
        paths.map((path) => resolve(ctx.io.cwd, path)),
        resolve(ctx.io.cwd, options.out),
        { lot: options.lot === true },
      );
      for (const note of written.notes) ctx.io.err(`ringbench: note: ${note}\n`);
      const what = `${written.records} measurement${written.records === 1 ? '' : 's'}${paths.length > 1 ? ` from ${paths.length} logs` : ''}`;
      ctx.io.out(`wrote ${options.out} (${written.format}${options.lot ? ' lot report' : ''}, ${what})\n`);
      // The report is written and states the skipped lines, but it does not cover the whole log: exit 1.
      if (written.skippedLines) ctx.setExitCode(EXIT.failure);
    });
}
