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
import type { Duplex } from 'node:stream';
import path from 'node:path';
import { API_PREFIX, type Envelope } from '../../shared/bridge';
import type { ApiErrorCode } from '../../shared/contract';
import { jsonTextNestedDeeperThan, NESTING_RULE } from '../../shared/validation';
import { duplicateMember } from '../../shared/json-duplicates';
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
  // Not refused for what it holds: it waits for the user's confirm (see ApiErrorCode).
  confirm: 409,
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


/**
 * A request the server refuses before the API sees it, with the status to answer and a
 * message that says what to do. Thrown by the request-reading helpers below.
 */
class RequestRefusal extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
    this.name = 'RequestRefusal';
  }
}

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

/**
 * Answers with an error envelope, unless the answer can no longer be sent (the client
 * went away, or an answer already started): then the connection is dropped instead, so a
 * second answer never throws inside the server.
 */
function refuse(res: http.ServerResponse, status: number, message: string): void {
  if (res.headersSent || res.writableEnded || res.destroyed) {
    res.destroy();
    return;
  }
  const envelope: Envelope = { ok: false, error: { code: 'invalid', message, fields: [] } };
  sendJson(res, status, envelope);
}

function tokenMatches(header: string | undefined, token: string): boolean {
  // The scheme's name is case-insensitive and may be followed by more than one space (RFC 9110 §11.1, §11.4).
  const m = /^bearer +(.+)$/i.exec(header ?? '');
  if (!m) return false;
  const given = Buffer.from(m[1]!);
  const expected = Buffer.from(token);
  return given.length === expected.length && timingSafeEqual(given, expected);
}

const megabytes = (bytes: number): string => `${Math.round(bytes / 1_048_576)} MB`;

/**
 * Reads the whole body as UTF-8 text. Refuses (413) a body larger than `limit` before
 * reading it when Content-Length says so, and as soon as it grows past it otherwise; a
 * body cut off before its end, or one that is not UTF-8, is refused with 400.
 */
function readBody(req: http.IncomingMessage, limit: number): Promise<string> {
  return new Promise((resolve, reject) => {
    const tooLarge = () =>
      new RequestRefusal(413, `The request is larger than ${megabytes(limit)}; nothing was changed. Import a large diary with \`forelog import FILE\` instead.`);
    const declared = Number(req.headers['content-length']);
    if (Number.isFinite(declared) && declared > limit) {
      reject(tooLarge());
      return;
    }
    const chunks: Buffer[] = [];
    let size = 0;
    let settled = false;
    const settle = (outcome: () => void) => {
      if (settled) return;
      settled = true;
      outcome();
    };
    req.on('data', (chunk: Buffer) => {
      if (settled) return;
      size += chunk.length;
      if (size > limit) {
        chunks.length = 0;
        settle(() => reject(tooLarge()));
        return;
      }
      chunks.push(chunk);
    });
    req.on('end', () =>
      settle(() => {
        try {
          resolve(new TextDecoder('utf-8', { fatal: true }).decode(Buffer.concat(chunks)));
        } catch {
          reject(new RequestRefusal(400, 'The request body is not UTF-8 text; nothing was changed. Send the JSON body encoded as UTF-8.'));
        }
      }),
    );
    const cutOff = () =>
      settle(() => reject(new RequestRefusal(400, 'The request body ended before its declared length; nothing was changed. Send the request again.')));
    req.on('error', cutOff);
    req.on('aborted', cutOff);
    req.on('close', cutOff);
  });
}

/**
 * The path of a request target (RFC 9112 §3.2): origin form `/path?query`, or absolute
 * form `http://host/path`, whose authority must then be ours like the Host header.
 * Anything else (`*`, an unparsable URL) is refused with 400.
 */
