// `ringbench log add FILE`, `log list`, `log amend ID` and `log withdraw ID`: append a measurement to the bench log,
// list the log as it stands, and correct a logged measurement by appending a correction (nothing is rewritten).

import type { Command } from 'commander';
import { resolve } from 'node:path';
import type { CommandContext } from '../commandContext';
import { addCaptureOptions, addComponentOptions, addModeOptions, addSetupOptions, measureSettingsOf, type MeasureCommandOptions } from '../measureOptions';
import { setupRefused } from '../../../core/workflow/setupChecks';
import { formatSetupChecksText } from '../../../core/report/setupChecksText';
import { appendBenchLog, describeTornTail, readCleanBenchLog, requireBenchLogFile, requireLogFolder } from '../../io/benchLog';
import { correctLoggedMeasurement } from '../../app/logCorrection';
import type { CorrectionAction, LabelChanges, WithdrawnMeasurement } from '../../../core/report/logCorrection';
import type { BenchRecord } from '../../../core/report/benchRecord';
import { createBenchRecord } from '../../app/benchLogRecord';
import { loadDesignFile, measureFile } from '../../app/measureFile';
import { checkConditions, checkLabel, checkNote } from '../../app/labels';
import { readMergedLogs } from '../../app/mergedLogs';
import { UsageError } from '../../../core/inputError';
import { formatFitText } from '../../../core/report/fitText';
import { fitSucceeded } from '../../../core/report/fitSummary';
import { formatVerdictText } from '../../../core/report/verdictText';
import { formatLogTable } from '../../../core/report/logTable';
import { formatCautionsText } from '../../../core/safety/cautionText';
import { EXIT, namingFile } from '../errors';

export interface LogAddOptions extends MeasureCommandOptions {
  log: string;
  unit: string;
  design?: string;
  operator?: string;
  station?: string;
  note?: string;
}

