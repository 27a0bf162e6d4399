// loadCapture reads a file of several pieces as parseCaptureFileBytes reads its bytes whole, with the same sha256 and size.
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { parseCaptureFileBytes } from '../../core/capture/parseCapture';
import { loadCapture } from '../../main/io/captureFile';
import { encodeText } from '../fixtures/exportHabits';

const folder = mkdtempSync(path.join(tmpdir(), 'ringbench-pieces-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

/** Rows enough for a few MB: time in µs, a ringing value in mV, a quoted cell now and then. */
function table(rows: number, newline: string): string {
  let text = `# scope export\nTime (µs),CH1 (mV)${newline}`;
  for (let i = 0; i < rows; i++) {
    const value = (500 * Math.exp(-i / 20_000) * Math.cos(i / 7)).toFixed(4);
    text += `${(i * 0.002).toFixed(3)},${i % 1009 === 5 ? `"${value}"` : value}${newline}`;
  }
  return text;
}

describe('loadCapture in pieces', () => {
  const cases: Record<string, Uint8Array> = {
    'UTF-8, CRLF, of 2 pieces': new TextEncoder().encode(table(100_000, '\r\n')),
    'UTF-16LE, of 4 pieces': encodeText(table(100_000, '\n'), 'UTF-16LE'),
    'Windows-1252, of 2 pieces': encodeText(table(100_000, '\n'), 'Windows-1252'),
  };
  for (const [name, bytes] of Object.entries(cases)) {
    it(`reads ${name} as the whole bytes read`, () => {
      const file = path.join(folder, `${name.replace(/\W+/g, '-')}.csv`);
      writeFileSync(file, bytes);
      const loaded = loadCapture(file, { hash: true });
      expect(loaded.bytes).toBe(bytes.length);
      expect(loaded.sha256).toBe(createHash('sha256').update(readFileSync(file)).digest('hex'));
      expect(loaded.capture).toEqual(parseCaptureFileBytes(bytes));
      expect(loaded.channel.values.length).toBe(loaded.capture.layout.rows);
      // Only a bench-log record needs the hash: without asking, none is taken, and the capture is the same.
      const unhashed = loadCapture(file);
      expect(unhashed.sha256).toBeNull();
      expect(unhashed.capture).toEqual(loaded.capture);
    });
  }

  it('names the file in a refusal, as the whole read did', () => {
    expect(() => loadCapture(path.join(folder, 'missing.csv'))).toThrow(`cannot read '${path.join(folder, 'missing.csv')}': no such file`);
    expect(() => loadCapture(folder)).toThrow(`'${folder}' is a folder, not a capture file`);
  });
});
