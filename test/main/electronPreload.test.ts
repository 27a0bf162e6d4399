// The preload between main and the page: only checked, plain data reaches the page, and its listeners on
// main's events go when the page goes.

import { beforeEach, describe, expect, it, vi } from 'vitest';
import { EVENTS, EXPOSED_NAME } from '../../main/electron/channels';

const electron = vi.hoisted(() => {
  const page = new EventTarget();
  // The page's window, where the preload listens for 'pagehide' (vitest runs without a DOM).
  Object.assign(globalThis, { addEventListener: page.addEventListener.bind(page) });
  return {
    page,
    exposed: {} as Record<string, unknown>,
    invoke: vi.fn(async (..._args: unknown[]): Promise<unknown> => ({ ok: true, value: 'answer' })),
    on: vi.fn(),
    removeListener: vi.fn(),
  };
});

vi.mock('electron', () => ({
  contextBridge: { exposeInMainWorld: (name: string, api: unknown) => (electron.exposed[name] = api) },
  ipcRenderer: { invoke: electron.invoke, on: electron.on, removeListener: electron.removeListener },
  webUtils: { getPathForFile: () => '/home/bench/ring.csv' },
}));

type Api = Record<string, (...args: unknown[]) => Promise<unknown>> & {
  onCaptureOpened(listener: (capture: unknown) => void): void;
  onMenuCommand(listener: (command: unknown) => void): void;
};

async function exposedApi(): Promise<Api> {
  await import('../../main/electron/preload');
  return electron.exposed[EXPOSED_NAME] as Api;
}

/** The relay the preload registered last on `channel`. */
function relayOn(channel: string): (event: unknown, payload: unknown) => void {
  const calls = electron.on.mock.calls.filter(([c]) => c === channel);
  return calls[calls.length - 1][1] as (event: unknown, payload: unknown) => void;
}

const bytes = new Uint8Array([0x74, 0x2c, 0x76, 0x0a]);
const good = { name: 'ring.csv', path: '/home/bench/ring.csv', sampleId: null, bytes };

beforeEach(() => {
  electron.invoke.mockClear();
  electron.removeListener.mockClear();
});

describe('a capture main opened', () => {
  it('reaches the page as a plain object of the four fields, and nothing else does', async () => {
    const api = await exposedApi();
    const heard: unknown[] = [];
    api.onCaptureOpened((capture) => heard.push(capture));
    const relay = relayOn(EVENTS.captureOpened);
    relay({}, { ...good, secret: '/etc/shadow' });
    for (const bad of [
      'ring.csv',
      null,
      [good],
      { ...good, bytes: Array.from(bytes) },
      { ...good, path: 'relative/ring.csv' },
      { ...good, path: '/home/bench/ring\0.csv' },
      { ...good, name: '' },
      { ...good, sampleId: 'input-filter-step' },
      Object.assign(Object.create({ inherited: true }), good),
    ]) {
      relay({}, bad);
    }
    expect(heard).toEqual([good]);
    expect(Object.keys(heard[0] as object).sort()).toEqual(['bytes', 'name', 'path', 'sampleId']);
  });
});

describe('call results', () => {
  it('pass on the two forms main answers in, and turn anything else into a failure', async () => {
    const api = await exposedApi();
    expect(await api.listSamples()).toEqual({ ok: true, value: 'answer' });
    electron.invoke.mockResolvedValueOnce({ ok: false, error: 'no sample', code: 'failed', stack: 'at main.ts:1' });
    expect(await api.listSamples()).toEqual({ ok: false, error: 'no sample', code: 'failed' });
    electron.invoke.mockResolvedValueOnce('<img src=x onerror=alert(1)>');
    expect(await api.listSamples()).toMatchObject({ ok: false, code: 'failed' });
    electron.invoke.mockResolvedValueOnce({ ok: 'yes', value: 1 });
    expect(await api.listSamples()).toMatchObject({ ok: false, code: 'failed' });
  });
});

describe('when the page goes', () => {
  it('removes every listener the preload added on main’s events', async () => {
    const api = await exposedApi();
    api.onMenuCommand(() => undefined);
    api.onCaptureOpened(() => undefined);
    const added = electron.on.mock.calls.map(([channel, relay]) => [channel, relay]);
    expect(added.length).toBeGreaterThanOrEqual(2);
    electron.page.dispatchEvent(new Event('pagehide'));
    expect(electron.removeListener.mock.calls).toEqual(added);
  });
});
