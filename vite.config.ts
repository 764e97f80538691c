/**
 * Builds the renderer into dist/renderer. `base: './'` makes every asset URL relative, so the
 * same build loads from forelog-app://app/ in the desktop app (main/shell/app-protocol.ts)
 * and from http://127.0.0.1 in browser mode.
 */
import { defineConfig, type Plugin } from 'vite';
import react from '@vitejs/plugin-react';
import { CONTENT_SECURITY_POLICY } from './main/shell/csp.ts';

// The policy the built page declares for itself: the same one the shell and browser mode
// send as a header (one definition, main/shell/csp.ts). `frame-ancestors` is ignored in a
// <meta>, so it is left out there.
const META_POLICY = CONTENT_SECURITY_POLICY.split('; ')
  .filter((directive) => !directive.startsWith('frame-ancestors'))
  .join('; ');

/**
 * Adds the policy as a <meta> only to the production build: the dev server injects an inline
 * fast-refresh preamble that a strict policy would (rightly) block.
 */
function contentSecurityPolicy(): Plugin {
  return {
    name: 'forelog-content-security-policy',
    apply: 'build',
    transformIndexHtml: {
      order: 'pre',
      handler: () => [
        {
          tag: 'meta',
          attrs: { 'http-equiv': 'Content-Security-Policy', content: META_POLICY },
          injectTo: 'head-prepend',
        },
      ],
    },
  };
}

export default defineConfig({
  root: 'renderer',
  base: './',
  plugins: [react(), contentSecurityPolicy()],
  build: {
    outDir: '../dist/renderer',
    emptyOutDir: true,
    // Chart.js alone is ~200 kB; one chunk keeps file:// loading simple.
    chunkSizeWarningLimit: 1024,
  },
});
