// The bench API behind both faces: the preload's IPC calls and the local server's /api/ routes.

import { join } from 'node:path';
import type { BenchApi } from '../../core/bench/benchApiTypes';
import { findSample, listDesignEntries, listSampleEntries, readDesignFile, readSampleFile } from './samples';
import { appendLogRequest, correctLogRequest, readLogView } from './logCalls';
import { captureReadPolicy, renderLogReport } from './reportCall';
import { BenchApiError } from './apiError';
import { existsSync } from 'node:fs';

export interface BenchApiOptions {
  /** The repository or installed application folder (holds sample-captures/). */
  projectRoot: string;
  /** The bench log file (JSON Lines); its folder must exist. */
  logPath: string;
  /** Clock for the records' times. Default: the system clock. */
  clock?: () => Date;
  /**
   * Captures a report may read again besides those in the project folder: the page could open only those
   * (Electron: GrantedPaths.isGranted). Default: none, so a record cannot make main read any file it names.
   */
  mayReadCapture?: (path: string) => boolean;
}

export function createBenchApi(options: BenchApiOptions): BenchApi {
  const sampleDir = join(options.projectRoot, 'sample-captures');
  const clock = options.clock ?? (() => new Date());
  return {
    listSamples: async () => listSampleEntries(sampleDir),
    readSample: async (id) => {
      const sample = findSample(sampleDir, id);
      return {
        name: sample.file,
        text: readSampleFile(sampleDir, sample.file),
        path: join(sampleDir, sample.file),
        sampleId: sample.id,
        sample,
        design: sample.designId ? readDesignFile(sampleDir, sample.designId) : null,
      };
    },
    listDesigns: async () => listDesignEntries(sampleDir),
    readDesign: async (id) => readDesignFile(sampleDir, id),
    readBenchLog: async () => readLogView(options.logPath),
    appendBenchLog: async (request) => appendLogRequest(options.logPath, request, clock()),
    correctBenchLog: async (request) => correctLogRequest(options.logPath, request, clock()),
    renderReport: async (format) => {
      if (!existsSync(options.logPath)) throw new BenchApiError('the bench log has no measurements yet: add one first');
      return renderLogReport(options.logPath, format, clock, captureReadPolicy(options.projectRoot, options.mayReadCapture ?? (() => false)));
    },
  };
}
