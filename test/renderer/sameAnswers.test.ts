// The window's worker and the command line give the same answers: for every sample capture the same fit summary,
// known-part text and cautions; the same loop parasitics for the switch-node set; the same before/after comparison.

import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../main/cli/program';
import type { CliIo } from '../../main/cli/io';
import { handleWorkerRequest } from '../../renderer/workerHandlers';
import type { WorkerAsk, WorkerReplyValue } from '../../renderer/workerProtocol';
import { parseKnown, parseTopology } from '../../core/workflow/userValues';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const SAMPLES = path.join(ROOT, 'sample-captures');
const SWITCH_NODE = ['switch-node-before.csv', 'switch-node-after-470p.csv', 'switch-node-after-1n.csv'];

interface ManifestEntry {
  file: string;
  topology: string;
  channel: string;
  known: { option: string };
}
const manifest: { captures: ManifestEntry[] } = JSON.parse(readFileSync(path.join(SAMPLES, 'manifest.json'), 'utf8'));

/** The command line run in this process; its one line of JSON parsed. */
async function cliJson(args: string[]): Promise<unknown> {
  let out = '';
  let err = '';
  const io: CliIo = { out: (t) => (out += t), err: (t) => (err += t), cwd: ROOT, interactive: false };
  const code = await runCli(args, io);
  expect(err, `ringbench ${args.join(' ')}`).toBe('');
  expect(code).toBe(0);
  return JSON.parse(out);
}

/** The window's path: the worker's handler, answered as the window receives it. */
function ask<A extends WorkerAsk>(request: A): Extract<WorkerReplyValue, { type: A['type'] }> {
  const { value } = handleWorkerRequest(request, () => undefined);
  expect(value.type).toBe(request.type);
  return value as Extract<WorkerReplyValue, { type: A['type'] }>;
}

/** Both sides as JSON text reads them (no functions, no typed arrays, no undefined fields). */
const asJson = (value: unknown): unknown => JSON.parse(JSON.stringify(value));

const sampleText = (file: string) => ({ name: file, text: readFileSync(path.join(SAMPLES, file), 'utf8') });

describe('the window and the command line give the same answers', () => {
  for (const entry of manifest.captures) {
    it(`measures ${entry.file} (${entry.channel}, ${entry.topology}, ${entry.known.option}) as \`fit --json\` does`, async () => {
      const cli = await cliJson(['fit', path.join('sample-captures', entry.file), '--column', entry.channel, '--topology', entry.topology, '--known', entry.known.option, '--json']);
      const { name, text } = sampleText(entry.file);
      const captureId = `same-${entry.file}`;
      const opened = ask({ type: 'open', captureId, name, content: { text } });
      const channel = opened.info!.channels.findIndex((c) => c.name === entry.channel);
      expect(channel).toBeGreaterThanOrEqual(0);
      const knownPart = { topology: parseTopology(entry.topology), known: parseKnown(entry.known.option) };
      const { reply } = ask({ type: 'measure', captureId, channel, window: {}, knownPart });
      expect(reply.fitError).toBeNull();
      const window = asJson({ ...reply.result!.summary, setupChecks: reply.result!.setupChecks, cautions: reply.result!.cautions }) as Record<string, any>;
      expect(window.components.known).toBe((cli as Record<string, any>).components.known);
      expect(window.cautions).toEqual((cli as Record<string, any>).cautions);
      expect(window).toEqual(cli);
    });
  }

  it('extracts the switch-node parasitics as `parasitics --added C=470p,1n --json` does', async () => {
    const cli = await cliJson(['parasitics', ...SWITCH_NODE.map((f) => path.join('sample-captures', f)), '--added', 'C=470p,1n', '--added-tolerance', '0', '--json']);
    const added = [0, 470e-12, 1e-9];
    const { result } = ask({ type: 'parasitics', captures: SWITCH_NODE.map((f, i) => ({ ...sampleText(f), addedC: added[i] })), addedTolerance: 0 });
    expect(asJson(result)).toEqual(cli);
  });

  it('compares the switch node before and after 470 pF as `compare --json` does', async () => {
    const cli = await cliJson(['compare', 'sample-captures/switch-node-before.csv', 'sample-captures/switch-node-after-470p.csv', '--json']);
    const { comparison } = ask({ type: 'compare', before: sampleText('switch-node-before.csv'), after: sampleText('switch-node-after-470p.csv') });
    expect(asJson(comparison)).toEqual(cli);
  });
});
