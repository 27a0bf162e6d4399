// The bytes a reader carries from one pushed piece to the next (an unfinished line, a piece of the head not yet cut), in one reused buffer.

export class HeldBytes {
  private buffer = new Uint8Array(0);
  /** Bytes held, at the start of the buffer. */
  length = 0;

  /** The held bytes: a view, valid until the next change. */
  get bytes(): Uint8Array {
    return this.buffer.subarray(0, this.length);
  }

  /** Adds `piece` after the held bytes; the buffer at least doubles when it grows, so holding a long run costs its length once. */
  append(piece: Uint8Array): void {
    const needed = this.length + piece.length;
    if (needed > this.buffer.length) {
      const grown = new Uint8Array(Math.max(needed, 2 * this.buffer.length));
      grown.set(this.bytes);
      this.buffer = grown;
    }
    this.buffer.set(piece, this.length);
    this.length = needed;
  }

  /** Holds `bytes[from, end)` instead of what was held (`bytes` may be the held bytes themselves). */
  keep(bytes: Uint8Array, from: number): void {
    if (bytes.buffer === this.buffer.buffer && bytes.byteOffset === this.buffer.byteOffset) {
      if (from > 0) this.buffer.copyWithin(0, from, bytes.length);
      this.length = bytes.length - from;
      return;
    }
    this.length = 0;
    this.append(bytes.subarray(from));
  }
}
