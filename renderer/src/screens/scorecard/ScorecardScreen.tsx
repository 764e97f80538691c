/**
 * Scorecard: every figure SCORING.md defines, for the questions the filters pick — headline
 * figures with their n and intervals, calibration, the Brier decomposition, skill against
 * baselines, the running score, discrimination, consequences of acting on the calls, and the
 * lead over reference forecasts; then a section for each other question type the view holds
 * (multiple choice, numeric), built from the report's `choice` and `numeric` members.
 *
 * The root carries `data-scorecard-ready` ("true" once the latest filter's answer is drawn,
 * "false" while one is on its way; written by useScorecard) and `data-scorecard-tag` (the tag
 * filter, "" for all): tests and the benchmark wait on these rather than on timing.
 */
import { useCallback, useMemo, useRef, type ReactNode } from 'react';
import type { Scorecard } from '../../../../shared/contract';
import type { Settings } from '../../../../shared/domain';
import { api } from '../../api/client';
import { describeError } from '../../api/errors';
import { useLoad, type Loaded } from '../../api/useLoad';
import { EmptyState } from '../../components/EmptyState';
import { ErrorBanner } from '../../components/ErrorBanner';
import { useDefaultTimeZone } from '../../diaryInfo';
import { useDocumentTitle } from '../../hooks';
import { hrefTo, useQueryState } from '../../routing';
import { CalibrationChart } from './CalibrationChart';
import { ChoiceSection } from './ChoiceSection';
import { Consequences } from './Consequences';
import { Decomposition } from './Decomposition';
import { Filters } from './Filters';
import { buildRequest, decodeFilter, encodeFilter, type FilterProblems, type ScorecardFilter } from './filterRequest';
import { Headline } from './Headline';
import { NumericSection } from './NumericSection';
import { ReferenceLeads } from './ReferenceLeads';
import { RocChart } from './RocChart';
import { RunningBrierChart } from './RunningBrierChart';
import { SkillBars } from './SkillBars';
import { useScorecard } from './useScorecard';
import { viewTotals } from './format';
import './scorecard.css';
import { formatCount } from '../../dates';

export function ScorecardScreen() {
  useDocumentTitle('Scorecard');
  const timeZone = useDefaultTimeZone();
  const [filter, change] = useQueryState(decodeFilter, encodeFilter);
  const built = useMemo(() => buildRequest(filter, timeZone), [filter, timeZone]);
  const root = useRef<HTMLDivElement>(null);
  const loaded = useScorecard(built.request, root);
  const list = useLoad(() => api.listTags({}), []);
  const settings = useLoad(() => api.getSettings({}), []);

  const setWhatIf = useCallback((whatIfFalseAlarm: string, whatIfMiss: string) => change({ whatIfFalseAlarm, whatIfMiss }), [change]);
  const filtered = filter.tag !== '' || filter.from !== '' || filter.to !== '';

  return (
    <div ref={root} className="screen scorecard" data-scorecard-tag={filter.tag} aria-busy={loaded.loading || undefined}>
      <header className="screen__header">
        <h1>Scorecard</h1>
        <p className="sc-caution" data-testid="caution">
          Scores describe past calls; small samples mislead.
        </p>
      </header>
      <Filters filter={filter} tags={list.data?.tags ?? []} problems={built.problems} timeZone={timeZone} onChange={change} />
      {loaded.error ? <ErrorBanner message={describeError(loaded.error)} onRetry={loaded.retry} /> : null}
      {/* A filter that cannot be used asks for nothing new: say whose figures stay on screen. */}
      {built.request === null && loaded.card ? (
        <p className="muted" role="status" data-testid="figures-held">
          The figures below are still those of your last usable filters; correct the marked field above to update them.
        </p>
      ) : null}
      {loaded.card ? (
        <ScorecardBody
          card={loaded.card}
          filtered={filtered}
          timeZone={timeZone}
          settings={settings}
          filter={filter}
          problems={built.problems}
          whatIf={built.whatIf}
          onWhatIf={setWhatIf}
        />
      ) : loaded.error ? null : (
        <p className="muted" role="status">
          Scoring your resolved questions…
        </p>
      )}
    </div>
  );
}

