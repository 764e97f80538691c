/**
 * Browser mode: the same renderer and the same API over HTTP on 127.0.0.1 only.
 * Every /api/ request must carry the per-launch token (401 otherwise); every request must
 * name our loopback address and port in Host, and an Origin if sent (403 otherwise), so a
 * page on another site cannot reach the diary through DNS rebinding.
 */
import { randomBytes, timingSafeEqual } from 'node:crypto';
import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { API_PREFIX, type Envelope } from '../../shared/bridge';
import type { ApiErrorCode } from '../../shared/contract';
import type { Dispatch } from '../service/dispatch';
import { CONTENT_SECURITY_POLICY } from '../shell/csp';

export interface HttpServerOptions {
  dispatch: Dispatch;
  /** Folder holding the built renderer (index.html and assets/). */
  rendererDir: string;
  port?: number;
  token?: string;
  /** Largest request body accepted, in bytes (imports are the big ones). */
  maxBodyBytes?: number;
}

export interface RunningServer {
  url: string;
  port: number;
  token: string;
  close(): Promise<void>;
}

// 403 is left to the Host/Origin refusal (the page reads 401/403 as "wrong token"); a
// read-only diary is a conflict with the state of the file, a busy one is worth a retry.
const STATUS: Record<ApiErrorCode, number> = {
  invalid: 400,
  not_found: 404,
  conflict: 409,
  read_only: 409,
  busy: 503,
  disk_full: 507,
  storage: 500,
  internal: 500,
};

const CONTENT_TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.json': 'application/json; charset=utf-8',
  '.woff2': 'font/woff2',
  '.map': 'application/json; charset=utf-8',
};


function sendJson(res: http.ServerResponse, status: number, body: unknown): void {
  const text = JSON.stringify(body);
  res.writeHead(status, {
    'Content-Type': 'application/json; charset=utf-8',
    'Content-Length': Buffer.byteLength(text),
    'Cache-Control': 'no-store',
    'X-Content-Type-Options': 'nosniff',
  });
  res.end(text);
}

function refuse(res: http.ServerResponse, status: number, message: string): void {
  const envelope: Envelope = { ok: false, error: { code: 'invalid', message, fields: [] } };
  sendJson(res, status, envelope);
}

function tokenMatches(header: string | undefined, token: string): boolean {
  const m = /^Bearer (.+)$/.exec(header ?? '');
  if (!m) return false;
  const given = Buffer.from(m[1]!);
  const expected = Buffer.from(token);
  return given.length === expected.length && timingSafeEqual(given, expected);
}

function readBody(req: http.IncomingMessage, limit: number): Promise<string> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on('data', (chunk: Buffer) => {
      size += chunk.length;
      if (size > limit) {
        reject(new Error(`The request is larger than ${Math.round(limit / 1_048_576)} MB.`));
        req.destroy();
        return;
      }
      chunks.push(chunk);
    });
    req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
    req.on('error', reject);
  });
}

export async function startHttpServer(options: HttpServerOptions): Promise<RunningServer> {
  const token = options.token ?? randomBytes(24).toString('base64url');
  const limit = options.maxBodyBytes ?? 64 * 1_048_576;
  const rendererDir = path.resolve(options.rendererDir);
  let port = 0;

  const allowedHosts = () => new Set([`127.0.0.1:${port}`, `localhost:${port}`]);
  const allowedOrigins = () => new Set([`http://127.0.0.1:${port}`, `http://localhost:${port}`]);

  async function handleApi(req: http.IncomingMessage, res: http.ServerResponse, operation: string): Promise<void> {
    if (!tokenMatches(req.headers.authorization, token)) {
      refuse(res, 401, 'This request lacks the launch token. Open Forelog from the address `forelog serve` printed.');
      return;
    }
    if (req.method !== 'POST') {
      res.setHeader('Allow', 'POST');
      refuse(res, 405, 'API calls use POST with a JSON body.');
      return;
    }
    let request: unknown = {};
    try {
      const text = await readBody(req, limit);
      request = text.trim() ? JSON.parse(text) : {};
    } catch (err) {
      refuse(res, 400, `The request body is not valid JSON: ${err instanceof Error ? err.message : String(err)}. Nothing was changed.`);
      return;
    }
    const answer = await options.dispatch(operation, request);
    sendJson(res, answer.ok ? 200 : STATUS[answer.error.code], answer);
  }

  function serveStatic(req: http.IncomingMessage, res: http.ServerResponse, pathname: string): void {
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      res.writeHead(405, { Allow: 'GET, HEAD' }).end();
      return;
    }
    const relative = pathname === '/' ? 'index.html' : decodeURIComponent(pathname.slice(1));
    const file = path.resolve(rendererDir, relative);
    if (!file.startsWith(rendererDir + path.sep) || !fs.existsSync(file) || !fs.statSync(file).isFile()) {
      res.writeHead(404, { 'Content-Type': 'text/plain; charset=utf-8' }).end('Not found');
      return;
    }
    const body = fs.readFileSync(file);
    res.writeHead(200, {
      'Content-Type': CONTENT_TYPES[path.extname(file)] ?? 'application/octet-stream',
      'Content-Length': body.length,
      'Content-Security-Policy': CONTENT_SECURITY_POLICY,
      'X-Content-Type-Options': 'nosniff',
      'Referrer-Policy': 'no-referrer',
      'Cache-Control': relative === 'index.html' ? 'no-store' : 'max-age=3600',
    });
    res.end(req.method === 'HEAD' ? undefined : body);
  }

  const server = http.createServer((req, res) => {
    const host = req.headers.host ?? '';
    const origin = req.headers.origin;
    if (!allowedHosts().has(host) || (origin !== undefined && !allowedOrigins().has(origin))) {
      refuse(res, 403, 'Refused: Forelog answers only requests addressed to its own loopback address and port.');
      return;
    }
    const pathname = new URL(req.url ?? '/', `http://${host}`).pathname;
    if (pathname.startsWith(API_PREFIX)) {
      handleApi(req, res, pathname.slice(API_PREFIX.length)).catch((err: unknown) => {
        refuse(res, 500, `Forelog could not answer: ${err instanceof Error ? err.message : String(err)}`);
      });
      return;
    }
    serveStatic(req, res, pathname);
  });

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, '127.0.0.1', () => resolve());
  });
  port = (server.address() as AddressInfo).port;
  return {
    url: `http://127.0.0.1:${port}/?token=${token}`,
    port,
    token,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
