// `ringbench check FILE --design board.json`: does the built board behave like its design? Exit 3 when not.

import type { Command } from 'commander';
import type { CommandContext } from '../commandContext';
import { addSetupOptions, addCaptureOptions, addModeOptions, measureSettingsOf, type MeasureCommandOptions } from '../measureOptions';
import { loadDesignFile, measureFile } from '../../app/measureFile';
import { formatFitText } from '../../../core/report/fitText';
import { formatNoVerdictText, formatVerdictText } from '../../../core/report/verdictText';
import { verdictRefusal } from '../../../core/workflow/measure';
import { formatCautionsText } from '../../../core/safety/cautionText';
import { EXIT, namingFile } from '../errors';
import { formatSetupChecksText } from '../../../core/report/setupChecksText';
import { setupRefused } from '../../../core/workflow/setupChecks';

interface CheckCommandOptions extends MeasureCommandOptions {
  design: string;
}

export function registerCheckCommand(program: Command, ctx: CommandContext): void {
  const command = program
    .command('check')
    .description(
      "fit a capture and check it against a design file: exit 0 when accepted under the design's decision rule, 3 when rejected (out of tolerance), 1 (no verdict) when the fit does not converge, finds a single decay where the design rings, or cannot decide a limit the design states",
    )
    .argument('<file>', 'capture file (CSV or text export of a scope)')
    .requiredOption('--design <file>', 'design file (topology, R, L, C with tolerances, source, probe; optional limits and decisionRule)');
  addModeOptions(addSetupOptions(addCaptureOptions(command)))
    .option('--json', 'print one JSON object instead of the table')
    .action((file: string, options: CheckCommandOptions) => {
      const design = namingFile(options.design, () => loadDesignFile(options.design, ctx.io.cwd));
      const m = namingFile(file, () => measureFile(file, measureSettingsOf(options), ctx.io.cwd, design));
      // A failed fit, a capture a setup check refuses, a single decay where the design rings, or a limit the capture cannot decide gets no verdict (measureCapture gives none), and says why.
      const refusal = verdictRefusal(design.design, m.summary, m.setupChecks);
      if (options.json) {
        ctx.io.out(`${JSON.stringify({ ...m.summary, design: design.design.name, verdict: m.verdict, ...(refusal ? { noVerdict: refusal } : {}), setupChecks: m.setupChecks, cautions: m.cautions })}\n`);
      } else {
        let text = formatFitText(m.summary);
        if (refusal) text += formatNoVerdictText(refusal);
        else if (m.verdict) text += formatVerdictText(m.verdict, design.design.name);
        text += formatSetupChecksText(m.setupChecks);
        text += formatCautionsText(m.cautions);
        ctx.io.out(text);
      }
      // A setup check's refusal means the capture cannot support the answer the verdict rests on.
      if (refusal || !m.verdict || setupRefused(m.setupChecks)) ctx.setExitCode(EXIT.failure);
      // Rejected under the rule: a conditional pass exits 3 under guarded acceptance, 0 under simple acceptance and guarded rejection.
      else if (!m.verdict.pass) ctx.setExitCode(EXIT.outOfTolerance);
    });
}
