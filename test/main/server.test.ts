// The local bench server's checks: token, Host, Origin and static paths, on a real loopback socket.

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { request } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startBenchServer, type RunningBenchServer } from '../../main/server/benchServer';
import type { ApiDispatch } from '../../main/server/apiRoute';

interface Reply {
  status: number;
  body: string;
  headers: Record<string, string | string[] | undefined>;
}

/** A raw request, so that Host and paths go out exactly as written (no URL normalisation). */
function send(port: number, path: string, options: { method?: string; headers?: Record<string, string>; body?: string } = {}): Promise<Reply> {
  return new Promise((resolve, reject) => {
    const req = request(
      { host: '127.0.0.1', port, path, method: options.method ?? 'GET', headers: { host: `127.0.0.1:${port}`, ...options.headers }, setHost: false },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, body: Buffer.concat(chunks).toString('utf8'), headers: res.headers }));
      },
    );
    req.on('error', reject);
    if (options.body !== undefined) req.write(options.body);
    req.end();
  });
}

let server: RunningBenchServer;
let root: string;
const calls: { method: string; args: unknown[] }[] = [];
const dispatch: ApiDispatch = async (method, args) => {
  calls.push({ method, args });
  if (method === 'listSamples') return { ok: true, value: ['one'] };
  return { ok: false, error: `unknown call ${method}`, code: 'unknown-method' };
};

beforeAll(async () => {
  root = mkdtempSync(join(tmpdir(), 'ringbench-server-'));
  mkdirSync(join(root, 'renderer'));
  writeFileSync(join(root, 'renderer', 'index.html'), '<!doctype html><title>bench</title>');
  writeFileSync(join(root, 'renderer', 'main.js'), 'console.log(1)');
  writeFileSync(join(root, 'renderer', '.hidden.js'), 'secret');
  writeFileSync(join(root, 'package.json'), '{"secret": true}');
  server = await startBenchServer({ rendererDir: join(root, 'renderer'), dispatch, port: 0 });
});

afterAll(async () => {
  await server?.close();
  rmSync(root, { recursive: true, force: true });
});

const json = { 'content-type': 'application/json' };