interface BodyProps {
  card: Scorecard;
  filtered: boolean;
  timeZone: string;
  settings: Loaded<Settings>;
  filter: ScorecardFilter;
  problems: FilterProblems;
  whatIf: { false_alarm: number; miss: number } | null;
  onWhatIf: (falseAlarm: string, miss: string) => void;
}

function ScorecardBody({ card, filtered, timeZone, settings, filter, problems, whatIf, onWhatIf }: BodyProps) {
  const { report, detail, leads } = card;
  const inView = (r: { scored: number; unscored: number; void: number; open: number }) => r.scored + r.unscored + r.void + r.open > 0;
  const totals = viewTotals(report);
  const total = (key: keyof typeof totals) => totals[key];
  // Each type gets its sections when the view holds questions of it; yes/no comes first.
  const typed = (
    <>
      {inView(report.choice) ? (
        <Section id="sc-choice" title="Multiple-choice questions">
          <ChoiceSection report={report.choice} />
        </Section>
      ) : null}
      {inView(report.numeric) ? (
        <Section id="sc-numeric" title="Numeric questions">
          <NumericSection report={report.numeric} rows={card.numeric_detail.per_question} />
        </Section>
      ) : null}
    </>
  );
  if (total('scored') === 0) {
    return (
      <EmptyState
        title={filtered ? 'Nothing scored in this view' : 'Nothing scored yet'}
        actions={<a href={hrefTo('questions')}>Go to Questions</a>}
      >
        {/* The title already says "nothing scored"; the body says what to do about it. */}
        <p data-testid="nothing-scored">
          {filtered
            ? 'No question in this view was resolved with a forecast made before its window closed.'
            : 'Resolve questions that have a forecast made before their window closed; their scores appear here.'}
        </p>
        <p>
          Here: {formatCount(total('open'))} open, {formatCount(total('unscored'))} resolved without a forecast before the window ended,{' '}
          {formatCount(total('void'))} void.
        </p>
      </EmptyState>
    );
  }
  if (report.scored === 0) {
    return (
      <>
        {inView(report) ? (
          <p className="sc-note" data-testid="binary-nothing-scored">
            No yes/no question is scored in this view: {report.open} open, {report.unscored} resolved without a forecast before the window ended,{' '}
            {report.void} void.
          </p>
        ) : null}
        {typed}
      </>
    );
  }
  return (
    <>
      <Section id="sc-headline" title="Headline figures">
        <Headline report={report} detail={detail} />
      </Section>
      <Section id="sc-calibration" title="Calibration">
        <div className="sc-grid">
          <CalibrationChart bins={report.bins} />
          <Decomposition terms={report.decomposition} brier={report.brier} scored={report.scored} />
        </div>
      </Section>
      <Section id="sc-skill" title="Skill against baselines">
        <SkillBars skill={report.skill} scored={report.scored} />
      </Section>
      <div className="sc-grid">
        <Section id="sc-running" title="Running Brier score">
          <RunningBrierChart running={detail.running_brier} timeZone={timeZone} />
        </Section>
        <Section id="sc-roc" title="Discrimination">
          {detail.roc.length > 0 ? (
            <RocChart roc={detail.roc} auc={report.auc} yes={detail.auc_n.yes} no={detail.auc_n.no} />
          ) : (
            <p className="sc-note" data-testid="roc-missing">
              The ROC curve needs both a Yes and a No question ({formatCount(detail.auc_n.yes)} Yes, {formatCount(detail.auc_n.no)} No here).
            </p>
          )}
        </Section>
      </div>
      <Section id="sc-consequences" title="Consequences">
        <p className="muted">
          A false alarm: a forecast above the threshold, and it did not happen. A miss: a forecast at or below it, and it happened.
          Costs are in any unit; correct calls cost nothing.
        </p>
        <Consequences report={report} settings={settings} filter={filter} problems={problems} whatIf={whatIf} onWhatIf={onWhatIf} />
      </Section>
      <Section id="sc-leads" title="Lead over reference forecasts">
        <ReferenceLeads leads={leads} />
      </Section>
      {typed}
    </>
  );
}

function Section({ id, title, children }: { id: string; title: string; children: ReactNode }) {
  return (
    <section className="sc-section" aria-labelledby={id}>
      <h2 id={id}>{title}</h2>
      {children}
    </section>
  );
}
