/**
 * The app's own origin: the scheme its pages are served on (app-protocol.ts), instead of
 * file://, and the tests for "is this URL ours?". Electron's security checklist ("Avoid usage
 * of the file:// protocol and prefer usage of custom protocols") gives the reason: a file://
 * page may read any local file the user can, while this scheme answers only for the files
 * of the built renderer, so the page's origin is exactly our build and nothing else.
 */

export const APP_SCHEME = 'forelog-app';
/** The one host the scheme answers for; URLs of a standard scheme need one. */
export const APP_HOST = 'app';
export const APP_INDEX_URL = `${APP_SCHEME}://${APP_HOST}/index.html`;

/**
 * For protocol.registerSchemesAsPrivileged. `standard`: relative URLs resolve (the build's
 * `./assets/…`) and the page gets a real origin, so `'self'` in the CSP means this scheme
 * and host. `secure`: a secure context, like https. Nothing more: no fetch API, service
 * workers or CSP bypass, since the page reaches the diary through the preload; and no
 * `corsEnabled`, which would let other origins read our files (the page's own module
 * script and stylesheet are same-origin, which needs no CORS).
 */
export const APP_SCHEME_PRIVILEGES = { standard: true, secure: true } as const;

/** The app's page, opened at a route of the renderer's hash router when given. */
export function appPageUrl(route?: string): string {
  return route === undefined ? APP_INDEX_URL : `${APP_INDEX_URL}#${route}`;
}

function parse(url: string): URL | null {
  try {
    return new URL(url);
  } catch {
    return null;
  }
}

/**
 * True for any URL on the app's scheme and host (no port). Node's URL parser keeps the host
 * of a non-special scheme as written, while Chromium lower-cases it, so case is ignored.
 */
export function isAppOrigin(url: string): boolean {
  const parsed = parse(url);
  return parsed !== null && parsed.protocol === `${APP_SCHEME}:` && parsed.host.toLowerCase() === APP_HOST;
}

/**
 * True when `url` is the app's own document (any #hash or ?query), false otherwise,
 * including for unparsable input. Compares decoded paths rather than string prefixes, so
 * `…/index.html.evil` or a differently percent-encoded path cannot pass.
 */
export function isAppDocument(url: string): boolean {
  const candidate = parse(url);
  return candidate !== null && isAppOrigin(url) && safeDecode(candidate.pathname) === '/index.html';
}

function safeDecode(pathname: string): string | null {
  try {
    return decodeURIComponent(pathname);
  } catch {
    return null;
  }
}
