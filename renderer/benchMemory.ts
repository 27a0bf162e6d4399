// The session as the browser keeps it between starts (window, known part and design, each tied to the capture it was
// set for); the captures themselves are kept by captureMemory.ts.

import type { ComponentsInput } from './benchState';
import type { FitWindow } from './workerProtocol';

/** The session as it was left: everything set for one capture and channel, applied again only to that same capture and channel. */
export interface SessionMemory {
  capture: { sha256: string; channel: number; name: string };
  window: FitWindow;
  /** A known part typed for this capture; null when none was typed (a sample's own comes with the sample). */
  known: ComponentsInput | null;
  /** A design the user loaded or edited; null when none, or only the sample's own. */
  design: { name: string; path: string; text: string } | null;
}

const SESSION_KEY = 'ringbench.session';

export function readSession(): SessionMemory | null {
  const session = readJson(SESSION_KEY);
  return isObject(session) && isObject(session.capture) && typeof session.capture.sha256 === 'string' && typeof session.capture.channel === 'number' && isObject(session.window)
    ? (session as unknown as SessionMemory)
    : null;
}

/** Saved when it changed; answers whether it did. */
export function saveSession(session: SessionMemory): boolean {
  const text = JSON.stringify(session);
  if (safeGet(SESSION_KEY) === text) return false;
  safeSet(SESSION_KEY, text);
  return true;
}

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function readJson(key: string): unknown {
  try {
    return JSON.parse(safeGet(key) ?? 'null');
  } catch {
    return null;
  }
}

/** localStorage throws in some private windows and when full: the bench works on without memory. */
function safeGet(key: string): string | null {
  try {
    return localStorage.getItem(key);
  } catch {
    return null;
  }
}

function safeSet(key: string, value: string): void {
  try {
    localStorage.setItem(key, value);
  } catch {
    // nothing kept
  }
}
