// The Electron main process at start: a second instance asks to quit and sets nothing up (app.quit() returns,
// so the code after it must not build the bench); the first registers its scheme and waits for Electron.

import { beforeEach, describe, expect, it, vi } from 'vitest';

const electron = vi.hoisted(() => ({
  lock: true,
  app: {
    requestSingleInstanceLock: vi.fn(() => electron.lock),
    quit: vi.fn(),
    // Never ready here: no window can open without a display.
    whenReady: vi.fn(() => new Promise<void>(() => undefined)),
    on: vi.fn(),
  },
  registerSchemesAsPrivileged: vi.fn(),
}));

vi.mock('electron', () => ({
  app: electron.app,
  protocol: { registerSchemesAsPrivileged: electron.registerSchemesAsPrivileged, handle: vi.fn() },
  BrowserWindow: vi.fn(),
  ipcMain: { handle: vi.fn() },
  Menu: { setApplicationMenu: vi.fn(), buildFromTemplate: vi.fn() },
  session: {},
  dialog: {},
}));

beforeEach(() => {
  vi.resetModules();
  vi.clearAllMocks();
});

describe('starting the main process', () => {
  it('as a second instance: quits, and registers nothing, waits for nothing', async () => {
    electron.lock = false;
    await import('../../main/electron/main');
    expect(electron.app.quit).toHaveBeenCalledTimes(1);
    expect(electron.app.whenReady).not.toHaveBeenCalled();
    expect(electron.app.on).not.toHaveBeenCalled();
    expect(electron.registerSchemesAsPrivileged).not.toHaveBeenCalled();
  });

  it('as the first: the scheme, the wait for Electron, and the app events; no quit', async () => {
    electron.lock = true;
    await import('../../main/electron/main');
    expect(electron.app.quit).not.toHaveBeenCalled();
    expect(electron.registerSchemesAsPrivileged).toHaveBeenCalledTimes(1);
    expect(electron.app.whenReady).toHaveBeenCalledTimes(1);
    expect(electron.app.on.mock.calls.map(([event]) => event).sort()).toEqual(['second-instance', 'window-all-closed']);
  });
});
