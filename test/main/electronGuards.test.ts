// The window's IPC surface: the one channel list, the argument guards, the preload built from the
// list, and the main-side registration that checks the sender and every argument before any handler runs.

import { beforeEach, describe, expect, it, vi } from 'vitest';
import { BENCH_METHODS, MENU_COMMANDS, type BenchApi } from '../../core/bench/benchApiTypes';
import { API_METHODS, type ApiMethod } from '../../main/api/apiMethods';
import { CHANNELS, EVENTS, EXPOSED_NAME } from '../../main/electron/channels';
import { argumentProblem, isAbsolutePath, isApiMethod, isBenchLogRequest, isResourceId, isSafeFileName, isSaveRequest } from '../../main/api/guards';
import { createApiDispatch } from '../../main/api/dispatch';
import { BenchApiError } from '../../main/api/apiError';
import { registerIpcHandlers } from '../../main/electron/ipcHandlers';
import { sampleTransitions } from '../fixtures/benchLog/sampleRecord';
import { BENCH_CALLS, MENU_COMMANDS as RENDERER_MENU_COMMANDS, type BenchCalls } from '../../renderer/bridgeTypes';

const electron = vi.hoisted(() => {
  // The page's window, where the preload listens for the page going (vitest runs without a DOM).
  Object.assign(globalThis, { addEventListener: () => undefined });
  return {
    exposed: {} as Record<string, unknown>,
    invoke: vi.fn(async (..._args: unknown[]) => ({ ok: true, value: 'answer' })),
    on: vi.fn(),
    getPathForFile: vi.fn((_file: unknown) => '/home/bench/captures/ring.csv'),
  };
});

vi.mock('electron', () => ({
  contextBridge: { exposeInMainWorld: (name: string, api: unknown) => (electron.exposed[name] = api) },
  ipcRenderer: { invoke: electron.invoke, on: electron.on },
  webUtils: { getPathForFile: electron.getPathForFile },
}));

/** A request the window would send for a fitted sample (the shape the guards must accept). */
function goodLogRequest(): Record<string, unknown> {
  const q = (value: number, unit: string) => ({ value, stderr: value / 1000, unit });
  return {
    unit: 'SN-0042',
    operator: 'A. Tester',
    note: null,
    capture: { path: '/home/bench/ring.csv', sha256: 'a'.repeat(64), bytes: 1234, channel: 'CH1' },
    settings: { topology: 'series', known: 'C=47u', column: 'CH1', sampleInterval: null, from: null, to: null, sortTime: false },
    fit: {
      file: 'ring.csv',
      channel: 'CH1',
      status: 'converged',
      message: 'ok',
      regime: 'underdamped',
      regimeEvidence: 'zeta < 1',
      alpha: q(1.1e4, 's^-1'),
      omega0: q(5.6e4, 'rad/s'),
      zeta: q(0.197, ''),
      Q: q(2.54, ''),
      finalValue: q(48, 'V'),
      t0: q(-1e-6, 's'),
      rmsResidual: 0.3,
      noiseRms: 0.4,
      samplesUsed: 2500,
      window: { start: -1e-4, end: 9e-4 },
      decimation: null,
      correlation: null,
      warnings: [],
    },
    verdict: null,
    design: null,
    cautions: { fired: [], energies: {} },
  };
}

