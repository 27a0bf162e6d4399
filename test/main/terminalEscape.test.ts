// What the command line prints when a capture's header, a file name or a log record carries control characters:
// escaped everywhere (fit text, import summary, JSON, errors, log list, batch table, commander's own messages).
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCliIn } from './cliHarness';
import { sampleRecord } from '../fixtures/benchLog/sampleRecord';

/** Clear the screen and home the cursor; set the terminal's title; an 8-bit CSI; right-to-left override. */
const CLEAR = '\u001b[2J\u001b[H';
const TITLE = '\u001b]0;owned\u0007';
const CSI8 = '\u009b31m';
const RLO = '\u202e';
/** Any character that acts on a terminal instead of showing; output may keep only line feeds and tabs. */
const ACTING = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/;

const dir = mkdtempSync(path.join(tmpdir(), 'ringbench-terminal-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A clean generated ringdown (10 MHz, a flat lead-in) under a header whose channel name is hostile. */
function ringText(channel: string): string {
  const lines = [`Time (s),${channel} (V)`];
  for (let i = 0; i < 400; i++) {
    const t = (i - 50) * 1e-8;
    lines.push(`${(i * 1e-8).toExponential(4)},${(i < 50 ? 0 : Math.exp(-t * 3e6) * Math.sin(2 * Math.PI * 1e7 * t)).toFixed(5)}`);
  }
  return `${lines.join('\n')}\n`;
}

const CHANNEL = `${TITLE}CH${RLO}1${CLEAR}${CSI8}`;
/** A file name a shell can make: escape sequences, a bidi override and a line feed that would forge an output line. */
const NAME = `ring${CLEAR}${RLO}\nstatus converged.csv`;
const folder = path.join(dir, 'captures');
mkdirSync(folder);
writeFileSync(path.join(folder, NAME), ringText(CHANNEL));

describe('control characters from a capture are shown escaped', () => {
  it('fit: the file and channel names in the text, the import summary, the cautions', async () => {
    const { code, out, err } = await runCliIn(folder, ['fit', NAME]);
    expect(err).toBe('');
    expect(code).toBe(0);
    expect(out).not.toMatch(ACTING);
    const lines = out.split('\n');
    expect(lines[0]).toBe('ring\\u001b[2J\\u001b[H\\u202e\\u000astatus converged.csv (\\u001b]0;owned\\u0007CH\\u202e1\\u001b[2J\\u001b[H\\u009b31m)');
    expect(out).toMatch(/channels +\\u001b\]0;owned\\u0007CH\\u202e1/);
    // The line feed in the name forged no line of its own.
    expect(lines.filter((l) => l.startsWith('status converged'))).toEqual([]);
  });

  it('fit --json: the escapes are JSON escapes, so the names read back exactly as written', async () => {
    const { code, out } = await runCliIn(folder, ['fit', NAME, '--json']);
    expect(code).toBe(0);
    expect(out).not.toMatch(ACTING);
    const parsed = JSON.parse(out) as { file: string; channel: string };
    expect(parsed.file).toBe(NAME);
    expect(parsed.channel).toBe(CHANNEL);
  });

  it('an error naming a hostile file stays one line, exit 2', async () => {
    const bad = `bad${TITLE}\n${RLO}.csv`;
    writeFileSync(path.join(dir, bad), `t,v\n0,${CLEAR}\n`);
    const { code, out, err } = await runCliIn(dir, ['fit', bad]);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).not.toMatch(ACTING);
    expect(err.trimEnd().split('\n')).toHaveLength(1);
    expect(err).toContain('bad\\u001b]0;owned\\u0007\\u000a\\u202e.csv');
  });

  it("commander's own message about an unknown option", async () => {
    const { code, err } = await runCliIn(folder, ['fit', NAME, `--bogus${TITLE}`]);
    expect(code).toBe(2);
    expect(err).not.toMatch(ACTING);
    expect(err).toContain("unknown option '--bogus\\u001b]0;owned\\u0007'");
  });

  it('batch: the table row of a hostile file name', async () => {
    const { out, err } = await runCliIn(folder, ['batch', '.', '--jobs', '1']);
    expect(err).not.toMatch(ACTING);
    expect(out).not.toMatch(ACTING);
    expect(out).toMatch(/^ring\\u001b\[2J\\u001b\[H\\u202e/m);
  });
});

describe('control characters in a bench log are shown escaped', () => {
  it('log list: a unit id that would clear the screen and reverse the line', async () => {
    const log = path.join(dir, 'hostile.jsonl');
    writeFileSync(log, `${JSON.stringify(sampleRecord({ unit: `SN${CLEAR}${RLO}42` }))}\n`);
    const { code, out, err } = await runCliIn(dir, ['log', 'list', '--log', log]);
    expect(err).toBe('');
    expect(code).toBe(0);
    expect(out).not.toMatch(ACTING);
    expect(out).toContain('SN\\u001b[2J\\u001b[H\\u202e42');
  });
});
