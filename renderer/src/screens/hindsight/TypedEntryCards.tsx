/**
 * Hindsight's cards for choice and numeric questions, beside the yes/no ones (EntryCard):
 * a choice question whose top choice was held at the threshold (a confident miss, or a hit
 * when asked for) and a numeric question whose outcome fell outside the widest range of the
 * final forecast (a surprise). Each shows the final forecast against what happened, and
 * every revision with the note written at the time; late revisions are marked, never scored.
 */
import { useId, type ReactNode } from 'react';
import type { Hindsight } from '../../../../shared/contract';
import type { ChoiceHindsightEntry, NumericHindsightEntry } from '../../../../shared/hindsight-entries';
import { toStoredValue } from '../../../../shared/numeric-value';
import { Badge } from '../../components/Badge';
import { RevisionTable, type Revision } from './RevisionTable';
import { formatCount, formatInstant } from '../../dates';
import { formatValue } from '../../forecastEntry/numericEntry';
import { numericSummary } from '../../questionTypes/summaries';
import { hrefTo, questionPath } from '../../routing';
import { choiceVerdictSentence, everyOption, surpriseSentence } from './typedWording';
import './typedEntries.css';

interface CardFrameProps {
  id: string;
  title: string;
  tags: string[];
  badge: ReactNode;
  verdict: string;
  kind: 'choice' | 'numeric';
  sentence: string;
  facts: [string, string][];
  rule: string;
  revisions: Revision[];
  resolved: string;
  resolution: { at: string; note: string };
  timeZone: string;
}

function CardFrame(p: CardFrameProps) {
  const headingId = useId();
  return (
    <article className={`hs-entry hs-entry--${p.verdict}`} aria-labelledby={headingId} data-testid={`hindsight-${p.kind}-entry`} data-id={p.id} data-verdict={p.verdict}>
      <header className="hs-entry__head">
        {p.badge}
        <h3 id={headingId} className="hs-entry__title">
          <a href={hrefTo(questionPath(p.id))}>{p.title}</a>
        </h3>
        {p.tags.length ? <p className="hs-entry__tags">{p.tags.join(' · ')}</p> : null}
      </header>
      <p className="hs-entry__sentence" data-testid="verdict-sentence">
        {p.sentence}
      </p>
      <dl className="hs-entry__facts">
        {p.facts.map(([term, value]) => (
          <div key={term}>
            <dt>{term}</dt>
            <dd>{value}</dd>
          </div>
        ))}
      </dl>
      {p.rule ? (
        <p className="hs-entry__rule">
          <span className="hs-label">Rule</span> {p.rule}
        </p>
      ) : null}
      <RevisionTable revisions={p.revisions} timeZone={p.timeZone} figures="typed" />
      <div className="hs-entry__resolution">
        <p className="hs-entry__resolved">
          <span className="hs-label">Resolved: {p.resolved}</span> {formatInstant(p.resolution.at, p.timeZone)}
        </p>
        {p.resolution.note ? (
          <p className="note" data-testid="resolution-note">
            {p.resolution.note}
          </p>
        ) : (
          <p className="muted">No resolution note.</p>
        )}
      </div>
    </article>
  );
}

export function ChoiceEntryCard({ entry: e, timeZone }: { entry: ChoiceHindsightEntry; timeZone: string }) {
  return (
    <CardFrame
      id={e.id}
      title={e.title}
      tags={e.tags}
      kind="choice"
      verdict={e.verdict}
      badge={<Badge tone={e.verdict === 'miss' ? 'danger' : 'success'}>{e.verdict === 'miss' ? 'Confident miss' : 'Confident hit'}</Badge>}
      sentence={choiceVerdictSentence(e)}
      facts={[
        ['Window ended', formatInstant(e.window_end, timeZone)],
        ['Option base rates', e.option_base_rates ? everyOption(e.options, e.option_base_rates) : 'not stated'],
        ['Final forecast', everyOption(e.options, e.final_probs)],
        ['Came true', e.options[e.outcome_option] ?? ''],
      ]}
      rule={e.rule}
      revisions={e.forecasts.map((f) => ({ ...f, said: everyOption(e.options, f.probs) }))}
      resolved={e.options[e.outcome_option] ?? ''}
      resolution={e.resolution}
      timeZone={timeZone}
    />
  );
}

