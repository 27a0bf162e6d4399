// Which character encoding a capture file's bytes are in (UTF-8, UTF-16 by its byte-order mark, or Windows-1252), and its decoding.

import type { TextEncoding } from './importSummary';

/** The WHATWG decoder every host has (Node, browsers, workers); core's library list names no host, so its shape is stated here. */
declare class TextDecoder {
  constructor(label?: string, options?: { fatal?: boolean; ignoreBOM?: boolean });
  decode(input?: Uint8Array, options?: { stream?: boolean }): string;
}

const LF = 10;
const CR = 13;

/** Decodes pieces of a file that end at line ends; `firstLine` is the 1-based line the piece starts on. */
export interface LineDecoder {
  decode(bytes: Uint8Array, firstLine: number): string;
  /**
   * True when decode(bytes) now gives what it would give these bytes as the start of a longer piece: a reader that
   * has not yet seen where its piece ends may decode them without waiting.
   */
  settles(bytes: Uint8Array): boolean;
  /** What the pieces decoded so far were read as (a byte-order mark is noted by the reader, which drops it). */
  readonly encoding: TextEncoding;
}

/** A UTF-16 file, told by its byte-order mark or, without one, by a zero byte beside each of its first two ASCII characters. */
export function utf16Of(bytes: Uint8Array): TextEncoding | null {
  const [a, b, c, d] = bytes;
  if (a === 0xff && b === 0xfe) return { name: 'UTF-16LE', byteOrderMark: true };
  if (a === 0xfe && b === 0xff) return { name: 'UTF-16BE', byteOrderMark: true };
  if (bytes.length < 4) return null;
  const ascii = (x: number) => x > 0 && x < 0x80;
  const zeroBytes = 'no byte-order mark; told by the zero byte beside each ASCII character';
  if (ascii(a) && b === 0 && ascii(c) && d === 0) return { name: 'UTF-16LE', byteOrderMark: false, note: zeroBytes };
  if (a === 0 && ascii(b) && c === 0 && ascii(d)) return { name: 'UTF-16BE', byteOrderMark: false, note: zeroBytes };
  return null;
}

/**
 * Decodes a UTF-16 file piece by piece, a character split between pieces included (the byte-order mark kept, for the
 * reader to note and drop); with no bytes, returns what an odd last byte leaves.
 */
export function utf16Decoder(encoding: TextEncoding): (bytes?: Uint8Array) => string {
  const decoder = new TextDecoder(encoding.name === 'UTF-16BE' ? 'utf-16be' : 'utf-16le', { ignoreBOM: true });
  return (bytes) => (bytes ? decoder.decode(bytes, { stream: true }) : decoder.decode());
}

/**
 * UTF-8 until a piece is not valid UTF-8: then Windows-1252 (a superset of Latin-1 that browsers and Node decode alike)
 * from that piece on, when every piece before was plain ASCII, which both read the same. After valid UTF-8 that is
 * not ASCII, a stray byte is replaced (U+FFFD) rather than reading the file two ways.
 */
export class DetectingDecoder implements LineDecoder {
  readonly encoding: TextEncoding = { name: 'UTF-8', byteOrderMark: false };
  private readonly utf8 = new TextDecoder('utf-8', { fatal: true, ignoreBOM: true });
  private fallback: TextDecoder | null = null;
  private sawNonAscii = false;

  decode(bytes: Uint8Array, firstLine: number): string {
    if (this.fallback) return this.fallback.decode(bytes);
    try {
      const text = this.utf8.decode(bytes);
      // Valid UTF-8 decodes to fewer characters than bytes exactly when it holds a character outside ASCII.
      if (text.length !== bytes.length) this.sawNonAscii = true;
      return text;
    } catch {
      const line = firstLine + linesBefore(bytes, Math.max(0, firstInvalidUtf8(bytes)));
      if (this.sawNonAscii) {
        this.encoding.note ??= `not valid UTF-8 at line ${line}; the stray bytes were replaced`;
        return new TextDecoder('utf-8', { ignoreBOM: true }).decode(bytes);
      }
      this.encoding.name = 'Windows-1252';
      this.encoding.note = `not valid UTF-8 at line ${line}`;
      this.fallback = new TextDecoder('windows-1252');
      return this.fallback.decode(bytes);
    }
  }

  /** Only valid UTF-8 beyond ASCII, before any such character, waits: it is read as Windows-1252 when a later byte of its piece is not UTF-8. */
  settles(bytes: Uint8Array): boolean {
    if (this.fallback || this.sawNonAscii || isAscii(bytes)) return true;
    try {
      this.utf8.decode(bytes);
      return false;
    } catch {
      return true;
    }
  }
}

/** A host's UTF-8 decoding function as a line decoder. */
export function utf8LineDecoder(decode: (bytes: Uint8Array) => string): LineDecoder {
  return { decode: (bytes) => decode(bytes), settles: () => true, encoding: { name: 'UTF-8', byteOrderMark: false } };
}

function isAscii(bytes: Uint8Array): boolean {
  for (let i = 0; i < bytes.length; i++) if (bytes[i] >= 0x80) return false;
  return true;
}

/** Offset of the first byte that does not start a well-formed UTF-8 sequence, or -1 (only used to name the line). */
function firstInvalidUtf8(bytes: Uint8Array): number {
  let i = 0;
  while (i < bytes.length) {
    const c = bytes[i];
    if (c < 0x80) {
      i++;
      continue;
    }
    const more = c >= 0xc2 && c <= 0xdf ? 1 : c >= 0xe0 && c <= 0xef ? 2 : c >= 0xf0 && c <= 0xf4 ? 3 : -1;
    if (more < 0 || i + more >= bytes.length) return i;
    for (let k = 1; k <= more; k++) if ((bytes[i + k] & 0xc0) !== 0x80) return i;
    i += more + 1;
  }
  return -1;
}

/** Line ends in bytes[0, end): LFs, or CRs when the piece has no LF (lines ending in CR alone). */
function linesBefore(bytes: Uint8Array, end: number): number {
  const piece = bytes.subarray(0, end);
  const terminator = bytes.includes(LF) ? LF : CR;
  let count = 0;
  for (const b of piece) if (b === terminator) count++;
  return count;
}