describe('the channel list', () => {
  it('gives every call its own channel, named by what it serves', () => {
    const channels = Object.values(CHANNELS);
    expect(new Set(channels).size).toBe(channels.length);
    for (const [method, channel] of Object.entries(CHANNELS)) {
      expect(channel).toMatch(BENCH_METHODS.includes(method as never) ? /^bench:[a-z-]+$/ : /^shell:[a-z-]+$/);
    }
    expect(Object.values(EVENTS).every((e) => e.startsWith('event:'))).toBe(true);
  });

  it('has a guard for every method, and the renderer mirrors the bench calls and menu commands', () => {
    expect(Object.keys(CHANNELS)).toEqual([...API_METHODS]);
    for (const method of Object.keys(CHANNELS) as ApiMethod[]) expect(() => argumentProblem(method, [])).not.toThrow();
    expect([...BENCH_CALLS].sort()).toEqual([...BENCH_METHODS].sort());
    expect([...RENDERER_MENU_COMMANDS]).toEqual([...MENU_COMMANDS]);
    // Compile-time: the window's view of the API and main's are the same (tsc -p test checks this line).
    const sameShape: BenchCalls = {} as BenchApi;
    const reverse: BenchApi = {} as BenchCalls;
    expect([sameShape, reverse]).toHaveLength(2);
  });

  it.each([
    ['listSamples', true],
    ['saveFileDialog', true],
    ['constructor', false],
    ['__proto__', false],
    ['toString', false],
    [42, false],
  ])('isApiMethod(%s) is %s', (name, expected) => {
    expect(isApiMethod(name)).toBe(expected);
  });
});

