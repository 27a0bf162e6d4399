// `ringbench parasitics BARE WITH-C [MORE...] --added C=470p[,1n@0.6...]`: loop L, C, R and an RC snubber, with
// real capacitors (derating, DC bias, the switch's own C) and L_p cross-checked on a turn-on edge.
// A capture whose fit gives no ring, or an edge whose L disagrees with L_p, exits 1 (a failed measurement); bad input exits 2.

import type { Command } from 'commander';
import { basename } from 'node:path';
import type { CommandContext } from '../commandContext';
import { loadCaptureFor } from '../../app/measureFile';
import { formatParasiticsText } from '../../../core/report/parasiticsText';
import { measureParasiticsOutcome, type EdgeRequest } from '../../../core/workflow/parasitics';
import { parseAddedCapacitances, parsePositiveValue } from '../../../core/workflow/userValues';
import { addedPartsTolerance, deratingsWithTolerance, parseFactor, parseProbeCapacitance, parseValueWithTolerance, probeCapacitanceTolerance, splitAddedDeratings } from '../../../core/workflow/capacitorValues';
import { UsageError } from '../../../core/inputError';
import { quantity } from '../../../core/quantity';
import { toleranceToRelativeUncertainty } from '../../../core/circuit/tolerance';
import { crossCheckLine } from '../../../core/circuit/edgeInductance';
import { EXIT, namingFile } from '../errors';

interface ParasiticsOptions {
  added: string;
  addedTolerance?: string;
  dcBiasFactor?: string;
  deratingTolerance?: string;
  switchCoss?: string;
  currentCapture?: string;
  currentColumn?: string;
  switchVoltageColumn?: string;
  plateauVoltage?: string;
  probeC?: string;
  probeCapacitance?: string;
  probeCTolerance?: string;
  bandwidth?: string;
  scopeBandwidth?: string;
  voltage?: string;
  switchingFrequency?: string;
  column?: string;
  json?: boolean;
}

/** An option given by either of its two spellings, with the flag it came by; both at once is bad input. */
function eitherSpelling(value: string | undefined, flag: string, earlier: string | undefined, earlierFlag: string): [string | undefined, string] {
  if (value !== undefined && earlier !== undefined) throw new UsageError(`${flag} and ${earlierFlag} are the same option: give one`);
  return value !== undefined ? [value, flag] : [earlier, earlierFlag];
}