export function registerLogCommand(program: Command, ctx: CommandContext): void {
  const log = program.command('log').description('the bench log: one JSON Lines file of measurements per project');
  const output = { writeOut: ctx.io.out, writeErr: ctx.io.err };

  const add = log
    .command('add')
    .description('fit a capture (and check it against a design) and append the result to the bench log; exit 3 when out of tolerance, 1 (nothing logged) when the fit fails')
    .argument('<file>', 'capture file (CSV or text export of a scope)')
    .requiredOption('--log <path>', 'bench log file (created when missing; its folder must exist)')
    .requiredOption('--unit <id>', 'unit under test, e.g. a serial number (1 to 100 characters)')
    .option('--design <file>', 'design file to check the unit against (instead of --topology/--known)');
  addModeOptions(addSetupOptions(addCaptureOptions(addComponentOptions(add))))
    .option('--operator <name>', 'who measured')
    .option('--station <name>', 'fixture or test station the unit was measured on')
    .option('--note <text>', 'free text kept with the record')
    .option('--json', 'print the logged record as JSON')
    .exitOverride()
    .configureOutput(output)
    .action((file: string, options: LogAddOptions) => {
      const logPath = resolve(ctx.io.cwd, options.log);
      const label = { unit: checkLabel(options.unit, '--unit'), ...checkConditions(options) };
      requireLogFolder(logPath);
      requireBenchLogFile(logPath);
      const design = options.design === undefined ? null : namingFile(options.design, () => loadDesignFile(options.design as string, ctx.io.cwd));
      const settings = measureSettingsOf(options);
      const measurement = namingFile(file, () => measureFile(file, settings, ctx.io.cwd, design, true));
      if (!fitSucceeded(measurement.summary)) {
        ctx.io.out(options.json ? `${JSON.stringify({ logged: null, fit: measurement.summary })}\n` : formatFitText(measurement.summary));
        ctx.io.err(`ringbench: the fit failed (${measurement.summary.status}), nothing was logged: ${measurement.summary.message}\n`);
        ctx.setExitCode(EXIT.failure);
        return;
      }
      // A setup check's refusal (an aliased frequency, a ring that does not decay): the answer cannot be stated, so it is not logged.
      if (setupRefused(measurement.setupChecks)) {
        const { setupChecks } = measurement;
        ctx.io.out(options.json ? `${JSON.stringify({ logged: null, fit: measurement.summary, setupChecks })}\n` : formatFitText(measurement.summary) + formatSetupChecksText(setupChecks));
        ctx.io.err(`ringbench: a setup check refused the answer, nothing was logged: ${setupChecks.find((c) => c.level === 'refusal')?.message}\n`);
        ctx.setExitCode(EXIT.failure);
        return;
      }
      const record = createBenchRecord(measurement, label, settings);
      const appended = appendBenchLog(logPath, record);
      if (appended.repairedTail) {
        ctx.io.err(`ringbench: note: the log ended in a cut-off line ${appended.repairedTail.line}; it was saved to ${appended.repairedTail.savedTo}\n`);
      }
      if (options.json) {
        ctx.io.out(`${JSON.stringify({ logged: record, cautions: measurement.cautions })}\n`);
      } else {
        let text = `logged ${record.unit} to ${options.log} (record ${record.id}, ${record.time})\n`;
        text += formatFitText(record.fit);
        if (record.verdict && record.design) text += formatVerdictText(record.verdict, record.design.name);
        text += formatCautionsText(measurement.cautions);
        ctx.io.out(text);
      }
      if (record.verdict && !record.verdict.pass) ctx.setExitCode(EXIT.outOfTolerance);
    });

  log
    .command('list')
    .description('list the measurements of a bench log, or of several merged (by time, a record in two logs listed once): time, unit, regime, f0, zeta, verdict')
    .argument('[logs...]', 'bench log files, as --log')
    .option('--log <path>', 'bench log file (repeat for several)', (value: string, previous: string[]) => [...previous, value], [] as string[])
    .option('--json', 'print the records as a JSON object { records, torn, duplicates, logs, withdrawn }: torn is the cut-off last line of a single log, logs gives each log\'s count, cut-off line and skipped lines')
    .exitOverride()
    .configureOutput(output)
    .action((logs: string[], options: { log: string[]; json?: boolean }) => {
      const given = [...options.log, ...logs];
      if (!given.length) throw new UsageError('no bench log given: name one with --log FILE (repeat --log, or list the logs, for several)', '--log');
      const perLog: { log: string; records: number; torn: { line: number; text: string } | null; skipped: { line: number; message: string }[] }[] = [];
      const corrected: Corrected = { withdrawn: [], amended: new Set(), skipped: 0 };
      const merged = readMergedLogs(
        given.map((shown) => ({ path: resolve(ctx.io.cwd, shown), shown })),
        ({ path, shown }) => {
          const contents = readCleanBenchLog(path, shown);
          perLog.push({ log: shown, records: contents.records.length, torn: contents.torn, skipped: contents.bad });
          corrected.withdrawn.push(...contents.withdrawn);
          for (const id of Object.keys(contents.amendments)) corrected.amended.add(id);
          corrected.skipped += contents.bad.length;
          return { records: contents.records, notes: [...contents.notes, ...contents.changes, ...(contents.torn ? [describeTornTail(shown, contents.torn)] : [])] };
        },
      );
      if (options.json) {
        const torn = perLog.length === 1 ? perLog[0].torn : null;
        ctx.io.out(`${JSON.stringify({ records: merged.records, torn, duplicates: merged.duplicates, logs: perLog, withdrawn: corrected.withdrawn })}\n`);
      } else {
        ctx.io.out(merged.records.length || corrected.withdrawn.length ? standingTable(merged.records, corrected) : 'no measurements logged yet\n');
      }
      for (const note of merged.notes) ctx.io.err(`ringbench: note: ${note}\n`);
      // Every good record is listed, but lines of the log could not be read: a failure a script should see (exit 1).
      if (corrected.skipped) ctx.setExitCode(EXIT.failure);
    });

  for (const action of ['amend', 'withdraw'] as const) registerCorrectionCommand(log, ctx, action);
}

