// Maps a request path to a file of the built renderer, refusing anything outside it, and the headers it is served with.

import { realpathSync, statSync } from 'node:fs';
import { extname, join, sep } from 'node:path';
import { SECURITY_HEADERS } from './securityHeaders';

const CONTENT_TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.map': 'application/json; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
};

/**
 * The file under `rootDir` that a raw request path names, or null (answered with 404).
 * Percent-decoding happens once here; '.' and '..' segments, dot files, empty segments, backslashes and NUL are refused
 * outright, and the real path must still lie inside the root (no symlink escapes).
 */
export function resolveStaticFile(rootDir: string, rawPathname: string): string | null {
  let decoded: string;
  try {
    decoded = decodeURIComponent(rawPathname);
  } catch {
    return null;
  }
  if (!decoded.startsWith('/') || decoded.includes('\0') || decoded.includes('\\')) return null;
  const segments = decoded === '/' ? ['index.html'] : decoded.slice(1).split('/');
  if (segments.some((segment) => segment === '' || segment.startsWith('.'))) return null;
  if (!(extname(segments[segments.length - 1]) in CONTENT_TYPES)) return null;
  try {
    const root = realpathSync(rootDir);
    const file = realpathSync(join(root, ...segments));
    if (!file.startsWith(root + sep) || !statSync(file).isFile()) return null;
    return file;
  } catch {
    return null;
  }
}

function contentTypeOf(file: string): string {
  return CONTENT_TYPES[extname(file)] ?? 'application/octet-stream';
}

/** The headers of a served renderer file, the same over HTTP and bench://: the security headers and its type. */
export function staticFileHeaders(file: string): Record<string, string> {
  return { ...SECURITY_HEADERS, 'Content-Type': contentTypeOf(file) };
}
