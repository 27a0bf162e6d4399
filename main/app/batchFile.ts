// One capture of a batch measured (fit, verdict, cautions, the record to log) as plain data a worker thread can send back.

import { basename, extname } from 'node:path';
import { describeFailure, type FailureText } from '../../core/inputError';
import type { BenchRecord } from '../../core/report/benchRecord';
import type { CautionResult } from '../../core/safety/evaluateCautions';
import { fitSucceeded, type FitSummary } from '../../core/report/fitSummary';
import type { Verdict } from '../../core/circuit/verdict';
import type { SetupCheck } from '../../core/circuit/setupTypes';
import type { MeasureSettings } from '../../core/workflow/measureSettings';
import { verdictRefusal } from '../../core/workflow/measure';
import { createBenchRecord } from './benchLogRecord';
import { measureFile, type LoadedDesign } from './measureFile';

/** What every capture of one batch shares: how to read and measure it, and whether to make a record. */
export interface BatchSettings {
  settings: MeasureSettings;
  /** Working folder that relative option paths are taken from. */
  cwd: string;
  design: LoadedDesign | null;
  /** With a bench log: who measured (the unit id is the file name without its extension); null: no records. */
  logging: { operator: string | null } | null;
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
  /** The record to append to the bench log: only when logging and the fit succeeded. */
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
    const measurement = measureFile(path, batch.settings, batch.cwd, batch.design);
    const { summary, verdict, cautions } = measurement;
    const record =
      batch.logging && fitSucceeded(summary)
        ? createBenchRecord(measurement, { unit: basename(file, extname(file)), operator: batch.logging.operator, note: null }, batch.settings)
        : null;
    const noVerdict = batch.design ? verdictRefusal(batch.design.design, summary) : null;
    return { file, summary, verdict, cautions, setupChecks: measurement.setupChecks, noVerdict, record };
  } catch (error) {
    return { file, failure: describeFailure(error) };
  }
}
