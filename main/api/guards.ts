// Type guards for every argument of the bench API, run in main before any file is touched.

import { isAbsolute } from 'node:path';
import type { BenchLogRequest, SaveRequest } from '../../core/bench/benchApiTypes';
import { API_METHODS, type ApiMethod } from './apiMethods';
import { importSummaryProblem } from './importSummaryGuard';
import { RESULT_ROWS, TRANSITION_ROWS, valueAtPath, type ResultRowSpec } from '../../core/report/resultRows';
import { fitSucceeded } from '../../core/report/fitSummary';
import type { FitStatus } from '../../core/fit/types';
import type { Regime } from '../../core/fit/responseFit';

type Json = Record<string, unknown>;

const MAX_TEXT = 2000;
const MAX_PATH = 4096;
/** Largest file the window may save (a report with plots, a PNG), characters. */
export const MAX_SAVE_CHARS = 64 * 1024 * 1024;

export function isApiMethod(name: unknown): name is ApiMethod {
  return typeof name === 'string' && (API_METHODS as readonly string[]).includes(name);
}

/** A sample or design id: a plain file-name stem, never a path. */
export function isResourceId(value: unknown): value is string {
  return typeof value === 'string' && /^[A-Za-z0-9][A-Za-z0-9._-]{0,99}$/.test(value) && !value.includes('..');
}

/** An absolute path without NUL, of sane length. */
export function isAbsolutePath(value: unknown): value is string {
  return typeof value === 'string' && value.length > 0 && value.length <= MAX_PATH && !value.includes('\0') && isAbsolute(value);
}

/** A file name for a save dialog: no folder part, no dot first, no characters that some systems refuse. */
export function isSafeFileName(value: unknown): value is string {
  return typeof value === 'string' && /^[^\\/:*?"<>|\0-\x1f.][^\\/:*?"<>|\0-\x1f]{0,199}$/.test(value);
}

export function isSaveRequest(value: unknown): value is SaveRequest {
  return (
    isObject(value) &&
    hasOnly(value, ['suggestedName', 'content', 'encoding']) &&
    isSafeFileName(value.suggestedName) &&
    typeof value.content === 'string' &&
    value.content.length <= MAX_SAVE_CHARS &&
    (value.encoding === 'utf8' || (value.encoding === 'base64' && /^[A-Za-z0-9+/]*={0,2}$/.test(value.content)))
  );
}

export function isBenchLogRequest(value: unknown): value is BenchLogRequest {
  return benchLogRequestProblem(value) === null;
}

/** The first thing wrong with a bench log request, as a phrase naming the field, or null. */
export function benchLogRequestProblem(value: unknown): string | null {
  if (!isObject(value)) return 'must be an object';
  const extra = Object.keys(value).find((key) => !LOG_REQUEST_KEYS.includes(key));
  if (extra !== undefined) return `has an unknown field "${extra}"`;
  if (!isText(value.unit) || value.unit.trim() === '') return 'unit: the unit under test needs a name or serial number';
  if (value.operator !== null && !isText(value.operator)) return 'operator: must be text or null';
  if (value.note !== null && !isText(value.note)) return 'note: must be text or null';
  const capture = value.capture;
  if (!isObject(capture) || !isText(capture.path, MAX_PATH) || !isText(capture.channel) || !isSha256(capture.sha256) || !isCount(capture.bytes)) {
    return 'capture: must give path, channel, sha256 (64 hex digits) and bytes';
  }
  if (!isSettings(value.settings)) {
    return 'settings: must give topology, known, column, sampleInterval, from, to (text or null) and sortTime, and timeUnit, valueUnit only as text';
  }
  const fitProblem = fitSummaryProblem(value.fit);
  if (fitProblem) return `fit: ${fitProblem}`;
  if (value.verdict !== null && !isVerdict(value.verdict)) return 'verdict: must be a design check result or null';
  const design = value.design;
  if (design !== null && (!isObject(design) || !isText(design.path, MAX_PATH) || !isText(design.name) || !isSha256(design.sha256) || !isObject(design.spec))) {
    return 'design: must give path, name, sha256 and spec, or be null';
  }
  const cautions = value.cautions;
  if (!isObject(cautions) || !Array.isArray(cautions.fired) || !cautions.fired.every(isObject) || !isObject(cautions.energies)) {
    return 'cautions: must list the fired cautions and the energies';
  }
  return null;
}

const LOG_REQUEST_KEYS = ['unit', 'operator', 'note', 'capture', 'settings', 'fit', 'verdict', 'design', 'cautions'];
/** Every status a fit can end in, and every regime a converged fit can have ('none' is a failed fit's), as records so that a new one fails to compile until it is listed here. */
const FIT_STATUSES = Object.keys({ converged: true, 'max-iterations': true, failed: true, 'no-response': true } satisfies Record<FitStatus, true>);
const REGIMES = Object.keys({ underdamped: true, 'critically damped': true, overdamped: true, 'first-order': true } satisfies Record<Exclude<Regime, 'none'>, true>);
/** The quantities a fit summary stores (derived rows such as f0 are not sent), from the one row table. */
const FIT_QUANTITY_ROWS: readonly ResultRowSpec[] = RESULT_ROWS.filter((row: ResultRowSpec) => !row.derived);

