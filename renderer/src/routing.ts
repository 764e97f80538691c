/**
 * Hash routing (`#/questions/<id>`): it works unchanged from file:// in the desktop app and
 * from http:// in browser mode, and needs no server-side fallback.
 */
import { useSyncExternalStore } from 'react';

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

function subscribe(onChange: () => void): () => void {
  window.addEventListener('hashchange', onChange);
  return () => window.removeEventListener('hashchange', onChange);
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
