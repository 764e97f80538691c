/**
 * What the yes/no page (QuestionScreen) and the choice/numeric page (TypedQuestionPage)
 * share: the dialogs' state and the changes made from the page, each saying what it did in a
 * toast whose Undo takes it back; the head with its actions; the resolution panel; the key
 * figures; the facts every question has; the history section; and the confirmations.
 */
import { useEffect, useRef, useState, type ReactNode } from 'react';
import type { UndoResult } from '../../../../shared/contract';
import type { Question, QuestionStatus, Settings } from '../../../../shared/domain';
import { api } from '../../api/client';
import { diaryChanged } from '../../api/changes';
import { Badge } from '../../components/Badge';
import { Button } from '../../components/Button';
import { ConfirmDialog } from '../../components/ConfirmDialog';
import { StatusPill } from '../../components/StatusPill';
import { TextArea } from '../../components/TextArea';
import { formatInstant, zoneName } from '../../dates';
import { useUndoToast } from '../../forgiving/undo';
import { hrefTo, navigate, questionPath } from '../../routing';
import { reopenWording } from './questionFacts';
import type { TypedInDialog } from './questionForms';

type DialogName = 'revise' | 'reference' | 'resolve' | 'edit' | 'delete' | 'reopen';
type PendingDelete = { kind: 'forecast' | 'reference'; id: string } | null;

/** The page's open dialog, the revision or reference awaiting confirmation, and the changes. */
export function useQuestionActions(q: Pick<Question, 'id' | 'title' | 'closes_at' | 'time_zone'>) {
  const undoToast = useUndoToast();
  const [dialog, setDialog] = useState<DialogName | null>(null);
  const [pendingDelete, setPendingDelete] = useState<PendingDelete>(null);
  const [reopenNote, setReopenNote] = useState('');
  // A dialog opened again by an Undo: what it held, and the question as the undo left it (the
  // page's own copy is reloaded only after), so the form starts from both.
  const [restoring, setRestoring] = useState<{ dialog: DialogName; typed: TypedInDialog; question: Question } | null>(null);
  // Whether anything is open when an Undo comes: it never closes a dialog in use.
  const busy = useRef(false);
  useEffect(() => {
    busy.current = dialog !== null || pendingDelete !== null;
  }, [dialog, pendingDelete]);

  /** Says what was done, with its Undo; `again` gives back what was typed once it is undone, unless a dialog is in use by then. */
  function announce(message: string, undo: string, again?: (result: UndoResult) => void) {
    setDialog(null);
    setRestoring(null);
    setPendingDelete(null);
    diaryChanged();
    const afterUndo = again
      ? (result: UndoResult) => {
          if (!busy.current) again(result);
        }
      : undefined;
    undoToast({ message, undo, title: q.title, ...(afterUndo ? { afterUndo } : {}) });
  }

  function saved(message: string, undo: string, typed?: TypedInDialog) {
    const from = dialog;
    // Undoing a revision or a resolution opens its dialog again with what was typed (typed text is never thrown away).
    announce(
      message,
      undo,
      typed && from
        ? (result) => {
            if (!result.question) return;
            setRestoring({ dialog: from, typed, question: result.question });
            setDialog(from);
          }
        : undefined,
    );
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
    const note = reopenNote;
    const { undo } = await api.reopenQuestion({ id: q.id, ...(note.trim() ? { note } : {}) });
    setReopenNote('');
    // Undone, the question is resolved again and the confirmation opens again with why, as typed.
    announce(reopenWording(q, Date.now()).done, undo, () => {
      setReopenNote(note);
      setDialog('reopen');
    });
  }

  return {
    dialog,
    open: setDialog,
    close: () => {
      setDialog(null);
      setRestoring(null);
    },
    /** What the dialog `name` is given back after an Undo, if it is the one reopened. */
    restored: (name: DialogName) => (restoring?.dialog === name ? restoring.typed : undefined),
    /** The question as the Undo that reopened a dialog left it; null otherwise. */
    restoredQuestion: restoring?.question ?? null,
    pendingDelete,
    setPendingDelete,
    reopenNote,
    setReopenNote,
    saved,
    deleteQuestion,
    deletePending,
    reopen,
  };
}

type QuestionActions = ReturnType<typeof useQuestionActions>;

/** The breadcrumb, the title with its status, and the actions an open or resolved question offers. */
export function QuestionHead({ q, status, actions }: { q: Question; status: QuestionStatus; actions: QuestionActions }) {
  return (
    <>
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
              <Button variant="primary" onClick={() => actions.open('revise')}>
                Revise
              </Button>
              <Button onClick={() => actions.open('reference')}>Add reference</Button>
              <Button onClick={() => actions.open('resolve')}>Resolve</Button>
            </>
          ) : null}
          <Button onClick={() => actions.open('edit')}>Edit</Button>
          <Button variant="ghost" className="btn--danger-text" onClick={() => actions.open('delete')}>
            Delete
          </Button>
        </div>
      </header>
    </>
  );
}

interface ResolutionPanelProps {
  q: Question;
  /** The panel's colour: the outcome, or 'yes' for any typed outcome but Void. */
  tone: string;
  /** "Resolved Yes", "Resolved: Ambledene". */
  heading: string;
  actions: QuestionActions;
}

