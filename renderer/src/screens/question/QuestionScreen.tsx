/**
 * One question: its definition, where it stands, its probability history (chart and tables),
 * the history of its resolution, and everything that can be done to it. Each change reloads
 * the page's data and says so in a toast whose Undo takes it back.
 */
import { useState } from 'react';
import type { BinaryQuestion, Settings } from '../../../../shared/domain';
import { questionStatus } from '../../../../shared/domain';
import { api } from '../../api/client';
import { diaryChanged } from '../../api/changes';
import { RequestError, describeError } from '../../api/errors';
import { useLoad } from '../../api/useLoad';
import { HistoryChart } from '../../chart/HistoryChart';
import { Badge } from '../../components/Badge';
import { Button } from '../../components/Button';
import { ConfirmDialog } from '../../components/ConfirmDialog';
import { EmptyState } from '../../components/EmptyState';
import { ErrorBanner } from '../../components/ErrorBanner';
import { OUTCOME_LABELS, StatusPill } from '../../components/StatusPill';
import { TextArea } from '../../components/TextArea';
import { formatInstant, zoneName } from '../../dates';
import { useUndoToast } from '../../forgiving/undo';
import { useDocumentTitle } from '../../hooks';
import { formatPercent } from '../../percent';
import { hrefTo, navigate, questionPath } from '../../routing';
import { ReferenceLeadNote } from '../../tools/ReferenceLeadNote';
import { StaleNotice } from '../../tools/StaleNotice';
import type { ScreenProps } from '../registry';
import { EditDialog } from './EditDialog';
import { HistoryTables } from './HistoryTables';
import { KIND_HINTS, KIND_LABELS } from './labels';
import { lastForecast } from './questionFacts';
import { ReferenceDialog } from './ReferenceDialog';
import { ResolutionHistory } from './ResolutionHistory';
import { ResolveDialog } from './ResolveDialog';
import { TypedQuestionPage } from './TypedQuestionPage';
import { ReviseDialog } from './ReviseDialog';
import { SnoozeNote } from './SnoozeNote';

type DialogName = 'revise' | 'reference' | 'resolve' | 'edit' | 'delete' | 'reopen';
type PendingDelete = { kind: 'forecast' | 'reference'; id: string } | null;

export function QuestionScreen({ params }: ScreenProps) {
  const id = params.id ?? '';
  const loaded = useLoad(() => Promise.all([api.getQuestion({ id }), api.getSettings({})]), [id]);
  const question = loaded.data?.[0];
  useDocumentTitle(question && question.id === id ? question.title : 'Question');

  if (loaded.error && !(question && question.id === id)) {
    if (loaded.error instanceof RequestError && loaded.error.code === 'not_found') {
      return (
        <div className="screen">
          <EmptyState title="This question is not in the diary" actions={<a href={hrefTo('questions')}>Back to Questions</a>}>
            <p>It may have been deleted. The list shows every question the diary holds.</p>
          </EmptyState>
        </div>
      );
    }
    return (
      <div className="screen">
        <ErrorBanner message={describeError(loaded.error)} onRetry={loaded.reload} />
      </div>
    );
  }
  if (!loaded.data || !question || question.id !== id) return <div className="screen" aria-busy="true" />;
  if (question.type !== 'binary') return <TypedQuestionPage question={question} settings={loaded.data[1]} />;
  return <QuestionPage question={question} settings={loaded.data[1]} />;
}

