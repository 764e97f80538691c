/**
 * Serves the built renderer on the app's own scheme (app-origin.ts) to the desktop window:
 * only files inside the renderer folder, each with its content type and our
 * Content-Security-Policy. main/app.ts registers it with protocol.handle once the app is
 * ready. It works on web-standard Request/Response objects and plain files, so it runs, and
 * is tested, without Electron.
 */
import { readFile, stat } from 'node:fs/promises';
import path from 'node:path';
import { APP_HOST, APP_SCHEME, isAppOrigin } from './app-origin';
import { CONTENT_SECURITY_POLICY } from './csp';

/**
 * The files a Vite build contains, by extension. `nosniff` goes with every answer, so an
 * unknown extension (application/octet-stream) is never run or rendered as something else.
 */
const CONTENT_TYPES: Readonly<Record<string, string>> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.map': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.webp': 'image/webp',
  '.woff2': 'font/woff2',
  '.txt': 'text/plain; charset=utf-8',
};

export function contentTypeFor(file: string): string {
  return CONTENT_TYPES[path.extname(file).toLowerCase()] ?? 'application/octet-stream';
}

function headers(contentType: string): Record<string, string> {
  return {
    'Content-Type': contentType,
    'Content-Security-Policy': CONTENT_SECURITY_POLICY,
    'X-Content-Type-Options': 'nosniff',
  };
}

function refusal(status: 400 | 403 | 404 | 405 | 500, message: string, extra: Record<string, string> = {}): Response {
  return new Response(message, { status, headers: { ...headers('text/plain; charset=utf-8'), ...extra } });
}

/**
 * Where a request for `pathname` (as it appears in the URL) is served from, or why it is
 * refused. Percent-decoding happens here, once, and containment is checked on the decoded
 * and resolved path: `%2e%2e%2f`, `..%5c`, `%2fetc` or a drive letter cannot step out.
 */
export type RendererFileLookup =
  | { ok: true; file: string }
  | { ok: false; status: 400 | 403; reason: string };

export function rendererFileFor(rendererDir: string, pathname: string): RendererFileLookup {
  let decoded: string;
  try {
    decoded = decodeURIComponent(pathname);
  } catch {
    return { ok: false, status: 400, reason: 'the address is not valid percent-encoding' };
  }
  if (decoded.includes('\0')) return { ok: false, status: 400, reason: 'the address contains a NUL character' };
  // A backslash is a separator on Windows only; refusing it everywhere keeps one behaviour.
  if (decoded.includes('\\')) return { ok: false, status: 403, reason: 'the address contains a backslash' };
  const relative = decoded === '/' ? 'index.html' : decoded.slice(1);
  const root = path.resolve(rendererDir);
  const file = path.resolve(root, relative);
  const inside = path.relative(root, file);
  // The folder itself (inside === '') is allowed here and answered 404, as it is no file.
  if (inside === '..' || inside.startsWith(`..${path.sep}`) || path.isAbsolute(inside)) {
    return { ok: false, status: 403, reason: "the address points outside Forelog's screens" };
  }
  return { ok: true, file };
}

/**
 * The handler for protocol.handle(APP_SCHEME, …): GET or HEAD of a file inside
 * `rendererDir`, with its content type and our Content-Security-Policy. Every answer,
 * refusals included, carries the policy. It never throws: a read error becomes a 500.
 */
export function rendererProtocolHandler(rendererDir: string): (request: Request) => Promise<Response> {
  return async (request) => {
    if (request.method !== 'GET' && request.method !== 'HEAD') {
      return refusal(405, `Forelog's screens are read-only; ${request.method} is not answered.`, { Allow: 'GET, HEAD' });
    }
    let url: URL;
    try {
      url = new URL(request.url);
    } catch {
      return refusal(400, 'Not a valid address.');
    }
    if (!isAppOrigin(request.url)) {
      return refusal(404, `Forelog serves its screens only at ${APP_SCHEME}://${APP_HOST}/.`);
    }
    const lookup = rendererFileFor(rendererDir, url.pathname);
    if (!lookup.ok) return refusal(lookup.status, `Refused: ${lookup.reason}.`);
    try {
      const info = await stat(lookup.file).catch(() => null);
      if (info === null || !info.isFile()) {
        return refusal(
          404,
          `Forelog has no file at ${url.pathname}. If its screens are missing, reinstall Forelog, or run "npm run build" in a checkout.`,
        );
      }
      const body = request.method === 'HEAD' ? null : await readFile(lookup.file);
      return new Response(body, { status: 200, headers: headers(contentTypeFor(lookup.file)) });
    } catch (error) {
      const reason = error instanceof Error ? error.message : String(error);
      return refusal(500, `Forelog could not read ${url.pathname}: ${reason}. Reinstall Forelog if this keeps happening.`);
    }
  };
}
