/**
 * Browser mode: `forelog serve` prints a URL carrying a per-launch token (`?token=…`). We keep
 * it for the tab's lifetime in sessionStorage and take it out of the address bar, so it does
 * not end up in bookmarks, history or a screenshot.
 */
const STORAGE_KEY = 'forelog.token';

export function takeTokenFromUrl(): void {
  const url = new URL(window.location.href);
  const token = url.searchParams.get('token');
  if (token === null) return;
  try {
    window.sessionStorage.setItem(STORAGE_KEY, token);
  } catch {
    // Storage can be disabled; the token then lives only in this module for this page.
    memoryToken = token;
  }
  url.searchParams.delete('token');
  window.history.replaceState(window.history.state, '', url.pathname + url.search + url.hash);
}

let memoryToken: string | null = null;

export function currentToken(): string | null {
  try {
    return window.sessionStorage.getItem(STORAGE_KEY) ?? memoryToken;
  } catch {
    return memoryToken;
  }
}
