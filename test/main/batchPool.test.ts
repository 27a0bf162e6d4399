// The batch's thread pool: every capture gets exactly one outcome, in any completion order, even when the worker
// holding it dies (an exit, an uncaught exception); a new worker takes the rest. Workers here are stand-ins.
import { Worker } from 'node:worker_threads';
import { describe, expect, it } from 'vitest';
import type { BatchOutcome, BatchSettings } from '../../main/app/batchFile';
import { measureBatch } from '../../main/app/batchPool';

/** Answers each capture with a stand-in outcome; 'exit.csv' ends its thread, 'throw.csv' throws out of the handler. */
const STAND_IN = `
const { parentPort } = require('node:worker_threads');
parentPort.on('message', ({ index, file }) => {
  if (file === 'exit.csv') process.exit(7);
  if (file === 'throw.csv') throw new Error('stand-in fault');
  parentPort.postMessage({ index, outcome: { file, failure: { input: true, text: 'answered ' + file } } });
});`;
const startStandIn = () => new Worker(STAND_IN, { eval: true });
const BATCH: BatchSettings = { settings: {}, cwd: '/', design: null, logging: null };

describe('measureBatch on workers (thread stand-ins)', () => {
  it('gives every capture one outcome; a dying worker fails only the capture it held', async () => {
    const files = ['a.csv', 'exit.csv', 'b.csv', 'c.csv', 'throw.csv', 'd.csv', 'e.csv', 'f.csv'];
    const seen: [number, BatchOutcome][] = [];
    await measureBatch(
      files.map((file) => ({ path: `/lot/${file}`, file })),
      BATCH,
      3,
      (index, outcome) => seen.push([index, outcome]),
      startStandIn,
    );
    expect(seen.map(([index]) => index).sort((x, y) => x - y)).toEqual(files.map((_, i) => i));
    const text = new Map(seen.map(([index, outcome]) => [files[index], 'failure' in outcome ? outcome.failure : null]));
    for (const file of ['a.csv', 'b.csv', 'c.csv', 'd.csv', 'e.csv', 'f.csv']) expect(text.get(file)).toEqual({ input: true, text: `answered ${file}` });
    expect(text.get('exit.csv')).toEqual({ input: false, text: 'the worker measuring it stopped: exit code 7' });
    expect(text.get('throw.csv')).toEqual({ input: false, text: 'the worker measuring it stopped: stand-in fault' });
  });

  it("ends with the handler's error when the handler throws", async () => {
    const files = ['a.csv', 'b.csv', 'c.csv'];
    const run = measureBatch(
      files.map((file) => ({ path: `/lot/${file}`, file })),
      BATCH,
      2,
      () => {
        throw new Error('log folder gone');
      },
      startStandIn,
    );
    await expect(run).rejects.toThrow('log folder gone');
  });
});
