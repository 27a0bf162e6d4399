// What `ringbench fit` refuses before reading: FIFOs, devices, folders and files over 2 GiB, each at once with exit 2; and a very wide file.
import { spawnSync } from 'node:child_process';
import { closeSync, ftruncateSync, mkdtempSync, openSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { readFileBytes } from '../../main/io/captureFile';
import { FileError } from '../../main/io/fileError';
import { tsxArgs } from '../core/boundsRun';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
/** A refusal that blocked on the FIFO would hang; past this the child is killed and the test fails. */
const CHILD_TIMEOUT_MS = 20_000;
/** 2 GiB and one byte: one more than the largest file read. */
const OVER_LIMIT_BYTES = 2 ** 31 + 1;

/** Folders made by the tests, removed at the end. */
const made: string[] = [];
afterAll(() => made.forEach((dir) => rmSync(dir, { recursive: true, force: true })));

/** `ringbench fit <file>` from the sources, in a child process, in an empty folder (to see that nothing is written). */
function fit(file: string) {
  const cwd = mkdtempSync(path.join(tmpdir(), 'ringbench-fit-'));
  made.push(cwd);
  const result = spawnSync(process.execPath, tsxArgs(path.join(ROOT, 'main/cli/index.ts'), 'fit', file), {
    cwd,
    encoding: 'utf8',
    timeout: CHILD_TIMEOUT_MS,
  });
  return { code: result.status, signal: result.signal, err: result.stderr, out: result.stdout, written: readdirSync(cwd) };
}

/** The FileError readFileBytes throws for `path`, by its message. */
function refusal(path: string): string {
  try {
    readFileBytes(path);
  } catch (error) {
    expect(error).toBeInstanceOf(FileError);
    return (error as Error).message;
  }
  throw new Error(`'${path}' was read`);
}

function tempDir(): string {
  const dir = mkdtempSync(path.join(tmpdir(), 'ringbench-bounds-'));
  made.push(dir);
  return dir;
}

const mkfifoMissing = spawnSync('mkfifo', ['--version'], { encoding: 'utf8' }).error !== undefined;
if (mkfifoMissing) console.warn('captureFileBounds: no mkfifo on this platform; the FIFO check is skipped');

describe('files that are not plain captures', () => {
  it.skipIf(mkfifoMissing)('refuses a FIFO at once with exit 2, without waiting for a writer', () => {
    const fifo = path.join(tempDir(), 'scope.csv');
    expect(spawnSync('mkfifo', [fifo]).status).toBe(0);
    const result = fit(fifo);
    expect(result.signal).toBeNull();
    expect(result.code).toBe(2);
    expect(result.err).toBe(`ringbench: '${fifo}' is a named pipe (FIFO), not a regular file; save what it gives to a file and read that\n`);
    expect(result.out).toBe('');
    expect(result.written).toEqual([]);
  }, CHILD_TIMEOUT_MS * 2);

  it.skipIf(process.platform === 'win32')('refuses a device', () => {
    expect(refusal('/dev/null')).toBe("'/dev/null' is a device, not a regular file; save what it gives to a file and read that");
  });

  it('refuses a folder and a file over 2 GiB with a plain message, reading nothing', () => {
    const dir = tempDir();
    expect(refusal(dir)).toBe(`'${dir}' is a folder, not a capture file`);
    const huge = path.join(dir, 'huge.csv');
    const fd = openSync(huge, 'w');
    ftruncateSync(fd, OVER_LIMIT_BYTES);
    closeSync(fd);
    expect(refusal(huge)).toBe(`'${huge}' is 2.0 GiB; capture files over 2 GiB are not read`);
  });

  it('refuses a file of 60,000 columns with one line and exit 2, nothing written', () => {
    const file = path.join(tempDir(), 'wide.csv');
    writeFileSync(file, `${'1,'.repeat(59_999)}1\n`.repeat(3));
    const result = fit(file);
    expect(result.code).toBe(2);
    expect(result.err).toBe(`ringbench: ${file}: line 1: the table has 60000 columns, more than the 1000 a capture can hold\n`);
    expect(result.written).toEqual([]);
  }, CHILD_TIMEOUT_MS * 2);
});
