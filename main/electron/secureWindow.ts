// The bench window and its hardening: isolated sandboxed page, no navigation, no new windows,
// no permissions, nothing loaded from outside the bench:// scheme.

import { BrowserWindow, type Session, type WebContents } from 'electron';
import { PAGE_ORIGIN, PAGE_URL } from './rendererProtocol';

export function createBenchWindow(preloadPath: string, backgroundColor: string): BrowserWindow {
  const win = new BrowserWindow({
    width: 1440,
    height: 920,
    minWidth: 980,
    minHeight: 640,
    show: false,
    title: 'Ringbench',
    backgroundColor,
    webPreferences: {
      preload: preloadPath,
      contextIsolation: true,
      nodeIntegration: false,
      nodeIntegrationInWorker: false,
      sandbox: true,
      webSecurity: true,
      allowRunningInsecureContent: false,
      webviewTag: false,
      navigateOnDragDrop: false,
      spellcheck: false,
    },
  });
  win.once('ready-to-show', () => win.show());
  return win;
}

export function isBenchUrl(url: string): boolean {
  return url.startsWith(`${PAGE_ORIGIN}/`);
}

export function hardenContents(contents: WebContents): void {
  contents.on('will-navigate', (event, url) => {
    if (url !== PAGE_URL) event.preventDefault();
  });
  contents.on('will-redirect', (event) => event.preventDefault());
  contents.on('will-attach-webview', (event) => event.preventDefault());
  contents.setWindowOpenHandler(() => ({ action: 'deny' }));
}

export function hardenSession(session: Session): void {
  session.setPermissionRequestHandler((_contents, _permission, callback) => callback(false));
  session.setPermissionCheckHandler(() => false);
  session.on('will-download', (event) => event.preventDefault());
  // No remote content: only the bench page, its blobs and data URLs (plot export), and devtools.
  session.webRequest.onBeforeRequest((details, callback) => {
    const url = details.url;
    const local = isBenchUrl(url) || url.startsWith('blob:') || url.startsWith('data:') || url.startsWith('devtools:');
    callback({ cancel: !local });
  });
}
