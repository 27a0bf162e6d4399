// `ringbench report --log FILE --out REPORT`: the bench log as an HTML, Markdown or CSV report.

import type { Command } from 'commander';
import { resolve } from 'node:path';
import type { CommandContext } from '../commandContext';
import { reportFormatFor, writeReport } from '../../app/reportFile';
import { UsageError } from '../../../core/inputError';

export function registerReportCommand(program: Command, ctx: CommandContext): void {
  program
    .command('report')
    .description('write a report of the bench log: summary, yield, and every measurement with its plot')
    .requiredOption('--log <path>', 'bench log file')
    .requiredOption('--out <file>', 'report file; the format follows the extension: .html (with plots), .md or .csv')
    .action((options: { log: string; out: string }) => {
      if (reportFormatFor(options.out) === null) {
        throw new UsageError(`--out '${options.out}': the name must end in .html, .md or .csv`);
      }
      const written = writeReport(resolve(ctx.io.cwd, options.log), resolve(ctx.io.cwd, options.out));
      for (const note of written.notes) ctx.io.err(`ringbench: note: ${note}\n`);
      ctx.io.out(`wrote ${options.out} (${written.format}, ${written.records} measurement${written.records === 1 ? '' : 's'})\n`);
    });
}
