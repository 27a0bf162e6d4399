// The checks made on every request before any routing: Host, Origin and the API token.

import type { IncomingHttpHeaders } from 'node:http';
import { tokensMatch } from './token';

export const TOKEN_HEADER = 'x-ringbench-token';

/** Host header values that name this server: its loopback address or localhost, with its port. */
export function isOwnHost(host: string | undefined, port: number): boolean {
  if (host === undefined) return false;
  const value = host.trim().toLowerCase();
  return value === `127.0.0.1:${port}` || value === `localhost:${port}`;
}

/** An Origin header is allowed only when absent (same-origin GET) or this server's own. */
export function isOwnOrigin(origin: string | undefined, port: number): boolean {
  if (origin === undefined) return true;
  const value = origin.trim().toLowerCase();
  return value === `http://127.0.0.1:${port}` || value === `http://localhost:${port}`;
}

/** The token from the header, else from the query string, else null. */
export function tokenOf(headers: IncomingHttpHeaders, query: URLSearchParams): string | null {
  const header = headers[TOKEN_HEADER];
  if (typeof header === 'string') return header;
  return query.get('token');
}

export type RequestVerdict = { allowed: true } | { allowed: false; status: 401 | 403; reason: string };

/** Host and Origin first (they protect the static files too), then the token for /api/. */
export function checkRequest(
  headers: IncomingHttpHeaders,
  pathname: string,
  query: URLSearchParams,
  port: number,
  token: string,
): RequestVerdict {
  if (!isOwnHost(headers.host, port)) return { allowed: false, status: 403, reason: 'foreign Host header' };
  const origin = headers.origin;
  if (Array.isArray(origin) || !isOwnOrigin(origin, port)) return { allowed: false, status: 403, reason: 'foreign Origin header' };
  if (isApiPath(pathname) && !tokensMatch(token, tokenOf(headers, query))) {
    return { allowed: false, status: 401, reason: 'missing or wrong bench token' };
  }
  return { allowed: true };
}

export function isApiPath(pathname: string): boolean {
  return pathname === '/api' || pathname.startsWith('/api/');
}
