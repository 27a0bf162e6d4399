// Child process for the bounds tests: reads one capture file (core: parseCaptureBytes; file: loadCapture) and prints its peak memory as JSON.
//
// Usage: node --import tsx test/core/captureBoundsProbe.ts <core|file> <path>

import { readFileSync } from 'node:fs';
import { parseCaptureBytes } from '../../core/capture/parseCapture';
import { decodeUtf8, loadCapture } from '../../main/io/captureFile';

const MB = 1024 * 1024;
const [mode, path] = process.argv.slice(2);
const startMB = process.memoryUsage().rss / MB;
let message = '';
let rows = 0;
try {
  const capture = mode === 'core' ? parseCaptureBytes(readFileSync(path), decodeUtf8) : loadCapture(path).capture;
  rows = capture.layout.rows;
} catch (error) {
  message = `${(error as Error).name}: ${(error as Error).message}`;
}
const peakMB = (process.resourceUsage().maxRSS * 1024) / MB;
process.stdout.write(`${JSON.stringify({ message, rows, startMB, peakMB })}\n`);
