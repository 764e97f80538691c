/**
 * A counter that goes up whenever the diary is changed from this window, so every screen that
 * shows diary data reloads after any mutation (a quick add from the list, a revision on the
 * question page) without the screens knowing about each other.
 */
import { useSyncExternalStore } from 'react';

let version = 0;
const listeners = new Set<() => void>();

export function diaryChanged(): void {
  version += 1;
  for (const listener of listeners) listener();
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

export function useDiaryVersion(): number {
  return useSyncExternalStore(subscribe, () => version);
}
