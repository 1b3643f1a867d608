/**
 * The preview's loopback HTTP transport: token guard, loopback-only binding, Host check, argument
 * validation and static serving. The service here is a small recording object (this file tests
 * the transport, not the service).
 */
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { request } from 'node:http';
import { connect } from 'node:net';
import { networkInterfaces, tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ProvisionApi } from '../../../app/api/contract';
import { ServiceError } from '../../../app/api/service-error';
import { type HttpTransport, SCREEN_CSP, startHttpTransport } from '../../../app/transport/http';

const calls: { method: string; args: unknown[] }[] = [];

function recordingService(): ProvisionApi {
  return new Proxy({} as ProvisionApi, {
    get(_t, method: string) {
      return async (...args: unknown[]) => {
        calls.push({ method, args });
        if (method === 'getItem' && args[0] === 'NOPE') throw new ServiceError("unknown SKU 'NOPE'");
        if (method === 'listItems') return [{ sku: 'FL-001' }];
        return { method, args };
      };
    },
  });
}

function send(
  t: HttpTransport,
  path: string,
  opts: { method?: string; token?: string | null; body?: string; host?: string } = {},
): Promise<{ status: number; body: string; headers: Record<string, unknown> }> {
  return new Promise((ok, ko) => {
    const headers: Record<string, string> = { 'content-type': 'application/json' };
    if (opts.token) headers['x-provision-token'] = opts.token;
    if (opts.host) headers.host = opts.host;
    const req = request(
      { host: '127.0.0.1', port: t.port, path, method: opts.method ?? 'POST', headers },
      (res) => {
        let body = '';
        res.on('data', (c) => {
          body += c;
        });
        res.on('end', () => ok({ status: res.statusCode ?? 0, body, headers: res.headers }));
      },
    );
    req.on('error', ko);
    req.end(opts.body);
  });
}

let t: HttpTransport;
let staticDir: string;

beforeAll(async () => {
  staticDir = mkdtempSync(join(tmpdir(), 'provision-static-'));
  writeFileSync(join(staticDir, 'index.html'), '<!doctype html><title>x</title>');
  mkdirSync(join(staticDir, 'assets'));
  writeFileSync(join(staticDir, 'assets', 'a.js'), 'console.log(1)');
  t = await startHttpTransport({ service: recordingService(), staticDir });
});

afterAll(async () => {
  await t.close();
});

describe('preview HTTP transport', () => {
  it('prints an address on 127.0.0.1 with a long random token that opens the items overview', () => {
    expect(t.openUrl).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/\?token=[A-Za-z0-9_-]{32}#\/items$/);
    expect(t.token.length).toBe(32); // 24 random bytes in base64url
  });

  it('answers 401 to every /api/ request without the right token, and never calls the service', async () => {
    const before = calls.length;
    for (const token of [null, '', 'wrong', `${t.token}x`, t.token.slice(1)]) {
      expect((await send(t, '/api/listItems', { token, body: '[]' })).status).toBe(401);
      expect((await send(t, '/api/listItems', { token, method: 'GET' })).status).toBe(401);
    }
    expect((await send(t, '/api/', { method: 'GET' })).status).toBe(401);
    expect((await send(t, '/api/nothing/at/all', { method: 'DELETE' })).status).toBe(401);
    expect(calls.length).toBe(before);
  });

  it('carries a call with the token to the service and returns its answer', async () => {
    const r = await send(t, '/api/listItems', { token: t.token, body: '[]' });
    expect(r.status).toBe(200);
    expect(JSON.parse(r.body)).toEqual({ result: [{ sku: 'FL-001' }] });
  });

  it('refuses unknown methods and malformed arguments with 400 and a message naming them', async () => {
    const unknown = await send(t, '/api/dropAllTables', { token: t.token, body: '[]' });
    expect(unknown.status).toBe(400);
    expect(JSON.parse(unknown.body).error).toContain('unknown method');
    const bad = await send(t, '/api/setOrderQty', { token: t.token, body: '["FL-001", -5, "typo"]' });
    expect(bad.status).toBe(400);
    expect(JSON.parse(bad.body).error).toContain('setOrderQty: qty must be between 0');
    const notJson = await send(t, '/api/listItems', { token: t.token, body: '{' });
    expect(notJson.status).toBe(400);
    const planner = await send(t, '/api/getItem', { token: t.token, body: '["NOPE"]' });
    expect(planner.status).toBe(400);
    expect(JSON.parse(planner.body).error).toBe("unknown SKU 'NOPE'");
  });

  it('listens on 127.0.0.1 only', async () => {
    const addr = t.server.address();
    expect(addr && typeof addr === 'object' && addr.address).toBe('127.0.0.1');
    const others = Object.values(networkInterfaces())
      .flat()
      .filter((i) => i && i.family === 'IPv4' && !i.internal)
      .map((i) => i?.address as string);
    for (const host of others) {
      const refused = await new Promise<boolean>((ok) => {
        const s = connect({ host, port: t.port });
        s.on('connect', () => {
          s.destroy();
          ok(false);
        });
        s.on('error', () => ok(true));
      });
      expect(refused, `${host}:${t.port} must not accept connections`).toBe(true);
    }
  });

  it('refuses a request whose Host header is not its loopback address (DNS rebinding)', async () => {
    const r = await send(t, '/api/listItems', { token: t.token, body: '[]', host: 'evil.example:80' });
    expect(r.status).toBe(421);
  });

  it('serves the screens with a strict Content-Security-Policy and no path escape', async () => {
    const index = await send(t, '/', { method: 'GET' });
    expect(index.status).toBe(200);
    expect(index.headers['content-security-policy']).toBe(SCREEN_CSP);
    expect(SCREEN_CSP).toContain("default-src 'none'");
    expect(SCREEN_CSP).not.toContain('unsafe');
    expect((await send(t, '/assets/a.js', { method: 'GET' })).body).toBe('console.log(1)');
    const escaped = await send(t, '/..%2f..%2fetc%2fpasswd', { method: 'GET' });
    expect([403, 404]).toContain(escaped.status);
    expect(escaped.body).not.toContain('root:');
    expect((await send(t, '/assets/missing.js', { method: 'GET' })).status).toBe(404);
  });
});
