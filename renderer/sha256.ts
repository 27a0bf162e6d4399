// SHA-256 of text as UTF-8 bytes, hex: the same digest main takes of the file on disk.

export async function sha256Hex(text: string): Promise<{ sha256: string; bytes: number }> {
  const data = new TextEncoder().encode(text);
  const digest = new Uint8Array(await crypto.subtle.digest('SHA-256', data));
  return { sha256: Array.from(digest, (b) => b.toString(16).padStart(2, '0')).join(''), bytes: data.length };
}
