/**
 * The Content-Security-Policy the shell puts on every response the window receives.
 *
 * Why each directive (W3C Content Security Policy Level 3; Electron security checklist,
 * "Define a Content Security Policy"):
 * - scripts only from our own files: no inline script and no eval, so injected markup
 *   cannot run code with access to `window.forelog`;
 * - styles only from our own files, without 'unsafe-inline': React and Chart.js set styles
 *   through the CSSOM (`element.style.x = …`), which CSP does not govern, so nothing needs
 *   inline styles (test/shell/csp-browser.test.ts checks this in Chromium);
 * - one more style by its hash: the printable briefing's own <style>, so the Hindsight
 *   screen can show it in a sandboxed srcdoc frame (which inherits this policy);
 * - images from our files and data: URLs (Chart.js exports charts as data: PNGs);
 * - no plugins, no <base>, no framing by other pages, no form submissions anywhere.
 *
 * This is the one definition: browser mode sends it as a header (main/transport/http.ts)
 * and the renderer's build declares it in a <meta> (vite.config.ts); when a header and a
 * <meta> both apply, the browser enforces both, so neither can loosen the other.
 */
import { BRIEFING_STYLE_HASH } from '../service/briefing-style.ts';

export const CONTENT_SECURITY_POLICY = [
  "default-src 'self'",
  "script-src 'self'",
  `style-src 'self' ${BRIEFING_STYLE_HASH}`,
  "img-src 'self' data:",
  "connect-src 'self'",
  "object-src 'none'",
  "base-uri 'none'",
  "frame-ancestors 'none'",
  "form-action 'none'",
].join('; ');

/**
 * Returns the response headers with our policy as the only Content-Security-Policy header
 * (header names are case-insensitive, so any spelling of an existing one is replaced).
 */
export function withContentSecurityPolicy(
  headers: Record<string, string[] | string> | undefined,
): Record<string, string[] | string> {
  const out: Record<string, string[] | string> = {};
  for (const [name, value] of Object.entries(headers ?? {})) {
    if (name.toLowerCase() !== 'content-security-policy') out[name] = value;
  }
  out['Content-Security-Policy'] = [CONTENT_SECURITY_POLICY];
  return out;
}