describe('argument guards', () => {
  it.each([
    ['input-filter-step', true],
    ['switch-node-after-470p', true],
    ['a.b_c-1', true],
    ['../package', false],
    ['..', false],
    ['a/b', false],
    ['a\\b', false],
    ['', false],
    ['.hidden', false],
    ['x'.repeat(101), false],
    [7, false],
    [null, false],
  ])('resource id #%#: %s', (id, expected) => {
    expect(isResourceId(id)).toBe(expected);
  });

  it.each([
    ['/home/bench/ring.csv', true],
    ['relative/ring.csv', false],
    ['/home/bench/ring\0.csv', false],
    ['', false],
    [`/${'a'.repeat(5000)}`, false],
    [{ path: '/x' }, false],
  ])('absolute path #%#: %s', (path, expected) => {
    expect(isAbsolutePath(path)).toBe(expected);
  });

  it.each([
    ['bench-report.html', true],
    ['ring fit.png', true],
    ['../evil.sh', false],
    ['a/b.txt', false],
    ['C:\\x.txt', false],
    ['.bashrc', false],
    ['con\u0007.txt', false],
    ['', false],
  ])('file name %j: %s', (name, expected) => {
    expect(isSafeFileName(name)).toBe(expected);
  });

  it('checks a save request field by field', () => {
    expect(isSaveRequest({ suggestedName: 'r.md', content: '# r', encoding: 'utf8' })).toBe(true);
    expect(isSaveRequest({ suggestedName: 'p.png', content: 'iVBORw0KGgo=', encoding: 'base64' })).toBe(true);
    expect(isSaveRequest({ suggestedName: 'p.png', content: 'not base64!', encoding: 'base64' })).toBe(false);
    expect(isSaveRequest({ suggestedName: 'r.md', content: '# r', encoding: 'latin1' })).toBe(false);
    expect(isSaveRequest({ suggestedName: 'r.md', content: '# r', encoding: 'utf8', path: '/etc/passwd' })).toBe(false);
    expect(isSaveRequest({ suggestedName: '/etc/passwd', content: '', encoding: 'utf8' })).toBe(false);
  });

  it('accepts a complete bench log request', () => {
    expect(isBenchLogRequest(goodLogRequest())).toBe(true);
  });

  it('accepts the optional rows of the result table: omega_d, and R, L, C with components', () => {
    const request = goodLogRequest();
    const q = (value: number, unit: string) => ({ value, stderr: null, unit });
    Object.assign(request.fit as Record<string, unknown>, {
      omegaD: q(5.5e4, 'rad/s'),
      components: { topology: 'series', known: 'C=47u', R: q(0.8, 'ohm'), L: q(6.8e-6, 'H'), C: q(47e-6, 'F') },
    });
    expect(isBenchLogRequest(request)).toBe(true);
    (request.fit as Record<string, unknown>).transitions = sampleTransitions();
    expect(isBenchLogRequest(request)).toBe(true);
  });

  it.each([
    ['an empty unit', (r: Record<string, unknown>) => (r.unit = '  '), /unit/],
    ['an unknown field', (r: Record<string, unknown>) => (r.path = '/etc/passwd'), /unknown field "path"/],
    ['a short sha256', (r: Record<string, unknown>) => ((r.capture as Record<string, unknown>).sha256 = 'abc'), /capture/],
    ['a bad status', (r: Record<string, unknown>) => ((r.fit as Record<string, unknown>).status = 'great'), /fit: status/],
    ['alpha without a unit', (r: Record<string, unknown>) => ((r.fit as Record<string, unknown>).alpha = { value: 1, stderr: null }), /fit: alpha/],
    ['no zeta', (r: Record<string, unknown>) => delete (r.fit as Record<string, unknown>).zeta, /fit: zeta must be a quantity/],
    ['omega_d as text', (r: Record<string, unknown>) => ((r.fit as Record<string, unknown>).omegaD = '55 krad/s'), /fit: omegaD must be a quantity/],
    ['components without a quantity R', (r: Record<string, unknown>) => ((r.fit as Record<string, unknown>).components = { topology: 'series', known: 'C=47u', R: 0.8 }), /fit: components\.R must be a quantity/],
    ['a transition metric as text', (r: Record<string, unknown>) => ((r.fit as Record<string, unknown>).transitions = { ...sampleTransitions(), model: { ...sampleTransitions().model, riseTime: '5 ns' } }), /fit: transitions\.model\.riseTime must be a quantity or null/],
    ['settings without sortTime', (r: Record<string, unknown>) => delete (r.settings as Record<string, unknown>).sortTime, /settings/],
    ['a verdict of the wrong shape', (r: Record<string, unknown>) => (r.verdict = { pass: 'yes' }), /verdict/],
    ['cautions without the list', (r: Record<string, unknown>) => (r.cautions = {}), /cautions/],
    ['an overlong note', (r: Record<string, unknown>) => (r.note = 'x'.repeat(3000)), /note/],
  ])('refuses a log request with %s, naming the field', (_name, spoil, message) => {
    const request = goodLogRequest();
    spoil(request);
    expect(argumentProblem('appendBenchLog', [request])).toMatch(message);
  });

  it('counts the arguments and names the method and argument', () => {
    expect(argumentProblem('listSamples', [])).toBeNull();
    expect(argumentProblem('listSamples', ['extra'])).toBe('listSamples: takes 0 arguments, got 1');
    expect(argumentProblem('readSample', [])).toBe('readSample: takes 1 argument, got 0');
    expect(argumentProblem('readSample', ['../../etc/passwd'])).toMatch(/^readSample: argument 1: the sample id/);
    expect(argumentProblem('renderReport', ['pdf'])).toMatch(/^renderReport: argument 1:/);
    expect(argumentProblem('openDroppedPath', ['ring.csv'])).toMatch(/absolute path/);
  });
});

