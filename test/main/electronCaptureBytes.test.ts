// The desktop window gets a capture's bytes as written, so a UTF-16 or Windows-1252 file reads there as on the command line.

import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { readCaptureFile } from '../../main/electron/captureReader';
import { createDesktopBridge } from '../../renderer/desktopBridge';
import { parseCaptureFileBytes } from '../../core/capture/parseCapture';
import type { OpenedCaptureFile, PreloadApi } from '../../renderer/bridgeTypes';

const folder = mkdtempSync(join(tmpdir(), 'ringbench-desktop-bytes-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

/** A short ring as text, one sample per line, with a micro sign in the header. */
function ringText(): string {
  const lines = ['Time (µs),Node (V)'];
  for (let i = 0; i < 200; i++) {
    const t = i * 0.05;
    lines.push(`${t.toFixed(2)},${(Math.exp(-0.3 * t) * Math.cos(2 * Math.PI * t)).toFixed(5)}`);
  }
  return lines.join('\r\n') + '\r\n';
}

/** What the window's bridge hands the worker for a file main opened through the dialog. */
async function openedThroughBridge(path: string) {
  const opened: OpenedCaptureFile = await readCaptureFile(path);
  const api = { openCaptureDialog: async () => ({ ok: true, value: opened }) } as unknown as PreloadApi;
  const file = await createDesktopBridge(api).pickCapture();
  if (!file?.bytes) throw new Error('the bridge gave no bytes');
  return parseCaptureFileBytes(new Uint8Array(file.bytes));
}

describe('desktop window capture bytes', () => {
  it('reads a UTF-16 LE file with its byte-order mark as UTF-16, micro sign and all', async () => {
    const path = join(folder, 'ring-utf16.csv');
    writeFileSync(path, Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(ringText(), 'utf16le')]));
    const capture = await openedThroughBridge(path);
    expect(capture.importSummary.encoding.name).toBe('UTF-16LE');
    expect(capture.channels[0].time[1] - capture.channels[0].time[0]).toBeCloseTo(0.05e-6, 15);
  });

  it('reads a Windows-1252 micro sign (the single byte 0xB5) as microseconds', async () => {
    const path = join(folder, 'ring-1252.csv');
    writeFileSync(path, Buffer.from(ringText(), 'latin1'));
    const capture = await openedThroughBridge(path);
    expect(capture.importSummary.encoding.name).toBe('Windows-1252');
    expect(capture.channels[0].time[1] - capture.channels[0].time[0]).toBeCloseTo(0.05e-6, 15);
  });
});
