// Type guards for every argument of the bench API, run in main before any file is touched.

import { isAbsolute } from 'node:path';
import type { BenchLogRequest, SaveRequest } from '../../core/bench/benchApiTypes';
import { API_METHODS, type ApiMethod } from './apiMethods';
import { isObject, isText } from '../../core/report/jsonShape';
import { MAX_PATH, measurementShapeProblem } from '../../core/report/recordShape';
import { RECORD_ID } from '../../core/report/benchRecord';
import { labelChangesProblem } from '../../core/report/logCorrection';

type Json = Record<string, unknown>;

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

/** The first thing wrong with a bench log request, as a phrase naming the field ('fit: import: delimiter ...'), or null. */
export function benchLogRequestProblem(value: unknown): string | null {
  if (!isObject(value)) return 'must be an object';
  const extra = Object.keys(value).find((key) => !LOG_REQUEST_KEYS.includes(key));
  if (extra !== undefined) return `has an unknown field "${extra}"`;
  // The window's note field is a label, not a document.
  if (value.note !== null && value.note !== undefined && !isText(value.note)) return 'note: must be text of at most 2000 characters, or null';
  // The same deep check the log applies to every line it reads back (core/report/recordShape.ts).
  const problem = measurementShapeProblem(value);
  return problem && `${problem.field.split('.').join(': ')}: ${problem.problem}`;
}

const LOG_REQUEST_KEYS = ['unit', 'operator', 'note', 'capture', 'settings', 'fit', 'verdict', 'design', 'cautions', 'setupChecks'];

/** The first thing wrong with a request to amend or withdraw a logged measurement, naming the field, or null. */
export function logCorrectionRequestProblem(value: unknown): string | null {
  if (!isObject(value)) return 'must be an object';
  const extra = Object.keys(value).find((key) => !['target', 'action', 'changes', 'reason'].includes(key));
  if (extra !== undefined) return `has an unknown field "${extra}"`;
  if (typeof value.target !== 'string' || !RECORD_ID.test(value.target)) return 'target: must be the 12 hex digits of a logged measurement';
  if (value.action !== 'amend' && value.action !== 'withdraw') return "action: must be 'amend' or 'withdraw'";
  if (!isText(value.reason) || value.reason.trim() === '') return 'reason: say why, in at most 2000 characters';
  const changes = labelChangesProblem(value.changes, value.action);
  return changes && `changes: ${changes}`;
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
  correctBenchLog: [logCorrectionRequestProblem],
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
