/**
 * What is due now. A check-in or a close can come due while the window sits open, so the
 * list is asked for again every minute and whenever the window comes back into view, as
 * well as after any change to the diary (useLoad follows diaryChanged()).
 */
import { useEffect, useState } from 'react';
import type { DueList } from '../../../../shared/contract';
import { api } from '../../api/client';
import { useLoad, type Loaded } from '../../api/useLoad';
import { deskItems } from './items';

export const DUE_POLL_MS = 60_000;

export function useDue(): Loaded<DueList> {
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
  return useLoad(() => api.due({}), [tick]);
}

/** How many questions the Desk lists now; null until the diary has answered once. */
export function useDueCount(): number | null {
  const due = useDue();
  return due.data ? deskItems(due.data.nudges).length : null;
}
