/**
 * Hash routing (`#/questions/<id>`): it works unchanged from file:// in the desktop app and
 * from http:// in browser mode, and needs no server-side fallback.
 */
import { useCallback, useMemo, useSyncExternalStore } from 'react';

export interface Route {
  /** Path without the leading "#/" and without the query, e.g. "questions/q_12". */
  path: string;
  query: URLSearchParams;
}

function readHash(): string {
  return window.location.hash.replace(/^#\/?/, '');
}

export function parseRoute(hash: string): Route {
  const [path = '', search = ''] = hash.replace(/^#\/?/, '').split('?', 2);
  return { path: path.replace(/\/+$/, ''), query: new URLSearchParams(search) };
}

/** Told when `replaceQuery` rewrites the address, which fires no hashchange. */
const queryListeners = new Set<() => void>();

function subscribe(onChange: () => void): () => void {
  window.addEventListener('hashchange', onChange);
  queryListeners.add(onChange);
  return () => {
    window.removeEventListener('hashchange', onChange);
    queryListeners.delete(onChange);
  };
}

/** The current route; re-renders the caller when the address changes. */
export function useRoute(): Route {
  const hash = useSyncExternalStore(subscribe, readHash);
  return parseRoute(hash);
}

export function hrefTo(path: string): string {
  return `#/${path}`;
}

export function navigate(path: string): void {
  window.location.hash = `/${path}`;
}

export function questionPath(id: string): string {
  return `questions/${encodeURIComponent(id)}`;
}

/**
 * Puts `query` in the current address in place of its query, without a new history entry:
 * a screen's filters live in the address, so Back, Forward and a reload keep them, while
 * typing in a filter does not add a step to Back per keystroke. Empty values are left out.
 */
export function replaceQuery(query: Readonly<Record<string, string>>): void {
  const { path } = parseRoute(readHash());
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) if (value !== '') params.set(key, value);
  const search = params.toString();
  const hash = `#/${path}${search ? `?${search}` : ''}`;
  if (hash === window.location.hash) return;
  window.history.replaceState(window.history.state, '', hash);
  for (const listener of queryListeners) listener();
}

/**
 * A screen's state kept in the address: `decode` reads it from the query (filling in
 * defaults), `encode` writes it back. Returns the state and a setter that merges changes.
 */
export function useQueryState<T extends object>(
  decode: (query: URLSearchParams) => T,
  encode: (state: T) => Record<string, string>,
): [T, (changes: Partial<T>) => void] {
  const route = useRoute();
  const key = route.query.toString();
  const state = useMemo(() => decode(new URLSearchParams(key)), [key]);
  const set = useCallback(
    (changes: Partial<T>) => replaceQuery(encode({ ...decode(parseRoute(readHash()).query), ...changes })),
    // `decode` and `encode` are module functions of the screen; they never change.
    [],
  );
  return [state, set];
}
