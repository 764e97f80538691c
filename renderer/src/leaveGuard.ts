/**
 * Asking before a screen with unsaved typing is left. A screen that holds changes (Settings),
 * or a dialog holding typed text, calls `useLeaveGuard(dirty, ask)`; while it is dirty:
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

interface Guard {
  dirty: () => boolean;
  ask: Ask;
}

// Everything that may hold unsaved typing, newest last. The newest that holds some asks: a
// dialog on top of a dirty Settings asks first, and Settings again once the dialog is gone.
let guards: Guard[] = [];

function current(): Ask | null {
  for (let i = guards.length - 1; i >= 0; i--) if (guards[i]!.dirty()) return guards[i]!.ask;
  return null;
}
let acceptedHash = window.location.hash;

function pathOf(hash: string): string {
  return parseRoute(hash).path;
}

window.addEventListener('hashchange', () => {
  const target = window.location.hash;
  const ask = current();
  if (ask && pathOf(target) !== pathOf(acceptedHash)) {
    // Put the address back; the screens never see the change. Back has already moved one
    // entry back, so the address is pushed as a new entry there rather than written over
    // that entry: a second Back then asks again, instead of leaving the app for the page
    // before it.
    window.history.pushState(window.history.state, '', acceptedHash || '#/');
    ask(() => leaveTo(target));
    return;
  }
  acceptedHash = target;
});

document.addEventListener(
  'click',
  (event) => {
    const ask = current();
    if (!ask || event.defaultPrevented || event.button !== 0 || event.metaKey || event.ctrlKey || event.shiftKey || event.altKey) return;
    const link = event.target instanceof Element ? event.target.closest<HTMLAnchorElement>('a[href^="#"]') : null;
    if (!link) return;
    const target = link.getAttribute('href') ?? '';
    if (pathOf(target) === pathOf(acceptedHash)) return;
    event.preventDefault();
    ask(() => leaveTo(target));
  },
  true,
);

window.addEventListener('beforeunload', (event) => {
  if (!current() || window.forelog) return;
  event.preventDefault();
  // Older browsers show the prompt only when returnValue is set.
  event.returnValue = '';
});

function leaveTo(hash: string): void {
  // The user chose to leave: every holder's typing goes with its screen.
  guards = [];
  window.location.hash = hash;
}

/**
 * While `dirty`, leaving the screen is asked about first (see the module comment). `dirty`
 * may be a function, asked at the moment of leaving: a Back pressed right after a keystroke
 * must not slip past a flag that has not been rendered yet.
 */
export function useLeaveGuard(dirty: boolean | (() => boolean), ask: Ask): void {
  const latest = useRef({ dirty, ask });
  latest.current = { dirty, ask };
  useEffect(() => {
    const mine: Guard = {
      dirty: () => {
        const now = latest.current.dirty;
        return typeof now === 'function' ? now() : now;
      },
      ask: (proceed) => latest.current.ask(proceed),
    };
    guards.push(mine);
    return () => {
      guards = guards.filter((g) => g !== mine);
    };
  }, []);
}
