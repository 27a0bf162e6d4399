// One capture of a batch measured (fit, verdict, cautions, the record to log) as plain data a worker process can send back.

import { basename, extname } from 'node:path';
import { describeFailure, type FailureText } from '../../core/inputError';
import type { BenchRecord } from '../../core/report/benchRecord';
import type { CautionResult } from '../../core/safety/evaluateCautions';
import { fitSucceeded, type FitSummary } from '../../core/report/fitSummary';
import type { Verdict } from '../../core/circuit/verdict';
import type { SetupCheck } from '../../core/circuit/setupTypes';
import type { MeasureSettings } from '../../core/workflow/measureSettings';
import { verdictRefusal } from '../../core/workflow/measure';
import { setupRefused } from '../../core/workflow/setupChecks';
import { createBenchRecord } from './benchLogRecord';
import { checkLabel } from './labels';
import { measureFile, type LoadedDesign } from './measureFile';

/** What every capture of one batch shares: how to read and measure it, and whether to make a record. */
export interface BatchSettings {
  settings: MeasureSettings;
  /** Working folder that relative option paths are taken from. */
  cwd: string;
  design: LoadedDesign | null;
  /** With a bench log: who measured, where, and a note for every record (the unit id is the file name without its extension); null: no records. */
  logging: { operator: string | null; station: string | null; note: string | null } | null;
}

/** A capture measured: the plain results, without the samples. */
export interface BatchMeasured {
  file: string;
  summary: FitSummary;
  verdict: Verdict | null;
  cautions: CautionResult;
  /** Can this capture support the answer (setupChecks.ts): a refusal fails the capture. */
  setupChecks: SetupCheck[];
  /** Why the design gave this capture no verdict (verdictRefusal), or null: without a design, or with a verdict. */
  noVerdict: string | null;
  /** The record to append to the bench log: only when logging, the fit succeeded and no setup check refused the answer. */
  record: BenchRecord | null;
}

/** A capture that could not be measured: its file and why (bad input, or a failure of ours). */
export interface BatchUnmeasured {
  file: string;
  failure: FailureText;
}

export type BatchOutcome = BatchMeasured | BatchUnmeasured;

export function isMeasured(outcome: BatchOutcome): outcome is BatchMeasured {
  return 'summary' in outcome;
}

/** Measure the capture `path` (shown as `file`); never throws: a capture that cannot be measured is an outcome too. */
export function measureBatchFile(path: string, file: string, batch: BatchSettings): BatchOutcome {
  try {
    const measurement = measureFile(path, batch.settings, batch.cwd, batch.design, batch.logging !== null);
    const { summary, verdict, cautions } = measurement;
    // As log add: a failed fit or an answer a setup check refused is not logged.
    const logged = batch.logging && fitSucceeded(summary) && !setupRefused(measurement.setupChecks) ? batch.logging : null;
    const record = logged
      ? createBenchRecord(measurement, { unit: checkLabel(basename(file, extname(file)), 'the unit id (the file name without its extension)'), ...logged }, batch.settings)
      : null;
    const noVerdict = batch.design ? verdictRefusal(batch.design.design, summary, measurement.setupChecks) : null;
    return { file, summary, verdict, cautions, setupChecks: measurement.setupChecks, noVerdict, record };
  } catch (error) {
    return { file, failure: describeFailure(error) };
  }
}
