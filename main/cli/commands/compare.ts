// `ringbench compare BEFORE AFTER`: the same circuit before and after a change: what moved, by how much
// against the combined uncertainty, and whether the change is significant.

import type { Command } from 'commander';
import type { CommandContext } from '../commandContext';
import { compareFiles, loadCaptureFor } from '../../app/measureFile';
import { parseMeasureSettings, type MeasureSettings } from '../../../core/workflow/measureSettings';
import { InputError } from '../../../core/inputError';
import { formatComparisonText } from '../../../core/report/comparisonText';
import { addCaptureOptions, addComponentOptions, measureSettingsOf, type MeasureCommandOptions } from '../measureOptions';
import { EXIT, namingFile } from '../errors';

export function registerCompareCommand(program: Command, ctx: CommandContext): void {
  const command = program
    .command('compare')
    .description('compare two captures of the same circuit (before and after a change): exit 0 with a verdict, 1 when no change can be judged (a fit failed, a setup check refused a capture, a single decay against a ring)')
    .argument('<before>', 'capture before the change')
    .argument('<after>', 'capture after the change');
  addCaptureOptions(addComponentOptions(command))
    .option('--json', 'print one JSON object instead of the table')
    .action((before: string, after: string, options: MeasureCommandOptions) => {
      const settings = measureSettingsOf(options);
      const comparison = namingFaultyCapture([before, after], settings, ctx.io.cwd, () => compareFiles(before, after, settings, ctx.io.cwd));
      ctx.io.out(options.json ? `${JSON.stringify(comparison)}\n` : formatComparisonText(comparison));
      if (comparison.verdict === 'undetermined') ctx.setExitCode(EXIT.failure);
    });
}

/**
 * Runs the comparison; on bad input, reads each capture alone to name the one at fault (the comparison reads
 * both at once). Bad input that no capture gives alone (an option, the pair) is passed on as it is.
 */
function namingFaultyCapture<T>(files: string[], settings: MeasureSettings, cwd: string, compare: () => T): T {
  try {
    return compare();
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    // Options that cannot be read are no capture's fault: their error comes first, unnamed.
    parseMeasureSettings(settings);
    for (const file of files) namingFile(file, () => loadCaptureFor(file, settings, cwd));
    throw error;
  }
}
