// Tells a binary file (an image, a workbook, a scope's own waveform format) from capture text, by its bytes, before they are read as text.

import { CaptureError } from './types';

/** Bytes of a file's start that the signatures below need. */
export const SIGNATURE_BYTES = 8;

/**
 * Files taken for a capture export by mistake (a screenshot, a workbook, a report), by the bytes they start with:
 * PNG (ISO/IEC 15948), JPEG (ITU-T T.81, its start-of-image marker), zip (PKWARE APPNOTE: a local file header;
 * .xlsx and .docx are zip files), PDF (ISO 32000-1), OLE2 compound files (Microsoft [MS-CFB]: .xls, .doc). From memory.
 */
const SIGNATURES: [string, number[]][] = [
  ['a PNG image', [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]],
  ['a JPEG image', [0xff, 0xd8, 0xff]],
  ['a zip archive (as an .xlsx workbook is)', [0x50, 0x4b, 0x03, 0x04]],
  ['a PDF document', [0x25, 0x50, 0x44, 0x46, 0x2d]],
  ['an .xls workbook (an OLE2 compound file)', [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]],
];

/** Binary content, what tells it, and what to do. */
function notText(telltale: string): CaptureError {
  return new CaptureError(`the file is not text but binary content: ${telltale}; export the capture as CSV or text`);
}

/** What a file is by its first bytes, or null. */
function signatureOf(start: Uint8Array): string | null {
  const found = SIGNATURES.find(([, bytes]) => bytes.length <= start.length && bytes.every((b, i) => start[i] === b));
  return found ? found[0] : null;
}

/** True when every other byte of the first SIGNATURE_BYTES is zero and the others are not: UTF-16 text without a byte-order mark. */
function looksLikeUtf16(start: Uint8Array): boolean {
  if (start.length < SIGNATURE_BYTES) return false;
  const zeroAt = (parity: number) => start.subarray(0, SIGNATURE_BYTES).every((b, i) => (b === 0) === (i % 2 === parity));
  return zeroAt(0) || zeroAt(1);
}

function onlyZeros(bytes: Uint8Array, from: number): boolean {
  for (let i = from; i < bytes.length; i++) if (bytes[i] !== 0) return false;
  return true;
}

/**
 * Watches a file's bytes, piece by piece before they are read, for binary content: a signature above at its start, or a
 * NUL byte, which no UTF-8 or Windows-1252 text holds. A run of NULs that ends a file after its text is let through:
 * the padding some instruments leave when they write a file of a fixed size (common practice); the reader leaves it
 * out as a line after the table, with a note.
 */
export class BinaryWatch {
  /** Bytes checked so far. */
  private seen = 0;
  /** Byte offset of the first NUL while only NULs have followed it; -1 before one. */
  private nulRun = -1;
  private utf16Like = false;

  /** Throws CaptureError when the next bytes of the file show it is not text; the first piece holds SIGNATURE_BYTES unless the file is shorter. */
  check(bytes: Uint8Array): void {
    const offset = this.seen;
    this.seen += bytes.length;
    if (offset === 0) {
      const kind = signatureOf(bytes);
      if (kind) throw notText(`its first bytes are those of ${kind}`);
      this.utf16Like = looksLikeUtf16(bytes);
    }
    if (this.nulRun >= 0) {
      if (!onlyZeros(bytes, 0)) throw this.nulError();
      return;
    }
    const at = bytes.indexOf(0);
    if (at < 0) return;
    this.nulRun = offset + at;
    if (!onlyZeros(bytes, at)) throw this.nulError();
  }

  /** At the end of the file: throws when it held nothing but NUL bytes. */
  end(): void {
    if (this.nulRun === 0) throw notText(`all ${this.seen} bytes are NUL`);
  }

  private nulError(): CaptureError {
    const at = `a NUL byte at byte offset ${this.nulRun}`;
    if (!this.utf16Like) return notText(at);
    return new CaptureError(
      `the file is not text as read: ${at} and at every other byte from the start, as UTF-16 text without a byte-order mark has; ` +
        'save it as UTF-8, or as UTF-16 with a byte-order mark',
    );
  }
}
