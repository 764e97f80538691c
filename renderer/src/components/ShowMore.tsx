/**
 * "Show 20 more" under a list that is shown a page at a time, with how many of how many
 * are on screen; nothing once every item is. Lists that grow with the diary (the Desk's
 * groups, Hindsight's calls, the Scorecard's numeric questions) stay quick to open and to
 * read with a screen reader by rendering a page, never the whole diary.
 */
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
}

export function ShowMore({ shown, total, page, onMore, busy = false }: ShowMoreProps) {
  const more = total - shown;
  if (more <= 0) return null;
  return (
    <div className="show-more">
      <Button onClick={onMore} busy={busy}>
        Show {formatCount(Math.min(more, page))} more
      </Button>
      <span className="muted">
        {formatCount(shown)} of {formatCount(total)} shown
      </span>
    </div>
  );
}
