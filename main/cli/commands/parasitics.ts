// `ringbench parasitics BARE WITH-C [MORE...] --added C=470p[,1n...]`: loop L, C, R and an RC snubber.
// A capture whose fit gives no ring exits 1 with one line (a failed measurement); bad input exits 2.

import type { Command } from 'commander';
import { basename } from 'node:path';
import type { CommandContext } from '../commandContext';
import { loadCaptureFor } from '../../app/measureFile';
import { formatParasiticsText } from '../../../core/report/parasiticsText';
import { measureParasiticsOutcome } from '../../../core/workflow/parasitics';
import { parseAddedCapacitances, parsePositiveValue, parseTolerance } from '../../../core/workflow/userValues';
import { UsageError } from '../../../core/inputError';
import { EXIT, namingFile } from '../errors';

interface ParasiticsOptions {
  added: string;
  addedTolerance?: string;
  probeC?: string;
  probeCTolerance?: string;
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
    .option('--probe-c-tolerance <TOL>', 'tolerance of the probe capacitance in %, e.g. 10')
    .option('--bandwidth <value>', 'scope or probe bandwidth, e.g. 200M: warns when the ring is above a third of it')
    .option('--voltage <value>', 'voltage the snubber capacitor swings each edge, for its dissipation only, e.g. 48 (the cautions use the captures\' own peak)')
    .option('--switching-frequency <value>', 'switching frequency, for the snubber dissipation only, e.g. 250k')
    .option('--column <name|index>', 'channel to fit in every capture (default: the first)')
    .option('--json', 'print one JSON object instead of the table')
    .action((files: string[], options: ParasiticsOptions) => {
      if (files.length < 2) throw new UsageError('parasitics needs at least two captures: the bare loop and one with a capacitor added');
      const added = [0, ...parseAddedCapacitances(options.added, files.length)];
      const request = {
        captures: files.map((file, i) => {
          const loaded = namingFile(file, () => loadCaptureFor(file, { column: options.column }, ctx.io.cwd));
          return { file: basename(file), channel: loaded.channel, captureWarnings: loaded.capture.warnings, addedC: added[i] };
        }),
        addedTolerance: options.addedTolerance === undefined ? 0 : parseTolerance(options.addedTolerance, '--added-tolerance'),
        probeC: parsePositiveValue(options.probeC, '--probe-c', 'F') ?? 0,
        probeCTolerance: options.probeCTolerance === undefined ? 0 : parseTolerance(options.probeCTolerance, '--probe-c-tolerance'),
        bandwidth: parsePositiveValue(options.bandwidth, '--bandwidth', 'Hz'),
        voltage: parsePositiveValue(options.voltage, '--voltage', 'V'),
        switchingFrequency: parsePositiveValue(options.switchingFrequency, '--switching-frequency', 'Hz'),
      };
      const { result, failure } = measureParasiticsOutcome(request);
      if (failure !== null) {
        ctx.io.err(`ringbench: ${failure}\n`);
        ctx.setExitCode(EXIT.failure);
        return;
      }
      ctx.io.out(options.json ? `${JSON.stringify(result)}\n` : formatParasiticsText(result));
    });
}
