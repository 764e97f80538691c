/**
 * Which URLs count as Forelog's own page, and which links may leave for the system browser.
 * The window only ever shows one document (dist/renderer/index.html, routed by its #hash),
 * so anything else is either refused or handed to the user's browser.
 */

/**
 * True when `url` is the app's own document (any #hash or ?query), false otherwise,
 * including for unparsable input. Compares decoded paths rather than string prefixes, so
 * `…/index.html.evil` or a differently percent-encoded path cannot pass.
 */
export function isAppDocument(url: string, indexUrl: string): boolean {
  let candidate: URL;
  let index: URL;
  try {
    candidate = new URL(url);
    index = new URL(indexUrl);
  } catch {
    return false;
  }
  return (
    candidate.protocol === index.protocol &&
    candidate.host === index.host &&
    safeDecode(candidate.pathname) === safeDecode(index.pathname)
  );
}

function safeDecode(pathname: string): string | null {
  try {
    return decodeURIComponent(pathname);
  } catch {
    return null;
  }
}

/**
 * The URL to open in the system browser for a link the page tried to follow, or null to
 * just refuse it. Only https: goes out: http: would leak what the user clicks in clear
 * text, and file:, javascript: or custom schemes could start local programs.
 */
export function externalLinkTarget(url: string): string | null {
  try {
    const parsed = new URL(url);
    return parsed.protocol === 'https:' ? parsed.href : null;
  } catch {
    return null;
  }
}
