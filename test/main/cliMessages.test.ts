// Messages of the command line: every input error names its file, options are named by their flags,
// 0 is a time like any other, a busy port is said in words, a design file may start with a byte-order mark.
import { existsSync, readFileSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { createServer, type Server } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { runCliIn } from './cliHarness';
import { messageFor } from '../../main/cli/errors';
import { InputError } from '../../core/inputError';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const DESIGN = readFileSync(path.join(ROOT, 'sample-captures', 'designs', 'switch-node-before.json'), 'utf8');
const BOM = '\uFEFF';
/** Internal option names that must never reach the terminal. */
const INTERNAL_NAMES = /sampleInterval|sortTime|timeUnit|valueUnit|jumpStart|probeC\b|^window:/;

const dir = mkdtempSync(path.join(tmpdir(), 'ringbench-messages-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const run = (args: string[]) => runCliIn(dir, args);

/** A generated ringdown triggered at t = 0: 1 µs of flat lead-in, 3 µs of a 5 MHz ring. */
function writeRing(name: string): string {
  const lines = ['Time (s),Node (V)'];
  for (let i = 0; i <= 400; i++) {
    const t = -1e-6 + i * 1e-8;
    lines.push(`${t.toExponential(6)},${(t < 0 ? 0 : Math.exp(-t * 1.5e6) * Math.sin(2 * Math.PI * 5e6 * t)).toFixed(5)}`);
  }
  writeFileSync(path.join(dir, name), `${lines.join('\n')}\n`);
  return name;
}
const ring = writeRing('ring-at-zero.csv');

describe('every input error names its file', () => {
  it.each([
    ['a file with no numbers', 'no-numbers.csv', 't,v\nx,y\n', []],
    ['a channel index the file does not have', 'one-channel.csv', 't,v\n0,1\n1e-9,2\n2e-9,3\n', ['--column', '9']],
    ['no time column and no interval', 'no-time.csv', '1\n2\n3\n4\n', []],
    ['time running backwards', 'backwards.csv', 't,v\n0,1\n2e-9,2\n1e-9,3\n3e-9,4\n', []],
  ])('%s', async (_what, name, text, options) => {
    writeFileSync(path.join(dir, name), text);
    const { code, err } = await run(['fit', name, ...options]);
    expect(code).toBe(2);
    expect(err).toMatch(new RegExp(`^ringbench: ${name.replace('.', '\\.')}: `));
    expect(err).not.toMatch(INTERNAL_NAMES);
  });

  it('of several captures, the one at fault', async () => {
    writeFileSync(path.join(dir, 'empty-second.csv'), '');
    const { code, err } = await run(['parasitics', ring, 'empty-second.csv', '--added', 'C=1n', '--added-tolerance', '0']);
    expect(code).toBe(2);
    expect(err).toMatch(/^ringbench: empty-second\.csv: /);
  });

  it('a design file, and the capture checked against it', async () => {
    writeFileSync(path.join(dir, 'board-rev-c.json'), '{"format": "something else"}');
    const { code, err } = await run(['check', ring, '--design', 'board-rev-c.json']);
    expect(code).toBe(2);
    expect(err).toMatch(/^ringbench: board-rev-c\.json: design format: /);
  });

  it('log add: the capture or the design at fault, and no log written', async () => {
    writeFileSync(path.join(dir, 'log-no-numbers.csv'), 't,v\nx,y\n');
    const capture = await run(['log', 'add', 'log-no-numbers.csv', '--unit', 'SN7', '--log', 'named.jsonl']);
    expect(capture.code).toBe(2);
    expect(capture.err).toMatch(/^ringbench: log-no-numbers\.csv: /);
    writeFileSync(path.join(dir, 'board-rev-d.json'), '{');
    const design = await run(['log', 'add', ring, '--design', 'board-rev-d.json', '--unit', 'SN7', '--log', 'named.jsonl']);
    expect(design.code).toBe(2);
    expect(design.err).toMatch(/^ringbench: board-rev-d\.json: /);
    expect(existsSync(path.join(dir, 'named.jsonl'))).toBe(false);
  });
});

describe('options are named by their flags', () => {
  it.each([
    ['no time column', 'no-time-2.csv', '1\n2\n3\n4\n', '--sample-interval'],
    ['time running backwards', 'backwards-2.csv', `t,v\n${Array.from({ length: 40 }, (_, i) => `${(i === 20 ? 5 : i) * 1e-9},${Math.sin(i)}`).join('\n')}\n`, '--sort-time'],
    ['time written with too few digits', 'coarse-time.csv', `t,v\n${Array.from({ length: 200 }, (_, i) => `${(i * 1e-9).toExponential(1)},${Math.sin(i)}`).join('\n')}\n`, '--sample-interval'],
  ])('%s: %s', async (_what, name, text, flag) => {
    writeFileSync(path.join(dir, name), text);
    const { err } = await run(['fit', name]);
    expect(err).toContain(flag);
    expect(err).not.toMatch(INTERNAL_NAMES);
  });

  it('a fit window that ends before it starts names --from and --to', async () => {
    const { code, err } = await run(['fit', ring, '--from', '2u', '--to', '1u']);
    expect(code).toBe(2);
    expect(err).toContain('--from/--to: the fit window starts');
    expect(err).not.toMatch(INTERNAL_NAMES);
  });
});

describe('0 is a time like any other', () => {
  it('--from 0 starts the window at the trigger', async () => {
    const { code, out, err } = await run(['fit', ring, '--from', '0', '--json']);
    expect(err).toBe('');
    expect(code).toBe(0);
    expect((JSON.parse(out) as { window: { start: number } }).window.start).toBeGreaterThanOrEqual(0);
  });

  it('--to 0 ends it there (before the ring: nothing to fit, but no bad input)', async () => {
    const { code, out } = await run(['fit', ring, '--to', '0', '--json']);
    expect(code).not.toBe(2);
    expect((JSON.parse(out) as { window: { end: number } }).window.end).toBeLessThanOrEqual(0);
  });

  it('--from -0 is 0, and a time that is no number is still refused naming the flag', async () => {
    expect((await run(['fit', ring, '--from', '-0', '--json'])).code).toBe(0);
    const bad = await run(['fit', ring, '--from', 'soon']);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/^ringbench: (ring-at-zero\.csv: )?--from 'soon'/);
  });
});

describe('a busy port', () => {
  let holder: Server;
  afterAll(() => new Promise<void>((resolve) => holder.close(() => resolve())));

  it('says the port is in use, exit 2', async () => {
    holder = createServer();
    await new Promise<void>((resolve) => holder.listen(0, '127.0.0.1', () => resolve()));
    const port = (holder.address() as { port: number }).port;
    const { code, out, err } = await run(['serve', '--port', String(port), '--no-open']);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).toBe(`ringbench: port ${port} is in use; choose another with --port, or leave it out for any free port\n`);
  });
});

describe('a design file with a UTF-8 byte-order mark', () => {
  it('is read as without one', async () => {
    writeFileSync(path.join(dir, 'with-bom.json'), BOM + DESIGN);
    const withBom = await run(['check', ring, '--design', 'with-bom.json', '--json']);
    writeFileSync(path.join(dir, 'without-bom.json'), DESIGN);
    const without = await run(['check', ring, '--design', 'without-bom.json', '--json']);
    expect(withBom.err).toBe('');
    expect(withBom.code).not.toBe(2);
    expect(withBom.out).toBe(without.out);
  });

  it('one far larger than any design is refused before it is read: exit 2 naming the file (one of 600 MB ended in an internal error)', async () => {
    const design = JSON.parse(DESIGN);
    writeFileSync(path.join(dir, 'huge-design.json'), JSON.stringify({ ...design, notes: 'x'.repeat(2 << 20) }));
    const { code, out, err } = await run(['check', ring, '--design', 'huge-design.json']);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).toMatch(/^ringbench: '.*huge-design\.json' is 2\.0 MiB: a design file is a few kilobytes \(at most 1 MiB is read\)\n$/);
  });

  it('and its errors name the design file', async () => {
    writeFileSync(path.join(dir, 'bom-broken.json'), `${BOM}{"format": "ringbench-design", "version": 7}`);
    const { code, err } = await run(['check', ring, '--design', 'bom-broken.json']);
    expect(code).toBe(2);
    expect(err).toMatch(/^ringbench: bom-broken\.json: design version: /);
  });
});

