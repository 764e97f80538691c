/**
 * Loads data for a screen and reloads it when its inputs or the diary change. Answers that
 * arrive after newer inputs were asked for are dropped, so a slow reply never overwrites a
 * fresh one (e.g. while typing a search).
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import { useDiaryVersion } from './changes';

export interface Loaded<T> {
  data: T | undefined;
  error: unknown;
  loading: boolean;
  reload: () => void;
}

export function useLoad<T>(load: () => Promise<T>, deps: readonly unknown[]): Loaded<T> {
  const version = useDiaryVersion();
  const [state, setState] = useState<{ data: T | undefined; error: unknown; loading: boolean }>({
    data: undefined,
    error: undefined,
    loading: true,
  });
  const [attempt, setAttempt] = useState(0);
  const latest = useRef(0);

  useEffect(() => {
    const ticket = ++latest.current;
    setState((s) => ({ ...s, loading: true }));
    load().then(
      (data) => {
        if (ticket === latest.current) setState({ data, error: undefined, loading: false });
      },
      (error: unknown) => {
        if (ticket === latest.current) setState((s) => ({ data: s.data, error, loading: false }));
      },
    );
    // `load` is recreated on every render; what it reads is listed in `deps`.
  }, [...deps, version, attempt]);

  const reload = useCallback(() => setAttempt((n) => n + 1), []);
  return { ...state, reload };
}
