/**
 * The loopback HTTP transport for the browser preview and the end-to-end tests: serves the built
 * screens and carries the contract's calls as `POST /api/<method>` with a JSON list of arguments.
 *
 * Guarded three ways: it listens on 127.0.0.1 only; every request under /api/ must carry the
 * random token made at this start (header `x-provision-token`), else 401; and the Host header must
 * name the loopback address, which keeps other web pages from reaching it by DNS rebinding.
 */
import { randomBytes, timingSafeEqual } from 'node:crypto';
import { createReadStream, existsSync, statSync } from 'node:fs';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { extname, join, normalize, resolve, sep } from 'node:path';
import type { ProvisionApi } from '../api/contract';
import { ServiceError } from '../api/service-error';
import { contentTypeOf } from './content-type';
import { ApiArgumentError, MAX_IMPORT_CHARS, validateCall } from './validate-call';

export const LOOPBACK = '127.0.0.1';
export const TOKEN_HEADER = 'x-provision-token';

/** The Content-Security-Policy of the screens: nothing but our own files, no remote content. */
export const SCREEN_CSP =
  "default-src 'none'; script-src 'self'; style-src 'self'; img-src 'self' data:; font-src 'self'; " +
  "connect-src 'self'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'";

export interface HttpTransport {
  url: string;
  /** The address that opens straight onto the items overview, token included. */
  openUrl: string;
  token: string;
  port: number;
  server: Server;
  close(): Promise<void>;
}

function send(res: ServerResponse, status: number, body: unknown): void {
  const text = JSON.stringify(body);
  res.writeHead(status, {
    'content-type': 'application/json; charset=utf-8',
    'cache-control': 'no-store',
    'x-content-type-options': 'nosniff',
  });
  res.end(text);
}

function tokenMatches(given: string | undefined, token: string): boolean {
  if (typeof given !== 'string') return false;
  const a = Buffer.from(given);
  const b = Buffer.from(token);
  return a.length === b.length && timingSafeEqual(a, b);
}

function readBody(req: IncomingMessage, limit: number): Promise<string> {
  return new Promise((ok, ko) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on('data', (c: Buffer) => {
      size += c.length;
      if (size > limit) {
        ko(new ApiArgumentError(`request body larger than ${limit} bytes`));
        req.destroy();
      } else chunks.push(c);
    });
    req.on('end', () => ok(Buffer.concat(chunks).toString('utf8')));
    req.on('error', ko);
  });
}

function serveStatic(staticDir: string, pathname: string, res: ServerResponse): void {
  const root = resolve(staticDir);
  let rel = decodeURIComponent(pathname);
  if (rel === '/' || rel === '') rel = '/index.html';
  let file = normalize(join(root, rel));
  if (file !== root && !file.startsWith(root + sep)) {
    res.writeHead(403).end();
    return;
  }
  // Unknown paths without an extension are screens of the single-page app: give them the shell.
  if (!existsSync(file) || !statSync(file).isFile()) {
    if (extname(rel) !== '') {
      res.writeHead(404, { 'content-type': 'text/plain' }).end('not found');
      return;
    }
    file = join(root, 'index.html');
  }
  const type = contentTypeOf(file);
  res.writeHead(200, {
    'content-type': type,
    'content-security-policy': SCREEN_CSP,
    'x-content-type-options': 'nosniff',
    'referrer-policy': 'no-referrer',
    'cache-control': type.startsWith('text/html') ? 'no-store' : 'max-age=60',
  });
  createReadStream(file).pipe(res);
}

export async function startHttpTransport(options: {
  service: ProvisionApi;
  staticDir: string;
  port?: number;
  token?: string;
}): Promise<HttpTransport> {
  const token = options.token ?? randomBytes(24).toString('base64url');
  const { service, staticDir } = options;
  let port = options.port ?? 0;

  const server = createServer((req, res) => {
    const url = new URL(req.url ?? '/', `http://${LOOPBACK}`);
    const host = req.headers.host ?? '';
    if (host !== `${LOOPBACK}:${port}` && host !== `localhost:${port}`) {
      send(res, 421, { error: 'this server answers only to its loopback address' });
      return;
    }
    if (url.pathname === '/api' || url.pathname.startsWith('/api/')) {
      if (!tokenMatches(req.headers[TOKEN_HEADER] as string | undefined, token)) {
        send(res, 401, { error: 'missing or wrong token' });
        return;
      }
      if (req.method !== 'POST') {
        send(res, 405, { error: 'use POST' });
        return;
      }
      handleCall(service, url.pathname.slice('/api/'.length), req, res);
      return;
    }
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      res.writeHead(405).end();
      return;
    }
    serveStatic(staticDir, url.pathname, res);
  });

  await new Promise<void>((ok, ko) => {
    server.once('error', ko);
    server.listen(port, LOOPBACK, () => {
      server.off('error', ko);
      ok();
    });
  });
  port = (server.address() as AddressInfo).port;
  const url = `http://${LOOPBACK}:${port}/`;
  return {
    url,
    openUrl: `${url}?token=${token}#/items`,
    token,
    port,
    server,
    close: () =>
      new Promise<void>((ok) => {
        server.closeAllConnections();
        server.close(() => ok());
      }),
  };
}

async function handleCall(
  service: ProvisionApi,
  name: string,
  req: IncomingMessage,
  res: ServerResponse,
): Promise<void> {
  try {
    const body = await readBody(req, MAX_IMPORT_CHARS * 2);
    let args: unknown;
    try {
      args = body === '' ? [] : JSON.parse(body);
    } catch {
      throw new ApiArgumentError(`${name}: the body is not JSON`);
    }
    const call = validateCall(name, args);
    const fn = service[call.method] as (...a: unknown[]) => Promise<unknown>;
    const result = await fn.apply(service, call.args);
    send(res, 200, { result });
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    const known = err instanceof ApiArgumentError || err instanceof ServiceError;
    if (!known) process.stderr.write(`api ${name}: ${err instanceof Error ? err.stack : message}\n`);
    send(res, known ? 400 : 500, { error: message });
  }
}
