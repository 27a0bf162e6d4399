// `ringbench compare BEFORE AFTER`: the same circuit before and after a change: what moved, by how much
// against the combined uncertainty, and whether the change is significant.

import type { Command } from 'commander';
import type { CommandContext } from '../commandContext';
import { compareFiles } from '../../app/measureFile';
import { formatComparisonText } from '../../../core/report/comparisonText';
import { addCaptureOptions, addComponentOptions, measureSettingsOf, type MeasureCommandOptions } from '../measureOptions';
import { EXIT } from '../errors';

export function registerCompareCommand(program: Command, ctx: CommandContext): void {
  const command = program
    .command('compare')
    .description('compare two captures of the same circuit (before and after a change): exit 0 with a verdict, 1 when a fit failed')
    .argument('<before>', 'capture before the change')
    .argument('<after>', 'capture after the change');
  addCaptureOptions(addComponentOptions(command))
    .option('--json', 'print one JSON object instead of the table')
    .action((before: string, after: string, options: MeasureCommandOptions) => {
      const comparison = compareFiles(before, after, measureSettingsOf(options), ctx.io.cwd);
      ctx.io.out(options.json ? `${JSON.stringify(comparison)}\n` : formatComparisonText(comparison));
      if (comparison.verdict === 'undetermined') ctx.setExitCode(EXIT.failure);
    });
}
