/**
 * The page of a choice or numeric question: its definition, where it stands, the history
 * (one line per option, or the range band with its median) with the tables beside it, and
 * everything that can be done to it. The yes/no page (QuestionScreen) keeps its own figures
 * and tools, which read a single probability.
 */
import { useState } from 'react';
import type { Settings } from '../../../../shared/domain';
import { questionStatus } from '../../../../shared/domain';
import { toStoredValue } from '../../../../shared/numeric-value';
import { api } from '../../api/client';
import { diaryChanged } from '../../api/changes';
import { ChoiceHistoryChart } from '../../chart/ChoiceHistoryChart';
import { NumericHistoryChart } from '../../chart/NumericHistoryChart';
import { Badge } from '../../components/Badge';
import { Button } from '../../components/Button';
import { ConfirmDialog } from '../../components/ConfirmDialog';
import { StatusPill } from '../../components/StatusPill';
import { TextArea } from '../../components/TextArea';
import { formatInstant, zoneName } from '../../dates';
import { formatPercent } from '../../percent';
import { levelsText } from '../../questionTypes/definition';
import { choiceSummary, numericSummary } from '../../questionTypes/summaries';
import { useUndoToast } from '../../forgiving/undo';
import { hrefTo, navigate, questionPath } from '../../routing';
import { ResolutionHistory } from './ResolutionHistory';
import { SnoozeNote } from './SnoozeNote';
import { TypedEditDialog } from './TypedEditDialog';
import { TypedEntryDialog, type TypedQuestion } from './TypedEntryDialog';
import { TypedHistoryTables } from './TypedHistoryTables';
import { TypedResolveDialog, outcomeText } from './TypedResolveDialog';
import { choiceHistoryInput, latestEntry, numericHistoryInput } from './typedFacts';
import './typedQuestion.css';

type DialogName = 'revise' | 'reference' | 'resolve' | 'edit' | 'delete' | 'reopen';
type PendingDelete = { kind: 'forecast' | 'reference'; id: string } | null;

/** The latest forecast of either type in a few words ("Ambledene 60%", "13 weeks (9 – 20)"). */
function latestText(q: TypedQuestion, of: 'forecasts' | 'references'): string {
  if (q.type === 'choice') {
    const last = latestEntry(q[of].map((e, i) => ({ ...e, seq: 'seq' in e ? e.seq : i })));
    return last ? choiceSummary(q.options, last.probs) : '—';
  }
  const last = latestEntry(q[of].map((e, i) => ({ ...e, seq: 'seq' in e ? e.seq : i })));
  return last ? numericSummary(q.levels, last.quantiles.map((v) => toStoredValue(v, q.value_kind)), q.value_kind, q.unit) : '—';
}

