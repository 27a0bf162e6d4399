// loadCapture reads a file in the encoding it was written in (UTF-16 by its byte-order mark, Windows-1252 when not UTF-8) and names it.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { loadCapture } from '../../main/io/captureFile';
import { encodeText, type HabitEncoding } from '../fixtures/exportHabits';

const folder = mkdtempSync(path.join(tmpdir(), 'ringbench-encoding-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

/** A ringdown with time in µs and values in mV: the micro sign is the one character beyond ASCII. */
function ringdownText(): string {
  const rows = Array.from({ length: 40 }, (_, i) => `${(i * 0.5).toFixed(1)},${(500 * Math.exp(-i / 15) * Math.cos(i)).toFixed(3)}`);
  return `Probe,10x\r\nTime (µs),Vout (mV)\r\n${rows.join('\r\n')}\r\n`;
}

describe('loadCapture encodings', () => {
  const cases: [HabitEncoding, { name: string; byteOrderMark: boolean; note?: string }][] = [
    ['UTF-16LE', { name: 'UTF-16LE', byteOrderMark: true }],
    ['UTF-16BE', { name: 'UTF-16BE', byteOrderMark: true }],
    ['Windows-1252', { name: 'Windows-1252', byteOrderMark: false, note: 'not valid UTF-8 at line 2' }],
    ['UTF-8 with BOM', { name: 'UTF-8', byteOrderMark: true }],
  ];
  for (const [encoding, expected] of cases) {
    it(`reads ${encoding}: µs and mV scaled, the encoding named in the summary`, () => {
      const file = path.join(folder, `${encoding.replaceAll(' ', '-')}.csv`);
      writeFileSync(file, encodeText(ringdownText(), encoding));
      const { capture, channel } = loadCapture(file);
      expect(capture.importSummary.encoding).toEqual(expected);
      expect(channel.name).toBe('Vout');
      expect(channel.time[1]).toBeCloseTo(0.5e-6, 15);
      expect(channel.values[0]).toBeCloseTo(0.5, 12);
    });
  }
});
