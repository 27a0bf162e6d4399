// The command line on units it cannot read: refused with one line naming the option, and read once the option states them.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runCliIn } from './cliHarness';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const SAMPLE = path.join(ROOT, 'sample-captures', 'input-filter-step.csv');
/** The sample's rows as [time s, value V]. */
const ROWS = readFileSync(SAMPLE, 'utf8')
  .trim()
  .split('\n')
  .slice(1)
  .map((line) => line.split(',').map(Number));
/** Relative agreement asked of a fit of the same samples written in other units (only rounding differs). */
const SAME_FIT = 1e-6;

const run = (args: string[]) => runCliIn(ROOT, args);

const dir = mkdtempSync(path.join(tmpdir(), 'ringbench-units-'));
function capture(name: string, header: string, row: (t: number, v: number) => string): string {
  const file = path.join(dir, name);
  writeFileSync(file, `${header}\n${ROWS.map(([t, v]) => row(t, v)).join('\n')}\n`);
  return file;
}

async function alphaOf(args: string[]): Promise<number> {
  const { code, out, err } = await run(['fit', ...args, '--json']);
  expect(err).toBe('');
  expect(code).toBe(0);
  return JSON.parse(out).alpha.value;
}

describe('fit with units it cannot read, then with the option that states them', async () => {
  const reference = await alphaOf([SAMPLE]);
  const cases: { name: string; file: string; refusal: string[]; fix: string[] }[] = [
    {
      name: "an ambiguous time unit 'MS'",
      file: capture('ms.csv', 'Time (MS),CH1 (V)', (t, v) => `${t * 1e3},${v}`),
      refusal: ["column 'Time (MS)'", "'MS' is ambiguous", '--time-unit'],
      fix: ['--time-unit', 'ms'],
    },
    {
      name: "an unknown time unit 'furlongs'",
      file: capture('furlongs.csv', 'Time (furlongs),CH1 (V)', (t, v) => `${t * 1e6},${v}`),
      refusal: ["column 'Time (furlongs)'", "'furlongs' is not recognised", '--time-unit'],
      fix: ['--time-unit', 'µs'],
    },
    {
      name: "an unknown channel unit 'µx'",
      file: capture('mux.csv', 'Time (s),CH1 (µx)', (t, v) => `${t},${v * 1e3}`),
      refusal: ["column 'CH1 (µx)'", "'µx' is not recognised", '--value-unit'],
      fix: ['--value-unit', 'mV'],
    },
    {
      name: 'a control character as the channel unit',
      file: capture('bell.csv', 'Time (s),CH1 (\u0007)', (t, v) => `${t},${v}`),
      refusal: ["column 'CH1 (\\x07)'", '--value-unit'],
      fix: ['--value-unit', 'V'],
    },
  ];
  for (const c of cases) {
    it(`${c.name}: exit 2, one line naming the column, the unit and the option; then the same fit`, async () => {
      const refused = await run(['fit', c.file]);
      expect(refused.code).toBe(2);
      expect(refused.out).toBe('');
      expect(refused.err.trim().split('\n')).toHaveLength(1);
      expect(refused.err).toMatch(/^ringbench: \S+: line 1: /);
      for (const part of c.refusal) expect(refused.err).toContain(part);
      const alpha = await alphaOf([c.file, ...c.fix]);
      expect(Math.abs(alpha - reference)).toBeLessThan(SAME_FIT * reference);
    });
  }

  it("a sample-interval line in 'furlongs': refused on its line, read with --time-unit", async () => {
    const file = path.join(dir, 'interval.csv');
    const interval = ROWS[1][0] - ROWS[0][0];
    writeFileSync(file, `Sample Interval,${Math.round(interval * 1e9)} furlongs\nCH1 (V)\n${ROWS.map(([, v]) => v).join('\n')}\n`);
    const refused = await run(['fit', file]);
    expect(refused.code).toBe(2);
    expect(refused.out).toBe('');
    expect(refused.err.trim().split('\n')).toEqual([expect.stringMatching(/^ringbench: \S+: line 1: 'Sample Interval': unit 'furlongs' is not recognised; .*--time-unit/)]);
    const fixed = await run(['fit', file, '--time-unit', 'ns', '--json']);
    expect(fixed.code).toBe(0);
    const json = JSON.parse(fixed.out);
    expect(json.warnings.join('\n')).toContain("'furlongs' of 'Sample Interval' is replaced by --time-unit ns");
  });

  it.each([
    ['--time-unit', 'furlongs', "--time-unit 'furlongs': unit 'furlongs' is not recognised"],
    ['--time-unit', 'MS', "--time-unit 'MS': unit 'MS' is ambiguous"],
    ['--value-unit', 'ns', "--value-unit 'ns': unit 'ns' is a unit of time"],
  ])('%s %s is bad input: exit 2, one line naming the option', async (option, value, message) => {
    const { code, out, err } = await run(['fit', SAMPLE, option, value]);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err.trim().split('\n')).toHaveLength(1);
    expect(err).toContain(message);
  });

  it.each([['fit'], ['check'], ['log', 'add'], ['batch'], ['compare']])('%s takes --time-unit and --value-unit', async (...command) => {
    const { out, err } = await run([...command, '--help']);
    expect(out + err).toContain('--time-unit <unit>');
    expect(out + err).toContain('--value-unit <unit>');
  });
});

describe('a measurement logged with a stated unit', () => {
  it('is read again with that unit when the report draws its plot', async () => {
    const file = capture('logged-us.csv', 'Time (furlongs),CH1 (V)', (t, v) => `${t * 1e6},${v}`);
    const log = path.join(dir, 'units-log.jsonl');
    const added = await run(['log', 'add', file, '--log', log, '--unit', 'U1', '--time-unit', 'us']);
    expect(added.err).toBe('');
    expect(added.code).toBe(0);
    const out = path.join(dir, 'units-report.html');
    const report = await run(['report', '--log', log, '--out', out]);
    expect(report.code).toBe(0);
    const html = readFileSync(out, 'utf8');
    expect(html).not.toMatch(/could not be read again/);
    expect(html).toMatch(/<svg/);
  });
});

describe('a channel without a unit, for the cautions', () => {
  it('fit and batch say its peak was not weighed, naming --value-unit, and weigh it once the option states V', async () => {
    const folder = mkdtempSync(path.join(tmpdir(), 'ringbench-unweighed-'));
    const file = path.join(folder, 'bare.csv');
    writeFileSync(file, `Time (s),CH1\n${ROWS.map(([t, v]) => `${t},${v}`).join('\n')}\n`);
    const fit = await run(['fit', file]);
    expect(fit.code).toBe(0);
    expect(fit.out).toContain('  not weighed: the channel states no unit, so its peak was weighed neither as a voltage nor as a current; state V or A with --value-unit\n');
    const batch = await run(['batch', folder]);
    expect(batch.out.split('\n')[1]).toMatch(/^bare\.csv\s.*\snot weighed$/);
    expect(batch.out).toContain('cautions not weighed for 1 file(s): the channel states no unit');
    const stated = await run(['fit', file, '--value-unit', 'V', '--json']);
    expect(JSON.parse(stated.out).cautions.peakNotWeighed).toBeUndefined();
  });
});
