// The captures the browser keeps between sessions: each file's content stored once under its sha256, the last capture
// (reopened on the next start) and the recent list referring to it; content neither refers to is deleted.

import type { CaptureContent, CaptureReading } from './workerProtocol';

/** A capture as the next start reopens it: a sample by id, a file by its content (stored once, under its sha256). */
export type RememberedCapture =
  | { kind: 'sample'; id: string; channel: number }
  | ({ kind: 'file'; name: string; path: string | null; channel: number; reading?: CaptureReading; sha256: string } & CaptureContent);

export interface RecentCapture {
  /** The capture's sha256 (the same file opened twice is one entry); a file's stored content is kept under it. */
  id: string;
  name: string;
  /** A bundled sample is reopened by its id, not from a kept copy. */
  sampleId: string | null;
  path: string | null;
  /** ISO time it was last opened. */
  openedAt: string;
}

/** As many as a menu shows at a glance. */
export const RECENT_KEPT = 8;

const DB = 'ringbench';
/** 2: one content store for the last capture and the recent list (1 kept the last capture whole, and the list apart). */
const DB_VERSION = 2;
const CONTENTS = 'contents';
const MEMORY = 'memory';
const LAST = 'last';
const RECENT = 'recent';
/** The previous layout's own stores: the last capture with its content, and the recent list's contents and list. */
const OLD_LAST_STORE = 'last-capture';
const OLD_RECENT_DB = 'ringbench-recent';
const OLD_RECENT_KEY = 'ringbench.recent-captures';
/**
 * The longest a start or an open waits for this memory: a commit takes milliseconds (about half a second for 10^6
 * samples), but a browser whose IndexedDB never answers must not hold the window back; a write may still land later.
 */
const STORAGE_WAIT_MS = 3000;

/** The recent list as last read or written (drawn at once by the capture panel; empty until the start read it). */
let recent: RecentCapture[] = [];

export function recentCaptures(): RecentCapture[] {
  return recent;
}

/** The remembered capture with its content, or null (first start, content gone, or storage unavailable); reads the recent list too. */
export function recallCapture(): Promise<RememberedCapture | null> {
  return withinWait(readMemory(), null, 'the last capture could not be read');
}

/**
 * Remember the capture as the last one and, with `entry`, put it first in the recent list; a file's content is stored
 * unless already kept. Resolves once committed (a reload from then on reopens it, and the list names only what the
 * browser has), or when storage failed or did not answer in time. Best effort: a private window or a full disk simply
 * starts from the sample again.
 */
export function rememberCapture(capture: RememberedCapture, entry: RecentCapture | null): Promise<void> {
  const write = writes.then(() => writeMemory(capture, entry));
  // Writes run in the order asked: an older open's write never lands after a newer one's.
  writes = write.catch(() => undefined);
  return withinWait(write, undefined, 'the capture could not be remembered');
}

/** The kept content of a recent file, or null when the browser no longer has it. */
export function recallContent(id: string): Promise<CaptureContent | null> {
  return withinWait(
    inTransaction('readonly', async (contents) => asContent(await ask(contents.get(id)))),
    null,
    'the capture could not be read',
  );
}

let writes: Promise<unknown> = Promise.resolve();

async function readMemory(): Promise<RememberedCapture | null> {
  return inTransaction('readonly', async (contents, memory) => {
    const [last, list] = await Promise.all([ask(memory.get(LAST)), ask(memory.get(RECENT))]);
    recent = asRecentList(list);
    if (!isObject(last) || typeof last.channel !== 'number') return null;
    if (last.kind === 'sample') return typeof last.id === 'string' ? { kind: 'sample', id: last.id, channel: last.channel } : null;
    if (last.kind !== 'file' || typeof last.name !== 'string') return null;
    // A last capture of the previous layout carries its content; it is stored the new way once reopened.
    const content = asContent(typeof last.sha256 === 'string' ? await ask(contents.get(last.sha256)) : last);
    if (!content) return null;
    const path = typeof last.path === 'string' ? last.path : null;
    const sha256 = typeof last.sha256 === 'string' ? last.sha256 : '';
    const reading = isObject(last.reading) && isObject(last.reading.units) ? (last.reading as unknown as CaptureReading) : undefined;
    return { kind: 'file', name: last.name, path, channel: last.channel, reading, sha256, ...content };
  });
}

/** One transaction: the content put when new, the last capture and the list written, and content no longer referred to deleted. */
async function writeMemory(capture: RememberedCapture, entry: RecentCapture | null): Promise<void> {
  const list = await inTransaction('readwrite', async (contents, memory) => {
    const [kept, stored] = await Promise.all([ask(contents.getAllKeys()), ask(memory.get(RECENT))]);
    const list = entry ? listWith(entry, asRecentList(stored)) : asRecentList(stored);
    let last: unknown = capture;
    if (capture.kind === 'file') {
      const { text, bytes, ...pointer } = capture;
      last = pointer;
      if (!kept.includes(capture.sha256)) contents.put(text === undefined ? { bytes } : { text }, capture.sha256);
    }
    memory.put(last, LAST);
    memory.put(list, RECENT);
    const referred = new Set(list.filter((e) => e.sampleId === null).map((e) => e.id));
    if (capture.kind === 'file') referred.add(capture.sha256);
    for (const key of kept) if (!referred.has(String(key))) contents.delete(key);
    return list;
  });
  recent = list;
}

