/**
 * Hindsight: before a new engagement, the calls the user was confident about that went the
 * other way (and, on request, the ones that went their way), each with the notes written at
 * the time; beside them the same selection's calibration; and a printable briefing.
 *
 * The root carries `data-hindsight-ready`: "true" once the answer for the current choices is
 * on screen, "false" while one is on its way. Tests wait on it rather than on timing.
 */
import { useCallback, useId, useMemo, useRef, useState, type ReactNode } from 'react';
import { LIST_PAGE_MAX, type Hindsight, type HindsightEntry, type Request } from '../../../../shared/contract';
import { api } from '../../api/client';
import { describeError } from '../../api/errors';
import { useLoad } from '../../api/useLoad';
import { Button } from '../../components/Button';
import { EmptyState } from '../../components/EmptyState';
import { ShowMore } from '../../components/ShowMore';
import { ErrorBanner } from '../../components/ErrorBanner';
import { useDefaultTimeZone, useDiaryInfo } from '../../diaryInfo';
import { useDebounced, useDocumentTitle } from '../../hooks';
import { hrefTo, useQueryState } from '../../routing';
import { BriefingPreview } from './BriefingPreview';
import { CalibrationSummary } from './CalibrationSummary';
import { EntryCard } from './EntryCard';
import { HindsightFilters } from './HindsightFilters';
import { TypedEntrySections } from './TypedEntryCards';
import { DEFAULT_THRESHOLD_PERCENT, INITIAL_SELECTION, buildSelection, decodeSelection, encodeSelection, type HindsightSelection } from './selection';
import { confidentMeaning, wholePercent } from './wording';
import { viewTotals } from '../scorecard/format';
import './hindsight.css';
import { formatCount, plural } from '../../dates';

/** Dragging the slider or typing a date asks once it settles, not at every step. */
const SETTLE_MS = 150;

/**
 * Calls listed at first in each list, and added by each "Show more". Each is a card about a
 * screen tall (its history included), so ten fill the first ten screens; rendering twenty in
 * each of the three lists made a first visit to a large mixed diary wait for some 6,000 elements.
 */
const FIRST_PAGE = 10;
const ENTRY_PAGE = 20;

/** How many calls of each list (yes/no, choice, numeric) are asked for. */
type Shown = Record<'binary' | 'choice' | 'numeric', number>;
const FIRST_PAGES: Shown = { binary: FIRST_PAGE, choice: FIRST_PAGE, numeric: FIRST_PAGE };

/** A `hindsight` request lists at most LIST_PAGE_MAX calls of each list. */
const CAP = { at: LIST_PAGE_MAX, note: 'choose a tag or a date range above to see the others.' };

interface Asked {
  key: string;
  request: Request<'hindsight'>;
  selection: HindsightSelection;
}

function asked(selection: HindsightSelection, request: Request<'hindsight'> | null): Asked | null {
  return request ? { key: JSON.stringify(request), request, selection } : null;
}

