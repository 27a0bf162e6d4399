// The bench log behind the bench API: a window's measurement made into a record, appended, corrected, read back as it stands.

import { existsSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { appendBenchLog, describeTornTail, readCleanBenchLog } from '../io/benchLog';
import { correctLoggedMeasurement } from '../app/logCorrection';
import { parseBenchRecord, RECORD_KIND, RECORD_SCHEMA, type BenchRecord } from '../../core/report/benchRecord';
import { parseDesign } from '../../core/circuit/design';
import type { BenchLogRequest, BenchLogView, LogCorrectionRequest } from '../../core/bench/benchApiTypes';
import { VERSION } from '../version';
import { checkLabel, checkNote } from '../app/labels';
import { UsageError } from '../../core/inputError';

/** The record for a request: the window's results plus the id, the time and the software. */
export function recordFromRequest(request: BenchLogRequest, now: Date, id = randomBytes(6).toString('hex')): BenchRecord {
  // As `ringbench log add`: an answer a setup check refused is not a measurement to log.
  const refusal = request.setupChecks?.find((check) => check.level === 'refusal');
  if (refusal) throw new UsageError(`a setup check refused the answer, nothing was logged: ${refusal.message}`);
  const record: BenchRecord = {
    record: RECORD_KIND,
    schema: RECORD_SCHEMA,
    id,
    time: now.toISOString(),
    // The same label rules as `ringbench log add --unit/--operator`.
    unit: checkLabel(request.unit, 'unit'),
    operator: request.operator === null || request.operator.trim() === '' ? null : checkLabel(request.operator, 'operator'),
    note: request.note === null ? null : checkNote(request.note, 'note'),
    capture: request.capture,
    settings: request.settings,
    fit: request.fit,
    verdict: request.verdict,
    // Re-reading the spec checks every field as a design file would be checked.
    design: request.design ? { ...request.design, spec: parseDesign(JSON.stringify(request.design.spec)) } : null,
    cautions: request.cautions,
    ...(request.setupChecks?.length ? { setupChecks: request.setupChecks } : {}),
    software: { name: 'ringbench', version: VERSION },
  };
  // The same check the log applies to every line it reads back.
  return parseBenchRecord(JSON.stringify(record), 1);
}

export function appendLogRequest(logPath: string, request: BenchLogRequest, now: Date): BenchLogView {
  appendBenchLog(logPath, recordFromRequest(request, now));
  return readLogView(logPath);
}

/** Amend or withdraw a logged measurement (the same function as `ringbench log amend` and `log withdraw`), then the log as it stands. */
export function correctLogRequest(logPath: string, request: LogCorrectionRequest, now: Date): BenchLogView {
  correctLoggedMeasurement(logPath, request, { clock: () => now });
  return readLogView(logPath);
}

/** The log as it stands (corrections applied) and plain notes about lines it could not use; empty when there is no log yet. */
export function readLogView(logPath: string): BenchLogView {
  if (!existsSync(logPath)) return { path: logPath, records: [], notes: [] };
  const contents = readCleanBenchLog(logPath);
  const notes = [...contents.notes];
  if (contents.torn) notes.push(describeTornTail(logPath, contents.torn));
  const amended = Object.keys(contents.amendments);
  const withdrawn = contents.withdrawn.map(({ record, withdrawal }) => ({ record, time: withdrawal.time, reason: withdrawal.reason }));
  return { path: logPath, records: contents.records, notes, ...(withdrawn.length ? { withdrawn } : {}), ...(amended.length ? { amended } : {}) };
}
