/**
 * One confident call: what was asked and by which rule, the final number against what
 * happened, and its revisions with the note written at the time (the latest first in view,
 * the rest a press away) — the notes are why the review exists, so they get the most room. Revisions made after the window end are shown
 * but marked: they never count towards a score.
 */
import { useId } from 'react';
import type { HindsightEntry } from '../../../../shared/contract';
import { Badge } from '../../components/Badge';
import { RevisionTable } from './RevisionTable';
import { formatInstant } from '../../dates';
import { hrefTo, questionPath } from '../../routing';
import { PathSparkline } from './PathSparkline';
import { verdictSentence, wholePercent } from './wording';

export interface EntryCardProps {
  entry: HindsightEntry;
  threshold: number;
  timeZone: string;
}

export function EntryCard({ entry, threshold, timeZone }: EntryCardProps) {
  const headingId = useId();
  const outcome = entry.outcome === 'yes' ? 'Yes' : 'No';
  return (
    <article className={`hs-entry hs-entry--${entry.verdict}`} aria-labelledby={headingId} data-testid="hindsight-entry" data-id={entry.id} data-verdict={entry.verdict}>
      <header className="hs-entry__head">
        <Badge tone={entry.verdict === 'miss' ? 'danger' : 'success'}>{entry.verdict === 'miss' ? 'Confident miss' : 'Confident hit'}</Badge>
        <h3 id={headingId} className="hs-entry__title">
          <a href={hrefTo(questionPath(entry.id))}>{entry.title}</a>
        </h3>
        {entry.tags.length ? <p className="hs-entry__tags">{entry.tags.join(' · ')}</p> : null}
      </header>

      <div className="hs-entry__verdict">
        <p className="hs-entry__sentence" data-testid="verdict-sentence">
          {verdictSentence(entry.final_p, entry.outcome)}
        </p>
        <PathSparkline entry={entry} threshold={threshold} />
      </div>

      <dl className="hs-entry__facts">
        <div>
          <dt>Window ended</dt>
          <dd>{formatInstant(entry.window_end, timeZone)}</dd>
        </div>
        <div>
          <dt>Base rate</dt>
          <dd>{entry.base_rate === null ? 'not stated' : wholePercent(entry.base_rate)}</dd>
        </div>
        <div>
          <dt>Final forecast</dt>
          <dd>{wholePercent(entry.final_p)}</dd>
        </div>
        <div>
          <dt>Outcome</dt>
          <dd>{outcome}</dd>
        </div>
      </dl>

      {entry.rule ? (
        <p className="hs-entry__rule">
          <span className="hs-label">Rule</span> {entry.rule}
        </p>
      ) : null}

      <RevisionTable
        revisions={entry.forecasts.map((f) => ({ at: f.at, note: f.note, counted: f.counted, said: wholePercent(f.p) }))}
        timeZone={timeZone}
        figures="probability"
      />

      <div className="hs-entry__resolution">
        <p className="hs-entry__resolved">
          <span className="hs-label">Resolved {outcome}</span> {formatInstant(entry.resolution.at, timeZone)}
        </p>
        {entry.resolution.note ? (
          <p className="note" data-testid="resolution-note">
            {entry.resolution.note}
          </p>
        ) : (
          <p className="muted">No resolution note.</p>
        )}
      </div>
    </article>
  );
}
