// Measuring capture files: read the capture (and design) from disk, then the use case of core/workflow.
// Shared by `fit`, `check`, `log add`, `batch`, `parasitics` and `compare`.

import { createHash } from 'node:crypto';
import { basename, resolve } from 'node:path';
import { MAX_DESIGN_BYTES, parseDesign, type Design } from '../../core/circuit/design';
import { UsageError } from '../../core/inputError';
import { compareCaptures } from '../../core/workflow/compare';
import type { Comparison } from '../../core/report/comparisonText';
import { measureCapture, type MeasureResult } from '../../core/workflow/measure';
import { parseMeasureSettings, type MeasureSettings } from '../../core/workflow/measureSettings';
import { loadCapture, readFileBytes, type LoadedCapture } from '../io/captureFile';
import { readingOptionsOf } from './readingOptions';
import { applyProbe } from '../../core/workflow/probeScaling';

export interface LoadedDesign {
  path: string;
  sha256: string;
  design: Design;
}

/** One capture file measured, with the file and design it came from. */
export interface FileMeasurement extends MeasureResult {
  capture: LoadedCapture;
  design: LoadedDesign | null;
}

/** A design file read and checked (DesignError names the faulty field). */
export function loadDesignFile(path: string, cwd: string): LoadedDesign {
  const full = resolve(cwd, path);
  const bytes = readFileBytes(full, { bytes: MAX_DESIGN_BYTES, why: `a design file is a few kilobytes (at most ${MAX_DESIGN_BYTES / 2 ** 20} MiB is read)` });
  return { path: full, sha256: createHash('sha256').update(bytes).digest('hex'), design: parseDesign(bytes.toString('utf8')) };
}

/**
 * The capture file read with the settings' channel, sample interval, time-order rule and stated units; the probe's
 * scale and sign applied to the channel. `hash`: with the file's sha256, for a bench-log record.
 */
export function loadCaptureFor(file: string, settings: MeasureSettings, cwd: string, hash = false): LoadedCapture {
  const loaded = loadCapture(file, { cwd, ...readingOptionsOf(settings), hash });
  return { ...loaded, channel: applyProbe(loaded.channel, parseMeasureSettings(settings).probe) };
}

/**
 * Fit one capture file; with a design, its verdict; the cautions from its samples. A part or design that cannot be used
 * throws. `forRecord`: the capture's sha256 is taken as it is read, for createBenchRecord.
 */
export function measureFile(file: string, settings: MeasureSettings, cwd: string, design: LoadedDesign | null = null, forRecord = false): FileMeasurement {
  if (design && (settings.topology !== undefined || settings.known !== undefined)) {
    throw new UsageError('--design gives the topology and components: leave out --topology and --known');
  }
  const parsed = parseMeasureSettings(settings);
  const capture = loadCaptureFor(file, settings, cwd, forRecord);
  const result = measureCapture({
    file: basename(file),
    channel: capture.channel,
    otherChannels: capture.capture.channels,
    captureWarnings: capture.capture.warnings,
    importSummary: capture.capture.importSummary,
    window: parsed.window,
    knownPart: parsed.knownPart,
    design: design?.design,
    event: parsed.event,
    continuity: parsed.continuity,
    metadata: capture.capture.metadata,
    setup: parsed.setup,
    modes: parsed.modes,
    mode: parsed.mode,
  });
  // On the command line a known part or design that cannot be used for this capture is bad input (exit 2).
  const problem = result.problems.components ?? result.problems.verdict;
  if (problem) throw problem;
  return { ...result, capture, design };
}

/** Two capture files of the same circuit, read with the same settings, compared. */
export function compareFiles(before: string, after: string, settings: MeasureSettings, cwd: string): Comparison {
  const parsed = parseMeasureSettings(settings);
  const side = (file: string) => {
    const capture = loadCaptureFor(file, settings, cwd);
    return { file: basename(file), channel: capture.channel, otherChannels: capture.capture.channels, captureWarnings: capture.capture.warnings, window: parsed.window, event: parsed.event, continuity: parsed.continuity };
  };
  return compareCaptures({ before: side(before), after: side(after), knownPart: parsed.knownPart });
}
