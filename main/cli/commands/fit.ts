// `ringbench fit FILE`: fit one capture and print alpha, omega0, ..., the transition metrics, the
// components from a known part, and the cautions.

import type { Command } from 'commander';
import type { CommandContext } from '../commandContext';
import { measureFile } from '../../app/measureFile';
import { formatFitText } from '../../../core/report/fitText';
import { fitSucceeded } from '../../../core/report/fitSummary';
import { formatCautionsText } from '../../../core/safety/cautionText';
import { addSetupOptions, addCaptureOptions, addComponentOptions, addModeOptions, measureSettingsOf, type MeasureCommandOptions } from '../measureOptions';
import { UsageError } from '../../../core/inputError';
import { EXIT, namingFile } from '../errors';
import { formatSetupChecksText } from '../../../core/report/setupChecksText';
import { setupRefused } from '../../../core/workflow/setupChecks';

export function registerFitCommand(program: Command, ctx: CommandContext): void {
  const command = program
    .command('fit')
    .description('fit a ringdown or step response and report alpha, omega0, zeta, Q, the step metrics (and R, L, C); exit 1 when the fit does not converge')
    .argument('<file>', 'capture file (CSV or text export of a scope)');
  addModeOptions(addSetupOptions(addCaptureOptions(addComponentOptions(command))))
    .option('--json', 'print one JSON object instead of the table')
    .action((file: string, options: MeasureCommandOptions) => {
      if (options.mode !== undefined && options.known === undefined) throw new UsageError('--mode names the mode R, L and C are derived for: give --topology and --known too');
      const { summary, cautions, setupChecks } = namingFile(file, () => measureFile(file, measureSettingsOf(options), ctx.io.cwd));
      ctx.io.out(options.json ? `${JSON.stringify({ ...summary, setupChecks, cautions })}\n` : formatFitText(summary) + formatSetupChecksText(setupChecks) + formatCautionsText(cautions));
      // A setup check's refusal (an aliased frequency, a sustained oscillation...) is a failed measurement too.
      if (!fitSucceeded(summary) || setupRefused(setupChecks)) ctx.setExitCode(EXIT.failure);
    });
}
