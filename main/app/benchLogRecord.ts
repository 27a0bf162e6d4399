// One measurement for the bench log: fit a capture, check it against a design, weigh the cautions,
// and build the record. Shared by `log add` and `batch`.

import { createHash, randomBytes } from 'node:crypto';
import { resolve } from 'node:path';
import { parseDesign, type Design } from '../../core/circuit/design';
import { probeUnit } from '../../core/circuit/predict';
import { checkDesign, type Verdict } from '../../core/circuit/verdict';
import { RECORD_KIND, RECORD_SCHEMA, type BenchRecord } from '../../core/report/benchRecord';
import type { FitSummary } from '../../core/report/fitSummary';
import { cautionInputsFromCapture } from '../../core/safety/cautionInputs';
import { evaluateCautions, type CautionResult } from '../../core/safety/evaluateCautions';
import { readFileBytes, type LoadedCapture } from '../io/captureFile';
import { fitCapture, type FitCommandOptions } from '../cli/commands/fit';
import { UsageError } from '../../core/inputError';
import { VERSION } from '../version';

export interface LoadedDesign {
  path: string;
  sha256: string;
  design: Design;
}

export interface Measurement {
  summary: FitSummary;
  capture: LoadedCapture;
  design: LoadedDesign | null;
  verdict: Verdict | null;
  cautions: CautionResult;
}

/** Who measured what: the fields of a record that the fit does not give. */
export interface MeasurementLabel {
  unit: string;
  operator: string | null;
  note: string | null;
}

/** A design file read and checked (DesignError names the faulty field). */
export function loadDesignFile(path: string, cwd: string): LoadedDesign {
  const full = resolve(cwd, path);
  const bytes = readFileBytes(full);
  return { path: full, sha256: createHash('sha256').update(bytes).digest('hex'), design: parseDesign(bytes.toString('utf8')) };
}

/** Fit one capture; with a design, its verdict. A design probing another unit than the channel is a UsageError. */
export function measureFile(file: string, options: FitCommandOptions, cwd: string, design: LoadedDesign | null): Measurement {
  if (design && (options.topology !== undefined || options.known !== undefined)) {
    throw new UsageError('--design gives the topology and components: leave out --topology and --known');
  }
  const { summary, loaded: capture } = fitCapture(file, options, cwd);
  const { channel } = capture;
  let verdict: Verdict | null = null;
  if (design && summary.status !== 'failed') {
    const expected = probeUnit(design.design);
    if (channel.unit !== '' && channel.unit !== expected) {
      throw new UsageError(`--design probes ${design.design.probe} (${expected}) but channel '${channel.name}' of ${file} is in ${channel.unit}`);
    }
    verdict = checkDesign(design.design, summary, { time: channel.time, values: channel.values });
  }
  const parts = design
    ? { C: design.design.components.C.value, L: design.design.components.L.value }
    : { C: summary.components?.C, L: summary.components?.L };
  const cautions = evaluateCautions(cautionInputsFromCapture(channel.values, channel.unit, parts));
  return { summary, capture, design, verdict, cautions };
}

export interface RecordDeps {
  clock?: () => Date;
  /** 12 hex digits. Default: random. */
  newId?: () => string;
}

export function createBenchRecord(m: Measurement, label: MeasurementLabel, options: FitCommandOptions, deps: RecordDeps = {}): BenchRecord {
  const { fired, energies, charge, discharge } = m.cautions;
  return {
    record: RECORD_KIND,
    schema: RECORD_SCHEMA,
    id: (deps.newId ?? (() => randomBytes(6).toString('hex')))(),
    time: (deps.clock ?? (() => new Date()))().toISOString(),
    unit: label.unit,
    operator: label.operator,
    note: label.note,
    capture: { path: m.capture.path, sha256: m.capture.sha256, bytes: m.capture.bytes, channel: m.capture.channel.name },
    settings: {
      topology: options.topology ?? null,
      known: options.known ?? null,
      column: options.column ?? null,
      sampleInterval: options.sampleInterval ?? null,
      from: options.from ?? null,
      to: options.to ?? null,
      sortTime: options.sortTime ?? false,
    },
    fit: m.summary,
    verdict: m.verdict,
    design: m.design ? { path: m.design.path, name: m.design.design.name, sha256: m.design.sha256, spec: m.design.design } : null,
    cautions: { fired, energies, ...(charge ? { charge } : {}), ...(discharge ? { discharge } : {}) },
    software: { name: 'ringbench', version: VERSION },
  };
}
