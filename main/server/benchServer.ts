// The local bench server: loopback only, the built renderer as static files and the bench API under /api/.

import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import { createReadStream, statSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { checkRequest, isApiPath } from './requestChecks';
import { resolveStaticFile, staticFileHeaders } from '../web/staticFiles';
import { handleApiRequest, sendJson, type ApiDispatch } from './apiRoute';
import { SECURITY_HEADERS } from '../web/securityHeaders';
import { createToken } from './token';
import { UsageError } from '../../core/inputError';

export interface BenchServerOptions {
  /** Port to listen on; 0 (default) lets the system choose a free one. */
  port?: number;
  /** Folder of the built renderer (dist/renderer). */
  rendererDir: string;
  dispatch: ApiDispatch;
  /** Fixed token for tests; default a fresh random one. */
  token?: string;
}

export interface RunningBenchServer {
  port: number;
  token: string;
  /** http://127.0.0.1:PORT */
  origin: string;
  /** The address to open in a browser, token included. */
  url: string;
  close(): Promise<void>;
}

export const LOOPBACK = '127.0.0.1';

export async function startBenchServer(options: BenchServerOptions): Promise<RunningBenchServer> {
  const token = options.token ?? createToken();
  let port = 0;
  const server = createServer((request, response) => {
    handleRequest(request, response, port, token, options).catch(() => {
      if (!response.headersSent) sendJson(response, 500, { ok: false, error: 'the bench server could not answer' }, SECURITY_HEADERS);
      else response.destroy();
    });
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', (error) => reject(listenError(error, options.port ?? 0)));
    server.listen(options.port ?? 0, LOOPBACK, () => resolve());
  });
  port = (server.address() as AddressInfo).port;
  const origin = `http://${LOOPBACK}:${port}`;
  return {
    port,
    token,
    origin,
    url: `${origin}/?token=${token}`,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}

async function handleRequest(
  request: IncomingMessage,
  response: ServerResponse,
  port: number,
  token: string,
  options: BenchServerOptions,
): Promise<void> {
  const raw = request.url ?? '/';
  const queryAt = raw.indexOf('?');
  const pathname = queryAt < 0 ? raw : raw.slice(0, queryAt);
  const query = new URLSearchParams(queryAt < 0 ? '' : raw.slice(queryAt + 1));
  const verdict = checkRequest(request.headers, pathname, query, port, token);
  if (!verdict.allowed) return sendText(response, verdict.status, verdict.reason);
  if (isApiPath(pathname)) return handleApiRequest(request, response, pathname, options.dispatch, SECURITY_HEADERS);
  if (request.method !== 'GET' && request.method !== 'HEAD') return sendText(response, 405, 'only GET for files');
  const file = resolveStaticFile(options.rendererDir, pathname);
  if (file === null) return sendText(response, 404, 'not found');
  response.writeHead(200, { ...staticFileHeaders(file), 'Content-Length': statSync(file).size });
  if (request.method === 'HEAD') return void response.end();
  createReadStream(file).pipe(response);
}

/** A port that cannot be had is bad input (the --port the user chose), said in words; anything else stays as it is. */
function listenError(error: NodeJS.ErrnoException, port: number): Error {
  if (error.code === 'EADDRINUSE') return new UsageError(`port ${port} is in use; choose another with --port, or leave it out for any free port`);
  if (error.code === 'EACCES') return new UsageError(`port ${port} needs privileges this user does not have; choose one above 1023 with --port`);
  return error;
}

function sendText(response: ServerResponse, status: number, text: string): void {
  response.writeHead(status, { ...SECURITY_HEADERS, 'Content-Type': 'text/plain; charset=utf-8' });
  response.end(`${text}\n`);
}
