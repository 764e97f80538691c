/**
 * Asking before a screen with unsaved typing is left. A screen that holds changes (Settings)
 * calls `useLeaveGuard(dirty, ask)`; while it is dirty:
 * - a click on a link inside the window is held, and `ask(proceed)` decides (the screen shows
 *   "Discard your changes?"; `proceed` follows the link);
 * - any other change of address (Back, Forward, a script) is undone at once and asked about
 *   the same way;
 * - in browser mode, reloading or closing the tab asks through the browser's own
 *   `beforeunload` prompt (its wording is the browser's).
 *
 * The desktop app gets no `beforeunload` prompt: Electron cancels an unload a page objects to
 * without showing anything, so Quit would silently do nothing. Closing its window only hides
 * it, and the page — with what was typed — stays as it was.
 *
 * The address listener is registered when this module loads, before React subscribes to the
 * address, so an address change that is undone never reaches the screens.
 */
import { useEffect, useRef } from 'react';
import { parseRoute } from './routing';

type Ask = (proceed: () => void) => void;

let guard: Ask | null = null;
let acceptedHash = window.location.hash;

function pathOf(hash: string): string {
  return parseRoute(hash).path;
}

window.addEventListener('hashchange', () => {
  const target = window.location.hash;
  if (guard && pathOf(target) !== pathOf(acceptedHash)) {
    const ask = guard;
    // Put the address back without a new history entry; the screens never see the change.
    window.history.replaceState(window.history.state, '', acceptedHash || '#/');
    ask(() => leaveTo(target));
    return;
  }
  acceptedHash = target;
});

document.addEventListener(
  'click',
  (event) => {
    if (!guard || event.defaultPrevented || event.button !== 0 || event.metaKey || event.ctrlKey || event.shiftKey || event.altKey) return;
    const link = event.target instanceof Element ? event.target.closest<HTMLAnchorElement>('a[href^="#"]') : null;
    if (!link) return;
    const target = link.getAttribute('href') ?? '';
    if (pathOf(target) === pathOf(acceptedHash)) return;
    event.preventDefault();
    const ask = guard;
    ask(() => leaveTo(target));
  },
  true,
);

window.addEventListener('beforeunload', (event) => {
  if (!guard || window.forelog) return;
  event.preventDefault();
  // Older browsers show the prompt only when returnValue is set.
  event.returnValue = '';
});

function leaveTo(hash: string): void {
  guard = null;
  window.location.hash = hash;
}

/** While `dirty`, leaving the screen is asked about first (see the module comment). */
export function useLeaveGuard(dirty: boolean, ask: Ask): void {
  const latest = useRef(ask);
  latest.current = ask;
  useEffect(() => {
    if (!dirty) return;
    const mine: Ask = (proceed) => latest.current(proceed);
    guard = mine;
    return () => {
      if (guard === mine) guard = null;
    };
  }, [dirty]);
}
