// `ringbench parasitics BEFORE AFTER [MORE...] --added C=470p[,1n...]`: loop L, C, R and an RC snubber.

import type { Command } from 'commander';
import { basename } from 'node:path';
import type { CommandContext } from '../commandContext';
import { fitCapture } from './fit';
import { extractParasitics } from '../../../core/circuit/addedCapacitor';
import { suggestSnubber } from '../../../core/circuit/snubber';
import { evaluateCautions } from '../../../core/safety/evaluateCautions';
import { formatParasiticsText } from '../../../core/report/parasiticsText';
import { quantity } from '../../../core/quantity';
import { parseAddedCapacitances, parsePositiveValue, parseTolerance } from '../../../core/workflow/userValues';
import { UsageError } from '../../../core/inputError';

interface ParasiticsOptions {
  added: string;
  addedTolerance?: string;
  probeC?: string;
  bandwidth?: string;
  voltage?: string;
  switchingFrequency?: string;
  column?: string;
  json?: boolean;
}

export function registerParasiticsCommand(program: Command, ctx: CommandContext): void {
  program
    .command('parasitics')
    .description('loop inductance, capacitance and resistance by the added-capacitor method, and an RC snubber starting point')
    .argument('<captures...>', 'the bare loop first, then one capture per added capacitor')
    .requiredOption('--added <C=VALUE[,VALUE...]>', 'capacitance added for each capture after the first, e.g. C=470p,1n')
    .option('--added-tolerance <TOL>', 'tolerance of the added capacitors in %, e.g. 5 or 5%')
    .option('--probe-c <value>', 'probe input capacitance in parallel with the node, e.g. 12p (default none)')
    .option('--bandwidth <value>', 'scope or probe bandwidth, e.g. 200M: warns when the ring is above a third of it')
    .option('--voltage <value>', 'voltage the node switches, for the snubber dissipation, e.g. 48')
    .option('--switching-frequency <value>', 'switching frequency, for the snubber dissipation, e.g. 250k')
    .option('--column <name|index>', 'channel to fit in every capture (default: the first)')
    .option('--json', 'print one JSON object instead of the table')
    .action((files: string[], options: ParasiticsOptions) => {
      if (files.length < 2) throw new UsageError('parasitics needs at least two captures: the bare loop and one with a capacitor added');
      const added = [0, ...parseAddedCapacitances(options.added, files.length)];
      const addedTolerance = options.addedTolerance === undefined ? 0 : parseTolerance(options.addedTolerance, '--added-tolerance');
      const probeC = parsePositiveValue(options.probeC, '--probe-c', 'F') ?? 0;
      const bandwidth = parsePositiveValue(options.bandwidth, '--bandwidth', 'Hz');
      const voltage = parsePositiveValue(options.voltage, '--voltage', 'V');
      const switchingFrequency = parsePositiveValue(options.switchingFrequency, '--switching-frequency', 'Hz');
      const fitted = files.map((file) => fitCapture(file, { column: options.column }, ctx.io.cwd));
      const fits = fitted.map((f) => f.summary);
      const failed = fits.find((f) => f.status === 'failed' || f.regime !== 'underdamped');
      if (failed) throw new UsageError(`${failed.file}: no ringing found to measure (${failed.status}, ${failed.regime}); the method needs an underdamped ring in every capture`);
      const extraction = extractParasitics(
        fits.map((fit, i) => ({
          addedC: added[i],
          addedCTolerance: i === 0 ? 0 : addedTolerance,
          frequency: quantity(fit.omega0.value / (2 * Math.PI), fit.omega0.stderr === null ? null : fit.omega0.stderr / (2 * Math.PI), 'Hz'),
          alpha: fit.alpha,
          sampleInterval: meanInterval(fitted[i].loaded.channel.time),
        })),
        { probeC, bandwidth },
      );
      const snubber = suggestSnubber(
        { L: extraction.L, C: extraction.C, R: extraction.R, characteristicImpedance: extraction.characteristicImpedance },
        { voltage, switchingFrequency },
      );
      const cautions = evaluateCautions({ peakVoltage: voltage, capacitance: extraction.C.value + snubber.C.value });
      const result = {
        L: extraction.L,
        C: extraction.C,
        R: extraction.R,
        characteristicImpedance: extraction.characteristicImpedance,
        residual: extraction.residual,
        captures: fits.map((fit, i) => ({
          file: basename(files[i]),
          addedC: added[i],
          frequency: quantity(fit.omega0.value / (2 * Math.PI), fit.omega0.stderr === null ? null : fit.omega0.stderr / (2 * Math.PI), 'Hz'),
          alpha: fit.alpha,
        })),
        snubber,
        cautions,
        warnings: [...extraction.warnings, ...fits.flatMap((f) => f.warnings.map((w) => `${f.file}: ${w}`))],
        notes: extraction.notes,
      };
      ctx.io.out(options.json ? `${JSON.stringify(result)}\n` : formatParasiticsText(result));
    });
}

function meanInterval(time: Float64Array): number | undefined {
  const n = time.length;
  return n > 1 ? (time[n - 1] - time[0]) / (n - 1) : undefined;
}