describe('compare names the capture at fault', () => {
  it.each([
    ['the first', ['empty-before.csv', ring], 'empty-before.csv'],
    ['the second', [ring, 'empty-after.csv'], 'empty-after.csv'],
  ])('%s of the two', async (_which, files, faulty) => {
    writeFileSync(path.join(dir, faulty), 'no numbers here\n');
    const { code, err } = await run(['compare', ...files]);
    expect(code).toBe(2);
    expect(err).toMatch(new RegExp(`^ringbench: ${faulty.replace('.', '\\.')}: `));
  });

  it('an option no capture could satisfy stays unnamed', async () => {
    const { code, err } = await run(['compare', ring, ring, '--known', 'C=1n']);
    expect(code).toBe(2);
    expect(err).toBe('ringbench: --topology and --known go together: give both to derive R, L and C\n');
  });
});

describe('the flag wording leaves the file’s own names alone', () => {
  it('a column called sortTime stays as the file names it; the option becomes its flag', () => {
    const message = messageFor(new InputError("line 3: time 5 ns is earlier than 19 ns (column 'sortTime'); time must increase (option sortTime sorts the rows)"));
    expect(message).toBe("line 3: time 5 ns is earlier than 19 ns (column 'sortTime'); time must increase (--sort-time sorts the rows)");
  });
});

