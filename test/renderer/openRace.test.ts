// Two captures opened one after the other: the newer open wins (shown, remembered, listed first) however long the older
// one takes to read, with the file reader held back by the test.

import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { ActionContext } from '../../renderer/actions/context';
import type { OpenedFile } from '../../renderer/bridgeTypes';
import { FakeIndexedDb, fakeLocalStorage } from './fakeIndexedDb';

type Capture = typeof import('../../renderer/actions/capture');
type Memory = typeof import('../../renderer/captureMemory');

let capture: Capture;
let memory: Memory;

beforeEach(async () => {
  vi.stubGlobal('indexedDB', new FakeIndexedDb().factory);
  vi.stubGlobal('localStorage', fakeLocalStorage());
  vi.resetModules();
  capture = await import('../../renderer/actions/capture');
  memory = await import('../../renderer/captureMemory');
});

afterEach(() => vi.unstubAllGlobals());

/** A file reader the test lets finish, file by file. */
function heldReader() {
  const held = new Map<string, (opened: OpenedFile) => void>();
  return {
    read: (file: File) => new Promise<OpenedFile>((resolve) => held.set(file.name, resolve)),
    finish: (name: string) => held.get(name)?.({ name, path: null, sampleId: null, text: `t,v # ${name}\n0,1\n1,0\n` }),
  };
}

async function context(reader: ReturnType<typeof heldReader>): Promise<ActionContext> {
  const { createStore } = await import('../../renderer/store');
  const { initialState } = await import('../../renderer/benchState');
  // The class the freshly imported actions check against.
  const { FitCancelled } = await import('../../renderer/fitClient');
  const client = {
    busy: false,
    cancelAll: () => undefined,
    // Read at once; the trace and the fit are not this test's business.
    request: (ask: { type: string }) => {
      if (ask.type !== 'open') return Promise.reject(new FitCancelled());
      return Promise.resolve({ type: 'open', info: { channels: [{ name: 'v' }] }, refusal: null });
    },
  };
  return {
    store: createStore(initialState('browser'), (run) => run()),
    bridge: { openDropped: reader.read, pickCapture: () => Promise.resolve(null) },
    client,
    plot: { clear: () => undefined },
    page: { showCaptureName: () => undefined },
    counters: { running: 0, fitGeneration: 0, captures: 0 },
    opens: { started: 0, shown: 0, running: new Set<number>() },
  } as unknown as ActionContext;
}

describe('opening captures in quick succession', () => {
  it('shows, remembers and lists the newest open, even when an older one finishes reading last', async () => {
    const reader = heldReader();
    const ctx = await context(reader);
    const first = capture.openDropped(ctx, new File([''], 'first.csv'));
    reader.finish('first.csv');
    await first;
    const large = capture.openDropped(ctx, new File([''], 'large.csv'));
    const small = capture.openDropped(ctx, new File([''], 'small.csv'));
    reader.finish('small.csv');
    await small;
    expect(ctx.store.state.capture?.opened.name).toBe('small.csv');
    reader.finish('large.csv');
    await large;
    expect(ctx.store.state.capture?.opened.name).toBe('small.csv');
    expect(ctx.store.state.error).toBeNull();
    const last = await memory.recallCapture();
    expect(last?.kind === 'file' ? last.name : null).toBe('small.csv');
    expect(memory.recentCaptures().map((e) => e.name)).toEqual(['small.csv', 'first.csv']);
  });

  it('still shows an older open when a newer one ends showing nothing (a dismissed dialog)', async () => {
    const reader = heldReader();
    const ctx = await context(reader);
    const large = capture.openDropped(ctx, new File([''], 'large.csv'));
    await capture.pickCapture(ctx);
    reader.finish('large.csv');
    await large;
    expect(ctx.store.state.capture?.opened.name).toBe('large.csv');
    expect(memory.recentCaptures().map((e) => e.name)).toEqual(['large.csv']);
  });
});