export function TypedQuestionPage({ question: q, settings }: { question: TypedQuestion; settings: Settings }) {
  const undoToast = useUndoToast();
  const [dialog, setDialog] = useState<DialogName | null>(null);
  const [pendingDelete, setPendingDelete] = useState<PendingDelete>(null);
  const [reopenNote, setReopenNote] = useState('');
  const close = () => setDialog(null);
  const status = questionStatus(Date.parse(q.closes_at), q.resolution?.outcome ?? null, Date.now(), settings.closing_soon_hours);
  const zone = q.time_zone;
  const lastForecast = q.type === 'choice' ? latestEntry(q.forecasts) : latestEntry(q.forecasts);
  const lastReference = [...q.references].sort((a, b) => Date.parse(a.at) - Date.parse(b.at)).at(-1);
  const resolvedText = q.resolution ? outcomeText(q, q.resolution) : '';

  // As on the yes/no page: every change says what it did in a toast whose Undo takes it back.
  function saved(message: string, undo: string) {
    setDialog(null);
    setPendingDelete(null);
    diaryChanged();
    undoToast({ message, undo, title: q.title });
  }

  async function deleteQuestion() {
    const { undo } = await api.deleteQuestion({ id: q.id });
    navigate('questions');
    diaryChanged();
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

  return (
    <div className="screen question-page" data-question-type={q.type}>
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
        <section className="resolution-panel" aria-labelledby="resolution-heading" data-outcome={q.resolution.outcome === 'void' ? 'void' : 'yes'}>
          <div>
            <h2 id="resolution-heading" className="resolution-panel__title">
              {q.resolution.outcome === 'void' ? 'Resolved Void' : `Resolved: ${resolvedText}`}
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

      <section className="figures" aria-label="Key figures">
        <Figure
          label="Your forecast"
          value={latestText(q, 'forecasts')}
          detail={lastForecast ? `since ${formatInstant(lastForecast.at, zone, false)}` : 'none yet'}
          tone="ink"
        />
        {q.type === 'choice' ? (
          <Figure
            label="Option base rates"
            value={q.option_base_rates ? choiceSummary(q.options, q.option_base_rates) : '—'}
            detail={q.base_rate_note || (q.option_base_rates ? '' : 'not stated')}
          />
        ) : (
          <Figure label="Levels" value={levelsText(q.levels).split(' (')[0]!} detail={q.value_kind === 'date' ? 'dates' : q.unit ? `in ${q.unit}` : 'no unit'} />
        )}
        <Figure label="Latest reference" value={latestText(q, 'references')} detail={lastReference ? lastReference.source : 'none yet'} tone="amber" />
      </section>

      <section className="card" aria-labelledby="definition-heading">
        <h2 id="definition-heading" className="card__title">
          Definition
        </h2>
        <dl className="facts">
          <dt>Resolution rule</dt>
          <dd className="note">{q.rule || <span className="muted">Not written yet — add it with Edit.</span>}</dd>
          <dt>Type</dt>
          <dd>
            {q.type === 'choice' ? (
              <>
                Multiple choice{q.ordered ? ', ordered options' : ''} <span className="muted">(exactly one option comes true)</span>
              </>
            ) : (
              <>
                {q.value_kind === 'date' ? 'A date' : `A number${q.unit ? ` in ${q.unit}` : ''}`}, forecast as <span className="muted">{levelsText(q.levels)}</span>
              </>
            )}
          </dd>
          {q.type === 'choice' ? (
            <>
              <dt>Options</dt>
              <dd>
                <ol className="typed-options" data-testid="options-list">
                  {q.options.map((option, k) => (
                    <li key={k}>
                      <span className="user-text">{option}</span>
                      {q.option_base_rates ? <span className="muted"> — base rate {formatPercent(q.option_base_rates[k])}</span> : null}
                    </li>
                  ))}
                </ol>
              </dd>
            </>
          ) : null}
          <dt>Window</dt>
          <dd>
            <time dateTime={q.opened_at}>{formatInstant(q.opened_at, zone)}</time> → <time dateTime={q.closes_at}>{formatInstant(q.closes_at, zone)}</time>{' '}
            <span className="muted">({zoneName(zone)})</span>
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
            {q.type === 'choice' ? (
              <ChoiceHistoryChart input={choiceHistoryInput(q)} timeZone={zone} />
            ) : (
              <NumericHistoryChart input={numericHistoryInput(q)} timeZone={zone} />
            )}
          </div>
          <TypedHistoryTables
            question={q}
            onDeleteForecast={(id) => setPendingDelete({ kind: 'forecast', id })}
            onDeleteReference={(id) => setPendingDelete({ kind: 'reference', id })}
          />
        </div>
      </section>

      <TypedEntryDialog question={q} mode="forecast" open={dialog === 'revise'} onClose={close} onSaved={saved} />
      <TypedEntryDialog question={q} mode="reference" open={dialog === 'reference'} onClose={close} onSaved={saved} />
      <TypedResolveDialog question={q} open={dialog === 'resolve'} onClose={close} onSaved={saved} />
      <TypedEditDialog question={q} open={dialog === 'edit'} onClose={close} onSaved={saved} />
      <ConfirmDialog open={dialog === 'delete'} title="Delete this question?" confirmLabel="Delete question" onConfirm={deleteQuestion} onClose={close}>
        <p>
          “{q.title}” will be removed with its {q.forecasts.length} forecast{q.forecasts.length === 1 ? '' : 's'} and {q.references.length} reference
          forecast{q.references.length === 1 ? '' : 's'}. You can take it back with Undo in the message that follows.
        </p>
      </ConfirmDialog>
      <ConfirmDialog open={dialog === 'reopen'} title="Reopen this question?" confirmLabel="Reopen" tone="primary" onConfirm={reopen} onClose={close}>
        <p>
          The recorded resolution ({resolvedText || 'Void'}) is moved to the question’s resolution history, and the question waits for a resolution
          again.
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
        <p>It will be removed from the history. Undo in the message that follows brings it back.</p>
      </ConfirmDialog>
    </div>
  );
}

function Figure({ label, value, detail, tone }: { label: string; value: string; detail: string; tone?: 'ink' | 'amber' }) {
  return (
    <div className={`figure-tile ${tone ? `figure-tile--${tone}` : ''}`}>
      <span className="figure-tile__label">{label}</span>
      <span className="figure-tile__value figure-tile__value--text">{value}</span>
      <span className="figure-tile__detail">{detail}</span>
    </div>
  );
}
