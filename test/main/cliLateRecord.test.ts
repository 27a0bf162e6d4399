// A capture file caught after its step, through the command line: `check` judges neither the level before the
// event nor the step metrics and compares no prediction, and the report of its logged record draws none.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { stepDesignJson, stepSamples } from '../fixtures/stepFromRest';
import { runCliIn } from './cliHarness';

let folder: string;

/** 3000 samples from `firstSample` samples after the event, 5 mV of seeded noise. */
function writeCapture(name: string, firstSample: number): void {
  const { time, values } = stepSamples(3000, firstSample, firstSample + 100, 0.005);
  const rows = Array.from(time, (t, i) => `${t.toExponential(6)},${values[i].toFixed(5)}`);
  writeFileSync(join(folder, name), `Time (s),CH1 (V)\n${rows.join('\n')}\n`);
}

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'ringbench-late-'));
  writeCapture('late.csv', 9);
  writeCapture('whole.csv', -300);
  writeFileSync(join(folder, 'design.json'), stepDesignJson());
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('a capture caught after its step, on the command line', () => {
  it('check: no initial level, no step metrics, no prediction compared; the board passes', async () => {
    const run = await runCliIn(folder, ['check', 'late.csv', '--design', 'design.json', '--json']);
    expect(run.code).toBe(0);
    const result = JSON.parse(run.out);
    expect(result.startsInResponse).toBe(true);
    expect(result.preLevel).toBeUndefined();
    expect(result.transitions.reason).toMatch(/starts inside the response/);
    expect(result.verdict.quantities.map((q: { name: string }) => q.name)).not.toContain('initial level');
    expect(result.verdict.rmsDifference).toBeNull();
    expect(result.verdict.pass).toBe(true);
    const text = await runCliIn(folder, ['check', 'late.csv', '--design', 'design.json']);
    expect(text.out).toMatch(/^ {2}transitions {6}not measured: the fit window starts inside the response/m);
  });

  it('the same board with its event in the record: the initial level is judged with its standard error', async () => {
    const result = JSON.parse((await runCliIn(folder, ['check', 'whole.csv', '--design', 'design.json', '--json'])).out);
    expect(result.startsInResponse).toBeUndefined();
    expect(result.preLevel.stderr).toBeGreaterThan(0);
    const initial = result.verdict.quantities.find((q: { name: string }) => q.name === 'initial level');
    expect(initial.measured.stderr).toBe(result.preLevel.stderr);
    expect(result.verdict.rmsDifference).toBeLessThan(0.01);
  });

  it("the report of its logged record draws no prediction, and says why", async () => {
    for (const [file, unit] of [['late.csv', 'LATE-1'], ['whole.csv', 'WHOLE-1']]) {
      expect((await runCliIn(folder, ['log', 'add', file, '--log', 'bench.jsonl', '--unit', unit, '--design', 'design.json'])).code).toBe(0);
    }
    expect((await runCliIn(folder, ['report', '--log', 'bench.jsonl', '--out', 'report.html'])).code).toBe(0);
    const html = readFileSync(join(folder, 'report.html'), 'utf8');
    const section = (unit: string) => html.slice(html.indexOf(`<h2>${unit} `)).split('</section>')[0];
    expect(section('LATE-1')).toContain('no event time places the prediction: prediction not drawn');
    expect(section('LATE-1')).not.toContain('class="prediction"');
    expect(section('WHOLE-1')).toContain('class="prediction"');
  });
});
