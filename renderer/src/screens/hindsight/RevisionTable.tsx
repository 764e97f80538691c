/**
 * The revisions of one Hindsight card, each with the note written at the time, for every
 * question type. Revisions after the window end are shown but marked: they never count.
 * The latest few come first in view (they led to the final forecast); a question revised
 * weekly for a year would otherwise fill the page with one card, and twenty such cards
 * thousands of rows. The earlier ones are a press away, above them.
 */
import { useRef } from 'react';
import { Badge } from '../../components/Badge';
import { ShowMore, usePages } from '../../components/ShowMore';
import { formatInstant } from '../../dates';

export interface Revision {
  at: string;
  note: string;
  counted: boolean;
  /** What the revision said, formatted for its type ("85%", "A 60% · B 40%", "P10 3 · P90 9"). */
  said: string;
}

/** Revisions shown at first (the latest), and how many each "Show earlier" adds. */
const FIRST_SHOWN = 10;
const EARLIER_PAGE = 50;

/**
 * `figures`: 'probability' for a yes/no question's one number (right-aligned, as numbers
 * are), 'typed' for a choice or numeric question's list.
 */
export function RevisionTable({ revisions, timeZone, figures }: { revisions: Revision[]; timeZone: string; figures: 'probability' | 'typed' }) {
  // After "Show earlier", focus moves to the earliest row now shown: reading on goes forward in time.
  const body = useRef<HTMLTableSectionElement>(null);
  const { shown, more } = usePages(EARLIER_PAGE, () => body.current?.rows[0]?.querySelector<HTMLElement>('td'), FIRST_SHOWN);
  const from = Math.max(0, revisions.length - shown);
  return (
    <>
      <ShowMore shown={revisions.length - from} total={revisions.length} page={EARLIER_PAGE} direction="earlier" onMore={more} />
      <table className="hs-revisions" data-testid="revisions">
        <caption className="hs-revisions__caption">{from === 0 ? 'Every revision' : 'The latest revisions'}, with what you wrote at the time</caption>
        <thead>
          <tr>
            <th scope="col">When</th>
            <th scope="col" className={figures === 'probability' ? 'num' : undefined}>
              You said
            </th>
            <th scope="col">Note</th>
          </tr>
        </thead>
        <tbody ref={body}>
          {revisions.slice(from).map((f, i) => (
            <tr key={from + i} className={f.counted ? undefined : 'hs-revisions__late'} data-counted={f.counted ? 'true' : 'false'}>
              <td className="nowrap" tabIndex={-1}>
                {formatInstant(f.at, timeZone, false)}
                {f.counted ? null : (
                  <span className="hs-revisions__late-mark">
                    <Badge tone="amber">late, not scored</Badge>
                  </span>
                )}
              </td>
              <td className={figures === 'probability' ? 'num hs-revisions__p' : 'hs-revisions__said'}>{f.said}</td>
              <td className="hs-revisions__note note" data-testid="revision-note">
                {f.note ? f.note : <span className="muted">No note written.</span>}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </>
  );
}
