/**
 * "Show 20 more" for a list that is shown a page at a time, with how many of how many are
 * on screen; nothing once every item is. Lists that grow with the diary (the Desk's
 * groups, Hindsight's calls, the Scorecard's numeric questions, a question's history) stay
 * quick to open and to read with a screen reader by rendering a page, never all of it.
 */
import { useEffect, useRef, useState } from 'react';
import { Button } from './Button';
import { formatCount } from '../dates';

interface ShowMoreProps {
  /** Items on screen now. */
  shown: number;
  /** Items in the whole list. */
  total: number;
  /** How many one press adds. */
  page: number;
  onMore: () => void;
  /** While the next page is on its way. */
  busy?: boolean;
  /** 'earlier' for a list in time order that shows its latest items and adds older ones above them. */
  direction?: 'more' | 'earlier';
  /**
   * The most the list may show (a request's own limit), and what to say once it does:
   * how to see the others instead.
   */
  cap?: { at: number; note: string };
}

export function ShowMore({ shown, total, page, onMore, busy = false, direction = 'more', cap }: ShowMoreProps) {
  const more = total - shown;
  if (more <= 0) return null;
  const room = cap ? cap.at - shown : Infinity;
  if (room <= 0) {
    return (
      <p className="show-more muted" role="status">
        {formatCount(shown)} of {formatCount(total)} shown, the most one page holds; {cap!.note}
      </p>
    );
  }
  return (
    <div className="show-more">
      <Button onClick={onMore} busy={busy}>
        Show {formatCount(Math.min(more, page, room))} {direction}
      </Button>
      <span className="muted">
        {formatCount(shown)} of {formatCount(total)} shown{direction === 'earlier' ? ', the latest' : ''}
      </span>
    </div>
  );
}

/**
 * Focus for a list that grows a page at a time: call the returned function with the index
 * of the first item a press adds, and once the list has drawn it (`shown` changed), focus
 * moves to the element `find` gives for that index. A keyboard or screen-reader user then
 * carries on from there instead of being left on a button that may have gone.
 */
function useFocusAfterMore(shown: number, find: (index: number) => HTMLElement | null | undefined): (index: number) => void {
  const pending = useRef<number | null>(null);
  useEffect(() => {
    const index = pending.current;
    if (index === null) return;
    pending.current = null;
    find(index)?.focus();
    // Only a new page moves focus; `find` is read as it is then.
  }, [shown]);
  return (index) => {
    pending.current = index;
  };
}

/**
 * How many items of a list drawn a page at a time are shown: `more` adds a page and, once
 * it is drawn, focuses what `find` gives for its first item (see useFocusAfterMore);
 * `reset` goes back to the first page (a new selection). The first page holds `first`
 * items when it differs from the others.
 */
export function usePages(page: number, find: (index: number) => HTMLElement | null | undefined, first = page) {
  const [shown, setShown] = useState(first);
  const focusFrom = useFocusAfterMore(shown, find);
  return {
    shown,
    more: () => {
      focusFrom(shown);
      setShown((n) => n + page);
    },
    reset: () => setShown(first),
  };
}
