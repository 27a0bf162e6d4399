// The /api/ routes: POST /api/<method> with a JSON body { "args": [...] }, answered with an ApiResult.

import type { IncomingMessage, ServerResponse } from 'node:http';
import type { ApiResult } from '../../core/bench/benchApiTypes';

/** Runs one bench API call by name; validates the arguments itself. */
export type ApiDispatch = (method: string, args: unknown[]) => Promise<ApiResult<unknown>>;

/** Largest request body accepted, bytes (bench log entries and designs are small). */
export const MAX_BODY_BYTES = 4 * 1024 * 1024;

export async function handleApiRequest(
  request: IncomingMessage,
  response: ServerResponse,
  pathname: string,
  dispatch: ApiDispatch,
  headers: Record<string, string>,
): Promise<void> {
  const method = pathname.slice('/api/'.length);
  if (request.method !== 'POST') return sendJson(response, 405, fail('the bench API takes POST requests'), headers);
  if (!/^application\/json\b/i.test(request.headers['content-type'] ?? '')) {
    return sendJson(response, 415, fail('the bench API takes a JSON body'), headers);
  }
  const body = await readBody(request);
  if (body === null) return sendJson(response, 413, fail(`request body larger than ${MAX_BODY_BYTES} bytes`), headers);
  let args: unknown[];
  try {
    const parsed: unknown = body.length === 0 ? {} : JSON.parse(body);
    const given = (parsed as { args?: unknown }).args;
    if (given !== undefined && !Array.isArray(given)) throw new Error('args is not a list');
    args = (given as unknown[] | undefined) ?? [];
  } catch {
    return sendJson(response, 400, fail('request body is not {"args": [...]} JSON'), headers);
  }
  const result = await dispatch(method, args);
  sendJson(response, result.ok ? 200 : statusOf(result.code), result, headers);
}

function statusOf(code: string | undefined): number {
  if (code === 'unknown-method') return 404;
  if (code === 'bad-argument') return 400;
  return 200; // a failed bench operation is an answer, not a transport error
}

function fail(error: string): ApiResult<never> {
  return { ok: false, error };
}

function readBody(request: IncomingMessage): Promise<string | null> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    let tooLarge = false;
    request.on('data', (chunk: Buffer) => {
      size += chunk.length;
      if (size > MAX_BODY_BYTES) tooLarge = true;
      else chunks.push(chunk);
    });
    request.on('end', () => resolve(tooLarge ? null : Buffer.concat(chunks).toString('utf8')));
    request.on('error', reject);
  });
}

export function sendJson(response: ServerResponse, status: number, value: unknown, headers: Record<string, string>): void {
  const text = JSON.stringify(value);
  response.writeHead(status, { ...headers, 'Content-Type': 'application/json; charset=utf-8', 'Content-Length': Buffer.byteLength(text) });
  response.end(text);
}
