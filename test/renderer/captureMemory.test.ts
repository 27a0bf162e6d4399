// The window's capture memory: a file's content kept once for the last capture and the recent list, content neither
// refers to deleted, the previous layout read or dropped, and a broken IndexedDB costing one console warning.

import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { FakeIndexedDb, fakeLocalStorage } from './fakeIndexedDb';

type Memory = typeof import('../../renderer/captureMemory');

let idb: FakeIndexedDb;
let memory: Memory;

beforeEach(async () => {
  idb = new FakeIndexedDb();
  vi.stubGlobal('indexedDB', idb.factory);
  vi.stubGlobal('localStorage', fakeLocalStorage());
  vi.resetModules();
  memory = await import('../../renderer/captureMemory');
});

afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});

function file(n: number, channel = 0) {
  const sha256 = `sha-${n}`;
  return {
    capture: { kind: 'file' as const, name: `f${n}.csv`, path: null, channel, sha256, text: `t,v\n0,${n}\n` },
    entry: { id: sha256, name: `f${n}.csv`, sampleId: null, path: null, openedAt: new Date(Date.UTC(2026, 0, 1, 0, n)).toISOString() },
  };
}

const contents = () => idb.store('ringbench', 'contents');

describe('the capture memory', () => {
  it('keeps a file content once for the last capture and the recent list, and reopens it', async () => {
    const { capture, entry } = file(1);
    await memory.rememberCapture(capture, entry);
    expect([...contents().keys()]).toEqual(['sha-1']);
    const last = idb.store('ringbench', 'memory').get('last') as Record<string, unknown>;
    expect(last.text).toBeUndefined();
    // A channel chosen later rewrites the pointer only.
    await memory.rememberCapture({ ...capture, channel: 1 }, null);
    expect(contents().size).toBe(1);
    vi.resetModules();
    const fresh: Memory = await import('../../renderer/captureMemory');
    expect(fresh.recentCaptures()).toEqual([]);
    expect(await fresh.recallCapture()).toEqual({ ...capture, channel: 1, reading: undefined });
    expect(fresh.recentCaptures().map((e) => e.name)).toEqual(['f1.csv']);
    expect(await fresh.recallContent('sha-1')).toEqual({ text: capture.text });
    expect(idb.open).toBe(0);
  });

  it('deletes content that neither the last capture nor the recent list refers to', async () => {
    for (let n = 1; n <= memory.RECENT_KEPT + 2; n++) await memory.rememberCapture(file(n).capture, file(n).entry);
    const listed = memory.recentCaptures().map((e) => e.id);
    expect(listed).toHaveLength(memory.RECENT_KEPT);
    expect([...contents().keys()].sort()).toEqual([...listed].sort());
    // A sample opened last: the files listed stay, nothing else.
    const sample = { id: 'sha-sample', name: 's.csv', sampleId: 's', path: null, openedAt: new Date(Date.UTC(2026, 0, 2)).toISOString() };
    await memory.rememberCapture({ kind: 'sample', id: 's', channel: 0 }, sample);
    expect(contents().size).toBe(memory.RECENT_KEPT - 1);
    expect(memory.recentCaptures()[0].name).toBe('s.csv');
  });

  it('lists the recent captures newest first, whatever order their writes were asked in', async () => {
    const [a, b] = [file(2), file(1)];
    await Promise.all([memory.rememberCapture(a.capture, a.entry), memory.rememberCapture(b.capture, b.entry)]);
    expect(memory.recentCaptures().map((e) => e.name)).toEqual(['f2.csv', 'f1.csv']);
  });

  it('reopens a last capture of the previous layout and drops its recent list, never crashing on what it finds', async () => {
    const old = { kind: 'file', name: 'old.csv', path: null, channel: 1, text: 'old text' };
    idb.databases.set('ringbench', { version: 1, stores: new Map([['last-capture', new Map<IDBValidKey, unknown>([['last', old]])]]) });
    idb.databases.set('ringbench-recent', { version: 1, stores: new Map([['contents', new Map<IDBValidKey, unknown>([['sha-x', { text: 'x' }]])]]) });
    localStorage.setItem('ringbench.recent-captures', JSON.stringify([{ id: 'sha-x', name: 'x.csv', sampleId: null, path: null, openedAt: '2025' }]));
    const last = await memory.recallCapture();
    expect(last).toMatchObject({ kind: 'file', name: 'old.csv', channel: 1, text: 'old text' });
    expect(idb.databases.has('ringbench-recent')).toBe(false);
    expect(localStorage.getItem('ringbench.recent-captures')).toBeNull();
    expect(idb.databases.get('ringbench')?.stores.has('last-capture')).toBe(false);
    // Reopened, it is stored the new way.
    await memory.rememberCapture({ ...file(3).capture, text: 'old text' }, file(3).entry);
    expect(idb.store('ringbench', 'memory').get('last')).not.toHaveProperty('text');

    for (const broken of [42, { kind: 'file', name: 'n.csv', channel: 0 }, { kind: 'file', name: 'n.csv', channel: 0, sha256: 'gone' }, { kind: 'sample' }]) {
      idb.store('ringbench', 'memory').set('last', broken);
      idb.store('ringbench', 'memory').set('recent', [{ id: 1 }, 'x', null]);
      expect(await memory.recallCapture()).toBeNull();
      expect(memory.recentCaptures()).toEqual([]);
    }
  });

  it.each(['throws', 'quota'] as const)('goes on with one console warning when IndexedDB %s, and lists no file it could not keep', async (failure) => {
    const warn = vi.spyOn(console, 'warn').mockImplementation(() => undefined);
    idb.failure = failure;
    const { capture, entry } = file(1);
    await memory.rememberCapture(capture, entry);
    await memory.rememberCapture(file(2).capture, file(2).entry);
    expect(memory.recentCaptures()).toEqual([]);
    expect(await memory.recallCapture()).toBeNull();
    expect(warn).toHaveBeenCalledTimes(1);
  });

  it('gives up waiting on an IndexedDB that never answers, with one console warning', async () => {
    vi.useFakeTimers();
    const warn = vi.spyOn(console, 'warn').mockImplementation(() => undefined);
    idb.failure = 'silent';
    const remembered = memory.rememberCapture(file(1).capture, file(1).entry);
    const recalled = memory.recallCapture();
    await vi.advanceTimersByTimeAsync(3000);
    await expect(remembered).resolves.toBeUndefined();
    await expect(recalled).resolves.toBeNull();
    expect(warn).toHaveBeenCalledTimes(1);
    expect(warn.mock.calls[0][0]).toMatch(/no answer from the browser's storage/);
  });
});