/** What the corrections and skipped lines of the logs listed came to. */
interface Corrected {
  withdrawn: WithdrawnMeasurement[];
  amended: Set<string>;
  skipped: number;
}

/** The table with each measurement's id first (what `log amend` and `log withdraw` take), amended rows marked, then the withdrawn ones apart. */
function standingTable(records: readonly BenchRecord[], corrected: Corrected): string {
  const withIds = (list: readonly BenchRecord[], mark: (r: BenchRecord, i: number) => string) => {
    const [header, ...rows] = formatLogTable(list).trimEnd().split('\n');
    return [`${'id'.padEnd(12)}  ${header}`, ...rows.map((row, i) => `${list[i].id}  ${row}${mark(list[i], i)}`)];
  };
  const lines = records.length ? withIds(records, (r) => (corrected.amended.has(r.id) ? '  (amended)' : '')) : ['no measurements standing'];
  if (corrected.withdrawn.length) {
    const { withdrawn } = corrected;
    lines.push('', 'withdrawn (left out of the yield and the reports):');
    lines.push(...withIds(withdrawn.map((w) => w.record), (_, i) => `  withdrawn: ${withdrawn[i].withdrawal.reason}`));
  }
  return `${lines.join('\n')}\n`;
}

interface CorrectionOptions {
  log: string;
  reason: string;
  unit?: string;
  operator?: string;
  note?: string;
  json?: boolean;
}

function registerCorrectionCommand(log: Command, ctx: CommandContext, action: CorrectionAction): void {
  const command = log
    .command(action)
    .description(
      action === 'amend'
        ? 'change the unit, operator or note of a logged measurement: a correction record is appended, the measurement line stays as it was'
        : 'withdraw a logged measurement (a wrong capture, a unit measured by mistake): it leaves the tables, yield and reports and is listed apart with the reason; nothing is deleted',
    )
    .argument('<id>', 'the measurement id (12 hex digits, the first column of `ringbench log list`)')
    .requiredOption('--log <path>', 'bench log file')
    .requiredOption('--reason <text>', 'why, kept with the change');
  if (action === 'amend') {
    command
      .option('--unit <id>', 'the unit under test it was')
      .option('--operator <name>', "who measured ('' clears it)")
      .option('--note <text>', "the note ('' clears it)");
  }
  command
    .option('--json', 'print the correction record as JSON')
    .exitOverride()
    .configureOutput({ writeOut: ctx.io.out, writeErr: ctx.io.err })
    .action((id: string, options: CorrectionOptions) => {
      if (!/^[0-9a-f]{12}$/.test(id)) throw new UsageError('<id> must be the 12 hex digits of a logged measurement (the first column of `ringbench log list`)');
      const changes: LabelChanges = {};
      if (options.unit !== undefined) changes.unit = checkLabel(options.unit, '--unit');
      if (options.operator !== undefined) changes.operator = options.operator.trim() === '' ? null : checkLabel(options.operator, '--operator');
      if (options.note !== undefined) changes.note = checkNote(options.note, '--note');
      if (action === 'amend' && !Object.keys(changes).length) throw new UsageError('log amend: give --unit, --operator or --note (what changes)');
      const correction = correctLoggedMeasurement(resolve(ctx.io.cwd, options.log), { target: id, action, changes, reason: options.reason });
      ctx.io.out(
        options.json
          ? `${JSON.stringify({ logged: correction })}\n`
          : `${action === 'amend' ? 'amended' : 'withdrew'} measurement ${id} in ${options.log} (correction ${correction.id}, ${correction.time})\n`,
      );
    });
}

