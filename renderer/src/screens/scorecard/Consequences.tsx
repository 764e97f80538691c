/**
 * Consequences: what the forecasts would have meant as decisions, given the price of a false
 * alarm (acted, nothing happened) and of a miss (did not act, it happened). The defaults are
 * diary settings; the what-if costs apply only to this view and are never saved.
 */
import type { Settings } from '../../../../shared/domain';
import { costLossThreshold } from '../../../../shared/scoring/index';
import type { ScoreReport } from '../../../../shared/scoring/types';
import { describeError } from '../../api/errors';
import type { Loaded } from '../../api/useLoad';
import { Button } from '../../components/Button';
import { ErrorBanner } from '../../components/ErrorBanner';
import { NumberField } from '../../components/NumberField';
import { CostSettings } from './CostSettings';
import { DecisionTable } from './DecisionTable';
import type { FilterProblems, ScorecardFilter } from './filterRequest';
import { cost, pct, score2 } from './format';
import { PolicyCosts } from './PolicyCosts';
import { ValueCurve } from './ValueCurve';

export interface ConsequencesProps {
  report: ScoreReport;
  settings: Loaded<Settings>;
  filter: ScorecardFilter;
  problems: FilterProblems;
  whatIf: { false_alarm: number; miss: number } | null;
  onWhatIf: (falseAlarm: string, miss: string) => void;
}

export function Consequences({ report, settings, filter, problems, whatIf, onWhatIf }: ConsequencesProps) {
  const defaults = settings.data ? { false_alarm: settings.data.default_false_alarm_cost, miss: settings.data.default_miss_cost } : null;
  const inForce = whatIf ?? defaults;
  const alpha = inForce ? costLossThreshold(inForce.false_alarm, inForce.miss) : null;
  const valueAt = alpha === null ? undefined : report.value_curve.find((p) => Math.abs(p.alpha - alpha) < 0.005);

  return (
    <>
      <div className="sc-grid sc-grid--costs">
        <div className="card sc-stack">
          {settings.error && !settings.data ? <ErrorBanner message={describeError(settings.error)} onRetry={settings.reload} /> : null}
          {settings.data ? <CostSettings settings={settings.data} /> : null}
          <fieldset className="form__group sc-whatif" data-active={whatIf ? 'true' : 'false'}>
            <legend>What if — costs for this view only (not saved)</legend>
            <p className="muted sc-small">
              Fill both to score every question in this view with these costs instead of its own. Clear both to go back.
            </p>
            <div className="sc-costs__row">
              <NumberField
                label="What-if false-alarm cost"
                value={filter.whatIfFalseAlarm}
                onChange={(v) => onWhatIf(v, filter.whatIfMiss)}
                min={0}
                step="any"
                error={problems.whatIfFalseAlarm}
              />
              <NumberField
                label="What-if miss cost"
                value={filter.whatIfMiss}
                onChange={(v) => onWhatIf(filter.whatIfFalseAlarm, v)}
                min={0}
                step="any"
                error={problems.whatIfMiss}
              />
              <Button onClick={() => onWhatIf('', '')} disabled={filter.whatIfFalseAlarm === '' && filter.whatIfMiss === ''} className="sc-costs__save">
                Clear what-if
              </Button>
            </div>
            <p className="sc-small" role="status" data-testid="whatif-status">
              {whatIf
                ? `In use: false-alarm cost ${cost(whatIf.false_alarm)}, miss cost ${cost(whatIf.miss)} for every question in this view.`
                : 'Not in use: each question’s own costs apply, or the defaults above.'}
            </p>
          </fieldset>
        </div>
        <div className="sc-stack">
          <div className="sc-threshold" data-testid="threshold">
            {inForce && alpha !== null ? (
              <>
                <p className="sc-threshold__formula">
                  α = FA / (FA + M) = {cost(inForce.false_alarm)} / ({cost(inForce.false_alarm)} + {cost(inForce.miss)}) ={' '}
                  <strong data-testid="threshold-value">{score2(alpha)}</strong>
                </p>
                <p className="sc-small">
                  A forecast above {pct(alpha)} counts as acting.{' '}
                  {whatIf ? 'What-if costs, for every question in this view.' : 'Diary defaults; questions with their own costs use their own threshold.'}
                  {valueAt && valueAt.value !== null ? ` Relative value at this ratio: ${score2(valueAt.value)}.` : ''}
                </p>
              </>
            ) : (
              <p className="sc-small">Loading the diary’s default costs…</p>
            )}
          </div>
          <DecisionTable decisions={report.decisions} />
        </div>
      </div>
      <div className="sc-grid">
        <PolicyCosts decisions={report.decisions} />
        <ValueCurve curve={report.value_curve} alpha={alpha ?? 0.5} />
      </div>
    </>
  );
}
