// SHA-256 of a file's bytes (or of text as UTF-8 bytes), hex: the same digest main takes of the file on disk.

import type { CaptureContent } from './workerProtocol';

export async function sha256Hex(content: string | CaptureContent): Promise<{ sha256: string; bytes: number }> {
  const text = typeof content === 'string' ? content : content.text;
  const data = text === undefined ? new Uint8Array((content as { bytes: ArrayBuffer }).bytes) : new TextEncoder().encode(text);
  const digest = new Uint8Array(await crypto.subtle.digest('SHA-256', data));
  return { sha256: Array.from(digest, (b) => b.toString(16).padStart(2, '0')).join(''), bytes: data.length };
}