function fitSummaryProblem(value: unknown): string | null {
  if (!isObject(value)) return 'must be a fit summary';
  if (!isText(value.file) || !isText(value.channel)) return 'file and channel must be text';
  if (!FIT_STATUSES.includes(value.status as string)) return `status must be one of ${FIT_STATUSES.join(', ')}`;
  if (!fitSucceeded({ status: value.status as FitStatus })) {
    if (value.regime !== undefined || value.regimeEvidence !== undefined) return 'a fit that did not converge has no regime';
  } else if (!REGIMES.includes(value.regime as string) || !isText(value.regimeEvidence)) {
    return `regime must be one of ${REGIMES.join(', ')}, with its evidence`;
  }
  for (const row of FIT_QUANTITY_ROWS) {
    const field = valueAtPath(value, row.name);
    if (row.optional && field === undefined) continue;
    if (!isQuantity(field)) return `${row.name} must be a quantity { value, stderr, unit }`;
  }
  if (!isCount(value.samplesUsed)) return 'samplesUsed must be a count';
  if (!isObject(value.window) || !isNumberOrNull(value.window.start) || !isNumberOrNull(value.window.end)) return 'window must give start and end';
  if (!Array.isArray(value.warnings) || !value.warnings.every((w) => isText(w, 10 * MAX_TEXT))) return 'warnings must be a list of text';
  const transitions = value.transitions === undefined ? null : transitionsProblem(value.transitions);
  if (transitions) return transitions;
  const imported = value.import === undefined ? null : importSummaryProblem(value.import);
  return imported ? `import: ${imported}` : null;
}

/** The transition metrics the reports show (the row table's), each a quantity or null from the model, a number or null as measured. */
function transitionsProblem(value: unknown): string | null {
  if (!isObject(value) || !isText(value.levelMethod) || (value.reason !== null && !isText(value.reason))) return 'transitions must give levelMethod and reason';
  for (const row of TRANSITION_ROWS) {
    if (value.model !== null && !(isObject(value.model) && (value.model[row.name] === null || isQuantity(value.model[row.name])))) {
      return `transitions.model.${row.name} must be a quantity or null`;
    }
    if (value.measured !== null && !(isObject(value.measured) && isNumberOrNull(value.measured[row.name]))) return `transitions.measured.${row.name} must be a number or null`;
  }
  if (!Array.isArray(value.warnings) || !value.warnings.every((w) => isText(w, 10 * MAX_TEXT))) return 'transitions.warnings must be a list of text';
  return null;
}

function isVerdict(value: unknown): boolean {
  return (
    isObject(value) &&
    typeof value.pass === 'boolean' &&
    Array.isArray(value.quantities) &&
    value.quantities.every((q) => isObject(q) && isText(q.name) && isQuantity(q.design) && isQuantity(q.measured) && typeof q.inTolerance === 'boolean') &&
    Array.isArray(value.notes)
  );
}

function isSettings(value: unknown): boolean {
  if (!isObject(value) || typeof value.sortTime !== 'boolean') return false;
  const given = ['topology', 'known', 'column', 'sampleInterval', 'from', 'to'].every((key) => value[key] === null || isText(value[key]));
  // The stated units are left out when not given (and by records of earlier versions).
  return given && ['timeUnit', 'valueUnit'].every((key) => value[key] === undefined || isText(value[key]));
}

/** JSON turns NaN and Infinity into null, so a number that could not be formed arrives as null. */
function isQuantity(value: unknown): boolean {
  return isObject(value) && isNumberOrNull(value.value) && isNumberOrNull(value.stderr) && typeof value.unit === 'string' && value.unit.length <= 16;
}

function isNumberOrNull(value: unknown): boolean {
  return value === null || typeof value === 'number';
}

function isCount(value: unknown): boolean {
  return typeof value === 'number' && Number.isInteger(value) && value >= 0;
}

function isSha256(value: unknown): boolean {
  return typeof value === 'string' && /^[0-9a-f]{64}$/.test(value);
}

function isText(value: unknown, max = MAX_TEXT): value is string {
  return typeof value === 'string' && value.length <= max && !value.includes('\0');
}

function isObject(value: unknown): value is Json {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function hasOnly(value: Json, keys: string[]): boolean {
  return Object.keys(value).every((key) => keys.includes(key));
}

/** Per method: the arguments it takes, checked in order; a message naming the first bad one. */
const ARGUMENT_CHECKS: Record<ApiMethod, readonly ((value: unknown) => string | null)[]> = {
  listSamples: [],
  readSample: [(v) => (isResourceId(v) ? null : 'the sample id must be a plain name (letters, digits, . _ -)')],
  listDesigns: [],
  readDesign: [(v) => (isResourceId(v) ? null : 'the design id must be a plain name (letters, digits, . _ -)')],
  readBenchLog: [],
  appendBenchLog: [benchLogRequestProblem],
  renderReport: [(v) => (v === 'html' || v === 'md' || v === 'csv' ? null : "the report format must be 'html', 'md' or 'csv'")],
  openCaptureDialog: [],
  openDroppedPath: [(v) => (isAbsolutePath(v) ? null : 'the dropped file must come with an absolute path')],
  openDesignDialog: [],
  saveFileDialog: [(v) => (isSaveRequest(v) ? null : 'the file to save needs a plain file name, its content and its encoding')],
};

/** Null when `args` are what `method` takes, else a message naming the method and the argument. */
export function argumentProblem(method: ApiMethod, args: readonly unknown[]): string | null {
  const checks = ARGUMENT_CHECKS[method];
  if (args.length !== checks.length) return `${method}: takes ${checks.length} argument${checks.length === 1 ? '' : 's'}, got ${args.length}`;
  for (let i = 0; i < checks.length; i++) {
    const problem = checks[i](args[i]);
    if (problem !== null) return `${method}: argument ${i + 1}: ${problem}`;
  }
  return null;
}
