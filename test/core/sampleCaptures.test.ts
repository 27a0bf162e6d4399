// The bundled sample captures: the generator reproduces them byte for byte, each imports as stated,
// and fitting each recovers its stated circuit within 3 reported standard errors, errors that match the
// Cramér-Rao bound of the record (noise plus quantisation, q^2/12 — derived, see trade-facts.md).

import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';
import { selectChannel } from '../../core/capture/selectChannel';
import { componentsFromResponse } from '../../core/circuit/components';
import { fitResponse } from '../../core/fit/fitResponse';
import { circuitDamping } from '../../sample-captures/circuitResponse';
import { fisherBound } from '../reference/ngspice/fisherBound';
import { readSampleManifest, SAMPLE_DIR, type SampleManifestEntry } from '../../sample-captures/sampleManifest';
import { alphaOmega0Correlation } from '../../core/fit/correlation';

const manifest = readSampleManifest();
const REPO_ROOT = path.resolve(SAMPLE_DIR, '..');

function loadChannel(entry: SampleManifestEntry) {
  const capture = parseCapture(readFileSync(path.join(SAMPLE_DIR, entry.file), 'utf8'));
  return { capture, channel: selectChannel(capture, entry.channel) };
}


/** |measured - stated| in units of the reported standard error (Infinity when none was reported). */
function sigmas(value: number, stderr: number | null, stated: number): number {
  return stderr === null || !(stderr > 0) ? Infinity : Math.abs(value - stated) / stderr;
}

describe('sample captures', () => {
  describe('generator', () => {
    let fresh = '';
    beforeAll(() => {
      fresh = mkdtempSync(path.join(tmpdir(), 'ringbench-samples-'));
      const run = spawnSync('npx', ['tsx', 'sample-captures/generate.ts', '--out', fresh], { cwd: REPO_ROOT, encoding: 'utf8' });
      expect(run.status, run.stderr).toBe(0);
    });
    afterAll(() => rmSync(fresh, { recursive: true, force: true }));

    it('writes exactly the committed files, byte for byte', () => {
      const written = readdirSync(fresh).sort();
      expect(written).toEqual([...manifest.captures.map((c) => c.file), 'README.md', 'manifest.json'].sort());
      for (const name of written) {
        const committed = readFileSync(path.join(SAMPLE_DIR, name));
        expect(readFileSync(path.join(fresh, name)).equals(committed), name).toBe(true);
      }
    });
  });

  it('cover the three regimes, both topologies, voltage and current probes, and keep each file small', () => {
    const regimes = new Set(manifest.captures.map((c) => c.regime));
    expect(regimes).toEqual(new Set(['underdamped', 'critically damped', 'overdamped']));
    expect(new Set(manifest.captures.map((c) => c.topology))).toEqual(new Set(['series', 'parallel']));
    expect(new Set(manifest.captures.map((c) => c.unit))).toEqual(new Set(['V', 'A']));
    expect(manifest.captures.filter((c) => c.railSamples > 0).map((c) => c.file)).toEqual(['half-bridge-clipped.csv']);
    const added = manifest.captures.filter((c) => c.addedCapacitor).map((c) => c.addedCapacitor?.added);
    expect(added).toEqual([0, 470e-12, 1e-9]);
    for (const c of manifest.captures) {
      expect(readFileSync(path.join(SAMPLE_DIR, c.file)).length, c.file).toBeLessThan(200_000);
    }
  });

  describe.each(manifest.captures.map((c) => [c.file, c] as const))('%s', (_file, entry) => {
    it('imports with the stated channel, unit, length and time axis', () => {
      const { channel } = loadChannel(entry);
      expect(channel.unit).toBe(entry.unit);
      expect(channel.values.length).toBe(entry.points);
      expect(channel.dropped).toBe(0);
      const firstTime = entry.layout === 'interval-only' ? 0 : -entry.preTrigger * entry.sampleInterval;
      expect(channel.time[0] / entry.sampleInterval).toBeCloseTo(firstTime / entry.sampleInterval, 6);
      const span = channel.time[channel.time.length - 1] - channel.time[0];
      expect(span / ((entry.points - 1) * entry.sampleInterval)).toBeCloseTo(1, 6);
      let railRun = 0;
      for (let i = 0; i < channel.clipped.length; i++) railRun += channel.clipped[i];
      if (entry.railSamples > 0) {
        expect(railRun).toBeGreaterThan(0);
        for (let i = 0; i < channel.clipped.length; i++) {
          if (channel.clipped[i]) expect(Math.abs(channel.values[i] - entry.scope.max)).toBeLessThan(entry.scope.codeStep / 100);
        }
      } else {
        expect(railRun).toBe(0);
      }
    });

    it('fits to the stated alpha, omega0 and components within 3 standard errors', () => {
      const { channel } = loadChannel(entry);
      const fit = fitResponse({ time: channel.time, values: channel.values, clipped: channel.clipped, unit: channel.unit, name: channel.name });
      expect(fit.status).toBe('converged');
      const stated = circuitDamping(entry);
      expect(sigmas(fit.alpha.value, fit.alpha.stderr, stated.alpha), `alpha ${fit.alpha.value}`).toBeLessThanOrEqual(3);
      expect(sigmas(fit.omega0.value, fit.omega0.stderr, stated.omega0), `omega0 ${fit.omega0.value}`).toBeLessThanOrEqual(3);
      const sigma = Math.sqrt(entry.noiseRms ** 2 + entry.scope.codeStep ** 2 / 12);
      const bound = fisherBound(entry.response, channel.time, sigma);
      for (const key of ['alpha', 'omega0'] as const) {
        const ratio = (fit[key].stderr ?? Infinity) / (bound[key].stderr ?? NaN);
        expect(ratio, `${key} stderr / bound`).toBeGreaterThan(0.7);
        expect(ratio, `${key} stderr / bound`).toBeLessThan(1.5);
      }

      const known = { name: entry.known.name, value: entry.known.value };
      const parts = componentsFromResponse(fit.alpha, fit.omega0, entry.topology, known, alphaOmega0Correlation(fit.correlation));
      for (const name of (['R', 'L', 'C'] as const).filter((n) => n !== known.name)) {
        const q = parts[name];
        expect(sigmas(q.value, q.stderr, entry[name]), `${name} = ${q.value} ± ${q.stderr}`).toBeLessThanOrEqual(3);
        // The bound must mean something: a few per cent at most for these records.
        expect((q.stderr ?? Infinity) / q.value, `${name} relative stderr`).toBeLessThan(0.05);
      }
    });
  });
});
