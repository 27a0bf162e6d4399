// One bench-log record (a logged measurement of one unit) and the check of a line read back.

import type { SetupCheck } from '../circuit/setupTypes';
import { InputError } from '../inputError';
import { isObject, isText } from './jsonShape';
import { measurementShapeProblem, type ShapeProblem } from './recordShape';

import type { FitSummary } from './fitSummary';
import type { Verdict } from '../circuit/verdict';
import type { Design } from '../circuit/design';
import type { CautionResult } from '../safety/evaluateCautions';

export const RECORD_KIND = 'ringbench-measurement';
export const RECORD_SCHEMA = 1;
/** A record's id: 12 hex digits, random. */
export const RECORD_ID = /^[0-9a-f]{12}$/;

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
  /** The event measured (--event), the stated jump at it (--jump-start), given only when asked for. */
  event?: string;
  jumpStart?: boolean;
  /** The ringing modes fitted (--modes) and the mode R, L and C are for (--mode), given only when asked for. */
  modes?: string;
  mode?: string;
  /** What the setup checks weighed (--scope-bandwidth, --probe-capacitance, --ground-lead), given only when stated. */
  scopeBandwidth?: string;
  probeCapacitance?: string;
  groundLead?: string;
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
  /** Can this capture support the answer (setup checks); absent when none applied, and in records logged before they were kept. */
  setupChecks?: SetupCheck[];
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
  return benchRecordFrom(parseLogLine(text, line), line);
}

/** The JSON value of one line of a log, or a LogError naming the line. */
export function parseLogLine(text: string, line: number): unknown {
  try {
    return JSON.parse(text);
  } catch {
    throw new LogError('not a JSON record (the line is cut or was edited by hand)', line);
  }
}

/** A parsed line checked as a measurement record, field by field. */
export function benchRecordFrom(value: unknown, line: number): BenchRecord {
  if (!isObject(value) || value.record !== RECORD_KIND) {
    throw new LogError(`not a ringbench measurement record (expected "record": "${RECORD_KIND}")`, line);
  }
  if (value.schema !== RECORD_SCHEMA) {
    throw new LogError(`record schema ${JSON.stringify(value.schema)} is not ${RECORD_SCHEMA}: written by another version of ringbench`, line);
  }
  const problem = recordShapeProblem(value);
  if (problem) throw new LogError(`record field "${problem.field}": ${problem.problem}`, line);
  return value as unknown as BenchRecord;
}

/** The first thing wrong with a whole measurement record (the kind and schema aside), or null. */
export function recordShapeProblem(r: Record<string, unknown>): ShapeProblem | null {
  if (typeof r.id !== 'string' || !RECORD_ID.test(r.id)) return { field: 'id', problem: 'must be 12 hex digits' };
  if (typeof r.time !== 'string' || Number.isNaN(Date.parse(r.time))) return { field: 'time', problem: 'must be an ISO date' };
  if (!isObject(r.software) || !isText(r.software.name) || !isText(r.software.version)) return { field: 'software', problem: 'must give the name and version' };
  return measurementShapeProblem(r);
}
