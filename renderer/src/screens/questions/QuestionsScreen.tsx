/**
 * Questions: every call in the diary, filtered by status, tag and text. An empty diary offers
 * the example diary or a first question instead of an empty table.
 */
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { LIST_SORTS, type ListSort, type SortDirection } from '../../../../shared/contract';
import { QUESTION_STATUSES } from '../../../../shared/domain';
import { SEARCH_MAX_CHARS } from '../../../../shared/validation';
import { api } from '../../api/client';
import { diaryChanged } from '../../api/changes';
import { describeError } from '../../api/errors';
import { Button } from '../../components/Button';
import { EmptyState } from '../../components/EmptyState';
import { ErrorBanner } from '../../components/ErrorBanner';
import { Select } from '../../components/Select';
import { statusLabel } from '../../components/StatusPill';
import { TextField } from '../../components/TextField';
import { useToast } from '../../components/Toast';
import { useDiaryInfo } from '../../diaryInfo';
import { useDocumentTitle } from '../../hooks';
import { parseRoute, replaceQuery, useQueryState, useRoute } from '../../routing';
import { decodeListQuery, encodeListQuery, isFiltered, nextSort, rememberList, rememberedList, type StatusFilter } from './listQuery';
import { QuestionTable } from './QuestionTable';
import { useQuestionPages } from './useQuestionPages';
import { QUICK_ADD_ARIA_SHORTCUTS, QUICK_ADD_SHORTCUT_TEXT, useQuickAdd } from './quickAdd';
import { formatCount } from '../../dates';

const STATUS_OPTIONS = [
  { value: 'all', label: 'All' },
  ...QUESTION_STATUSES.map((status) => ({ value: status, label: statusLabel(status) })),
];

export function QuestionsScreen() {
  const info = useDiaryInfo();
  const quickAdd = useQuickAdd();
  useDocumentTitle('Questions');

  const newButton = (
    <Button variant="primary" onClick={quickAdd.open} title={`New question (${QUICK_ADD_SHORTCUT_TEXT})`} aria-keyshortcuts={QUICK_ADD_ARIA_SHORTCUTS}>
      New question <kbd aria-hidden="true">N</kbd>
    </Button>
  );

  return (
    <div className="screen">
      <header className="screen__header">
        <h1>Questions</h1>
        {info.data && info.data.question_count > 0 ? newButton : null}
      </header>
      {info.error && !info.data ? <ErrorBanner message={describeError(info.error)} onRetry={info.reload} /> : null}
      {info.data ? info.data.question_count === 0 ? <FirstRun onNew={quickAdd.open} /> : <QuestionList /> : null}
    </div>
  );
}

function FirstRun({ onNew }: { onNew: () => void }) {
  const toast = useToast();
  const [busy, setBusy] = useState(false);
  async function loadExample() {
    setBusy(true);
    try {
      const { added } = await api.loadDemo({});
      diaryChanged();
      toast.show({ message: `Loaded the example diary: ${formatCount(added)} questions from an invented freight-consulting engagement.` });
    } catch (error) {
      toast.show({ tone: 'error', message: describeError(error) });
    } finally {
      setBusy(false);
    }
  }
  return (
    <EmptyState
      title="Your diary is empty"
      actions={
        <>
          <Button variant="primary" onClick={loadExample} busy={busy}>
            Load the example diary
          </Button>
          <Button onClick={onNew} title={`New question (${QUICK_ADD_SHORTCUT_TEXT})`} aria-keyshortcuts={QUICK_ADD_ARIA_SHORTCUTS}>
            Write your first question
          </Button>
        </>
      }
    >
      <p>Write down a call you are making — a question, when it closes, the base rate and your probability — and revise it as evidence arrives.</p>
      <p>Or look around first with an example diary from an invented scenario; when you are done, Settings removes it in one step and keeps your own questions.</p>
    </EmptyState>
  );
}

