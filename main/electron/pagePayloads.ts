// What the preload hands the page from main, checked first: only known menu commands, an opened capture of
// the expected shape, and call results of the { ok, value } | { ok: false, error } form, each rebuilt as plain data.
// No Node module here: a sandboxed preload may require nothing but 'electron'.

import { MENU_COMMANDS, type ApiResult, type MenuCommand, type OpenedCaptureFile } from '../../core/bench/benchApiTypes';

/** Longest file name and path passed on, characters (paths of common file systems stay far below). */
const MAX_NAME = 1000;
const MAX_PATH = 4096;
/** An absolute path of POSIX ('/...') or Windows ('C:\...', '\\server\...') form. */
const ABSOLUTE_PATH = /^(\/|[A-Za-z]:[\\/]|\\\\)/;

function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && Object.getPrototypeOf(value) === Object.prototype;
}

export function menuCommandFrom(value: unknown): MenuCommand | null {
  return (MENU_COMMANDS as readonly unknown[]).includes(value) ? (value as MenuCommand) : null;
}

/** The capture main opened (a recent file), or null when the payload is anything else. */
export function openedCaptureFrom(value: unknown): OpenedCaptureFile | null {
  if (!isPlainObject(value)) return null;
  const { name, path, sampleId, bytes } = value;
  if (typeof name !== 'string' || name.length === 0 || name.length > MAX_NAME) return null;
  if (typeof path !== 'string' || path.length > MAX_PATH || path.includes('\0') || !ABSOLUTE_PATH.test(path)) return null;
  if (sampleId !== null || !(bytes instanceof Uint8Array)) return null;
  return { name, path, sampleId: null, bytes };
}

/** A call's answer as main sends it; anything of another shape becomes a failure the page can show. */
export function apiResultFrom(value: unknown): ApiResult<unknown> {
  if (isPlainObject(value) && value.ok === true && 'value' in value) return { ok: true, value: value.value };
  if (isPlainObject(value) && value.ok === false && typeof value.error === 'string') {
    const code = value.code === 'unknown-method' || value.code === 'bad-argument' || value.code === 'failed' ? value.code : undefined;
    return code === undefined ? { ok: false, error: value.error } : { ok: false, error: value.error, code };
  }
  return { ok: false, error: 'the bench answered in a form the window does not know', code: 'failed' };
}
