// Serves the browser bench: the bench API and the built renderer on loopback, until stopped.

import { spawn } from 'node:child_process';
import { createBenchApi } from '../api/benchApi';
import { createApiDispatch } from '../api/dispatch';
import { rendererDirOf } from '../io/projectPaths';
import { startBenchServer, type RunningBenchServer } from './benchServer';

export interface ServeOptions {
  projectRoot: string;
  logPath: string;
  port?: number;
  /** Open the address in the system's browser. */
  open: boolean;
}

export async function startServing(options: ServeOptions): Promise<RunningBenchServer> {
  const api = createBenchApi({ projectRoot: options.projectRoot, logPath: options.logPath });
  const server = await startBenchServer({ rendererDir: rendererDirOf(options.projectRoot), dispatch: createApiDispatch(api), port: options.port });
  if (options.open) openInBrowser(server.url);
  return server;
}

/** Resolves when the process is asked to stop (Ctrl+C, SIGTERM), after closing the server. */
export function serveUntilStopped(server: RunningBenchServer): Promise<void> {
  return new Promise((resolve) => {
    const stop = () => {
      process.off('SIGINT', stop);
      process.off('SIGTERM', stop);
      void server.close().then(resolve);
    };
    process.on('SIGINT', stop);
    process.on('SIGTERM', stop);
  });
}

/** Best effort: a missing opener only means the user copies the printed address. */
export function openInBrowser(url: string): void {
  const [command, args] =
    process.platform === 'darwin' ? ['open', [url]] : process.platform === 'win32' ? ['cmd', ['/c', 'start', '""', url]] : ['xdg-open', [url]];
  try {
    const child = spawn(command, args, { detached: true, stdio: 'ignore' });
    child.on('error', () => undefined);
    child.unref();
  } catch {
    // no opener on this system
  }
}
