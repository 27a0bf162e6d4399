// A measurement made into a bench log record: who, what, with which settings, and the software.
// Shared by `log add` and `batch`.

import { randomBytes } from 'node:crypto';
import { RECORD_KIND, RECORD_SCHEMA, type BenchRecord } from '../../core/report/benchRecord';
import type { MeasureSettings } from '../../core/workflow/measureSettings';
import type { FileMeasurement } from './measureFile';
import { VERSION } from '../version';

/** Who measured what: the fields of a record that the fit does not give. */
export interface MeasurementLabel {
  unit: string;
  operator: string | null;
  /** Fixture or test station; null or absent when not given (the record then has no station field). */
  station?: string | null;
  note: string | null;
}

export interface RecordDeps {
  clock?: () => Date;
  /** 12 hex digits. Default: random. */
  newId?: () => string;
}

/** The record of a measurement whose capture was read with its hash (measureFile's `forRecord`). */
export function createBenchRecord(m: FileMeasurement, label: MeasurementLabel, options: MeasureSettings, deps: RecordDeps = {}): BenchRecord {
  const { fired, energies, charge, discharge } = m.cautions;
  const sha256 = m.capture.sha256;
  if (sha256 === null) throw new Error('a bench-log record needs its capture read with the hash (measureFile with forRecord)');
  return {
    record: RECORD_KIND,
    schema: RECORD_SCHEMA,
    id: (deps.newId ?? (() => randomBytes(6).toString('hex')))(),
    time: (deps.clock ?? (() => new Date()))().toISOString(),
    unit: label.unit,
    operator: label.operator,
    ...(label.station ? { station: label.station } : {}),
    note: label.note,
    capture: { path: m.capture.path, sha256, bytes: m.capture.bytes, channel: m.capture.channel.name },
    settings: {
      topology: options.topology ?? null,
      known: options.known ?? null,
      column: options.column ?? null,
      sampleInterval: options.sampleInterval ?? null,
      from: options.from ?? null,
      to: options.to ?? null,
      sortTime: options.sortTime ?? false,
      ...(options.timeUnit === undefined ? {} : { timeUnit: options.timeUnit }),
      ...(options.valueUnit === undefined ? {} : { valueUnit: options.valueUnit }),
      ...(options.segment === undefined ? {} : { segment: options.segment }),
      ...(options.probeRatio === undefined ? {} : { probeRatio: options.probeRatio }),
      ...(options.invert ? { invert: true } : {}),
      ...(options.event === undefined ? {} : { event: options.event }),
      ...(options.jumpStart ? { jumpStart: true } : {}),
      ...(options.modes === undefined ? {} : { modes: options.modes }),
      ...(options.mode === undefined ? {} : { mode: options.mode }),
      ...(options.scopeBandwidth === undefined ? {} : { scopeBandwidth: options.scopeBandwidth }),
      ...(options.probeCapacitance === undefined ? {} : { probeCapacitance: options.probeCapacitance }),
      ...(options.groundLead === undefined ? {} : { groundLead: options.groundLead }),
    },
    fit: m.summary,
    verdict: m.verdict,
    design: m.design ? { path: m.design.path, name: m.design.design.name, sha256: m.design.sha256, spec: m.design.design } : null,
    cautions: { fired, energies, ...(charge ? { charge } : {}), ...(discharge ? { discharge } : {}) },
    ...(m.setupChecks.length ? { setupChecks: m.setupChecks } : {}),
    software: { name: 'ringbench', version: VERSION },
  };
}
