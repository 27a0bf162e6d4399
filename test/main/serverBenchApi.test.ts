// The bench API behind the local server, end to end over HTTP: samples, designs, the bench log and reports.

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, mkdirSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { startBenchServer, type RunningBenchServer } from '../../main/server/benchServer';
import { createApiDispatch } from '../../main/api/dispatch';
import { createBenchApi } from '../../main/api/benchApi';
import { measureFile } from '../../main/app/measureFile';
import type { FitSummary } from '../../core/report/fitSummary';
import { evaluateCautions } from '../../core/safety/evaluateCautions';
import type { BenchLogRequest } from '../../core/bench/benchApiTypes';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
const sampleFile = join(root, 'sample-captures', 'input-filter-step.csv');
let server: RunningBenchServer;
let folder: string;
let logPath: string;
let summary: FitSummary;

async function call(method: string, ...args: unknown[]): Promise<{ status: number; body: { ok: boolean; value?: any; error?: string; code?: string } }> {
  const response = await fetch(`${server.origin}/api/${method}`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-ringbench-token': server.token },
    body: JSON.stringify({ args }),
  });
  return { status: response.status, body: await response.json() };
}

beforeAll(async () => {
  // Fitted before the server starts: a long synchronous fit must not stall its idle connections.
  summary = measureFile(sampleFile, { topology: 'series', known: 'C=47u' }, root).summary;
  folder = mkdtempSync(join(tmpdir(), 'ringbench-api-'));
  mkdirSync(join(folder, 'renderer'));
  writeFileSync(join(folder, 'renderer', 'index.html'), '<!doctype html>');
  logPath = join(folder, 'bench-log.jsonl');
  const api = createBenchApi({ projectRoot: root, logPath, clock: () => new Date('2030-01-02T03:04:05Z') });
  server = await startBenchServer({ rendererDir: join(folder, 'renderer'), dispatch: createApiDispatch(api) });
});

afterAll(async () => {
  await server?.close();
  rmSync(folder, { recursive: true, force: true });
});

describe('samples and designs', () => {
  it('lists the manifest with channel, known part and designs', async () => {
    const { body } = await call('listSamples');
    expect(body.ok).toBe(true);
    const manifest = JSON.parse(readFileSync(join(root, 'sample-captures', 'manifest.json'), 'utf8')) as { captures: { file: string }[] };
    expect(body.value.map((s: { file: string }) => s.file)).toEqual(manifest.captures.map((c) => c.file));
    const gate = body.value.find((s: { id: string }) => s.id === 'gate-drive-turn-on');
    expect(gate.options).toMatchObject({ column: 'CH2', known: 'C=3.3n', topology: 'series' });
    expect(body.value.filter((s: { addedCapacitor: unknown }) => s.addedCapacitor !== null)).toHaveLength(3);
  });

  it('reads a sample with its design', async () => {
    const { body } = await call('readSample', 'input-filter-step');
    expect(body.ok).toBe(true);
    expect(body.value.text).toBe(readFileSync(sampleFile, 'utf8'));
    expect(body.value.path).toBe(sampleFile);
    if (body.value.sample.designId) expect(JSON.parse(body.value.design.text).format).toBe('ringbench-design');
  });

  it.each([
    ['../package', 400, 'bad-argument'],
    ['no-such-sample', 200, 'failed'],
  ])('refuses sample %s', async (id, status, code) => {
    const reply = await call('readSample', id);
    expect(reply.status).toBe(status);
    expect(reply.body).toMatchObject({ ok: false, code });
  });

  it('does not answer window-only calls over HTTP', async () => {
    const reply = await call('saveFileDialog', { suggestedName: 'x.txt', content: 'x', encoding: 'utf8' });
    expect(reply.status).toBe(404);
  });
});

describe('bench log and report', () => {
  it('starts empty and refuses a report of nothing', async () => {
    expect((await call('readBenchLog')).body).toEqual({ ok: true, value: { path: logPath, records: [], notes: [] } });
    const report = await call('renderReport', 'md');
    expect(report.body.ok).toBe(false);
    expect(report.body.error).toMatch(/no measurements yet/);
  });

  it('appends a measurement as the window sends it, and reports it', async () => {
    const { advice: _a, adviceSource: _s, deferral: _d, ...cautions } = evaluateCautions({ peakVoltage: 74, capacitance: 47e-6 });
    const bytes = readFileSync(sampleFile);
    const request: BenchLogRequest = {
      unit: 'FILTER-007',
      operator: 'bench test',
      note: '  ',
      capture: { path: sampleFile, sha256: createHash('sha256').update(bytes).digest('hex'), bytes: bytes.length, channel: summary.channel },
      settings: { topology: 'series', known: 'C=47u', column: 'CH1', sampleInterval: null, from: null, to: null, sortTime: false },
      fit: JSON.parse(JSON.stringify(summary)),
      verdict: null,
      design: null,
      cautions,
    };
    const added = await call('appendBenchLog', request);
    expect(added.body.ok).toBe(true);
    const [record] = added.body.value.records;
    expect(record).toMatchObject({ record: 'ringbench-measurement', unit: 'FILTER-007', operator: 'bench test', note: null, time: '2030-01-02T03:04:05.000Z' });
    expect(record.id).toMatch(/^[0-9a-f]{12}$/);
    expect(record.fit.alpha.value).toBe(summary.alpha.value);
    const lines = readFileSync(logPath, 'utf8').trim().split('\n');
    expect(lines).toHaveLength(1);

    const md = await call('renderReport', 'md');
    expect(md.body.ok).toBe(true);
    expect(md.body.value.name).toBe('bench-report.md');
    expect(md.body.value.text).toMatch(/FILTER\\?-007/); // the hyphen may come escaped for Markdown
    const html = await call('renderReport', 'html');
    expect(html.body.value.text).toMatch(/^<!doctype html>/i);
    expect(html.body.value.text).toContain('FILTER-007');
    expect(html.body.value.text).toContain('<svg');
  });

  it('refuses a malformed measurement before touching the log', async () => {
    const before = readFileSync(logPath, 'utf8');
    const reply = await call('appendBenchLog', { unit: 'X', fit: {} });
    expect(reply.status).toBe(400);
    expect(reply.body.error).toMatch(/^appendBenchLog: argument 1:/);
    expect(readFileSync(logPath, 'utf8')).toBe(before);
  });
});
