/**
 * One question: its definition, where it stands, its probability history (chart and tables),
 * the history of its resolution, and everything that can be done to it. Each change reloads
 * the page's data and says so in a toast whose Undo takes it back.
 */
import type { BinaryQuestion, Settings } from '../../../../shared/domain';
import { questionStatus } from '../../../../shared/domain';
import { api } from '../../api/client';
import { RequestError, describeError } from '../../api/errors';
import { useLoad } from '../../api/useLoad';
import { HistoryChart } from '../../chart/HistoryChart';
import { EmptyState } from '../../components/EmptyState';
import { ErrorBanner } from '../../components/ErrorBanner';
import { OUTCOME_LABELS } from '../../components/StatusPill';
import { formatInstant } from '../../dates';
import { useDocumentTitle } from '../../hooks';
import { formatPercent } from '../../percent';
import { hrefTo } from '../../routing';
import { ReferenceLeadNote } from '../../tools/ReferenceLeadNote';
import { StaleNotice } from '../../tools/StaleNotice';
import type { ScreenProps } from '../registry';
import { EditDialog } from './EditDialog';
import { HistoryTables } from './HistoryTables';
import { KIND_HINTS, KIND_LABELS } from './labels';
import { lastForecast } from './questionFacts';
import {
  CheckinsFact,
  DefinitionCard,
  Figure,
  HistorySection,
  QuestionConfirmations,
  QuestionHead,
  ResolutionPanel,
  RuleFact,
  TagsFact,
  useQuestionActions,
  WindowFact,
} from './questionPage';
import { ReferenceDialog } from './ReferenceDialog';
import { ResolutionHistory } from './ResolutionHistory';
import { ResolveDialog } from './ResolveDialog';
import { TypedQuestionPage } from './TypedQuestionPage';
import { ReviseDialog } from './ReviseDialog';
import { SnoozeNote } from './SnoozeNote';

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
  const actions = useQuestionActions(q);
  const { dialog, close, saved, pendingDelete } = actions;
  // A dialog reopened by an Undo starts from the question as the undo left it.
  const back = actions.restoredQuestion;
  const dq = back && back.type === 'binary' ? back : q;
  const status = questionStatus(Date.parse(q.closes_at), q.resolution?.outcome ?? null, Date.now(), settings.closing_soon_hours);
  const last = lastForecast(q);
  const lastReference = [...q.references].sort((a, b) => Date.parse(a.at) - Date.parse(b.at)).at(-1);
  const zone = q.time_zone;

  const pendingForecast = pendingDelete?.kind === 'forecast' ? q.forecasts.find((f) => f.id === pendingDelete.id) : undefined;
  const pendingReference = pendingDelete?.kind === 'reference' ? q.references.find((r) => r.id === pendingDelete.id) : undefined;

  return (
    <div className="screen question-page">
      <QuestionHead q={q} status={status} actions={actions} />

      {q.resolution ? <ResolutionPanel q={q} tone={q.resolution.outcome} heading={`Resolved ${OUTCOME_LABELS[q.resolution.outcome]}`} actions={actions} /> : null}

      <ResolutionHistory question={q} />

      <SnoozeNote question={q} />

      <StaleNotice question={q} settings={settings} onRevise={() => actions.open('revise')} />

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

      <DefinitionCard>
        <RuleFact q={q} />
        <dt>Kind</dt>
        <dd>
          {KIND_LABELS[q.kind]} <span className="muted">({KIND_HINTS[q.kind]})</span>
        </dd>
        <WindowFact q={q} />
        <dt>Base rate</dt>
        <dd>
          {q.base_rate === null ? <span className="muted">Not stated</span> : formatPercent(q.base_rate)}
          {q.base_rate_note ? <span className="muted"> — {q.base_rate_note}</span> : null}
        </dd>
        <TagsFact q={q} />
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
        <CheckinsFact q={q} settings={settings} />
      </DefinitionCard>

      <HistorySection
        chart={<HistoryChart question={q} />}
        tables={
          <HistoryTables
            question={q}
            onDeleteForecast={(id) => actions.setPendingDelete({ kind: 'forecast', id })}
            onDeleteReference={(id) => actions.setPendingDelete({ kind: 'reference', id })}
          />
        }
      />

      <ReviseDialog question={dq} open={dialog === 'revise'} onClose={close} onSaved={saved} restored={actions.restored('revise')} />
      <ReferenceDialog question={dq} open={dialog === 'reference'} onClose={close} onSaved={saved} restored={actions.restored('reference')} />
      <ResolveDialog question={dq} open={dialog === 'resolve'} onClose={close} onSaved={saved} restored={actions.restored('resolve')} />
      <EditDialog question={q} open={dialog === 'edit'} onClose={close} onSaved={saved} />
      <QuestionConfirmations
        q={q}
        actions={actions}
        recorded={q.resolution ? OUTCOME_LABELS[q.resolution.outcome] : ''}
        pendingText={
          pendingForecast
            ? `Your ${formatPercent(pendingForecast.p)} of ${formatInstant(pendingForecast.at, zone)} will be removed from the history. Undo in the message that follows brings it back.`
            : pendingReference
              ? `${pendingReference.source}’s ${formatPercent(pendingReference.p)} of ${formatInstant(pendingReference.at, zone)} will be removed. Undo in the message that follows brings it back.`
              : ''
        }
      />
    </div>
  );
}
