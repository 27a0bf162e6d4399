// The bench:// scheme that serves the built renderer to the window, with the same path checks and headers as the server.

import { protocol } from 'electron';
import { readFileSync } from 'node:fs';
import { resolveStaticFile, staticFileHeaders } from '../web/staticFiles';
import { SECURITY_HEADERS } from '../web/securityHeaders';

export const SCHEME = 'bench';
export const PAGE_ORIGIN = `${SCHEME}://app`;
export const PAGE_URL = `${PAGE_ORIGIN}/index.html`;

/** Must run before the app is ready. */
export function registerBenchScheme(): void {
  protocol.registerSchemesAsPrivileged([{ scheme: SCHEME, privileges: { standard: true, secure: true, supportFetchAPI: true } }]);
}

export function serveRenderer(rendererDir: string): void {
  protocol.handle(SCHEME, (request) => {
    const url = new URL(request.url);
    const file = url.host === 'app' ? resolveStaticFile(rendererDir, url.pathname) : null;
    if (file === null) return new Response('not found', { status: 404, headers: SECURITY_HEADERS });
    return new Response(readFileSync(file), { headers: staticFileHeaders(file) });
  });
}