describe('bench server', () => {
  it('listens on loopback only and gives a token URL', () => {
    expect(server.origin).toBe(`http://127.0.0.1:${server.port}`);
    expect(server.url).toBe(`${server.origin}/?token=${server.token}`);
    expect(server.token.length).toBeGreaterThanOrEqual(40);
  });

  it('answers an API call with the token in the header or the query', async () => {
    const byHeader = await send(server.port, '/api/listSamples', { method: 'POST', headers: { ...json, 'x-ringbench-token': server.token }, body: '{"args":[]}' });
    expect(byHeader.status).toBe(200);
    expect(JSON.parse(byHeader.body)).toEqual({ ok: true, value: ['one'] });
    const byQuery = await send(server.port, `/api/listSamples?token=${server.token}`, { method: 'POST', headers: json, body: '{}' });
    expect(byQuery.status).toBe(200);
  });

  it.each([
    { name: 'no token', headers: {} as Record<string, string>, path: '/api/listSamples' },
    { name: 'a wrong token', headers: { 'x-ringbench-token': 'not-the-token' }, path: '/api/listSamples' },
    { name: 'a wrong token of the right length', headers: {}, path: '/api/listSamples?token=WRONG' },
    { name: 'no token, unknown route', headers: {}, path: '/api/../../etc/passwd' },
    { name: 'no token, bare /api', headers: {}, path: '/api' },
  ])('refuses an API request with $name: 401 before any routing', async ({ headers, path }) => {
    const before = calls.length;
    const wrongLength = path.replace('WRONG', 'x'.repeat(server.token.length));
    const reply = await send(server.port, wrongLength, { method: 'POST', headers: { ...json, ...headers }, body: '{}' });
    expect(reply.status).toBe(401);
    expect(calls.length).toBe(before);
  });

  it.each([
    { name: 'a foreign Origin', headers: { origin: 'http://evil.example' } },
    { name: 'an Origin on another port', headers: { origin: 'http://127.0.0.1:1' } },
    { name: 'the null Origin', headers: { origin: 'null' } },
  ])('refuses $name with 403, even with the token', async ({ headers }) => {
    const reply = await send(server.port, '/api/listSamples', { method: 'POST', headers: { ...json, 'x-ringbench-token': server.token, ...headers }, body: '{}' });
    expect(reply.status).toBe(403);
  });

  it('accepts its own Origin', async () => {
    const reply = await send(server.port, '/api/listSamples', {
      method: 'POST',
      headers: { ...json, 'x-ringbench-token': server.token, origin: server.origin },
      body: '{}',
    });
    expect(reply.status).toBe(200);
  });

  it.each(['evil.example', 'evil.example:80', '127.0.0.1', '127.0.0.1:1', '0.0.0.0:PORT', 'localhost.evil.example:PORT'])(
    'refuses a foreign Host %s with 403 (page and API)',
    async (host) => {
      const headers = { host: host.replace('PORT', String(server.port)) };
      expect((await send(server.port, '/', { headers })).status).toBe(403);
      const api = await send(server.port, '/api/listSamples', { method: 'POST', headers: { ...headers, ...json, 'x-ringbench-token': server.token }, body: '{}' });
      expect(api.status).toBe(403);
    },
  );

  it('serves the built page with a strict Content-Security-Policy', async () => {
    const reply = await send(server.port, '/');
    expect(reply.status).toBe(200);
    expect(reply.body).toContain('<title>bench</title>');
    expect(String(reply.headers['content-security-policy'])).toContain("script-src 'self'");
    expect(reply.headers['x-content-type-options']).toBe('nosniff');
    expect((await send(server.port, '/main.js?v=1')).status).toBe(200);
    expect((await send(server.port, `/?token=${server.token}`)).status).toBe(200);
  });

  it.each([
    '/../package.json',
    '/%2e%2e/package.json',
    '/%2E%2E/package.json',
    '/..%2fpackage.json',
    '/%2e%2e%2fpackage.json',
    '/.%2e/package.json',
    '/..\\package.json',
    '/%5c..%5cpackage.json',
    '/.hidden.js',
    '/main.js%00.html',
    '/%zz',
    '/package.json',
    '/index.html/',
    '/nothing-here.js',
    '//etc/passwd',
  ])('answers %s with 404', async (path) => {
    const reply = await send(server.port, path);
    expect(reply.status).toBe(404);
    expect(reply.body).not.toContain('secret');
  });

  it('takes API calls as POST with a JSON body only', async () => {
    const token = { 'x-ringbench-token': server.token };
    expect((await send(server.port, '/api/listSamples', { headers: token })).status).toBe(405);
    expect((await send(server.port, '/api/listSamples', { method: 'POST', headers: { ...token, 'content-type': 'text/plain' }, body: '{}' })).status).toBe(415);
    expect((await send(server.port, '/api/listSamples', { method: 'POST', headers: { ...token, ...json }, body: '{args' })).status).toBe(400);
    expect((await send(server.port, '/api/listSamples', { method: 'POST', headers: { ...token, ...json }, body: '{"args": 3}' })).status).toBe(400);
    const unknown = await send(server.port, '/api/deleteEverything', { method: 'POST', headers: { ...token, ...json }, body: '{}' });
    expect(unknown.status).toBe(404);
    expect(JSON.parse(unknown.body).ok).toBe(false);
  });

  it('passes the arguments through to the dispatcher', async () => {
    await send(server.port, '/api/listSamples', { method: 'POST', headers: { ...json, 'x-ringbench-token': server.token }, body: '{"args":["a",2]}' });
    expect(calls[calls.length - 1]).toEqual({ method: 'listSamples', args: ['a', 2] });
  });

  it('refuses files for methods other than GET and HEAD', async () => {
    expect((await send(server.port, '/index.html', { method: 'DELETE' })).status).toBe(405);
    expect((await send(server.port, '/index.html', { method: 'HEAD' })).status).toBe(200);
  });
});
