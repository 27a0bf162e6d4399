// Builds every sample capture, the manifest and the README from the scenario table, deterministically.

import { createRandom } from '../core/random';
import { evaluateResponse } from '../core/response/secondOrder';
import { captureText, type TextChannel } from './captureText';
import { circuitDamping, circuitResponseParams, probeUnit } from './circuitResponse';
import { optionText } from './prefixed';
import { sampleReadme } from './readme';
import type { SampleManifest, SampleManifestEntry } from './sampleManifest';
import { sampleScenarios, type SampleScenario } from './scenarios';
import { codeStep, digitise, rails } from './scopeModel';

function regimeOf(zeta: number): SampleManifestEntry['regime'] {
  if (zeta < 0.98) return 'underdamped';
  return zeta > 1.02 ? 'overdamped' : 'critically damped';
}

/** The source level over time with a linear edge centred on the event (the driver-output channel). */
function driveLevels(s: SampleScenario, time: Float64Array, eventTime: number, edge: number): Float64Array {
  const source = s.circuit.source;
  if (source.kind !== 'step') throw new Error(`${s.file}: a drive channel needs a step source`);
  return time.map((t) => {
    const x = Math.min(1, Math.max(0, (t - eventTime) / edge + 0.5));
    return source.initialLevel + source.amplitude * x;
  });
}

function buildOne(s: SampleScenario): { text: string; entry: SampleManifestEntry } {
  const dt = s.sampleInterval;
  const fromZero = s.layout === 'interval-only';
  const time = Float64Array.from({ length: s.points }, (_, i) => (fromZero ? i : i - s.preTrigger) * dt);
  const eventTime = s.eventTime + (fromZero ? s.preTrigger * dt : 0);
  const response = circuitResponseParams(s.circuit, eventTime);
  const random = createRandom(s.seed);
  const probe = digitise(evaluateResponse(response, time), s.scope, random);
  const unit = probeUnit(s.circuit.probe);
  const channels: TextChannel[] = [{ name: s.channel, unit, values: probe.values, milli: s.drive !== undefined }];
  if (s.drive) {
    const drive = digitise(driveLevels(s, time, eventTime, s.drive.edge), s.scope, random);
    channels.unshift({ name: s.drive.channel, unit: 'V', values: drive.values });
  }
  const title = s.file.replace(/\.csv$/, '');
  const text = captureText({ layout: s.layout, title, sampleInterval: dt, time, channels });
  const { alpha, omega0 } = circuitDamping(s.circuit);
  const knownValue = s.circuit[s.known];
  const entry: SampleManifestEntry = {
    file: s.file,
    scenario: s.scenario,
    topology: s.circuit.topology,
    R: s.circuit.R,
    L: s.circuit.L,
    C: s.circuit.C,
    ...(s.addedCapacitor ? { addedCapacitor: s.addedCapacitor } : {}),
    source: s.circuit.source,
    probe: s.circuit.probe,
    unit,
    channel: s.channel,
    known: { name: s.known, value: knownValue, option: `${s.known}=${optionText(knownValue)}` },
    zeta: Number((alpha / omega0).toPrecision(6)),
    regime: regimeOf(alpha / omega0),
    layout: s.layout,
    sampleInterval: dt,
    points: s.points,
    preTrigger: s.preTrigger,
    eventTime: Number(eventTime.toPrecision(12)),
    response,
    scope: { bits: 8, perDivision: s.scope.perDivision, center: s.scope.center, codeStep: codeStep(s.scope), ...rails(s.scope) },
    noiseRms: s.scope.noiseRms,
    railSamples: probe.railSamples,
  };
  return { text, entry };
}

/** File name to contents for every capture plus manifest.json and README.md. */
export function buildSampleCaptures(scenarios: SampleScenario[] = sampleScenarios): Map<string, string> {
  const files = new Map<string, string>();
  const captures: SampleManifestEntry[] = [];
  for (const s of scenarios) {
    const { text, entry } = buildOne(s);
    files.set(s.file, text);
    captures.push(entry);
  }
  const manifest: SampleManifest = {
    format: 'ringbench-sample-captures',
    version: 1,
    generator: 'sample-captures/generate.ts (npx tsx sample-captures/generate.ts)',
    captures,
  };
  files.set('manifest.json', JSON.stringify(manifest, null, 2) + '\n');
  files.set('README.md', sampleReadme(captures));
  return files;
}
