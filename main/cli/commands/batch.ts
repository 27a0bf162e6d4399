// `ringbench batch DIR`: fit every capture of a folder, one result each; a bad file does not stop the rest.
// Exit 0 when every fit converged (and was in tolerance), 1 when any file could not be read, its fit failed
// (any status but converged) or, with a design, it got no verdict (verdictRefusal), else 3 when any unit was out of tolerance.

import type { Command } from 'commander';
import { readdirSync, statSync } from 'node:fs';
import { basename, extname, join, resolve } from 'node:path';
import type { CommandContext } from '../commandContext';
import type { LogAddOptions } from './log';
import { addCaptureOptions, addComponentOptions, measureSettingsOf } from '../measureOptions';
import { appendBenchLog, requireLogFolder } from '../../io/benchLog';
import { createBenchRecord } from '../../app/benchLogRecord';
import { loadDesignFile, measureFile, type FileMeasurement } from '../../app/measureFile';
import { briefValue, regimeTag } from '../../../core/report/resultRows';
import { fitSucceeded, fitWarnings } from '../../../core/report/fitSummary';
import { verdictRefusal } from '../../../core/workflow/measure';
import { EXIT, messageFor } from '../errors';
import { UsageError } from '../../../core/inputError';
import { FileError } from '../../io/fileError';

const CAPTURE_EXTENSIONS = new Set(['.csv', '.txt', '.dat']);

type BatchOptions = Omit<LogAddOptions, 'log' | 'unit'> & { log?: string };

interface BatchEntry {
  file: string;
  measurement?: FileMeasurement;
  /** Why a measured file got no verdict against the design (verdictRefusal), or null: without a design, or with a verdict. */
  noVerdict?: string | null;
  error?: string;
}

/** Capture files of a folder (*.csv, *.txt, *.dat, any case), sorted by name. */
export function listCaptureFiles(folder: string): string[] {
  let names: string[];
  try {
    if (!statSync(folder).isDirectory()) throw new FileError(`'${folder}' is not a folder`);
    names = readdirSync(folder);
  } catch (error) {
    if (error instanceof FileError) throw error;
    throw new FileError(`cannot read folder '${folder}': ${(error as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such folder' : (error as NodeJS.ErrnoException).code}`);
  }
  return names
    .filter((name) => CAPTURE_EXTENSIONS.has(extname(name).toLowerCase()) && statSync(join(folder, name)).isFile())
    .sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
}

export function registerBatchCommand(program: Command, ctx: CommandContext): void {
  const command = program
    .command('batch')
    .description('fit every capture (*.csv, *.txt, *.dat) of a folder; exit 1 when a file could not be read, its fit failed or it got no verdict against the design, 3 when a unit was out of tolerance')
    .argument('<dir>', 'folder of capture files')
    .option('--design <file>', 'design file to check every unit against (instead of --topology/--known)');
  addCaptureOptions(addComponentOptions(command))
    .option('--log <path>', 'append each converged result to this bench log, the unit id taken from the file name')
    .option('--operator <name>', 'who measured (with --log)')
    .option('--json', 'print a JSON array, one fit summary per file with its status and warnings, and noVerdict when the design gave it no verdict ({ file, error } for a file that could not be read)')
    .action((dir: string, options: BatchOptions) => {
      const folder = resolve(ctx.io.cwd, dir);
      if (options.design && (options.topology !== undefined || options.known !== undefined)) {
        throw new UsageError('--design gives the topology and components: leave out --topology and --known');
      }
      const logPath = options.log === undefined ? null : resolve(ctx.io.cwd, options.log);
      if (logPath) requireLogFolder(logPath);
      const design = options.design === undefined ? null : loadDesignFile(options.design, ctx.io.cwd);
      const files = listCaptureFiles(folder);
      if (!files.length) throw new FileError(`no capture files (*.csv, *.txt, *.dat) in '${dir}'`);
      const settings = measureSettingsOf(options);
      const operator = options.operator?.trim() || null;

      const entries: BatchEntry[] = files.map((name, i) => {
        if (ctx.io.interactive) ctx.io.err(`[${i + 1}/${files.length}] ${name}\n`);
        try {
          const measurement = measureFile(join(folder, name), settings, ctx.io.cwd, design);
          if (logPath && fitSucceeded(measurement.summary)) {
            const record = createBenchRecord(measurement, { unit: basename(name, extname(name)), operator, note: null }, settings);
            appendBenchLog(logPath, record);
          }
          return { file: name, measurement, noVerdict: design ? verdictRefusal(design.design, measurement.summary) : null };
        } catch (error) {
          return { file: name, error: messageFor(error) };
        }
      });

      ctx.io.out(options.json ? `${JSON.stringify(entries.map(jsonOf))}\n` : formatBatchTable(entries));
      const failed = entries.some((e) => !e.measurement || !fitSucceeded(e.measurement.summary) || e.noVerdict);
      const outOfTolerance = entries.some((e) => e.measurement?.verdict && !e.measurement.verdict.pass);
      ctx.setExitCode(failed ? EXIT.failure : outOfTolerance ? EXIT.outOfTolerance : EXIT.ok);
    });
}

function jsonOf(entry: BatchEntry): object {
  if (entry.error !== undefined || !entry.measurement) return { file: entry.file, error: entry.error };
  const { summary, verdict, cautions } = entry.measurement;
  return { ...summary, file: entry.file, verdict, ...(entry.noVerdict ? { noVerdict: entry.noVerdict } : {}), cautions };
}

function formatBatchTable(entries: BatchEntry[]): string {
  const header = ['file', 'status', 'warnings', 'regime', 'f0', 'zeta', 'Q', 'verdict', 'cautions'];
  const rows = entries.map((entry) => {
    if (!entry.measurement) return [entry.file, `error: ${entry.error}`];
    const { summary: s, verdict, cautions } = entry.measurement;
    return [
      entry.file,
      s.status,
      String(fitWarnings(s).length),
      regimeTag(s) ?? '-',
      briefValue(s, 'f0'),
      briefValue(s, 'zeta'),
      briefValue(s, 'Q'),
      entry.noVerdict ? 'none' : verdict ? (verdict.pass ? 'pass' : 'FAIL') : '-',
      cautions.fired.length ? cautions.fired.map((c) => c.id).join(',') : '-',
    ];
  });
  const widths = header.map((h, c) => Math.max(h.length, ...rows.filter((r) => r.length > 2).map((r) => r[c].length)));
  const line = (cells: string[]) => (cells.length === 2 ? cells.join('  ') : cells.map((cell, c) => cell.padEnd(widths[c])).join('  ').trimEnd());
  // Why a file got no verdict, one line each below the table (a reason is too long for a column).
  const refusals = entries.filter((e) => e.noVerdict).map((e) => `${e.file}: no verdict: ${e.noVerdict}`);
  return [line(header), ...rows.map(line), ...refusals].map((l) => `${l}\n`).join('');
}
