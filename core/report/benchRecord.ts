// One bench-log record (a logged measurement of one unit) and the check of a line read back.

import { InputError } from '../inputError';

import type { FitSummary } from './fitSummary';
import type { Verdict } from '../circuit/verdict';
import type { Design } from '../circuit/design';
import type { CautionResult } from '../safety/evaluateCautions';

export const RECORD_KIND = 'ringbench-measurement';
export const RECORD_SCHEMA = 1;

/** The options of the fit as given, enough to run it again (null where left to the default). */
export interface MeasurementSettings {
  topology: string | null;
  known: string | null;
  column: string | null;
  sampleInterval: string | null;
  from: string | null;
  to: string | null;
  sortTime: boolean;
  /** Given only when stated (records written before these options have neither). */
  timeUnit?: string;
  valueUnit?: string;
  /** The segment read, given only when asked for (--segment). */
  segment?: string;
  /** The probe attenuation and reversal applied to the channel, given only when stated (--probe-ratio, --invert). */
  probeRatio?: string;
  invert?: boolean;
}

/** Cautions as logged: the standing advice and deferral are the same for every record and left out. */
export type LoggedCautions = Omit<CautionResult, 'advice' | 'adviceSource' | 'deferral'>;

export interface BenchRecord {
  record: typeof RECORD_KIND;
  schema: typeof RECORD_SCHEMA;
  /** 12 hex digits, random. */
  id: string;
  /** ISO 8601 time the measurement was logged. */
  time: string;
  /** Unit under test (serial number or name). */
  unit: string;
  operator: string | null;
  /** Fixture or test station the unit was measured on; absent when not given (and in records logged before it was kept). */
  station?: string;
  note: string | null;
  capture: { path: string; sha256: string; bytes: number; channel: string };
  settings: MeasurementSettings;
  fit: FitSummary;
  verdict: Verdict | null;
  design: { path: string; name: string; sha256: string; spec: Design } | null;
  cautions: LoggedCautions;
  software: { name: 'ringbench'; version: string };
}

/** A bench log that cannot be used: bad line, bad location, held lock. Names the line or path. */
export class LogError extends InputError {
  /** 1-based line of the log, when the problem is one line. */
  readonly line: number | null;
  constructor(message: string, line: number | null = null) {
    super(line === null ? message : `line ${line}: ${message}`, line === null ? null : `line ${line}`);
    this.name = 'LogError';
    this.line = line;
  }
}

/** The record on one line of a log, or a LogError naming the line and what is wrong. */
export function parseBenchRecord(text: string, line: number): BenchRecord {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    throw new LogError('not a JSON record (the line is cut or was edited by hand)', line);
  }
  if (!isObject(value) || value.record !== RECORD_KIND) {
    throw new LogError(`not a ringbench measurement record (expected "record": "${RECORD_KIND}")`, line);
  }
  if (value.schema !== RECORD_SCHEMA) {
    throw new LogError(`record schema ${JSON.stringify(value.schema)} is not ${RECORD_SCHEMA}: written by another version of ringbench`, line);
  }
  const problem = missingField(value);
  if (problem) throw new LogError(`record field ${problem}`, line);
  return value as unknown as BenchRecord;
}

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** The first field that is missing or of the wrong type, as a phrase, or null. */
function missingField(r: Record<string, unknown>): string | null {
  const strings = ['id', 'time', 'unit'] as const;
  for (const key of strings) if (typeof r[key] !== 'string' || r[key] === '') return `"${key}" must be a non-empty string`;
  if (!/^[0-9a-f]{12}$/.test(r.id as string)) return '"id" must be 12 hex digits';
  if (Number.isNaN(Date.parse(r.time as string))) return '"time" must be an ISO date';
  for (const key of ['operator', 'note'] as const) if (r[key] !== null && typeof r[key] !== 'string') return `"${key}" must be a string or null`;
  const capture = r.capture;
  if (!isObject(capture) || typeof capture.path !== 'string' || typeof capture.sha256 !== 'string' || typeof capture.bytes !== 'number') {
    return '"capture" must hold path, sha256 and bytes';
  }
  if (!isObject(r.settings)) return '"settings" must be an object';
  const fit = r.fit;
  if (!isObject(fit) || !isObject(fit.alpha) || !isObject(fit.omega0) || typeof fit.status !== 'string') {
    return '"fit" must be a fit summary (status, alpha, omega0, ...)';
  }
  // Records logged before the import summary was kept have none.
  if (fit.import !== undefined && !isObject(fit.import)) return '"fit.import" must be an import summary object';
  if (r.verdict !== null && !isObject(r.verdict)) return '"verdict" must be an object or null';
  if (r.design !== null && !isObject(r.design)) return '"design" must be an object or null';
  if (!isObject(r.cautions) || !Array.isArray(r.cautions.fired)) return '"cautions" must list the fired cautions';
  if (!isObject(r.software) || typeof r.software.version !== 'string') return '"software" must give the version';
  return null;
}
