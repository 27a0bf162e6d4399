// The window's recent captures: our own list in userData (newest first), mirrored to the system's list.

import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

const FILE = 'recent-captures.json';
const KEEP = 10;

export function readRecentCaptures(userData: string): string[] {
  try {
    const list: unknown = JSON.parse(readFileSync(join(userData, FILE), 'utf8'));
    return Array.isArray(list) ? list.filter((p): p is string => typeof p === 'string').slice(0, KEEP) : [];
  } catch {
    return [];
  }
}

/** Put `path` first and save; returns the new list. */
export function rememberCapture(userData: string, list: string[], path: string): string[] {
  return saveRecentCaptures(userData, [path, ...list.filter((p) => p !== path)].slice(0, KEEP));
}

export function saveRecentCaptures(userData: string, list: string[]): string[] {
  try {
    writeFileSync(join(userData, FILE), `${JSON.stringify(list, null, 2)}\n`);
  } catch {
    // The list is a convenience: a read-only profile must not stop the capture from opening.
  }
  return list;
}
