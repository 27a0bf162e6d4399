// The window's file reader in the Electron main process: a regular file only, checked on the opened handle
// (FIFOs, devices and links to them state size 0), within its cap, read without stalling the event loop.

import { mkdtempSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { MAX_DESIGN_BYTES, readCaptureFile, readDesignText, readRegularFile } from '../../main/electron/captureReader';

const folder = mkdtempSync(join(tmpdir(), 'ringbench-electron-reader-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

const posix = process.platform !== 'win32';
const hasMkfifo = posix && spawnSync('mkfifo', ['--version']).error === undefined;

describe('what the reader refuses before reading a byte', () => {
  it.skipIf(!hasMkfifo)('a FIFO, at once, with no writer on the other end', async () => {
    const fifo = join(folder, 'scope-stream.csv');
    expect(spawnSync('mkfifo', [fifo]).status).toBe(0);
    await expect(readCaptureFile(fifo)).rejects.toThrow("'scope-stream.csv' is a named pipe (FIFO), not a regular file");
  });

  it.skipIf(!posix)('a device that states size 0 and never ends (/dev/zero)', async () => {
    await expect(readCaptureFile('/dev/zero')).rejects.toThrow("'zero' is a device, not a regular file");
  });

  it.skipIf(!posix)('a link with a capture name that leads to a device', async () => {
    const link = join(folder, 'ring.csv');
    symlinkSync('/dev/zero', link);
    await expect(readCaptureFile(link)).rejects.toThrow("'ring.csv' is a device, not a regular file");
  });

  it('a folder, and a path that does not exist', async () => {
    await expect(readCaptureFile(folder)).rejects.toThrow('is a folder');
    await expect(readCaptureFile(join(folder, 'gone.csv'))).rejects.toThrow("cannot read 'gone.csv': no such file");
  });
});

describe('the size cap', () => {
  it('reads a file of exactly the cap, refuses one byte more', async () => {
    const path = join(folder, 'at-cap.json');
    writeFileSync(path, Buffer.alloc(MAX_DESIGN_BYTES, 0x20));
    expect((await readDesignText(path)).text).toHaveLength(MAX_DESIGN_BYTES);
    writeFileSync(path, Buffer.alloc(MAX_DESIGN_BYTES + 1, 0x20));
    await expect(readDesignText(path)).rejects.toThrow(`is ${MAX_DESIGN_BYTES + 1} bytes, more than the ${MAX_DESIGN_BYTES} bytes the window reads`);
  });

  it.skipIf(process.platform !== 'linux')('holds for a regular file whose stated size (0) is not its length', async () => {
    // Files under /proc state size 0 and still give their text: the cap is counted as the bytes come in.
    await expect(readRegularFile('/proc/self/status', 16)).rejects.toThrow("'status' is more than the 16 bytes the window reads");
    expect((await readRegularFile('/proc/self/status', 1 << 20)).toString('utf8')).toMatch(/^Name:/);
  });
});

describe('reading off the event loop', () => {
  it('lets the main process turn its loop while a large capture is read', async () => {
    const path = join(folder, 'long-record.csv');
    const row = '1.000000e-09,0.123456\n';
    writeFileSync(path, row.repeat(Math.ceil((48 * 1024 * 1024) / row.length)));
    let turns = 0;
    let reading = true;
    const turn = () => {
      if (!reading) return;
      turns++;
      setImmediate(turn);
    };
    setImmediate(turn);
    const opened = await readCaptureFile(path);
    reading = false;
    expect(opened.bytes.length).toBeGreaterThan(48 * 1024 * 1024 - row.length);
    // A synchronous read returns before the loop turns once; several reads in the thread pool let it turn.
    expect(turns).toBeGreaterThan(0);
  });
});
