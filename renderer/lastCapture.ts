// Remembers the last capture opened (a sample by id, or a file's content and how it was read) so the next start reopens it.

import type { CaptureContent, CaptureReading } from './workerProtocol';

export type RememberedCapture =
  | { kind: 'sample'; id: string; channel: number }
  | ({ kind: 'file'; name: string; path: string | null; channel: number; reading?: CaptureReading } & CaptureContent);

const DB = 'ringbench';
const STORE = 'last-capture';
const KEY = 'last';

function openDb(): Promise<IDBDatabase> {
  return new Promise((resolve, reject) => {
    const request = indexedDB.open(DB, 1);
    request.onupgradeneeded = () => request.result.createObjectStore(STORE);
    request.onsuccess = () => resolve(request.result);
    request.onerror = () => reject(request.error);
  });
}

/** The remembered capture, or null (first start, or storage unavailable). */
export async function recallCapture(): Promise<RememberedCapture | null> {
  try {
    const db = await openDb();
    return await new Promise((resolve) => {
      const request = db.transaction(STORE, 'readonly').objectStore(STORE).get(KEY);
      request.onsuccess = () => resolve((request.result as RememberedCapture | undefined) ?? null);
      request.onerror = () => resolve(null);
    });
  } catch {
    return null;
  }
}

/** Best effort: a private window without storage simply starts from the sample again. */
export async function rememberCapture(capture: RememberedCapture): Promise<void> {
  try {
    const db = await openDb();
    await new Promise<void>((resolve) => {
      const tx = db.transaction(STORE, 'readwrite');
      tx.objectStore(STORE).put(capture, KEY);
      tx.oncomplete = () => resolve();
      tx.onerror = () => resolve();
    });
  } catch {
    // nothing to do
  }
}
