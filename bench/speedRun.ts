// One speed measurement in a fresh process: import and fit one capture as the fit command does, then the floor; prints one JSON line.
//
// Usage: tsx bench/speedRun.ts <capture.csv> <whole|stream> <repeats> (bench/speed.ts runs it bundled, as the command line is)

import { closeSync, createReadStream, openSync, readFileSync, readSync } from 'node:fs';
import { decodeUtf8, loadCapture } from '../main/io/captureFile';
import { createCaptureReader } from '../core/capture/parseCapture';
import { selectChannel } from '../core/capture/selectChannel';
import type { Channel } from '../core/capture/types';
import { fitResponse } from '../core/fit/fitResponse';
import { parseFloor, splitLoop } from './importFloors';
import { truthPath, type SpeedTruth } from './speedCapture';

export interface SpeedRunResult {
  mode: 'whole' | 'stream';
  /** First (cold) import and fit in this process, as one command-line run sees them, s. */
  importS: number;
  fitS: number;
  endToEndS: number;
  /** Fastest of the repeated imports, fits, floor loops and split loops (null when streaming: it holds the whole text), s. */
  bestImportS: number;
  bestFitS: number;
  floorS: number;
  splitS: number | null;
  /** Peak resident set of the process after the first import and fit, and before importing, MB. */
  peakMB: number;
  idleMB: number;
  status: string;
  message: string;
  omegaD: number | null;
  omegaDStderr: number | null;
  alpha: number;
  alphaStderr: number | null;
  decimation: string | null;
  warnings: string[];
}

const MB = 1024 * 1024;

function maxRssMB(): number {
  return (process.resourceUsage().maxRSS * 1024) / MB;
}

/** Reads the file once without keeping it, so that every timed read finds it in the page cache. */
function warmPageCache(path: string): void {
  const buffer = Buffer.allocUnsafe(1 << 20);
  const fd = openSync(path, 'r');
  try {
    while (readSync(fd, buffer, 0, buffer.length, null) > 0);
  } finally {
    closeSync(fd);
  }
}

async function streamChannel(path: string): Promise<Channel> {
  const reader = createCaptureReader({}, decodeUtf8);
  for await (const chunk of createReadStream(path, { highWaterMark: 1 << 20 })) reader.pushBytes(chunk as Buffer);
  return selectChannel(reader.finish());
}

async function importChannel(path: string, mode: 'whole' | 'stream'): Promise<Channel> {
  return mode === 'whole' ? loadCapture(path).channel : streamChannel(path);
}

async function seconds<T>(run: () => Promise<T> | T): Promise<{ s: number; value: T }> {
  const start = performance.now();
  const value = await run();
  return { s: (performance.now() - start) / 1000, value };
}

async function measure(path: string, mode: 'whole' | 'stream', repeats: number): Promise<SpeedRunResult> {
  const truth = JSON.parse(readFileSync(truthPath(path), 'utf8')) as SpeedTruth;
  warmPageCache(path);
  const idleMB = maxRssMB();
  const imported = await seconds(() => importChannel(path, mode));
  const channel = imported.value;
  const trace = { time: channel.time, values: channel.values, clipped: channel.clipped, unit: channel.unit, name: channel.name };
  const fitted = await seconds(() => fitResponse(trace));
  const peakMB = maxRssMB();
  const fit = fitted.value;
  // Later runs reuse the warmed-up code; they no longer count for memory.
  let bestImportS = imported.s;
  let bestFitS = fitted.s;
  let floorS = Infinity;
  let splitS: number | null = null;
  for (let k = 0; k < repeats; k++) {
    floorS = Math.min(floorS, (await seconds(() => parseFloor(path, truth.samples))).s);
    if (mode === 'whole') splitS = Math.min(splitS ?? Infinity, (await seconds(() => splitLoop(path))).s);
    if (k === 0) continue;
    bestImportS = Math.min(bestImportS, (await seconds(() => importChannel(path, mode))).s);
    bestFitS = Math.min(bestFitS, (await seconds(() => fitResponse(trace))).s);
  }
  return {
    mode,
    importS: imported.s,
    fitS: fitted.s,
    endToEndS: imported.s + fitted.s,
    bestImportS,
    bestFitS,
    floorS,
    splitS,
    peakMB,
    idleMB,
    status: fit.status,
    message: fit.message,
    omegaD: fit.omegaD?.value ?? null,
    omegaDStderr: fit.omegaD?.stderr ?? null,
    alpha: fit.alpha.value,
    alphaStderr: fit.alpha.stderr,
    decimation: fit.decimation?.note ?? null,
    warnings: fit.warnings,
  };
}

const [path, mode, repeats] = process.argv.slice(2);
if (!path || (mode !== 'whole' && mode !== 'stream')) {
  process.stderr.write('usage: tsx bench/speedRun.ts <capture.csv> <whole|stream> <repeats>\n');
  process.exit(2);
}
process.stdout.write(`${JSON.stringify(await measure(path, mode, Math.max(1, Number(repeats) || 1)))}\n`);