describe('a flat channel points to the channels that vary', () => {
  it('fit: exit 1, and the status names the other channel', async () => {
    const source = readFileSync(path.join(dir, ring), 'utf8').trimEnd().split('\n');
    const lines = source.map((line, i) => (i === 0 ? 'Time (s),Probe off (V),Node (V)' : line.replace(',', ',0.25,')));
    writeFileSync(path.join(dir, 'flat-first.csv'), `${lines.join('\n')}\n`);
    const { code, out } = await run(['fit', 'flat-first.csv']);
    expect(code).toBe(1);
    expect(out).toContain("every usable sample holds one value");
    expect(out).toContain("channel 'Node' of this capture varies: choose the channel to fit (--column)");
    const chosen = await run(['fit', 'flat-first.csv', '--column', 'Node']);
    expect(chosen.code).toBe(0);
  });
});

describe('a side channel whose unit cannot be read', () => {
  it("fit: exit 2 naming it and the channel to choose; with --column the other channel is fitted, the side one noted", async () => {
    const source = readFileSync(path.join(dir, ring), 'utf8').trimEnd().split('\n');
    const lines = source.map((line, i) => (i === 0 ? 'Time (s),Temp (degC),Node (V)' : line.replace(',', ',24.5,')));
    writeFileSync(path.join(dir, 'with-temperature.csv'), `${lines.join('\n')}\n`);
    const refused = await run(['fit', 'with-temperature.csv']);
    expect(refused.code).toBe(2);
    expect(refused.err).toBe(
      "ringbench: with-temperature.csv: line 1: column 'Temp (degC)': unit 'degC' is not recognised; state the channel's unit with --value-unit, or choose another channel with --column ('Node')\n",
    );
    const chosen = await run(['fit', 'with-temperature.csv', '--column', 'Node']);
    expect(chosen.code).toBe(0);
    expect(chosen.out).toContain("column 'Temp (degC)': unit 'degC' is not recognised");
  });
});