export function HindsightScreen() {
  useDocumentTitle('Hindsight');
  const timeZone = useDefaultTimeZone();
  const [selection, change] = useQueryState(decodeSelection, encodeSelection);
  // How many calls are listed, of each list; its "Show more" adds a page.
  const [shown, setShown] = useState<Shown>(FIRST_PAGES);
  const built = useMemo(() => buildSelection(selection, timeZone), [selection, timeZone]);
  const wanted = useMemo(() => asked(selection, built.request), [selection, built.request]);

  // The last usable choices: while a field is half-typed the screen keeps showing them.
  const [active, setActive] = useState<Asked>(() => wanted ?? asked(INITIAL_SELECTION, buildSelection(INITIAL_SELECTION, timeZone).request)!);
  if (wanted && wanted.key !== active.key) {
    setActive(wanted);
    setShown(FIRST_PAGES);
  }
  const settled = useDebounced(active, SETTLE_MS);

  const loaded = useLoad(
    () =>
      api
        .hindsight({ ...settled.request, limit: shown.binary, choice_limit: shown.choice, numeric_limit: shown.numeric })
        .then((hindsight) => ({ key: settled.key, hindsight })),
    [settled.key, shown.binary, shown.choice, shown.numeric],
  );
  const list = useLoad(() => api.listTags({}), []);
  // How many times the briefing was asked for: each ask brings the open preview into view.
  const [briefingAsks, setBriefingAsks] = useState(0);
  const briefingButton = useRef<HTMLButtonElement>(null);
  const closeBriefing = useCallback(() => {
    setBriefingAsks(0);
    briefingButton.current?.focus();
  }, []);

  // An empty diary has nothing to brief on: the button says so rather than opening a blank document.
  const nothingToBrief = useDiaryInfo().data?.question_count === 0;
  const nothingToBriefId = useId();

  const current = loaded.data && loaded.data.key === active.key && !loaded.loading;
  const tag = settled.request.tag ?? '';
  const threshold = settled.request.threshold ?? DEFAULT_THRESHOLD_PERCENT / 100;

  return (
    <div className="screen hindsight" data-hindsight-ready={current ? 'true' : 'false'} aria-busy={loaded.loading || undefined}>
      <header className="screen__header hs-header">
        <div className="hs-header__text">
          <h1>Hindsight</h1>
          <p className="hs-lede">Calls you were confident about that went the other way, with what you wrote at the time.</p>
        </div>
        <div className="hs-header__briefing">
          <Button
            ref={briefingButton}
            variant="primary"
            onClick={() => setBriefingAsks((n) => n + 1)}
            disabled={nothingToBrief}
            aria-describedby={nothingToBrief ? nothingToBriefId : undefined}
          >
            {tag ? 'Briefing for this tag' : 'Briefing for the whole diary'}
          </Button>
          {nothingToBrief ? (
            <p className="hs-header__briefing-why" id={nothingToBriefId} data-testid="briefing-unavailable">
              Nothing to brief on yet: a briefing lists your confident misses and open questions. Write a question first.
            </p>
          ) : null}
        </div>
      </header>
      <p className="hs-caution" data-testid="caution">
        Scores describe past calls, not future ones. Small samples mislead: every count here shows its n.
      </p>
      <HindsightFilters selection={selection} tags={list.data?.tags ?? []} problems={built.problems} timeZone={timeZone} onChange={change} />
      {briefingAsks > 0 && !nothingToBrief ? <BriefingPreview tag={tag} threshold={threshold} focusSignal={briefingAsks} onClose={closeBriefing} /> : null}
      {loaded.error ? <ErrorBanner message={describeError(loaded.error)} onRetry={loaded.reload} /> : null}
      {loaded.data ? (
        <HindsightBody
          hindsight={loaded.data.hindsight}
          request={settled.request}
          selection={settled.selection}
          timeZone={timeZone}
          onMore={(list) => setShown((n) => ({ ...n, [list]: Math.min(LIST_PAGE_MAX, n[list] + ENTRY_PAGE) }))}
          busy={loaded.loading}
        />
      ) : loaded.error ? null : (
        <p className="muted" role="status">
          Looking back over your resolved questions…
        </p>
      )}
    </div>
  );
}

function describeSelection(selection: HindsightSelection): string {
  const range =
    selection.from && selection.to
      ? `, windows ending ${selection.from} to ${selection.to}`
      : selection.from
        ? `, windows ending on or after ${selection.from}`
        : selection.to
          ? `, windows ending on or before ${selection.to}`
          : '';
  return `${selection.tag ? `Tag ${selection.tag}` : 'All tags'}${range}`;
}

interface BodyProps {
  hindsight: Hindsight;
  /** The request the entries answer: its tag and dates choose the questions counted. */
  request: Request<'hindsight'>;
  selection: HindsightSelection;
  timeZone: string;
  onMore: (list: keyof Shown) => void;
  busy: boolean;
}



/**
 * "Here: 2 open, …" over every type, as the Scorecard counts them: the review's own counts are
 * yes/no only, and a diary of choice questions read "0 open". Read from the same selection's scorecard.
 */
function ViewCounts({ request }: { request: Request<'hindsight'> }) {
  const { tag, from, to } = request;
  const loaded = useLoad(() => api.score({ ...(tag ? { tag } : {}), ...(from ? { from } : {}), ...(to ? { to } : {}) }), [tag, from, to]);
  if (!loaded.data) return null;
  const totals = viewTotals(loaded.data.report);
  return (
    <p data-testid="hindsight-here">
      Here: {formatCount(totals.open)} open, {formatCount(totals.unscored)} resolved without a forecast before the window ended, {formatCount(totals.void)} void.
    </p>
  );
}