/** The list with `entry` in it, newest first, at most RECENT_KEPT long. */
function listWith(entry: RecentCapture, list: RecentCapture[]): RecentCapture[] {
  return [entry, ...list.filter((e) => e.id !== entry.id)].sort((a, b) => b.openedAt.localeCompare(a.openedAt)).slice(0, RECENT_KEPT);
}

function openDb(): Promise<IDBDatabase> {
  return new Promise((resolve, reject) => {
    const request = indexedDB.open(DB, DB_VERSION);
    request.onupgradeneeded = (event) => upgrade(request, event.oldVersion);
    request.onsuccess = () => resolve(request.result);
    request.onerror = () => reject(request.error ?? new Error('the database could not be opened'));
  });
}

/** Make this layout's stores; a last capture of the previous layout moves over as it was, its list and contents are dropped. */
function upgrade(request: IDBOpenDBRequest, oldVersion: number): void {
  const db = request.result;
  const tx = request.transaction as IDBTransaction;
  const memory = db.createObjectStore(MEMORY);
  db.createObjectStore(CONTENTS);
  if (oldVersion < 1) return;
  const old = tx.objectStore(OLD_LAST_STORE).get(LAST);
  old.onsuccess = () => {
    if (old.result !== undefined) memory.put(old.result, LAST);
    db.deleteObjectStore(OLD_LAST_STORE);
  };
  indexedDB.deleteDatabase(OLD_RECENT_DB);
  try {
    localStorage.removeItem(OLD_RECENT_KEY);
  } catch {
    // localStorage off: nothing of the old list to drop
  }
}

/** Run `work` in one transaction over both stores; its answer once committed, or the failure (an abort on quota too). */
async function inTransaction<T>(mode: IDBTransactionMode, work: (contents: IDBObjectStore, memory: IDBObjectStore) => Promise<T>): Promise<T> {
  const db = await openDb();
  try {
    const tx = db.transaction([CONTENTS, MEMORY], mode);
    const committed = new Promise<void>((resolve, reject) => {
      tx.oncomplete = () => resolve();
      tx.onabort = () => reject(tx.error ?? new Error('the transaction was aborted'));
    });
    const answer = work(tx.objectStore(CONTENTS), tx.objectStore(MEMORY)).catch((error: unknown) => {
      try {
        tx.abort();
      } catch {
        // already ended by the failed request
      }
      throw error;
    });
    return (await Promise.all([answer, committed]))[0];
  } finally {
    db.close();
  }
}

function ask<T>(request: IDBRequest<T>): Promise<T> {
  return new Promise((resolve, reject) => {
    request.onsuccess = () => resolve(request.result);
    request.onerror = () => reject(request.error ?? new Error('the read failed'));
  });
}

/** The work's answer, or the fallback when it fails or takes longer than STORAGE_WAIT_MS (said once on the console). */
function withinWait<T>(work: Promise<T>, fallback: T, what: string): Promise<T> {
  return new Promise<T>((resolve) => {
    const timer = setTimeout(() => {
      warnOnce(`${what}: no answer from the browser's storage in ${STORAGE_WAIT_MS} ms`);
      resolve(fallback);
    }, STORAGE_WAIT_MS);
    work.then(
      (value) => {
        clearTimeout(timer);
        resolve(value);
      },
      (error: unknown) => {
        clearTimeout(timer);
        warnOnce(`${what} (${error instanceof Error ? error.message : String(error)})`);
        resolve(fallback);
      },
    );
  });
}

let warned = false;

/** Said once a page: the bench works on without this memory (the start opens a sample instead). */
function warnOnce(message: string): void {
  if (warned) return;
  warned = true;
  console.warn(`Ringbench: ${message}; the bench works on without it.`);
}

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** A stored content as the worker reads it, or null for anything else. */
function asContent(value: unknown): CaptureContent | null {
  if (!isObject(value)) return null;
  if (typeof value.text === 'string') return { text: value.text };
  return value.bytes instanceof ArrayBuffer ? { bytes: value.bytes } : null;
}

function asRecentList(value: unknown): RecentCapture[] {
  return Array.isArray(value) ? value.filter(isRecentCapture).slice(0, RECENT_KEPT) : [];
}

function isRecentCapture(value: unknown): value is RecentCapture {
  return isObject(value) && typeof value.id === 'string' && typeof value.name === 'string' && typeof value.openedAt === 'string' && (value.sampleId === null || typeof value.sampleId === 'string');
}
