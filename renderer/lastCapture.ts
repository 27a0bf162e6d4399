// Remembers the last capture opened (a sample by id, or a file's content and how it was read) so the next start reopens it.

import type { CaptureContent, CaptureReading } from './workerProtocol';

export type RememberedCapture =
  | { kind: 'sample'; id: string; channel: number }
  | ({ kind: 'file'; name: string; path: string | null; channel: number; reading?: CaptureReading } & CaptureContent);

const DB = 'ringbench';
const STORE = 'last-capture';
const KEY = 'last';
/**
 * The longest a start or an open waits for this memory: a commit takes milliseconds (about half a second for 10^6
 * samples), but a browser whose IndexedDB never answers must not hold the window back; a put may still land later.
 */
const STORAGE_WAIT_MS = 3000;

function openDb(): Promise<IDBDatabase> {
  return new Promise((resolve, reject) => {
    const request = indexedDB.open(DB, 1);
    request.onupgradeneeded = () => request.result.createObjectStore(STORE);
    request.onsuccess = () => resolve(request.result);
    request.onerror = () => reject(request.error);
  });
}

/** The remembered capture, or null (first start, or storage unavailable). */
export function recallCapture(): Promise<RememberedCapture | null> {
  return withinWait(getCapture(), null, 'the last capture could not be read');
}

/**
 * Remember the capture; resolves once it is committed (a reload from then on reopens it), or when storage failed or
 * did not answer in time. Best effort: a private window or a full disk simply starts from the sample again.
 */
export function rememberCapture(capture: RememberedCapture): Promise<void> {
  return withinWait(putCapture(capture), undefined, 'the last capture could not be remembered');
}

async function getCapture(): Promise<RememberedCapture | null> {
  const db = await openDb();
  try {
    return await new Promise((resolve, reject) => {
      const request = db.transaction(STORE, 'readonly').objectStore(STORE).get(KEY);
      request.onsuccess = () => resolve((request.result as RememberedCapture | undefined) ?? null);
      request.onerror = () => reject(request.error ?? new Error('the read failed'));
    });
  } finally {
    db.close();
  }
}

/** One put in its own transaction, settled by its commit (quota and other failures end in an abort). */
async function putCapture(capture: RememberedCapture): Promise<void> {
  const db = await openDb();
  try {
    await new Promise<void>((resolve, reject) => {
      const tx = db.transaction(STORE, 'readwrite');
      tx.oncomplete = () => resolve();
      tx.onabort = () => reject(tx.error ?? new Error('the transaction was aborted'));
      tx.objectStore(STORE).put(capture, KEY);
    });
  } finally {
    db.close();
  }
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