function HindsightBody({ hindsight, request, selection, timeZone, onMore, busy }: BodyProps) {
  const { report, threshold, entries } = hindsight;
  const moreButton = <ShowMore shown={hindsight.offset + entries.length} total={hindsight.misses + hindsight.hits} page={ENTRY_PAGE} onMore={() => onMore('binary')} busy={busy} cap={CAP} />;
  const filtered = selection.tag !== '' || selection.from !== '' || selection.to !== '';
  // The counts are yes/no counts; choice and numeric questions bring their own entries.
  const typedEntries = hindsight.choice_miss_count + hindsight.choice_hit_count + hindsight.numeric_surprise_count;
  if (report.scored === 0 && typedEntries === 0) {
    return (
      <EmptyState title={filtered ? 'Nothing scored in this selection' : 'Nothing scored yet'} actions={<a href={hrefTo('questions')}>Go to Questions</a>}>
        <p data-testid="nothing-scored">
          n = 0 scored questions{filtered ? ` (${describeSelection(selection)})` : ''}. Hindsight needs resolved questions with a forecast made
          before their window closed.
        </p>
        <ViewCounts request={request} />
      </EmptyState>
    );
  }
  const misses = entries.filter((e) => e.verdict === 'miss');
  const hits = entries.filter((e) => e.verdict === 'hit');
  const at = wholePercent(threshold);
  return (
    <div className="hs-layout">
      <div className="hs-list">
        {report.scored > 0 ? (
          <>
            <p className="hs-count" data-testid="hindsight-count">
              <strong>{plural(hindsight.misses, 'confident miss', 'confident misses')}</strong>
              {selection.includeHits ? (
                <>
                  {' '}
                  and <strong>{plural(hindsight.hits, 'confident hit', 'confident hits')}</strong>
                </>
              ) : null}{' '}
              among n = {formatCount(report.scored)} scored {report.scored === 1 ? 'question' : 'questions'}. Confident at {at}: a {confidentMeaning(threshold)}.
            </p>
            <EntrySection
              id="hs-misses"
              title="Confident misses"
              entries={misses}
              count={hindsight.misses}
              threshold={threshold}
              timeZone={timeZone}
              more={misses.length < hindsight.misses ? moreButton : null}
              empty={`No confident misses at ${at} in this selection — that is good news, or a small sample: n = ${formatCount(report.scored)}.`}
            />
            {selection.includeHits ? (
              <EntrySection
                id="hs-hits"
                title="Confident hits"
                entries={hits}
                count={hindsight.hits}
                threshold={threshold}
                timeZone={timeZone}
                more={misses.length === hindsight.misses ? moreButton : null}
                empty={`No confident hits at ${at} in this selection (n = ${formatCount(report.scored)}).`}
              />
            ) : null}
          </>
        ) : null}
        <TypedEntrySections
          hindsight={hindsight}
          includeHits={selection.includeHits}
          timeZone={timeZone}
          moreChoice={(listed, total) => <ShowMore shown={listed} total={total} page={ENTRY_PAGE} onMore={() => onMore('choice')} busy={busy} cap={CAP} />}
          moreNumeric={(listed, total) => <ShowMore shown={listed} total={total} page={ENTRY_PAGE} onMore={() => onMore('numeric')} busy={busy} cap={CAP} />}
        />
      </div>
      <aside className="hs-aside">
        <CalibrationSummary report={report} brierInterval={hindsight.brier_interval} subject={describeSelection(selection)} />
      </aside>
    </div>
  );
}

interface EntrySectionProps {
  id: string;
  title: string;
  /** The entries listed so far (a page or more). */
  entries: HindsightEntry[];
  /** How many the whole selection has. */
  count: number;
  /** The "Show more" control, when this section is where the listing stopped. */
  more: ReactNode;
  threshold: number;
  timeZone: string;
  empty: string;
}

function EntrySection({ id, title, entries, count, more, threshold, timeZone, empty }: EntrySectionProps) {
  return (
    <section className="hs-section" aria-labelledby={id} data-testid={id}>
      <h2 id={id} className="hs-section__title">
        {title} <span className="hs-section__n">({count})</span>
      </h2>
      {count ? (
        <>
          {entries.map((entry) => (
            <EntryCard key={entry.id} entry={entry} threshold={threshold} timeZone={timeZone} />
          ))}
          {more}
        </>
      ) : (
        <p className="hs-empty" data-testid="hindsight-empty">
          {empty}
        </p>
      )}
    </section>
  );
}