function QuestionList() {
  const [query, change] = useQueryState(decodeListQuery, encodeListQuery);
  const typed = query.text.trim();
  // A longer search (a pasted paragraph) is searched for by its start, and the box says so,
  // rather than refused with the diary's limit as an error over an unfiltered list.
  const search = typed.length > SEARCH_MAX_CHARS ? typed.slice(0, SEARCH_MAX_CHARS).replace(/[\uD800-\uDBFF]$/, '').trim() : typed;
  const searchHint =
    typed.length > SEARCH_MAX_CHARS ? `A search reads up to ${formatCount(SEARCH_MAX_CHARS)} characters: this searches for the first ${formatCount(SEARCH_MAX_CHARS)} of ${formatCount(typed.length)}.` : undefined;
  const request = useMemo(
    () => ({
      ...(query.status !== 'all' ? { status: query.status } : {}),
      ...(query.tag ? { tag: query.tag } : {}),
      ...(search ? { text: search } : {}),
      sort: query.sort,
      direction: query.direction,
    }),
    [query.status, query.tag, search, query.sort, query.direction],
  );
  const pages = useQuestionPages(request);
  useListMemory(pages.key !== null);

  const tagOptions = [{ value: '', label: 'All tags' }, ...pages.tags.map((t) => ({ value: t.tag, label: `${t.tag} (${formatCount(t.count)})` }))];
  // Keep a chosen tag selectable even when the current filters leave no question carrying it.
  if (query.tag && !tagOptions.some((o) => o.value === query.tag)) tagOptions.push({ value: query.tag, label: query.tag });
  const onSort = useCallback((sort: ListSort) => change(nextSort(query, sort)), [change, query]);

  return (
    <>
      <div role="search" className="filters" aria-label="Filter questions">
        <TextField label="Search" type="search" value={query.text} onChange={(text) => change({ text })} placeholder="Title, rule or note" hint={searchHint} className="filters__search" />
        <Select label="Status" value={query.status} options={STATUS_OPTIONS} onChange={(v) => change({ status: v as StatusFilter })} />
        <Select label="Tag" value={query.tag} options={tagOptions} onChange={(tag) => change({ tag })} />
        <Select
          label="Order"
          value={`${query.sort}:${query.direction}`}
          options={ORDER_OPTIONS}
          onChange={(v) => {
            const [sort, direction] = v.split(':') as [ListSort, SortDirection];
            change({ sort, direction });
          }}
        />
      </div>
      {pages.error ? <ErrorBanner message={describeError(pages.error)} onRetry={pages.retry} /> : null}
      {pages.key !== null ? (
        pages.matched === 0 ? (
          <EmptyState
            title="No questions match"
            actions={isFiltered(query) ? <Button onClick={() => change({ text: '', status: 'all', tag: '' })}>Clear filters</Button> : undefined}
          >
            <p>Nothing in the diary fits these filters.</p>
          </EmptyState>
        ) : (
          <QuestionTable pages={pages} query={query} busy={pages.loading} onSort={onSort} />
        )
      ) : null}
    </>
  );
}

const SORT_LABELS: Record<ListSort, [string, string]> = {
  attention: ['Needs attention first', 'Needs attention last'],
  title: ['Title, A to Z', 'Title, Z to A'],
  status: ['Status, open first', 'Status, void first'],
  closes: ['Closes, soonest first', 'Closes, latest first'],
  last_p: ['Last forecast, lowest first', 'Last forecast, highest first'],
  base_rate: ['Base rate, lowest first', 'Base rate, highest first'],
};

const ORDER_OPTIONS = LIST_SORTS.flatMap((sort) => [
  { value: `${sort}:asc`, label: SORT_LABELS[sort][0] },
  { value: `${sort}:desc`, label: SORT_LABELS[sort][1] },
]);

/**
 * Remembers the list's address and scroll position when the user leaves it, and on coming
 * back brings them back: the address from the navigation bar (which has no filters in it),
 * the scroll position once the first rows are there to scroll over.
 */
function useListMemory(ready: boolean) {
  const route = useRoute();
  const search = route.query.toString();
  const restore = useRef(rememberedList());
  useEffect(() => {
    const memory = restore.current;
    if (memory && search === '' && memory.search !== '') replaceQueryString(memory.search);
    // Only on arrival: later changes of the address are the user's.
  }, []);
  useEffect(() => {
    if (!ready) return;
    const memory = restore.current;
    restore.current = null;
    // After the window's own move to the top of a newly opened screen (App).
    if (memory && memory.scrollY > 0) requestAnimationFrame(() => window.scrollTo(0, memory.scrollY));
  }, [ready]);
  const latest = useRef(search);
  latest.current = search;
  useEffect(() => {
    // Kept as the user scrolls: by the time the list unmounts, following a link to a question
    // has already moved the window to the top. Scrolls after the address left the list are not its own.
    let scrollY = window.scrollY;
    const onScroll = () => {
      if (parseRoute(window.location.hash).path === 'questions') scrollY = window.scrollY;
    };
    window.addEventListener('scroll', onScroll, { passive: true });
    return () => {
      window.removeEventListener('scroll', onScroll);
      rememberList(latest.current, scrollY);
    };
  }, []);
}

function replaceQueryString(search: string) {
  replaceQuery(Object.fromEntries(new URLSearchParams(search)));
}
