/**
 * Loads the scorecard for the current filter and marks the screen's root when what is drawn
 * belongs to it.
 *
 * Every request gets a key (the request, the diary's change counter and the retry count).
 * An answer is kept only if its key is still the latest one asked for, so a slow answer to an
 * old filter never replaces a newer one.
 *
 * `data-scorecard-ready` is written straight onto the root rather than rendered: "false" in the
 * same commit that asks for new data (a layout effect), "true" in the passive effect of the
 * commit that rendered the answer. React runs the children's passive effects — where each
 * chart takes its new data and redraws — before the parent's, so "true" means every figure is
 * drawn, without a second render just to flip the flag. (On a first visit a chart more than a
 * screen's height below the visible part is created in a task of its own just after, with the
 * data current then; its canvas carries `data-drawn` once it is.)
 */
import { useCallback, useEffect, useLayoutEffect, useRef, useState, type RefObject } from 'react';
import type { Request, Scorecard } from '../../../../shared/contract';
import { api } from '../../api/client';
import { useDiaryVersion } from '../../api/changes';

export interface LoadedScorecard {
  /** The latest answer received; it may belong to an older filter while a new one loads. */
  card: Scorecard | undefined;
  /** The latest request failed (the last answer, if any, is still shown). */
  error: unknown;
  /** A request for the current filter is on its way. */
  loading: boolean;
  retry: () => void;
}

export function useScorecard(request: Request<'score'> | null, root: RefObject<HTMLElement | null>): LoadedScorecard {
  const version = useDiaryVersion();
  const [attempt, setAttempt] = useState(0);
  const key = request ? `${JSON.stringify(request)}#${version}#${attempt}` : null;
  const [answer, setAnswer] = useState<{ key: string; card: Scorecard } | null>(null);
  const [failure, setFailure] = useState<{ key: string; error: unknown } | null>(null);
  const latest = useRef<string | null>(null);

  useEffect(() => {
    if (!request || key === null) return;
    latest.current = key;
    api.score(request).then(
      (card) => {
        if (latest.current === key) setAnswer({ key, card });
      },
      (error: unknown) => {
        if (latest.current === key) setFailure({ key, error });
      },
    );
    // `request` is fully described by `key`.
  }, [key]);

  // With an unusable filter nothing new is asked for; the last request stays the latest.
  const wanted = key ?? latest.current;
  const failed = failure !== null && failure.key === wanted;
  const drawn = wanted !== null && answer?.key === wanted;

  useLayoutEffect(() => {
    if (!drawn) root.current?.setAttribute('data-scorecard-ready', 'false');
  });
  useEffect(() => {
    root.current?.setAttribute('data-scorecard-ready', drawn ? 'true' : 'false');
  });

  const retry = useCallback(() => setAttempt((n) => n + 1), []);
  return {
    card: answer?.card,
    error: failed ? failure.error : undefined,
    loading: wanted !== null && !drawn && !failed,
    retry,
  };
}
