// Amending or withdrawing a logged measurement: a correction record appended to the log, and the log as it stands once they apply.
//
// Nothing in a bench log is ever rewritten. A correction names the measurement it changes (`target`), what it
// does and why; readers apply the corrections in log order: an amendment replaces the labels it gives (unit,
// operator, note), a withdrawal takes the measurement out of the tables and the yield, shown apart with its reason.

import { benchRecordFrom, LogError, RECORD_ID, RECORD_SCHEMA, type BenchRecord } from './benchRecord';
import { isObject, isText, MAX_TEXT } from './jsonShape';

export const CORRECTION_KIND = 'ringbench-correction';

export type CorrectionAction = 'amend' | 'withdraw';

/** The labels an amendment may change; a key left out keeps its value, null clears operator or note. */
export interface LabelChanges {
  unit?: string;
  operator?: string | null;
  note?: string | null;
}

export interface CorrectionRecord {
  record: typeof CORRECTION_KIND;
  schema: typeof RECORD_SCHEMA;
  /** This correction's own id: 12 hex digits, random. */
  id: string;
  /** ISO 8601 time the correction was logged. */
  time: string;
  /** Id of the measurement record it changes. */
  target: string;
  action: CorrectionAction;
  /** What an amendment changes; empty for a withdrawal. */
  changes: LabelChanges;
  /** Why, in the words of whoever made it. */
  reason: string;
  software: { name: 'ringbench'; version: string };
}

/** One line of a bench log: a measurement or a correction of one. */
export type LogEntry = BenchRecord | CorrectionRecord;

export function isCorrection(entry: LogEntry): entry is CorrectionRecord {
  return entry.record === CORRECTION_KIND;
}

/** A parsed line as a measurement or a correction, checked field by field; a LogError naming the line otherwise. */
export function logEntryFrom(value: unknown, line: number): LogEntry {
  if (!isObject(value) || value.record !== CORRECTION_KIND) return benchRecordFrom(value, line);
  if (value.schema !== RECORD_SCHEMA) {
    throw new LogError(`record schema ${JSON.stringify(value.schema)} is not ${RECORD_SCHEMA}: written by another version of ringbench`, line);
  }
  const problem = correctionProblem(value);
  if (problem) throw new LogError(`correction field ${problem}`, line);
  return value as unknown as CorrectionRecord;
}

function correctionProblem(c: Record<string, unknown>): string | null {
  if (typeof c.id !== 'string' || !RECORD_ID.test(c.id)) return '"id": must be 12 hex digits';
  if (typeof c.time !== 'string' || Number.isNaN(Date.parse(c.time))) return '"time": must be an ISO date';
  if (typeof c.target !== 'string' || !RECORD_ID.test(c.target)) return '"target": must be the 12 hex digits of a measurement';
  if (c.action !== 'amend' && c.action !== 'withdraw') return '"action": must be "amend" or "withdraw"';
  if (!isText(c.reason) || c.reason.trim() === '') return `"reason": must be text of 1 to ${MAX_TEXT} characters`;
  const changes = labelChangesProblem(c.changes, c.action);
  if (changes) return `"changes": ${changes}`;
  if (!isObject(c.software) || !isText(c.software.name) || !isText(c.software.version)) return '"software": must give the name and version';
  return null;
}

/** What is wrong with the changes of an amendment (at least one label) or a withdrawal (none), or null. */
export function labelChangesProblem(changes: unknown, action: CorrectionAction): string | null {
  if (!isObject(changes)) return 'must be an object';
  const keys = Object.keys(changes);
  const extra = keys.find((key) => !['unit', 'operator', 'note'].includes(key));
  if (extra !== undefined) return `has an unknown field "${extra}"`;
  if (action === 'withdraw') return keys.length ? 'a withdrawal changes no label' : null;
  if (!keys.length) return 'an amendment changes at least one of unit, operator and note';
  if (changes.unit !== undefined && (!isText(changes.unit) || changes.unit.trim() === '')) return 'unit must be a non-empty text';
  for (const key of ['operator', 'note']) if (changes[key] !== undefined && changes[key] !== null && !isText(changes[key])) return `${key} must be text or null`;
  return null;
}

/** A measurement taken out of the log's tables, with the correction that did it. */
export interface WithdrawnMeasurement {
  record: BenchRecord;
  withdrawal: CorrectionRecord;
}

/** The log once its corrections apply. */
export interface StandingLog {
  /** Measurements not withdrawn, in log order, with their amended labels. */
  records: BenchRecord[];
  withdrawn: WithdrawnMeasurement[];
  /** Amendments per measurement id, in log order. */
  amendments: Record<string, CorrectionRecord[]>;
  /** Plain notes: corrections that name no measurement of this log. */
  notes: string[];
}

/** Apply the corrections in log order; a later amendment of the same label wins, a withdrawal is final. */
export function applyCorrections(entries: readonly LogEntry[]): StandingLog {
  const measurements: BenchRecord[] = [];
  /** Where each id's latest measurement sits in `measurements` (an id logged twice: the later one is corrected). */
  const at = new Map<string, number>();
  const withdrawals = new Map<number, CorrectionRecord>();
  const standing: StandingLog = { records: [], withdrawn: [], amendments: {}, notes: [] };
  for (const entry of entries) {
    if (!isCorrection(entry)) {
      at.set(entry.id, measurements.push(entry) - 1);
      continue;
    }
    const index = at.get(entry.target);
    if (index === undefined) {
      standing.notes.push(`correction ${entry.id} names measurement ${entry.target}, which is not logged before it: not applied`);
      continue;
    }
    if (entry.action === 'withdraw') {
      if (!withdrawals.has(index)) withdrawals.set(index, entry);
      continue;
    }
    measurements[index] = { ...measurements[index], ...entry.changes };
    (standing.amendments[entry.target] ??= []).push(entry);
  }
  for (const [index, record] of measurements.entries()) {
    const withdrawal = withdrawals.get(index);
    if (withdrawal) standing.withdrawn.push({ record, withdrawal });
    else standing.records.push(record);
  }
  return standing;
}

/** 'unit SN040 → SN041, note cleared' for one amendment. */
export function describeChanges(changes: LabelChanges): string {
  return (['unit', 'operator', 'note'] as const)
    .filter((key) => changes[key] !== undefined)
    .map((key) => (changes[key] === null ? `${key} cleared` : `${key} set to “${changes[key]}”`))
    .join(', ');
}

/** One line per amendment and withdrawal, for the terminal and the reports (the stray corrections are in `notes`). */
export function describeCorrections(standing: StandingLog): string[] {
  const lines: string[] = [];
  for (const [id, list] of Object.entries(standing.amendments)) {
    for (const a of list) lines.push(`measurement ${id} amended ${a.time.slice(0, 19).replace('T', ' ')} UTC: ${describeChanges(a.changes)} (${a.reason})`);
  }
  for (const { record, withdrawal } of standing.withdrawn) {
    lines.push(`measurement ${record.id} of ${record.unit} (${record.time.slice(0, 19).replace('T', ' ')} UTC) withdrawn ${withdrawal.time.slice(0, 19).replace('T', ' ')} UTC: ${withdrawal.reason}; left out of the tables and the yield`);
  }
  return lines;
}
