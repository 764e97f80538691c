/**
 * What is due now. A check-in or a close can come due while the window sits open, so both
 * the Desk's list and the top bar's count are asked for again every minute and whenever the
 * window comes back into view, as well as after any change to the diary (useLoad follows
 * diaryChanged()). The count has its own small operation: every screen shows it, and
 * fetching the whole list for one number made each screen pay for the Desk.
 */
import { useEffect, useState } from 'react';
import type { DueList } from '../../../../shared/contract';
import { api } from '../../api/client';
import { useLoad, type Loaded } from '../../api/useLoad';

export const DUE_POLL_MS = 60_000;

/** A counter that moves every DUE_POLL_MS and when the window becomes visible again. */
function usePollTick(): number {
  const [tick, setTick] = useState(0);
  useEffect(() => {
    const again = () => setTick((n) => n + 1);
    const onVisibility = () => {
      if (document.visibilityState === 'visible') again();
    };
    const timer = window.setInterval(again, DUE_POLL_MS);
    document.addEventListener('visibilitychange', onVisibility);
    return () => {
      window.clearInterval(timer);
      document.removeEventListener('visibilitychange', onVisibility);
    };
  }, []);
  return tick;
}

/** The Desk's list: every nudge due now. */
export function useDue(): Loaded<DueList> {
  const tick = usePollTick();
  return useLoad(() => api.due({}), [tick]);
}

/** How many questions the Desk lists now; null until the diary has answered once. */
export function useDueCount(): number | null {
  const tick = usePollTick();
  const due = useLoad(() => api.dueCount({}), [tick]);
  return due.data ? due.data.count : null;
}