function targetPath(target: string | undefined, allowedHosts: Set<string>): string {
  const text = target ?? '';
  if (text.startsWith('/')) return text.replace(/[?#].*$/s, '');
  let url: URL;
  try {
    url = new URL(text);
  } catch {
    throw new RequestRefusal(400, 'The request names no valid path; ask for a path such as / or /api/<operation>.');
  }
  if (url.protocol !== 'http:') throw new RequestRefusal(400, 'The request names no valid path; ask for a path such as / or /api/<operation>.');
  if (!allowedHosts.has(url.host)) {
    throw new RequestRefusal(403, 'Refused: Forelog answers only requests addressed to its own loopback address and port.');
  }
  return url.pathname;
}

/**
 * What a malformed request line, bad or oversized headers, a malformed body encoding or a
 * timeout earn: a bare status line, then the connection closes. Node's parser reports
 * these on the server rather than the request, so they never reach the request handler.
 * `earlier` are the answers still being given to requests read whole before the broken
 * one on the same connection (pipelining): the status line waits until they are sent, so
 * it never lands inside one, and a caller whose write was carried out learns so.
 */
function answerClientError(err: NodeJS.ErrnoException, socket: Duplex, earlier: readonly http.ServerResponse[]): void {
  if (err.code === 'ECONNRESET' || !socket.writable) {
    socket.destroy();
    return;
  }
  if (earlier.length > 0) {
    let left = earlier.length;
    for (const res of earlier) {
      res.once('close', () => {
        if (--left === 0) answerClientError(err, socket, []);
      });
    }
    return;
  }
  const status =
    err.code === 'HPE_HEADER_OVERFLOW'
      ? '431 Request Header Fields Too Large'
      : err.code === 'ERR_HTTP_REQUEST_TIMEOUT'
        ? '408 Request Timeout'
        : '400 Bad Request';
  socket.end(`HTTP/1.1 ${status}\r\nConnection: close\r\nContent-Length: 0\r\n\r\n`);
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
    // A body declared as something else (a form, plain text) is not what the caller meant to
    // send as an API request; a request without the header is read as JSON, as curl -d sends it.
    const declared = req.headers['content-type'];
    if (declared !== undefined && declared.split(';')[0]!.trim().toLowerCase() !== 'application/json') {
      throw new RequestRefusal(415, `API calls take a JSON body, but this one is declared as "${declared.slice(0, 100)}"; send it with Content-Type: application/json. Nothing was changed.`);
    }
    // The body is read as UTF-8; one declared in another character set would be stored garbled.
    const charset = declared === undefined ? undefined : /;\s*charset\s*=\s*"?([^";\s]*)/i.exec(declared)?.[1];
    if (charset !== undefined && charset.toLowerCase() !== 'utf-8' && charset.toLowerCase() !== 'utf8') {
      throw new RequestRefusal(
        415,
        `API calls take JSON in UTF-8, but this body is declared as charset=${charset.slice(0, 40)}; send it as UTF-8 (Content-Type: application/json; charset=utf-8, or no charset). Nothing was changed.`,
      );
    }
    // A compressed body is not unpacked: read as it is, gzip was called "not UTF-8" and a
    // body declared compressed but sent plain was carried out (RFC 9110 §8.4: refuse with 415).
    const coding = req.headers['content-encoding'];
    if (coding !== undefined && coding.split(',').some((c) => c.trim() !== '' && c.trim().toLowerCase() !== 'identity')) {
      res.setHeader('Accept-Encoding', 'identity');
      throw new RequestRefusal(415, `API calls take an uncompressed body, but this one is declared as Content-Encoding: ${coding.slice(0, 40)}; send it without compression. Nothing was changed.`);
    }
    // Node takes the chunks apart but unpacks no other transfer coding (gzip, chunked): the
    // bytes would be read as the body itself (RFC 9112 §6.1: refuse with 501).
    const transfer = req.headers['transfer-encoding'];
    if (transfer !== undefined && transfer.split(',').some((c) => !['', 'chunked', 'identity'].includes(c.trim().toLowerCase()))) {
      throw new RequestRefusal(501, `API calls take a body sent plain or in chunks, but this one is declared as Transfer-Encoding: ${transfer.slice(0, 40)}; send it without compression. Nothing was changed.`);
    }
    const text = await readBody(req, limit);
    if (jsonTextNestedDeeperThan(text)) {
      throw new RequestRefusal(400, `The request body is nested too deeply: ${NESTING_RULE}. Nothing was changed.`);
    }
    let request: unknown = {};
    try {
      request = text.trim() ? JSON.parse(text) : {};
    } catch (err) {
      throw new RequestRefusal(400, `The request body is not valid JSON: ${err instanceof Error ? err.message : String(err)}. Nothing was changed.`);
    }
    const twice = duplicateMember(text);
    if (twice) {
      throw new RequestRefusal(400, `The request body names the member "${twice.key}" twice in one object (the second at character ${twice.offset + 1}); keep one of them. Nothing was changed.`);
    }
    const answer = await options.dispatch(operation, request);
    sendJson(res, answer.ok ? 200 : STATUS[answer.error.code], answer);
  }

  function serveStatic(req: http.IncomingMessage, res: http.ServerResponse, pathname: string): void {
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      // Most often an API call with a misspelt prefix (/API/…): answer in the API's own
      // shape, so a script reading the envelope learns what went wrong.
      res.setHeader('Allow', 'GET, HEAD');
      res.setHeader('Connection', 'close');
      refuse(
        res,
        405,
        `${pathname.slice(0, 100)} serves pages only (GET, HEAD); API calls are POST /api/<operation>, with /api/ in lower case. Nothing was changed.`,
      );
      return;
    }
    let relative: string;
    try {
      relative = pathname === '/' ? 'index.html' : decodeURIComponent(pathname.slice(1));
    } catch {
      throw new RequestRefusal(400, 'The path is not valid percent-encoded UTF-8; check the address.');
    }
    const file = path.resolve(rendererDir, relative);
    // fs treats a NUL in a path as an error rather than a missing file.
    if (relative.includes('\0') || !file.startsWith(rendererDir + path.sep) || !fs.existsSync(file) || !fs.statSync(file).isFile()) {
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

  /** Whatever a request handler throws becomes an answer here; nothing reaches the process. */
  function answerFailure(res: http.ServerResponse, err: unknown): void {
    try {
      if (err instanceof RequestRefusal) {
        // A refused body may still be arriving: close the connection after answering.
        if (!res.headersSent) res.setHeader('Connection', 'close');
        refuse(res, err.status, err.message);
        return;
      }
      refuse(res, 500, `Forelog could not answer: ${err instanceof Error ? err.message : String(err)}. Nothing was changed; try again.`);
    } catch {
      res.destroy();
    }
  }

  function handle(req: http.IncomingMessage, res: http.ServerResponse): void {
    const host = req.headers.host ?? '';
    const origin = req.headers.origin;
    if (!allowedHosts().has(host) || (origin !== undefined && !allowedOrigins().has(origin))) {
      refuse(res, 403, 'Refused: Forelog answers only requests addressed to its own loopback address and port.');
      return;
    }
    const pathname = targetPath(req.url, allowedHosts());
    if (pathname.startsWith(API_PREFIX)) {
      handleApi(req, res, pathname.slice(API_PREFIX.length)).catch((err: unknown) => answerFailure(res, err));
      return;
    }
    serveStatic(req, res, pathname);
  }

  // Requests still being answered, per connection: see answerClientError.
  const inFlight = new WeakMap<Duplex, Set<{ req: http.IncomingMessage; res: http.ServerResponse }>>();

  const server = http.createServer((req, res) => {
    const socket = req.socket;
    const pending = inFlight.get(socket) ?? new Set();
    inFlight.set(socket, pending);
    const entry = { req, res };
    pending.add(entry);
    res.on('close', () => pending.delete(entry));
    try {
      handle(req, res);
    } catch (err) {
      answerFailure(res, err);
    }
  });
  server.on('clientError', (err: NodeJS.ErrnoException, socket: Duplex) => {
    // A request whose own body broke and whose answer has not begun is answered by the status
    // line; requests read whole before it (or already being answered) get their answers first.
    const earlier = [...(inFlight.get(socket) ?? [])].filter(({ req, res }) => req.complete || res.headersSent).map(({ res }) => res);
    answerClientError(err, socket, earlier);
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
