// What the browser keeps between sessions: the recent captures (the list in localStorage, each file's content in
// IndexedDB) and the session as it was left (window, known part and design, each tied to the capture it was set for).

import type { ComponentsInput } from './benchState';
import type { CaptureContent, FitWindow } from './workerProtocol';

export interface RecentCapture {
  /** The capture's sha256 (the same file opened twice is one entry). */
  id: string;
  name: string;
  /** A bundled sample is reopened by its id, not from a kept copy. */
  sampleId: string | null;
  path: string | null;
  /** ISO time it was last opened. */
  openedAt: string;
}

/** The session as it was left: everything set for one capture and channel, applied again only to that same capture and channel. */
export interface SessionMemory {
  capture: { sha256: string; channel: number; name: string };
  window: FitWindow;
  /** A known part typed for this capture; null when none was typed (a sample's own comes with the sample). */
  known: ComponentsInput | null;
  /** A design the user loaded or edited; null when none, or only the sample's own. */
  design: { name: string; path: string; text: string } | null;
}

const RECENT_KEY = 'ringbench.recent-captures';
const SESSION_KEY = 'ringbench.session';
/** As many as a menu shows at a glance. */
export const RECENT_KEPT = 8;
const DB = 'ringbench-recent';
const CONTENTS = 'contents';

export function readRecent(): RecentCapture[] {
  const list = readJson(RECENT_KEY);
  return Array.isArray(list) ? list.filter(isRecentCapture).slice(0, RECENT_KEPT) : [];
}

/**
 * Put the capture first; a file's content is kept (a sample needs none). A file is listed only once its content
 * is stored: listed at once, a reload before the store commits would list a file the browser does not have. Best
 * effort: storage may be full or off (the file is then not listed). Resolves once the list is written.
 */
export async function rememberRecent(entry: RecentCapture, content: CaptureContent | null): Promise<void> {
  const before = readRecent();
  const planned = listWith(entry, before);
  const dropped = before.filter((e) => !planned.some((kept) => kept.id === e.id));
  const stored = await withContents('readwrite', (store) => {
    if (content) store.put(content, entry.id);
    for (const e of dropped) store.delete(e.id);
  });
  if (content && !stored) return;
  // Read again: another capture may have been listed while this one was stored.
  writeJson(RECENT_KEY, listWith(entry, readRecent()));
}

/** The list with `entry` in it, newest first, at most RECENT_KEPT long. */
function listWith(entry: RecentCapture, list: RecentCapture[]): RecentCapture[] {
  return [entry, ...list.filter((e) => e.id !== entry.id)].sort((a, b) => b.openedAt.localeCompare(a.openedAt)).slice(0, RECENT_KEPT);
}

/** The kept content of a recent file, or null when the browser no longer has it. */
export async function recallContent(id: string): Promise<CaptureContent | null> {
  let found: CaptureContent | null = null;
  await withContents('readonly', (store) => {
    const request = store.get(id);
    request.onsuccess = () => (found = (request.result as CaptureContent | undefined) ?? null);
  });
  return found;
}

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

/** Runs `work` in one transaction on the kept contents; resolves whether it committed (false when storage is off or failed). */
function withContents(mode: IDBTransactionMode, work: (store: IDBObjectStore) => void): Promise<boolean> {
  return new Promise((resolve) => {
    let request: IDBOpenDBRequest;
    try {
      request = indexedDB.open(DB, 1);
    } catch {
      return resolve(false);
    }
    request.onupgradeneeded = () => request.result.createObjectStore(CONTENTS);
    request.onerror = () => resolve(false);
    request.onsuccess = () => {
      const db = request.result;
      const ended = (committed: boolean) => () => {
        db.close();
        resolve(committed);
      };
      try {
        const tx = db.transaction(CONTENTS, mode);
        work(tx.objectStore(CONTENTS));
        tx.oncomplete = ended(true);
        tx.onerror = tx.onabort = ended(false);
      } catch {
        ended(false)();
      }
    };
  });
}

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function isRecentCapture(value: unknown): value is RecentCapture {
  return isObject(value) && typeof value.id === 'string' && typeof value.name === 'string' && typeof value.openedAt === 'string' && (value.sampleId === null || typeof value.sampleId === 'string');
}

function readJson(key: string): unknown {
  try {
    return JSON.parse(safeGet(key) ?? 'null');
  } catch {
    return null;
  }
}

function writeJson(key: string, value: unknown): void {
  safeSet(key, JSON.stringify(value));
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