export function SurpriseCard({ entry: e, timeZone }: { entry: NumericHindsightEntry; timeZone: string }) {
  const stored = (values: (number | string)[]) => values.map((v) => toStoredValue(v, e.value_kind));
  const show = (v: number | string) => formatValue(toStoredValue(v, e.value_kind), e.value_kind, e.unit);
  return (
    <CardFrame
      id={e.id}
      title={e.title}
      tags={e.tags}
      kind="numeric"
      verdict="miss"
      badge={<Badge tone="danger">Surprise</Badge>}
      sentence={surpriseSentence(e)}
      facts={[
        ['Window ended', formatInstant(e.window_end, timeZone)],
        ['Final forecast', numericSummary(e.levels, stored(e.final_quantiles), e.value_kind, e.unit)],
        ['Outcome', show(e.value)],
      ]}
      rule={e.rule}
      revisions={e.forecasts.map((f) => ({ ...f, said: numericSummary(e.levels, stored(f.quantiles), e.value_kind, e.unit) }))}
      resolved={show(e.value)}
      resolution={e.resolution}
      timeZone={timeZone}
    />
  );
}

function TypedSection({ id, title, children, n }: { id: string; title: string; n: number; children: ReactNode }) {
  return (
    <section className="hs-section" aria-labelledby={id} data-testid={id}>
      <h2 id={id} className="hs-section__title">
        {title} <span className="hs-section__n">({formatCount(n)})</span>
      </h2>
      {children}
    </section>
  );
}

interface TypedSectionsProps {
  hindsight: Hindsight;
  includeHits: boolean;
  timeZone: string;
  /** The "Show more" control for the choice list and for the numeric one (made by the screen, which knows the page size). */
  moreChoice: (listed: number, total: number) => ReactNode;
  moreNumeric: (listed: number, total: number) => ReactNode;
}

/**
 * The choice and numeric sections, after the yes/no ones: each appears only when it has an
 * entry, since the filter's counts of scored questions are yes/no counts. Each list comes a
 * page at a time (misses, then hits, for choice questions), with the whole selection's
 * count in its heading.
 */
export function TypedEntrySections({ hindsight, includeHits, timeZone, moreChoice, moreNumeric }: TypedSectionsProps) {
  const misses = hindsight.choice_entries.filter((e) => e.verdict === 'miss');
  const hits = includeHits ? hindsight.choice_entries.filter((e) => e.verdict === 'hit') : [];
  const surprises = hindsight.numeric_surprises;
  const choiceTotal = hindsight.choice_miss_count + (includeHits ? hindsight.choice_hit_count : 0);
  const choiceMore = moreChoice(misses.length + hits.length, choiceTotal);
  // The control sits where the listing stopped: among the misses while some are unlisted, else after the hits.
  const moreInMisses = misses.length < hindsight.choice_miss_count;
  return (
    <>
      {hindsight.choice_miss_count ? (
        <TypedSection id="hs-choice-misses" title="Multiple choice: confident misses" n={hindsight.choice_miss_count}>
          {misses.map((e) => (
            <ChoiceEntryCard key={e.id} entry={e} timeZone={timeZone} />
          ))}
          {moreInMisses ? choiceMore : null}
        </TypedSection>
      ) : null}
      {includeHits && hindsight.choice_hit_count ? (
        <TypedSection id="hs-choice-hits" title="Multiple choice: confident hits" n={hindsight.choice_hit_count}>
          {hits.map((e) => (
            <ChoiceEntryCard key={e.id} entry={e} timeZone={timeZone} />
          ))}
          {moreInMisses ? null : choiceMore}
        </TypedSection>
      ) : null}
      {hindsight.numeric_surprise_count ? (
        <TypedSection id="hs-surprises" title="Numbers and dates: surprises (outside your widest range)" n={hindsight.numeric_surprise_count}>
          {surprises.map((e) => (
            <SurpriseCard key={e.id} entry={e} timeZone={timeZone} />
          ))}
          {moreNumeric(surprises.length, hindsight.numeric_surprise_count)}
        </TypedSection>
      ) : null}
    </>
  );
}
