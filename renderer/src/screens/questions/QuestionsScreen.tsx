/**
 * Questions: every call in the diary, filtered by status, tag and text. An empty diary offers
 * the example diary or a first question instead of an empty table.
 */
import { useState, type MouseEvent } from 'react';
import type { QuestionStatus, QuestionSummary } from '../../../../shared/domain';
import { QUESTION_STATUSES } from '../../../../shared/domain';
import { api } from '../../api/client';
import { diaryChanged } from '../../api/changes';
import { describeError } from '../../api/errors';
import { useLoad } from '../../api/useLoad';
import { Button } from '../../components/Button';
import { EmptyState } from '../../components/EmptyState';
import { ErrorBanner } from '../../components/ErrorBanner';
import { Select } from '../../components/Select';
import { StatusPill, statusLabel } from '../../components/StatusPill';
import { TextField } from '../../components/TextField';
import { useToast } from '../../components/Toast';
import { formatInstant } from '../../dates';
import { useDiaryInfo } from '../../diaryInfo';
import { useDebounced, useDocumentTitle } from '../../hooks';
import { formatPercent } from '../../percent';
import { hrefTo, navigate, questionPath } from '../../routing';
import { QUICK_ADD_ARIA_SHORTCUTS, QUICK_ADD_SHORTCUT_TEXT, useQuickAdd } from './quickAdd';
import { lastForecastText } from '../../questionTypes/summaries';

type StatusFilter = QuestionStatus | 'all';

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
      toast.show({ message: `Loaded the example diary: ${added} questions from an invented freight-consulting engagement.` });
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
      <p>Or look around first with an example diary from an invented scenario; you can delete its questions whenever you like.</p>
    </EmptyState>
  );
}

function QuestionList() {
  const [status, setStatus] = useState<StatusFilter>('all');
  const [tag, setTag] = useState('');
  const [text, setText] = useState('');
  const search = useDebounced(text.trim(), 250);

  const list = useLoad(
    () =>
      api.listQuestions({
        ...(status !== 'all' ? { status } : {}),
        ...(tag ? { tag } : {}),
        ...(search ? { text: search } : {}),
      }),
    [status, tag, search],
  );

  const tagOptions = [
    { value: '', label: 'All tags' },
    ...(list.data?.tags ?? []).map((t) => ({ value: t.tag, label: `${t.tag} (${t.count})` })),
  ];
  // Keep a chosen tag selectable even when the current filters leave no question carrying it.
  if (tag && !tagOptions.some((o) => o.value === tag)) tagOptions.push({ value: tag, label: tag });
  const filtered = status !== 'all' || tag !== '' || search !== '';

  return (
    <>
      <div role="search" className="filters" aria-label="Filter questions">
        <TextField label="Search" type="search" value={text} onChange={setText} placeholder="Title, rule or note" className="filters__search" />
        <Select label="Status" value={status} options={STATUS_OPTIONS} onChange={(v) => setStatus(v as StatusFilter)} />
        <Select label="Tag" value={tag} options={tagOptions} onChange={setTag} />
      </div>
      {list.error ? <ErrorBanner message={describeError(list.error)} onRetry={list.reload} /> : null}
      {list.data ? (
        list.data.questions.length === 0 ? (
          <EmptyState
            title="No questions match"
            actions={
              filtered ? (
                <Button
                  onClick={() => {
                    setStatus('all');
                    setTag('');
                    setText('');
                  }}
                >
                  Clear filters
                </Button>
              ) : undefined
            }
          >
            <p>Nothing in the diary fits these filters.</p>
          </EmptyState>
        ) : (
          <QuestionTable questions={list.data.questions} total={list.data.total} busy={list.loading} />
        )
      ) : null}
    </>
  );
}

function QuestionTable({ questions, total, busy }: { questions: QuestionSummary[]; total: number; busy: boolean }) {
  return (
    <div className="table-card" aria-busy={busy || undefined}>
      <table className="question-table" data-testid="question-table">
        <caption className="table-card__caption">
          {questions.length === total ? `${total} questions` : `${questions.length} of ${total} questions`}
        </caption>
        <thead>
          <tr>
            <th scope="col">Question</th>
            <th scope="col">Status</th>
            <th scope="col">Closes</th>
            <th scope="col" className="num">
              Last forecast
            </th>
            <th scope="col" className="num">
              Base rate
            </th>
          </tr>
        </thead>
        <tbody>
          {questions.map((q) => (
            <tr key={q.id} className="question-row" onClick={(event) => openRow(event, q.id)}>
              <td>
                <a href={hrefTo(questionPath(q.id))} className="question-row__title">
                  {q.title}
                </a>
                {q.tags.length > 0 ? (
                  <span className="question-row__tags">
                    <span className="visually-hidden">Tags: </span>
                    {q.tags.join(' · ')}
                  </span>
                ) : null}
              </td>
              <td>
                <StatusPill status={q.status} outcome={q.outcome} />
              </td>
              <td className="nowrap">
                <time dateTime={q.closes_at}>{formatInstant(q.closes_at, q.time_zone)}</time>
              </td>
              <td className="num">{lastForecastText(q)}</td>
              <td className="num">{formatPercent(q.base_rate)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** A click anywhere on a row opens the question; the title link is the keyboard route. */
function openRow(event: MouseEvent, id: string) {
  if ((event.target as HTMLElement).closest('a, button')) return;
  navigate(questionPath(id));
}
