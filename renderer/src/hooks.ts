/** Small hooks shared by screens. */
import { useEffect, useState, useSyncExternalStore } from 'react';

/** `value`, but only after it has stopped changing for `delayMs` (e.g. search as you type). */
export function useDebounced<T>(value: T, delayMs: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    const timer = window.setTimeout(() => setSettled(value), delayMs);
    return () => window.clearTimeout(timer);
  }, [value, delayMs]);
  return settled;
}

const darkQuery = () => window.matchMedia('(prefers-color-scheme: dark)');

/** 'dark' or 'light', following the system setting live (charts redraw with the theme). */
export function useColorScheme(): 'light' | 'dark' {
  return useSyncExternalStore(
    (onChange) => {
      const query = darkQuery();
      query.addEventListener('change', onChange);
      return () => query.removeEventListener('change', onChange);
    },
    () => (darkQuery().matches ? 'dark' : 'light'),
  );
}

/** True when keyboard focus is in a place where typing a letter means text, not a command. */
export function isTypingTarget(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false;
  if (target.isContentEditable) return true;
  const tag = target.tagName;
  return tag === 'INPUT' || tag === 'TEXTAREA' || tag === 'SELECT';
}

export const IS_MAC = /Mac|iPhone|iPad/.test(navigator.platform || navigator.userAgent);

// The title has two owners: the screen names itself, the window adds how much is due.
let screenTitle: string | null = null;
let dueCount = 0;

function applyTitle(): void {
  const base = screenTitle ? `${screenTitle} — Forelog` : 'Forelog';
  document.title = dueCount > 0 ? `(${dueCount}) ${base}` : base;
}

/** Names the window/tab after the screen, so the task switcher and history say where you are. */
export function useDocumentTitle(title: string | null): void {
  useEffect(() => {
    screenTitle = title;
    applyTitle();
  }, [title]);
}

/** Puts "(N) " before the title while N things are due, so a background tab shows it. */
export function useTitleCount(count: number): void {
  useEffect(() => {
    dueCount = count;
    applyTitle();
  }, [count]);
}