function QuestionPage({ question: q, settings }: { question: BinaryQuestion; settings: Settings }) {
  const undoToast = useUndoToast();
  const [dialog, setDialog] = useState<DialogName | null>(null);
  const [pendingDelete, setPendingDelete] = useState<PendingDelete>(null);
  const [reopenNote, setReopenNote] = useState('');
  const close = () => setDialog(null);

  const status = questionStatus(Date.parse(q.closes_at), q.resolution?.outcome ?? null, Date.now(), settings.closing_soon_hours);
  const last = lastForecast(q);
  const lastReference = [...q.references].sort((a, b) => Date.parse(a.at) - Date.parse(b.at)).at(-1);
  const zone = q.time_zone;

  function saved(message: string, undo: string) {
    setDialog(null);
    setPendingDelete(null);
    diaryChanged();
    undoToast({ message, undo, title: q.title });
  }

  async function deleteQuestion() {
    const { undo } = await api.deleteQuestion({ id: q.id });
    // Leave the page before announcing the change, so it does not reload a deleted question.
    navigate('questions');
    diaryChanged();
    // Undo brings the question back whole; the page it was deleted from comes back with it.
    undoToast({ message: `Deleted “${q.title}”.`, undo, title: q.title, afterUndo: () => navigate(questionPath(q.id)) });
  }

  async function deletePending() {
    if (!pendingDelete) return;
    const { undo } = pendingDelete.kind === 'forecast' ? await api.deleteForecast({ id: pendingDelete.id }) : await api.deleteReference({ id: pendingDelete.id });
    saved(pendingDelete.kind === 'forecast' ? 'Revision deleted.' : 'Reference forecast deleted.', undo);
  }

  async function reopen() {
    const { undo } = await api.reopenQuestion({ id: q.id, ...(reopenNote.trim() ? { note: reopenNote } : {}) });
    setReopenNote('');
    saved('Reopened; the question awaits a resolution again.', undo);
  }

  const pendingForecast = pendingDelete?.kind === 'forecast' ? q.forecasts.find((f) => f.id === pendingDelete.id) : undefined;
  const pendingReference = pendingDelete?.kind === 'reference' ? q.references.find((r) => r.id === pendingDelete.id) : undefined;

  return (
    <div className="screen question-page">
      <nav aria-label="Breadcrumb" className="breadcrumb">
        <a href={hrefTo('questions')}>Questions</a>
      </nav>
      <header className="question-head">
        <div className="question-head__title">
          <h1>{q.title}</h1>
          <StatusPill status={status} outcome={q.resolution?.outcome ?? null} />
        </div>
        <div className="toolbar" aria-label="Question actions" role="group">
          {q.resolution === null ? (
            <>
              <Button variant="primary" onClick={() => setDialog('revise')}>
                Revise
              </Button>
              <Button onClick={() => setDialog('reference')}>Add reference</Button>
              <Button onClick={() => setDialog('resolve')}>Resolve</Button>
            </>
          ) : null}
          <Button onClick={() => setDialog('edit')}>Edit</Button>
          <Button variant="ghost" className="btn--danger-text" onClick={() => setDialog('delete')}>
            Delete
          </Button>
        </div>
      </header>

      {q.resolution ? (
        <section className="resolution-panel" aria-labelledby="resolution-heading" data-outcome={q.resolution.outcome}>
          <div>
            <h2 id="resolution-heading" className="resolution-panel__title">
              Resolved {OUTCOME_LABELS[q.resolution.outcome]}
              <span className="resolution-panel__when"> on {formatInstant(q.resolution.at, zone)}</span>
            </h2>
            {q.resolution.note ? <p className="note">{q.resolution.note}</p> : null}
            {q.resolution.outcome === 'void' ? <p className="muted">Void questions are never scored.</p> : null}
          </div>
          <div className="toolbar">
            <Button onClick={() => setDialog('resolve')}>Correct</Button>
            <Button onClick={() => setDialog('reopen')}>Reopen</Button>
          </div>
        </section>
      ) : null}

      <ResolutionHistory question={q} />

      <SnoozeNote question={q} />

      <StaleNotice question={q} settings={settings} onRevise={() => setDialog('revise')} />

      <section className="figures" aria-label="Key figures">
        <Figure label="Your forecast" value={formatPercent(last?.p)} detail={last ? `since ${formatInstant(last.at, zone, false)}` : 'none yet'} tone="ink" />
        <Figure label="Base rate" value={formatPercent(q.base_rate)} detail={q.base_rate_note || (q.base_rate === null ? 'not stated' : '')} />
        <Figure
          label="Latest reference"
          value={formatPercent(lastReference?.p)}
          detail={lastReference ? lastReference.source : 'none yet'}
          tone="amber"
        />
      </section>

      <ReferenceLeadNote question={q} />

      <section className="card" aria-labelledby="definition-heading">
        <h2 id="definition-heading" className="card__title">
          Definition
        </h2>
        <dl className="facts">
          <dt>Resolution rule</dt>
          <dd className="note">{q.rule || <span className="muted">Not written yet — add it with Edit.</span>}</dd>
          <dt>Kind</dt>
          <dd>
            {KIND_LABELS[q.kind]} <span className="muted">({KIND_HINTS[q.kind]})</span>
          </dd>
          <dt>Window</dt>
          <dd>
            <time dateTime={q.opened_at}>{formatInstant(q.opened_at, zone)}</time> → <time dateTime={q.closes_at}>{formatInstant(q.closes_at, zone)}</time>{' '}
            <span className="muted">({zoneName(zone)})</span>
          </dd>
          <dt>Base rate</dt>
          <dd>
            {q.base_rate === null ? <span className="muted">Not stated</span> : formatPercent(q.base_rate)}
            {q.base_rate_note ? <span className="muted"> — {q.base_rate_note}</span> : null}
          </dd>
          <dt>Tags</dt>
          <dd>
            {q.tags.length ? (
              <span className="tag-row">
                {q.tags.map((t) => (
                  <Badge key={t}>{t}</Badge>
                ))}
              </span>
            ) : (
              <span className="muted">None</span>
            )}
          </dd>
          <dt>Costs</dt>
          <dd>
            {q.costs ? (
              <>
                False-alarm cost {q.costs.false_alarm} · Miss cost {q.costs.miss}
              </>
            ) : (
              <span className="muted">
                Diary defaults (false-alarm cost {settings.default_false_alarm_cost} · miss cost {settings.default_miss_cost})
              </span>
            )}
          </dd>
          <dt>Check-ins</dt>
          <dd>
            {q.checkin_days === null ? (
              <span className="muted">Diary default (every {settings.default_checkin_days} days)</span>
            ) : q.checkin_days === 0 ? (
              'None'
            ) : (
              `Every ${q.checkin_days} day${q.checkin_days === 1 ? '' : 's'}`
            )}
          </dd>
        </dl>
      </section>

      <section className="history" aria-labelledby="history-heading">
        <h2 id="history-heading">Forecast history</h2>
        <div className="history__grid">
          <div className="card history__chart">
            <HistoryChart question={q} />
          </div>
          <HistoryTables
            question={q}
            onDeleteForecast={(id) => setPendingDelete({ kind: 'forecast', id })}
            onDeleteReference={(id) => setPendingDelete({ kind: 'reference', id })}
          />
        </div>
      </section>

      <ReviseDialog question={q} open={dialog === 'revise'} onClose={close} onSaved={saved} />
      <ReferenceDialog question={q} open={dialog === 'reference'} onClose={close} onSaved={saved} />
      <ResolveDialog question={q} open={dialog === 'resolve'} onClose={close} onSaved={saved} />
      <EditDialog question={q} open={dialog === 'edit'} onClose={close} onSaved={saved} />
      <ConfirmDialog open={dialog === 'delete'} title="Delete this question?" confirmLabel="Delete question" onConfirm={deleteQuestion} onClose={close}>
        <p>
          “{q.title}” will be removed with its {q.forecasts.length} forecast{q.forecasts.length === 1 ? '' : 's'} and {q.references.length} reference
          forecast{q.references.length === 1 ? '' : 's'}. You can take it back with Undo in the message that follows.
        </p>
      </ConfirmDialog>
      <ConfirmDialog open={dialog === 'reopen'} title="Reopen this question?" confirmLabel="Reopen" tone="primary" onConfirm={reopen} onClose={close}>
        <p>
          The recorded resolution ({q.resolution ? OUTCOME_LABELS[q.resolution.outcome] : ''}) is moved to the question’s resolution history, and the question waits
          for a resolution again.
        </p>
        <TextArea label="Why reopen" value={reopenNote} onChange={setReopenNote} rows={2} hint="Optional; kept in the history beside the resolution it removes." />
      </ConfirmDialog>
      <ConfirmDialog
        open={pendingDelete !== null}
        title={pendingDelete?.kind === 'reference' ? 'Delete this reference forecast?' : 'Delete this revision?'}
        confirmLabel="Delete"
        onConfirm={deletePending}
        onClose={() => setPendingDelete(null)}
      >
        <p>
          {pendingForecast
            ? `Your ${formatPercent(pendingForecast.p)} of ${formatInstant(pendingForecast.at, zone)} will be removed from the history. Undo in the message that follows brings it back.`
            : pendingReference
              ? `${pendingReference.source}’s ${formatPercent(pendingReference.p)} of ${formatInstant(pendingReference.at, zone)} will be removed. Undo in the message that follows brings it back.`
              : ''}
        </p>
      </ConfirmDialog>
    </div>
  );
}

function Figure({ label, value, detail, tone }: { label: string; value: string; detail: string; tone?: 'ink' | 'amber' }) {
  return (
    <div className={`figure-tile ${tone ? `figure-tile--${tone}` : ''}`}>
      <span className="figure-tile__label">{label}</span>
      <span className="figure-tile__value">{value}</span>
      <span className="figure-tile__detail">
        {detail}
      </span>
    </div>
  );
}
