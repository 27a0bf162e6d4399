// The worker reads a capture from its bytes as written, in the encodings the importer knows, as it reads the same text.

import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { handleWorkerRequest } from '../../renderer/workerHandlers';
import type { CaptureContent, WorkerReplyValue } from '../../renderer/workerProtocol';

const SAMPLES = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../sample-captures');
const TEXT = readFileSync(path.join(SAMPLES, 'input-filter-step.csv'), 'utf8');

function open(content: CaptureContent) {
  return handleWorkerRequest({ type: 'open', captureId: 'bytes', name: 'input-filter-step.csv', content }, () => undefined).value as Extract<WorkerReplyValue, { type: 'open' }>;
}

/** A Node buffer as the ArrayBuffer a browser's File gives, holding exactly its bytes. */
function arrayBufferOf(buffer: Buffer): ArrayBuffer {
  return buffer.buffer.slice(buffer.byteOffset, buffer.byteOffset + buffer.byteLength) as ArrayBuffer;
}

describe('a capture read from its bytes', () => {
  const fromText = open({ text: TEXT }).info;

  it.each([
    ['UTF-8', Buffer.from(TEXT, 'utf8'), 'UTF-8'],
    ['UTF-16 LE with its byte-order mark', Buffer.from(`\ufeff${TEXT}`, 'utf16le'), 'UTF-16LE'],
  ])('reads %s as the same samples as the text', (_name, bytes, encoding) => {
    const info = open({ bytes: arrayBufferOf(bytes) }).info;
    expect(info?.import.encoding.name).toBe(encoding);
    expect(info?.channels).toEqual(fromText?.channels);
    expect(info?.sampleInterval).toBe(fromText?.sampleInterval);
  });

  it('reads a Windows-1252 micro sign (byte 0xB5) in a header as microseconds', () => {
    const [, ...rows] = TEXT.trim().split('\n');
    const micro = ['Time (\u00b5s),CH1 (V)', ...rows.map((row) => row.replace(/^[^,]+/, (t) => String(Number(t) * 1e6)))].join('\r\n');
    const info = open({ bytes: arrayBufferOf(Buffer.from(micro, 'latin1')) }).info;
    expect(info?.import.encoding.name).toBe('Windows-1252');
    expect(info?.sampleInterval).toBeCloseTo(400e-9, 15);
  });
});