describe('dispatch in main', () => {
  it('runs no handler when an argument is refused, and wraps failures as plain results', async () => {
    const readSample = vi.fn(async (id: string) => ({ id }));
    const failing = vi.fn(async () => {
      throw new BenchApiError("no sample capture 'x'");
    });
    const dispatch = createApiDispatch({ readSample, listDesigns: failing });
    expect(await dispatch('readSample', ['../secret'])).toMatchObject({ ok: false, code: 'bad-argument' });
    expect(readSample).not.toHaveBeenCalled();
    expect(await dispatch('readSample', ['input-filter-step'])).toEqual({ ok: true, value: { id: 'input-filter-step' } });
    expect(await dispatch('listDesigns', [])).toEqual({ ok: false, error: "no sample capture 'x'", code: 'failed' });
    expect(await dispatch('openCaptureDialog', [])).toMatchObject({ ok: false, code: 'unknown-method' });
    const crash = createApiDispatch({ listSamples: async () => JSON.parse('{') });
    const result = await crash('listSamples', []);
    expect(result.ok).toBe(false);
    expect(JSON.stringify(result)).not.toMatch(/at .*\.ts:\d+/);
  });

  it('registers every channel and answers only our own page', async () => {
    const handlers = new Map<string, (event: unknown, ...args: unknown[]) => Promise<unknown>>();
    const ipc = { handle: (channel: string, handler: (event: unknown, ...args: unknown[]) => Promise<unknown>) => void handlers.set(channel, handler) };
    const listSamples = vi.fn(async () => ['one']);
    const readSample = vi.fn(async () => 'read');
    registerIpcHandlers(ipc as never, createApiDispatch({ listSamples, readSample }), (event) => (event as unknown as { url: string }).url.startsWith('bench://app/'));
    expect([...handlers.keys()].sort()).toEqual(Object.values(CHANNELS).sort());
    const ours = { url: 'bench://app/index.html' };
    const foreign = { url: 'https://example.com/' };
    expect(await handlers.get(CHANNELS.listSamples)!(foreign)).toMatchObject({ ok: false });
    expect(listSamples).not.toHaveBeenCalled();
    expect(await handlers.get(CHANNELS.listSamples)!(ours)).toEqual({ ok: true, value: ['one'] });
    expect(await handlers.get(CHANNELS.readSample)!(ours, { toString: () => 'x' })).toMatchObject({ ok: false, code: 'bad-argument' });
    expect(readSample).not.toHaveBeenCalled();
  });
});

describe('the preload', () => {
  beforeEach(() => {
    electron.invoke.mockClear();
    electron.on.mockClear();
  });

  it('exposes one object built from the channel list', async () => {
    await import('../../main/electron/preload');
    const api = electron.exposed[EXPOSED_NAME] as Record<string, (...args: unknown[]) => Promise<unknown>>;
    const expected = [...Object.keys(CHANNELS).filter((m) => m !== 'openDroppedPath'), 'openDroppedFile', 'onMenuCommand', 'onCaptureOpened'];
    expect(Object.keys(api).sort()).toEqual(expected.sort());
    for (const method of Object.keys(CHANNELS) as ApiMethod[]) {
      if (method === 'openDroppedPath') continue;
      electron.invoke.mockClear();
      await api[method]('argument');
      expect(electron.invoke).toHaveBeenCalledWith(CHANNELS[method], 'argument');
    }
  });

  it('takes a dropped file’s path from the File itself, never from the page', async () => {
    await import('../../main/electron/preload');
    const api = electron.exposed[EXPOSED_NAME] as Record<string, (...args: unknown[]) => Promise<unknown>>;
    await api.openDroppedFile({ name: 'ring.csv' });
    expect(electron.invoke).toHaveBeenCalledWith(CHANNELS.openDroppedPath, '/home/bench/captures/ring.csv');
    electron.getPathForFile.mockReturnValueOnce('');
    expect(await api.openDroppedFile({ name: 'made-up.csv' })).toMatchObject({ ok: false });
    electron.getPathForFile.mockImplementationOnce(() => {
      throw new TypeError('not a File');
    });
    expect(await api.openDroppedFile('/etc/passwd')).toMatchObject({ ok: false });
    expect(electron.invoke).toHaveBeenCalledTimes(1);
  });

  it('passes on only known menu commands', async () => {
    await import('../../main/electron/preload');
    const api = electron.exposed[EXPOSED_NAME] as { onMenuCommand(listener: (command: string) => void): void };
    const heard: string[] = [];
    api.onMenuCommand((command) => heard.push(command));
    const [channel, relay] = electron.on.mock.calls[0] as [string, (event: unknown, command: unknown) => void];
    expect(channel).toBe(EVENTS.menuCommand);
    relay({}, 'toggle-theme');
    relay({}, 'format-disk');
    expect(heard).toEqual(['toggle-theme']);
  });
});
