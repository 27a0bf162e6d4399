// The command line on a file of repeated acquisitions: the first segment by default, --segment N another, a bad N refused with the count.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { parseCapture } from '../../core/capture/parseCapture';
import { createRandom } from '../../core/random';
import { loadReportTraces } from '../../main/app/reportFile';
import { readBenchLog } from '../../main/io/benchLog';
import { runCliIn } from './cliHarness';

const dir = mkdtempSync(path.join(tmpdir(), 'ringbench-segments-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Generated rings, one per segment: decay rate (1/s) and ring frequency (rad/s), told apart by both. */
const RINGS = [
  { alpha: 2e4, omegaD: 2 * Math.PI * 50e3 },
  { alpha: 5e4, omegaD: 2 * Math.PI * 80e3 },
];
const DT = 0.2e-6;
const ROWS = 800;
const PRE_TRIGGER_ROWS = 50;
/** Noise (V) against a 1 V ring: small, so that the fit's error bars are tight and the check is meaningful. */
const NOISE = 2e-3;
/** Agreement asked of the fitted decay rate and ring frequency: well outside their error bars at this noise. */
const CLOSE = 0.02;

function segmentedFile(): string {
  const random = createRandom(1010);
  const lines = ['Time (s),Vout (V)'];
  RINGS.forEach(({ alpha, omegaD }, k) => {
    if (k > 0) lines.push(`Acquisition ${k + 1}`);
    for (let i = 0; i < ROWS; i++) {
      const t = (i - PRE_TRIGGER_ROWS) * DT;
      const ring = t < 0 ? 0 : Math.exp(-alpha * t) * Math.cos(omegaD * t);
      lines.push(`${t.toExponential(6)},${(ring + NOISE * random.normal()).toFixed(5)}`);
    }
  });
  const file = path.join(dir, 'two-acquisitions.csv');
  writeFileSync(file, `${lines.join('\n')}\n`);
  return file;
}

const run = (args: string[]) => runCliIn(dir, args);

describe('fit --segment', () => {
  const file = segmentedFile();

  for (const segment of [undefined, 1, 2]) {
    it(`fits segment ${segment ?? '1 (the default)'} and says which was read`, async () => {
      const { code, out, err } = await run(['fit', file, '--json', ...(segment === undefined ? [] : ['--segment', String(segment)])]);
      expect(err).toBe('');
      expect(code).toBe(0);
      const result = JSON.parse(out);
      const truth = RINGS[(segment ?? 1) - 1];
      expect(result.status).toBe('converged');
      expect(Math.abs(result.alpha.value / truth.alpha - 1)).toBeLessThan(CLOSE);
      expect(Math.abs(result.omegaD.value / truth.omegaD - 1)).toBeLessThan(CLOSE);
      expect(result.import.segments.map((s: { read: boolean }) => s.read)).toEqual([segment !== 2, segment === 2]);
      expect(result.import.segments.map((s: { rows: number }) => s.rows)).toEqual([ROWS, ROWS]);
    });
  }

  it('prints the segments in the import block, the one read marked', async () => {
    const { code, out } = await run(['fit', file, '--segment', '2']);
    expect(code).toBe(0);
    expect(out).toContain(`2 segments: lines 2-${ROWS + 1}, lines ${ROWS + 3}-${2 * ROWS + 2} (read)`);
  });

  for (const bad of ['0', '3', '1.5', 'two']) {
    it(`refuses --segment ${bad} with exit 2 and one line${bad === 'two' ? '' : ' naming the count'}`, async () => {
      const { code, out, err } = await run(['fit', file, '--segment', bad]);
      expect(code).toBe(2);
      expect(out).toBe('');
      expect(err.trim().split('\n')).toHaveLength(1);
      expect(err).toMatch(bad === 'two' ? /--segment: 'two' is not a segment number/ : /the file has 2 segments; segments count from 1/);
    });
  }
});

describe('log add --segment', () => {
  it("keeps the segment in the record's settings, and the report reads that segment again", async () => {
    const file = segmentedFile();
    const { code, err } = await run(['log', 'add', file, '--segment', '2', '--log', 'bench.jsonl', '--unit', 'SN7', '--json']);
    expect(err).toBe('');
    expect(code).toBe(0);
    const [record] = readBenchLog(path.join(dir, 'bench.jsonl')).records;
    expect(record.settings.segment).toBe('2');
    const trace = loadReportTraces([record]).traces[record.id];
    const second = parseCapture(readFileSync(file, 'utf8'), { segment: 2 }).channels[0];
    expect(Array.from(trace.values)).toEqual(Array.from(second.values));
  });
});