/** How a resolved question came out, when, the note, and the ways to correct or reopen it. */
export function ResolutionPanel({ q, tone, heading, actions }: ResolutionPanelProps) {
  if (!q.resolution) return null;
  return (
    <section className="resolution-panel" aria-labelledby="resolution-heading" data-outcome={tone}>
      <div>
        <h2 id="resolution-heading" className="resolution-panel__title">
          {heading}
          <span className="resolution-panel__when"> on {formatInstant(q.resolution.at, q.time_zone)}</span>
        </h2>
        {q.resolution.note ? <p className="note">{q.resolution.note}</p> : null}
        {q.resolution.outcome === 'void' ? <p className="muted">Void questions are never scored.</p> : null}
      </div>
      <div className="toolbar">
        <Button onClick={() => actions.open('resolve')}>Correct</Button>
        <Button onClick={() => actions.open('reopen')}>Reopen</Button>
      </div>
    </section>
  );
}

/** One key figure; `text` for a value in words (a choice or a range) rather than a percentage. */
export function Figure({ label, value, detail, tone, text }: { label: string; value: string; detail: string; tone?: 'ink' | 'amber'; text?: boolean }) {
  return (
    <div className={`figure-tile ${tone ? `figure-tile--${tone}` : ''}`}>
      <span className="figure-tile__label">{label}</span>
      <span className={text ? 'figure-tile__value figure-tile__value--text' : 'figure-tile__value'}>{value}</span>
      <span className="figure-tile__detail">{detail}</span>
    </div>
  );
}

/** The definition card; `children` are its facts as <dt>/<dd> pairs. */
export function DefinitionCard({ children }: { children: ReactNode }) {
  return (
    <section className="card" aria-labelledby="definition-heading">
      <h2 id="definition-heading" className="card__title">
        Definition
      </h2>
      <dl className="facts">{children}</dl>
    </section>
  );
}

export function RuleFact({ q }: { q: Question }) {
  return (
    <>
      <dt>Resolution rule</dt>
      <dd className="note">{q.rule || <span className="muted">Not written yet — add it with Edit.</span>}</dd>
    </>
  );
}

export function WindowFact({ q }: { q: Question }) {
  return (
    <>
      <dt>Window</dt>
      <dd>
        <time dateTime={q.opened_at}>{formatInstant(q.opened_at, q.time_zone)}</time> → <time dateTime={q.closes_at}>{formatInstant(q.closes_at, q.time_zone)}</time>{' '}
        <span className="muted">({zoneName(q.time_zone)})</span>
      </dd>
    </>
  );
}

export function TagsFact({ q }: { q: Question }) {
  return (
    <>
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
    </>
  );
}

export function CheckinsFact({ q, settings }: { q: Question; settings: Settings }) {
  return (
    <>
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
    </>
  );
}

/** The history chart with the tables of the same points beside it. */
export function HistorySection({ chart, tables }: { chart: ReactNode; tables: ReactNode }) {
  return (
    <section className="history" aria-labelledby="history-heading">
      <h2 id="history-heading">Forecast history</h2>
      <div className="history__grid">
        <div className="card history__chart">{chart}</div>
        {tables}
      </div>
    </section>
  );
}

interface ConfirmationsProps {
  q: Question;
  actions: QuestionActions;
  /** The recorded resolution in a word or two, for the reopen confirmation. */
  recorded: string;
  /** What deleting the pending revision or reference removes. */
  pendingText: string;
}

/** The confirmations before deleting the question, reopening it, or deleting one revision or reference. */
export function QuestionConfirmations({ q, actions, recorded, pendingText }: ConfirmationsProps) {
  const { dialog, close, pendingDelete } = actions;
  return (
    <>
      <ConfirmDialog open={dialog === 'delete'} title="Delete this question?" confirmLabel="Delete question" onConfirm={actions.deleteQuestion} onClose={close}>
        <p>
          “{q.title}” will be removed with its {q.forecasts.length} forecast{q.forecasts.length === 1 ? '' : 's'} and {q.references.length} reference
          forecast{q.references.length === 1 ? '' : 's'}. You can take it back with Undo in the message that follows.
        </p>
      </ConfirmDialog>
      <ConfirmDialog open={dialog === 'reopen'} title="Reopen this question?" confirmLabel="Reopen" tone="primary" onConfirm={actions.reopen} onClose={close}>
        <p>
          The recorded resolution ({recorded}) is moved to the question’s resolution history, and {reopenWording(q, Date.now()).effect}.
        </p>
        <TextArea label="Why reopen" value={actions.reopenNote} onChange={actions.setReopenNote} rows={2} hint="Optional; kept in the history beside the resolution it removes." />
      </ConfirmDialog>
      <ConfirmDialog
        open={pendingDelete !== null}
        title={pendingDelete?.kind === 'reference' ? 'Delete this reference forecast?' : 'Delete this revision?'}
        confirmLabel="Delete"
        onConfirm={actions.deletePending}
        onClose={() => actions.setPendingDelete(null)}
      >
        <p>{pendingText}</p>
      </ConfirmDialog>
    </>
  );
}
