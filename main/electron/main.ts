// The Electron main process: one hardened window over the built renderer, the bench API over IPC,
// native menus, dialogs, recent captures.

import { app, BrowserWindow, ipcMain, Menu, session } from 'electron';
import { mkdirSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createBenchApi } from '../api/benchApi';
import { createApiDispatch } from '../api/dispatch';
import type { MenuCommand } from '../../core/bench/benchApiTypes';
import { EVENTS } from './channels';
import { GrantedPaths } from './grantedPaths';
import { readRecentCaptures, rememberCapture, saveRecentCaptures } from './recentCaptures';
import { createShellHandlers } from './shellHandlers';
import { registerIpcHandlers } from './ipcHandlers';
import { PAGE_URL, registerBenchScheme, serveRenderer } from './rendererProtocol';
import { createBenchWindow, hardenContents, hardenSession, isBenchUrl } from './secureWindow';
import { buildAppMenu } from './appMenu';
import { readCaptureFile } from './captureReader';

const here = dirname(fileURLToPath(import.meta.url));
/** dist/electron/main.js sits two folders below the application folder. */
const projectRoot = resolve(here, '..', '..');
const isMac = process.platform === 'darwin';

let win: BrowserWindow | null = null;
const granted = new GrantedPaths();
let recent: string[] = [];

function send(channel: string, payload: unknown): void {
  win?.webContents.send(channel, payload);
}

function refreshMenu(): void {
  Menu.setApplicationMenu(
    buildAppMenu(
      {
        recent,
        command: (command: MenuCommand) => send(EVENTS.menuCommand, command),
        openRecent: async (path) => {
          try {
            if (!granted.isGranted(path)) return;
            send(EVENTS.captureOpened, await readCaptureFile(path));
            noteOpened(path);
          } catch {
            recent = recent.filter((p) => p !== path);
            refreshMenu();
          }
        },
        clearRecent: () => {
          recent = saveRecentCaptures(app.getPath('userData'), []);
          app.clearRecentDocuments();
          refreshMenu();
        },
      },
      isMac,
    ),
  );
}

function noteOpened(path: string): void {
  recent = rememberCapture(app.getPath('userData'), recent, path);
  app.addRecentDocument(path);
  refreshMenu();
}

/** The bench in this process: the scheme, the window once Electron is ready, and the app's events. */
function startBench(): void {
  registerBenchScheme();
  void app.whenReady().then(openBench);
  app.on('second-instance', () => {
    if (win?.isMinimized()) win.restore();
    win?.focus();
  });
  app.on('window-all-closed', () => app.quit());
}

function openBench(): void {
  const userData = app.getPath('userData');
  mkdirSync(userData, { recursive: true });
  recent = readRecentCaptures(userData);
  // Captures opened in an earlier session were granted then.
  for (const path of recent) granted.grant(path);

  hardenSession(session.defaultSession);
  serveRenderer(join(projectRoot, 'dist', 'renderer'));
  app.on('web-contents-created', (_event, contents) => hardenContents(contents));

  const bench = createBenchApi({ projectRoot, logPath: join(userData, 'bench-log.jsonl'), mayReadCapture: (path) => granted.isGranted(path) });
  const shell = createShellHandlers({
    window: () => win,
    granted,
    documentsDir: app.getPath('documents'),
    onCaptureOpened: noteOpened,
  });
  registerIpcHandlers(ipcMain, createApiDispatch({ ...bench, ...shell }), (event) => event.senderFrame !== null && isBenchUrl(event.senderFrame.url));

  refreshMenu();
  win = createBenchWindow(join(here, 'preload.cjs'), '#f4f1ea');
  win.on('closed', () => (win = null));
  void win.loadURL(PAGE_URL);
}

// One bench per user: a second start hands over to the first (its 'second-instance') and ends. app.quit()
// only asks Electron to quit and returns, so nothing of the bench may be set up after it.
if (app.requestSingleInstanceLock()) startBench();
else app.quit();
