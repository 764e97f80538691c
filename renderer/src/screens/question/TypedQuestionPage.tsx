/**
 * The page of a choice or numeric question: its definition, where it stands, the history
 * (one line per option, or the range band with its median) with the tables beside it, and
 * everything that can be done to it. The yes/no page (QuestionScreen) keeps its own figures
 * and tools, which read a single probability; the frame, the page's changes and the
 * confirmations are the ones it uses (questionPage.tsx).
 */
import type { Settings } from '../../../../shared/domain';
import { questionStatus } from '../../../../shared/domain';
import { toStoredValue } from '../../../../shared/numeric-value';
import { ChoiceHistoryChart } from '../../chart/ChoiceHistoryChart';
import { NumericHistoryChart } from '../../chart/NumericHistoryChart';
import { formatInstant } from '../../dates';
import { formatPercent } from '../../percent';
import { levelsText } from '../../questionTypes/definition';
import { choiceSummary, numericSummary } from '../../questionTypes/summaries';
import { CheckinsFact, DefinitionCard, Figure, HistorySection, QuestionConfirmations, QuestionHead, ResolutionPanel, RuleFact, TagsFact, useQuestionActions, WindowFact } from './questionPage';
import { ResolutionHistory } from './ResolutionHistory';
import { SnoozeNote } from './SnoozeNote';
import { TypedEditDialog } from './TypedEditDialog';
import { TypedEntryDialog, type TypedQuestion } from './TypedEntryDialog';
import { TypedHistoryTables } from './TypedHistoryTables';
import { TypedResolveDialog, outcomeText } from './TypedResolveDialog';
import { choiceHistoryInput, latestEntry, numericHistoryInput } from './typedFacts';
import './typedQuestion.css';

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
  const actions = useQuestionActions(q);
  const { dialog, close, saved } = actions;
  // A dialog reopened by an Undo starts from the question as the undo left it.
  const back = actions.restoredQuestion;
  const dq = back && back.type !== 'binary' ? back : q;
  const status = questionStatus(Date.parse(q.closes_at), q.resolution?.outcome ?? null, Date.now(), settings.closing_soon_hours);
  const zone = q.time_zone;
  const lastForecast = q.type === 'choice' ? latestEntry(q.forecasts) : latestEntry(q.forecasts);
  const lastReference = [...q.references].sort((a, b) => Date.parse(a.at) - Date.parse(b.at)).at(-1);
  const resolvedText = q.resolution ? outcomeText(q, q.resolution) : '';

  return (
    <div className="screen question-page" data-question-type={q.type}>
      <QuestionHead q={q} status={status} actions={actions} />

      {q.resolution ? (
        <ResolutionPanel
          q={q}
          tone={q.resolution.outcome === 'void' ? 'void' : 'yes'}
          heading={q.resolution.outcome === 'void' ? 'Resolved Void' : `Resolved: ${resolvedText}`}
          actions={actions}
        />
      ) : null}

      <ResolutionHistory question={q} />

      <SnoozeNote question={q} />

      <section className="figures" aria-label="Key figures">
        <Figure
          label="Your forecast"
          value={latestText(q, 'forecasts')}
          detail={lastForecast ? `since ${formatInstant(lastForecast.at, zone, false)}` : 'none yet'}
          tone="ink"
          text
        />
        {q.type === 'choice' ? (
          <Figure
            label="Option base rates"
            value={q.option_base_rates ? choiceSummary(q.options, q.option_base_rates) : '—'}
            detail={q.base_rate_note || (q.option_base_rates ? '' : 'not stated')}
            text
          />
        ) : (
          <Figure label="Levels" value={levelsText(q.levels).split(' (')[0]!} detail={q.value_kind === 'date' ? 'dates' : q.unit ? `in ${q.unit}` : 'no unit'} text />
        )}
        <Figure label="Latest reference" value={latestText(q, 'references')} detail={lastReference ? lastReference.source : 'none yet'} tone="amber" text />
      </section>

      <DefinitionCard>
        <RuleFact q={q} />
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
        <WindowFact q={q} />
        <TagsFact q={q} />
        <CheckinsFact q={q} settings={settings} />
      </DefinitionCard>

      <HistorySection
        chart={q.type === 'choice' ? <ChoiceHistoryChart input={choiceHistoryInput(q)} timeZone={zone} /> : <NumericHistoryChart input={numericHistoryInput(q)} timeZone={zone} />}
        tables={
          <TypedHistoryTables
            question={q}
            onDeleteForecast={(id) => actions.setPendingDelete({ kind: 'forecast', id })}
            onDeleteReference={(id) => actions.setPendingDelete({ kind: 'reference', id })}
          />
        }
      />

      <TypedEntryDialog question={dq} mode="forecast" open={dialog === 'revise'} onClose={close} onSaved={saved} restored={actions.restored('revise')} />
      <TypedEntryDialog question={dq} mode="reference" open={dialog === 'reference'} onClose={close} onSaved={saved} restored={actions.restored('reference')} />
      <TypedResolveDialog question={dq} open={dialog === 'resolve'} onClose={close} onSaved={saved} restored={actions.restored('resolve')} />
      <TypedEditDialog question={q} open={dialog === 'edit'} onClose={close} onSaved={saved} />
      <QuestionConfirmations
        q={q}
        actions={actions}
        recorded={resolvedText || 'Void'}
        pendingText="It will be removed from the history. Undo in the message that follows brings it back."
      />
    </div>
  );
}
