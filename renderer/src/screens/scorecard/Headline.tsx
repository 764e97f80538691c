/**
 * The headline figures: each with its number, how many questions it rests on, its interval
 * where one exists, and one plain sentence saying what it means. Definitions: SCORING.md.
 */
import { memo, type ReactNode } from 'react';
import { MIN_CALIBRATION_N, recalibrate } from '../../../../shared/scoring/index';
import type { Scorecard } from '../../../../shared/contract';
import type { ReportBin, ScoreReport } from '../../../../shared/scoring/types';
import { ALWAYS_HALF_BRIER, binLabel, pct, pctInterval, questions, score2, score3, scoreInterval } from './format';
import { formatCount } from '../../dates';

export interface TileProps {
  id: string;
  label: string;
  value: string;
  n: ReactNode;
  interval?: string | null | undefined;
  tone?: 'ink' | 'amber' | 'plain';
  children: ReactNode;
}

export function Tile({ id, label, value, n, interval, tone = 'plain', children }: TileProps) {
  const headingId = `headline-${id}-label`;
  return (
    <section className={`sc-tile sc-tile--${tone}`} aria-labelledby={headingId} data-testid={`headline-${id}`}>
      <h3 id={headingId} className="sc-tile__label">
        {label}
      </h3>
      <p className="sc-tile__value" data-testid={`headline-${id}-value`}>
        {value}
      </p>
      <p className="sc-tile__meta">
        <span data-testid={`headline-${id}-n`}>n = {typeof n === 'number' ? formatCount(n) : n}</span>
        {interval ? <span> · 95% interval {interval}</span> : null}
      </p>
      <p className="sc-tile__reading">{children}</p>
    </section>
  );
}

/**
 * The bin that says most about confident calls: the highest one above 50%, else the lowest one
 * below 50%, else the 50% bin.
 */
export function confidentBin(bins: readonly ReportBin[]): ReportBin | undefined {
  const above = bins.filter((b) => b.index > 5);
  if (above.length) return above[above.length - 1];
  const below = bins.filter((b) => b.index < 5);
  if (below.length) return below[0];
  return bins[0];
}

/** "Your 90% calls came true 67% of the time (n = 3, 95% interval 21–94%)". */
export function binSentence(bin: ReportBin): string {
  return `Your ${binLabel(bin.index)} calls came true ${pct(bin.observed)} of the time (n = ${formatCount(bin.n)}, 95% interval ${pctInterval(bin.wilson_low, bin.wilson_high)}).`;
}

function calibrationReading(report: ScoreReport): string {
  const { intercept, slope, reason } = report.calibration;
  if (intercept === null || slope === null) {
    if (report.scored < MIN_CALIBRATION_N) return `Resolve ${MIN_CALIBRATION_N} questions to see your calibration slope (${reason ?? 'too few scored questions'}).`;
    return `No calibration slope: ${reason ?? 'the fit gave no estimate'}.`;
  }
  const like90 = recalibrate(0.9, intercept, slope);
  const like10 = recalibrate(0.1, intercept, slope);
  const direction = slope < 1 ? 'below 1: outcomes were less extreme than your forecasts' : slope > 1 ? 'above 1: outcomes were more extreme than your forecasts' : 'exactly 1';
  return `Your 90% behaves like ${pct(like90)} and your 10% like ${pct(like10)} (intercept ${score2(intercept)}; slope ${direction}).`;
}

export const Headline = memo(function Headline({ report, detail }: { report: ScoreReport; detail: Scorecard['detail'] }) {
  const n = report.scored;
  const bin = confidentBin(report.bins);
  const { yes, no } = detail.auc_n;
  return (
    <div className="sc-tiles">
      <Tile id="brier" label="Brier score" value={score3(report.brier)} n={n} interval={detail.brier_interval && scoreInterval(detail.brier_interval)} tone="ink">
        Brier {score2(report.brier)} over {questions(n)} — 0 is perfect, always saying 50% scores {ALWAYS_HALF_BRIER}.
      </Tile>
      <Tile id="brier-time" label="Time-averaged Brier" value={score3(report.brier_time_avg)} n={n}>
        Each forecast’s squared error weighted by how long it stood before the window ended (final Brier {score2(report.brier)}).
      </Tile>
      <Tile id="log" label="Log score" value={score3(report.log_score)} n={n} interval={detail.log_interval && scoreInterval(detail.log_interval)}>
        Lower is better; always saying 50% scores 0.693 (ln 2), and one confident miss weighs heavily.
      </Tile>
      <Tile
        id="confident"
        label={bin ? `Your ${binLabel(bin.index)} calls` : 'Calibration'}
        value={bin ? pct(bin.observed) : '—'}
        n={bin ? bin.n : 0}
        interval={bin ? pctInterval(bin.wilson_low, bin.wilson_high) : null}
        tone="amber"
      >
        {bin ? binSentence(bin) : 'No bins yet: nothing is scored.'}
      </Tile>
      <Tile id="slope" label="Calibration slope" value={score2(report.calibration.slope)} n={n}>
        {calibrationReading(report)}
      </Tile>
      <Tile id="auc" label="Discrimination (ROC AUC)" value={score2(report.auc)} n={`${formatCount(yes)} Yes, ${formatCount(no)} No`}>
        {report.auc === null
          ? `Needs both a Yes and a No question (${formatCount(yes)} Yes, ${formatCount(no)} No so far).`
          : `A Yes question got a higher final forecast than a No question ${pct(report.auc)} of the time; 0.5 is a coin toss.`}
      </Tile>
      <Tile id="sharpness" label="Sharpness" value={score2(report.sharpness)} n={n}>
        0 is always 50%, 1 is always 0% or 100%; {pct(report.share_certain)} of final forecasts were exactly 0% or 100%.
      </Tile>
      <Tile id="counts" label="Scored questions in this view" value={formatCount(n)} n={`${formatCount(n + report.unscored + report.void + report.open)} in view`}>
        {formatCount(n)} scored, {formatCount(report.unscored)} resolved without a forecast before the window ended, {formatCount(report.void)} void, {formatCount(report.open)} still open.
      </Tile>
    </div>
  );
});
