// `ringbench batch DIR`: fit every capture of a folder (or one shard's share of it) on worker processes, one result each; a bad file does not stop the rest.
// Exit 0 when every fit converged (and was in tolerance), 1 when any file could not be read, its fit failed
// (any status but converged) or, with a design, it got no verdict (verdictRefusal), else 3 when any unit was out of tolerance.

import type { Command } from 'commander';
import { join, resolve } from 'node:path';
import type { CommandContext } from '../commandContext';
import type { LogAddOptions } from './log';
import { addSetupOptions, addCaptureOptions, addComponentOptions, addModeOptions, measureSettingsOf } from '../measureOptions';
import { appendBenchLog, requireBenchLogFile, requireLogFolder } from '../../io/benchLog';
import { checkConditions } from '../../app/labels';
import { loadDesignFile } from '../../app/measureFile';
import { isMeasured, type BatchOutcome } from '../../app/batchFile';
import { listCaptureFiles, shardShare } from '../../app/batchFolder';
import { measureBatch } from '../../app/batchPool';
import { fitSucceeded } from '../../../core/report/fitSummary';
import { parseMeasureSettings } from '../../../core/workflow/measureSettings';
import { describeFailure, UsageError } from '../../../core/inputError';
import { EXIT } from '../errors';
import { setupRefused } from '../../../core/workflow/setupChecks';
import { FileError } from '../../io/fileError';
import { parseJobs, parseShard } from '../batchOptions';
import { startProgress } from '../batchProgress';
import { batchJsonLine, batchJsonOf, formatBatchTable } from '../batchOutput';

type BatchOptions = Omit<LogAddOptions, 'log' | 'unit'> & { log?: string; jobs?: string; shard?: string; jsonl?: boolean };

export function registerBatchCommand(program: Command, ctx: CommandContext): void {
  const command = program
    .command('batch')
    .description('fit every capture (*.csv, *.txt, *.dat, *.lvm) of a folder; exit 1 when a file could not be read, its fit failed or it got no verdict against the design, 3 when a unit was out of tolerance')
    .argument('<dir>', 'folder of capture files')
    .option('--design <file>', 'design file to check every unit against (instead of --topology/--known)');
  addModeOptions(addSetupOptions(addCaptureOptions(addComponentOptions(command))))
    .option('--log <path>', 'append each converged result to this bench log as it finishes, the unit id taken from the file name')
    .option('--operator <name>', 'who measured (with --log)')
    .option('--station <name>', 'fixture or test station the units were measured on (with --log)')
    .option('--note <text>', 'a free note kept in every record (with --log)')
    .option('--jobs <n>', 'captures fitted at once, each on its own thread (default: one per core; 1: no threads)')
    .option('--shard <K/N>', "fit shard K of N only: file i of the folder (0-based, by code-point order of its name) belongs to shard (i mod N) + 1")
    .option('--json', 'print a JSON array in folder order, one fit summary per file with its status and warnings, and noVerdict when the design gave it no verdict ({ file, error } for a file that could not be read)')
    .option('--jsonl', "print one JSON object per line as each capture finishes (completion order): --json's element, or { file, status: 'error', message } for a file that could not be read")
    .action(async (dir: string, options: BatchOptions) => {
      const folder = resolve(ctx.io.cwd, dir);
      if (options.design && (options.topology !== undefined || options.known !== undefined)) {
        throw new UsageError('--design gives the topology and components: leave out --topology and --known');
      }
      if (options.json && options.jsonl) throw new UsageError('--json and --jsonl: choose one');
      if (options.mode !== undefined && options.known === undefined && !options.design) {
        throw new UsageError('--mode names the mode R, L and C are derived for (or a design checks): give --topology and --known, or --design');
      }
      const jobs = parseJobs(options.jobs);
      const shard = parseShard(options.shard);
      const settings = measureSettingsOf(options);
      parseMeasureSettings(settings); // a bad measuring option is refused here, once, not once per file
      const logPath = options.log === undefined ? null : resolve(ctx.io.cwd, options.log);
      if (logPath) {
        requireLogFolder(logPath);
        requireBenchLogFile(logPath);
      }
      const logging = logPath ? checkConditions(options) : null;
      const design = options.design === undefined ? null : loadDesignFile(options.design, ctx.io.cwd);
      const files = listCaptureFiles(folder);
      if (!files.length) throw new FileError(`no capture files (*.csv, *.txt, *.dat, *.lvm) in '${dir}'`);
      const share = shard ? shardShare(files, shard) : files;
      if (shard && !share.length) ctx.io.err(`ringbench: shard ${shard.index}/${shard.count} holds none of the ${files.length} captures in '${dir}'\n`);

      const batch = { settings, cwd: ctx.io.cwd, design, logging };
      const progress = startProgress(ctx.io, share.length);
      // Kept in folder order for the table and --json, whatever finishes first.
      const outcomes: BatchOutcome[] = new Array(share.length);
      let done = 0;
      await measureBatch(
        share.map((file) => ({ path: join(folder, file), file })),
        batch,
        jobs,
        (index, measured) => {
          const outcome = logPath ? logRecord(logPath, measured) : measured;
          outcomes[index] = outcome;
          if (options.jsonl) progress.print(batchJsonLine(outcome));
          progress.update(++done);
        },
      );

      if (!options.jsonl) ctx.io.out(options.json ? `${JSON.stringify(outcomes.map(batchJsonOf))}\n` : formatBatchTable(outcomes));
      const failed = outcomes.some((o) => !isMeasured(o) || !fitSucceeded(o.summary) || o.noVerdict || setupRefused(o.setupChecks));
      const outOfTolerance = outcomes.some((o) => isMeasured(o) && o.verdict && !o.verdict.pass);
      ctx.setExitCode(failed ? EXIT.failure : outOfTolerance ? EXIT.outOfTolerance : EXIT.ok);
    });
}

/** Append the outcome's record, if it has one; a record that cannot be appended makes the capture's line an error. */
function logRecord(logPath: string, outcome: BatchOutcome): BatchOutcome {
  if (!isMeasured(outcome) || !outcome.record) return outcome;
  try {
    appendBenchLog(logPath, outcome.record);
    return outcome;
  } catch (error) {
    return { file: outcome.file, failure: describeFailure(error) };
  }
}