export function registerParasiticsCommand(program: Command, ctx: CommandContext): void {
  program
    .command('parasitics')
    .description('loop inductance, capacitance and resistance by the added-capacitor method, and an RC snubber starting point')
    .argument('<captures...>', 'the bare loop first, then one capture per added capacitor')
    .requiredOption('--added <C=VALUE[@FACTOR][,...]>', 'capacitance added for each capture after the first, e.g. C=470p,1n; @FACTOR is that part\'s value at the operating voltage over its nominal one, e.g. 2.2n@0.6')
    .option('--added-tolerance <TOL>', 'tolerance of the added capacitors in %, e.g. 5 or 5% (needed: L_p and C_p are known no better than the parts; 0 takes them as exact)')
    .option('--dc-bias-factor <FACTOR>', 'one DC-bias factor for every added capacitor without its own @FACTOR (class-II ceramics), e.g. 0.55 or 55%')
    .option('--derating-tolerance <TOL>', 'tolerance of the derating and DC-bias factors in %, needed with any factor below 1, e.g. 15')
    .option('--switch-coss <C,TOL>', 'the switch\'s output capacitance at the operating voltage (small-signal) with its tolerance in %, split off C_p, e.g. 180p,20 (180p,0 takes it as exact)')
    .option('--current-capture <file>', 'a turn-on edge of the loop current: L_p is cross-checked as V_L / (di/dt) (exit 1 when they disagree)')
    .option('--current-column <name|index>', 'the current channel in the --current-capture file (default: the first)')
    .option('--switch-voltage-column <name|index>', 'the switch voltage in the --current-capture file: its drop while the current rises is V_L')
    .option('--plateau-voltage <V,TOL>', 'V_L read by hand instead: the voltage across the loop inductance while the current rises, with its tolerance in %, e.g. 9.5,10')
    .option('--probe-capacitance <C[,TOL]>', 'probe input capacitance in parallel with the node, with its tolerance in % here or as --probe-c-tolerance, e.g. 12p,10 (default none; the same option as on fit)')
    .option('--probe-c <value>', 'the same as --probe-capacitance (the earlier spelling)')
    .option('--probe-c-tolerance <TOL>', 'tolerance of the probe capacitance in %, e.g. 10 (needed with a probe capacitance that does not carry its own; 0 takes it as exact)')
    .option('--scope-bandwidth <value>', 'scope or probe bandwidth, e.g. 200M: warns when the ring is above a third of it, or when it passes a faster ring that would alias onto this one (the same option as on fit)')
    .option('--bandwidth <value>', 'the same as --scope-bandwidth (the earlier spelling)')
    .option('--voltage <value>', 'voltage the snubber capacitor swings each edge, for its dissipation only, e.g. 48 (the cautions use the captures\' own peak)')
    .option('--switching-frequency <value>', 'switching frequency, for the snubber dissipation only, e.g. 250k')
    .option('--column <name|index>', 'channel to fit in every capture (default: the first)')
    .option('--json', 'print one JSON object instead of the table')
    .action((files: string[], options: ParasiticsOptions) => {
      if (files.length < 2) throw new UsageError('parasitics needs at least two captures: the bare loop and one with a capacitor added');
      const split = splitAddedDeratings(options.added, '--added');
      const added = [0, ...parseAddedCapacitances(split.nominal, files.length)];
      const dcBiasFactor = options.dcBiasFactor === undefined ? undefined : parseFactor(options.dcBiasFactor, '--dc-bias-factor');
      const { deratings, dcBias } = deratingsWithTolerance(split.deratings, dcBiasFactor, options.deratingTolerance, '--derating-tolerance');
      const addedTolerance = addedPartsTolerance(options.addedTolerance, '--added-tolerance');
      const switchCoss = options.switchCoss === undefined ? undefined : parseValueWithTolerance(options.switchCoss, '--switch-coss', 'F');
      const probe = parseProbeCapacitance(...eitherSpelling(options.probeCapacitance, '--probe-capacitance', options.probeC, '--probe-c'));
      const probeCTolerance = probeCapacitanceTolerance(probe, options.probeCTolerance, '--probe-c-tolerance');
      const edge = edgeRequest(options, ctx.io.cwd);
      const request = {
        captures: files.map((file, i) => {
          const loaded = namingFile(file, () => loadCaptureFor(file, { column: options.column }, ctx.io.cwd));
          return { file: basename(file), channel: loaded.channel, captureWarnings: loaded.capture.warnings, addedC: added[i], derating: i === 0 ? undefined : deratings[i - 1] };
        }),
        addedTolerance,
        dcBias,
        switchC: switchCoss,
        edge,
        probeC: probe?.value ?? 0,
        probeCTolerance,
        bandwidth: parsePositiveValue(...eitherSpelling(options.scopeBandwidth, '--scope-bandwidth', options.bandwidth, '--bandwidth'), 'Hz'),
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
      if (result.edgeCheck?.verdict === 'disagree') {
        ctx.io.err(`ringbench: ${crossCheckLine(result.edgeCheck.L, result.edgeCheck, result.L)}\n`);
        ctx.setExitCode(EXIT.failure);
      }
    });
}

/** The turn-on edge of --current-capture with its voltage: a channel of the same file, or the plateau given. */
function edgeRequest(options: ParasiticsOptions, cwd: string): EdgeRequest | undefined {
  const { currentCapture: file, switchVoltageColumn, plateauVoltage } = options;
  if (file === undefined) {
    const stray = [['--current-column', options.currentColumn], ['--switch-voltage-column', switchVoltageColumn], ['--plateau-voltage', plateauVoltage]].find(([, v]) => v !== undefined);
    if (stray) throw new UsageError(`${stray[0]} belongs to the L_p cross-check: give the turn-on edge with --current-capture`);
    return undefined;
  }
  if ((switchVoltageColumn === undefined) === (plateauVoltage === undefined)) {
    throw new UsageError('--current-capture needs the voltage across the loop inductance: give --switch-voltage-column or --plateau-voltage (one of them)');
  }
  const current = namingFile(file, () => loadCaptureFor(file, { column: options.currentColumn }, cwd)).channel;
  if (plateauVoltage !== undefined) {
    const given = parseValueWithTolerance(plateauVoltage, '--plateau-voltage', 'V');
    return { file: basename(file), current, plateau: quantity(given.value, given.value * toleranceToRelativeUncertainty(given.tolerance), 'V') };
  }
  const voltage = namingFile(file, () => loadCaptureFor(file, { column: switchVoltageColumn }, cwd)).channel;
  return { file: basename(file), current, voltage };
}
