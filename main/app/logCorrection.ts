// Amend or withdraw a logged measurement: the one function `log amend`, `log withdraw`, the bench API and the window's button call.

import { randomBytes } from 'node:crypto';
import { LogError, RECORD_SCHEMA } from '../../core/report/benchRecord';
import { CORRECTION_KIND, labelChangesProblem, type CorrectionAction, type CorrectionRecord, type LabelChanges } from '../../core/report/logCorrection';
import { MAX_TEXT } from '../../core/report/jsonShape';
import { UsageError } from '../../core/inputError';
import { appendBenchLog, readCleanBenchLog } from '../io/benchLog';
import { checkLabel, checkNote } from './labels';
import { VERSION } from '../version';

export interface CorrectionRequest {
  /** Id of the logged measurement. */
  target: string;
  action: CorrectionAction;
  /** For an amendment: the labels to change (null clears operator or note); {} for a withdrawal. */
  changes: LabelChanges;
  reason: string;
}

export interface CorrectionDeps {
  clock?: () => Date;
  /** 12 hex digits. Default: random. */
  newId?: () => string;
}

/**
 * Append the correction of one measurement to the log after checking that the measurement is there and
 * not withdrawn already; the measurement's own line is never touched. LogError or UsageError (exit 2) otherwise.
 */
export function correctLoggedMeasurement(logPath: string, request: CorrectionRequest, deps: CorrectionDeps = {}): CorrectionRecord {
  const reason = request.reason.trim();
  if (reason === '') throw new UsageError(`say why the measurement is ${request.action === 'amend' ? 'amended' : 'withdrawn'} (a reason is kept with the change)`);
  if (reason.length > MAX_TEXT) throw new UsageError(`the reason must be at most ${MAX_TEXT} characters, got ${reason.length}`);
  // The reason is printed in `log list` and the reports, so it may not move a terminal's cursor.
  if (/[\u0000-\u001f\u007f]/.test(reason)) throw new UsageError('the reason must not contain line breaks or control characters');
  const changes = normalizedChanges(request.changes);
  const problem = labelChangesProblem(changes, request.action);
  if (problem) throw new UsageError(`the change ${problem}`);
  const log = readCleanBenchLog(logPath);
  const withdrawn = log.withdrawn.find((w) => w.record.id === request.target);
  if (withdrawn) throw new LogError(`measurement ${request.target} in '${logPath}' was withdrawn already (${withdrawn.withdrawal.time}: ${withdrawn.withdrawal.reason})`);
  if (!log.records.some((r) => r.id === request.target)) throw new LogError(`no measurement ${request.target} in bench log '${logPath}' (\`ringbench log list\` shows the ids)`);
  const correction: CorrectionRecord = {
    record: CORRECTION_KIND,
    schema: RECORD_SCHEMA,
    id: (deps.newId ?? (() => randomBytes(6).toString('hex')))(),
    time: (deps.clock ?? (() => new Date()))().toISOString(),
    target: request.target,
    action: request.action,
    changes,
    reason,
    software: { name: 'ringbench', version: VERSION },
  };
  appendBenchLog(logPath, correction);
  return correction;
}

/** Labels as the log keeps them: checked as `log add` checks them, a blank operator or note cleared. */
function normalizedChanges(changes: LabelChanges): LabelChanges {
  const out: LabelChanges = {};
  if (changes.unit !== undefined) out.unit = checkLabel(changes.unit, 'unit');
  if (changes.operator !== undefined) out.operator = changes.operator === null || changes.operator.trim() === '' ? null : checkLabel(changes.operator, 'operator');
  if (changes.note !== undefined) out.note = changes.note === null ? null : checkNote(changes.note, 'note');
  return out;
}
