// The sample captures' manifest: what each file holds and the stated circuit behind it.

import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { ResponseParams } from '../core/response/secondOrder';
import type { StatedCircuit } from './circuitResponse';
import type { SampleLayout } from './scenarios';

export const SAMPLE_DIR = path.dirname(fileURLToPath(import.meta.url));

/** A stated circuit (R, L, C in ohm, H, F; C is the total across the probed node) and its capture. */
export interface SampleManifestEntry extends StatedCircuit {
  file: string;
  scenario: string;
  addedCapacitor?: { group: string; parasitic: number; added: number };
  unit: 'V' | 'A';
  /** Channel holding the response. */
  channel: string;
  known: { name: 'R' | 'L' | 'C'; value: number; option: string };
  zeta: number;
  regime: 'underdamped' | 'critically damped' | 'overdamped';
  layout: SampleLayout;
  sampleInterval: number;
  points: number;
  preTrigger: number;
  /** Event time on the file's own time axis, s. */
  eventTime: number;
  /** The noiseless waveform on the file's time axis. */
  response: ResponseParams;
  scope: { bits: 8; perDivision: number; center: number; codeStep: number; min: number; max: number };
  noiseRms: number;
  /** Samples of the response channel that hit a converter rail. */
  railSamples: number;
}

export interface SampleManifest {
  format: 'ringbench-sample-captures';
  version: 1;
  generator: string;
  captures: SampleManifestEntry[];
}

export function readSampleManifest(dir = SAMPLE_DIR): SampleManifest {
  return JSON.parse(readFileSync(path.join(dir, 'manifest.json'), 'utf8')) as SampleManifest;
}
