// `ringbench log add FILE` and `ringbench log list`: append a measurement to the bench log, list the log.

import type { Command } from 'commander';
import { resolve } from 'node:path';
import type { CommandContext } from '../commandContext';
import { addCaptureOptions, addComponentOptions, measureSettingsOf, type MeasureCommandOptions } from '../measureOptions';
import { appendBenchLog, describeTornTail, readCleanBenchLog, requireLogFolder } from '../../io/benchLog';
import { createBenchRecord } from '../../app/benchLogRecord';
import { loadDesignFile, measureFile } from '../../app/measureFile';
import { checkLabel } from '../../app/labels';
import { readMergedLogs } from '../../app/mergedLogs';
import { UsageError } from '../../../core/inputError';
import { formatFitText } from '../../../core/report/fitText';
import { fitSucceeded } from '../../../core/report/fitSummary';
import { formatVerdictText } from '../../../core/report/verdictText';
import { formatLogTable } from '../../../core/report/logTable';
import { formatCautionsText } from '../../../core/safety/cautionText';
import { EXIT } from '../errors';

export interface LogAddOptions extends MeasureCommandOptions {
  log: string;
  unit: string;
  design?: string;
  operator?: string;
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
  addCaptureOptions(addComponentOptions(add))
    .option('--operator <name>', 'who measured')
    .option('--note <text>', 'free text kept with the record')
    .option('--json', 'print the logged record as JSON')
    .exitOverride()
    .configureOutput(output)
    .action((file: string, options: LogAddOptions) => {
      const logPath = resolve(ctx.io.cwd, options.log);
      const label = {
        unit: checkLabel(options.unit, '--unit'),
        operator: options.operator === undefined ? null : checkLabel(options.operator, '--operator'),
        note: options.note === undefined || options.note.trim() === '' ? null : options.note,
      };
      requireLogFolder(logPath);
      const design = options.design === undefined ? null : loadDesignFile(options.design, ctx.io.cwd);
      const settings = measureSettingsOf(options);
      const measurement = measureFile(file, settings, ctx.io.cwd, design);
      if (!fitSucceeded(measurement.summary)) {
        ctx.io.out(options.json ? `${JSON.stringify({ logged: null, fit: measurement.summary })}\n` : formatFitText(measurement.summary));
        ctx.io.err(`ringbench: the fit failed (${measurement.summary.status}), nothing was logged: ${measurement.summary.message}\n`);
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
    .option('--json', 'print the records as a JSON object { records, torn, duplicates, logs }: torn is the cut-off last line of a single log, logs gives each log\'s')
    .exitOverride()
    .configureOutput(output)
    .action((logs: string[], options: { log: string[]; json?: boolean }) => {
      const given = [...options.log, ...logs];
      if (!given.length) throw new UsageError('no bench log given: name one with --log FILE (repeat --log, or list the logs, for several)', '--log');
      const perLog: { log: string; records: number; torn: { line: number; text: string } | null }[] = [];
      const merged = readMergedLogs(
        given.map((shown) => ({ path: resolve(ctx.io.cwd, shown), shown })),
        ({ path, shown }) => {
          const contents = readCleanBenchLog(path);
          perLog.push({ log: shown, records: contents.records.length, torn: contents.torn });
          return { records: contents.records, notes: contents.torn ? [describeTornTail(shown, contents.torn)] : [] };
        },
      );
      if (options.json) {
        const torn = perLog.length === 1 ? perLog[0].torn : null;
        ctx.io.out(`${JSON.stringify({ records: merged.records, torn, duplicates: merged.duplicates, logs: perLog })}\n`);
      } else {
        ctx.io.out(merged.records.length ? formatLogTable(merged.records) : 'no measurements logged yet\n');
      }
      for (const note of merged.notes) ctx.io.err(`ringbench: note: ${note}\n`);
    });
}
