/**
 * The Scorecard's section for numeric questions (SCORING.md "Numeric questions"): coverage
 * of each range size with Wilson intervals, quantile calibration, where outcomes landed
 * beside where they should, whether revising helped (relative WIS), and each question's
 * weighted interval score in its own unit (never averaged across questions).
 */
import { memo, useEffect, useRef } from 'react';
import { ShowMore, usePages } from '../../components/ShowMore';
import type { CoverageRow, NumericQuestionRow, NumericReport } from '../../../../shared/scoring/types';
import { formatValue, levelName } from '../../forecastEntry/numericEntry';
import { pct, questions, score2, unitScore } from './format';
import { Tile } from './Headline';
import { LevelCalibrationChart, type LevelRow } from './LevelCalibrationChart';
import { coverageReading, gapName, quantileSentence, revisingSentence } from './typedReadings';
import { formatCount } from '../../dates';

function show(row: NumericQuestionRow, value: number): string {
  return formatValue(value, row.value_kind, row.unit);
}

/** A score in the question's unit (days for a date question), two decimals like every other (`unitScore`). */
function scoreIn(row: NumericQuestionRow, value: number | null): string {
  if (value === null) return '—';
  const text = unitScore(value);
  if (row.value_kind === 'date') return `${text} days`;
  return row.unit ? `${text} ${row.unit}` : text;
}

/** Rows of the per-question table drawn at first, and added by each "Show more": a diary of thousands of numeric questions would otherwise draw them all. */
const WIS_PAGE = 25;

export const NumericSection = memo(function NumericSection({ report, rows }: { report: NumericReport; rows: NumericQuestionRow[] }) {
  // After "Show more", focus moves to the first row it added, so a keyboard user reads on from there.
  const body = useRef<HTMLTableSectionElement>(null);
  const { shown, more, reset } = usePages(WIS_PAGE, (index) => body.current?.rows[index]?.querySelector<HTMLElement>('th'));
  // A new selection starts again at the first page.
  useEffect(reset, [rows]);
  const n = report.scored;
  if (n === 0) {
    return (
      <p className="sc-note" data-testid="numeric-nothing-scored">
        No numeric question is scored in this view: {report.open} open, {report.unscored} resolved without a forecast before the window
        ended, {report.void} void.
      </p>
    );
  }
  const coverageRows: LevelRow[] = report.coverage.map((c) => ({
    label: `${pct(c.level)} range`,
    stated: c.level,
    observed: c.rate,
    n: c.n,
    low: c.wilson_low,
    high: c.wilson_high,
  }));
  const quantileRows: LevelRow[] = report.quantile_calibration.map((q) => ({
    label: levelName(q.tau),
    stated: q.tau,
    observed: q.rate,
    n: q.n,
    low: q.wilson_low,
    high: q.wilson_high,
  }));
  // The range size most questions have (the 80 % of P10/P90 by default) leads the section.
  const widest = report.coverage.reduce<CoverageRow | undefined>((best, c) => (!best || c.n > best.n || (c.n === best.n && c.level > best.level) ? c : best), undefined);
  return (
    <div className="sc-stack" data-testid="numeric-section">
      <div className="sc-tiles">
        {widest ? (
          <Tile id="numeric-coverage" label={`Your ${pct(widest.level)} ranges`} value={pct(widest.rate)} n={widest.n} tone="amber">
            {coverageReading(widest)}
          </Tile>
        ) : null}
        <Tile id="numeric-revising" label="Revising helped? (relative WIS)" value={score2(report.relative_wis_vs_first)} n={n}>
          {revisingSentence(report.relative_wis_vs_first, n)} Below 1: the revisions improved the ranges.
        </Tile>
        <Tile id="numeric-counts" label="Numeric questions in this view" value={formatCount(n)} n={`${formatCount(n + report.unscored + report.void + report.open)} in view`}>
          {formatCount(n)} scored, {formatCount(report.unscored)} resolved without a forecast before the window ended, {formatCount(report.void)} void, {formatCount(report.open)} still open.
        </Tile>
      </div>
      <div className="sc-grid">
        <LevelCalibrationChart
          testId="coverage-chart"
          rows={coverageRows}
          caption="Coverage: how often each size of range caught the outcome. Well calibrated ranges sit on the diagonal; below it they are too narrow."
          xTitle="Range size (stated coverage)"
          yTitle="Share that caught the outcome"
          rowHeading="Range"
          observedHeading="Caught"
          readings={
            <span className="sc-readings">
              {report.coverage.map((c) => (
                <span key={c.level} className="sc-reading" data-testid="coverage-reading">
                  {coverageReading(c)}
                </span>
              ))}
            </span>
          }
        />
        <LevelCalibrationChart
          testId="quantile-calibration-chart"
          rows={quantileRows}
          caption="Quantile calibration: how often the outcome fell at or below each of your quantiles. A calibrated P90 has 90% at or below it."
          xTitle="Quantile level"
          yTitle="Share at or below"
          rowHeading="Quantile"
          observedHeading="At or below"
          readings={
            <span className="sc-readings">
              {report.quantile_calibration.map((q) => (
                <span key={q.tau} className="sc-reading">
                  {quantileSentence(q)}
                </span>
              ))}
            </span>
          }
        />
      </div>
      <section className="sc-stack" aria-labelledby="sc-landed">
        <h3 id="sc-landed" className="sc-subhead">
          Where outcomes landed
        </h3>
        {report.landed.map((set) => {
          const total = set.gaps.reduce((sum, g) => sum + g.n, 0);
          const name = set.levels.map(levelName).join(' / ');
          return (
            <div key={set.levels.join(',')} className="table-card sc-landed" data-testid="landed-table">
            <table>
              <caption>
                Questions with {name} ({questions(total)})
              </caption>
              <thead>
                <tr>
                  <th scope="col">Where the outcome fell</th>
                  <th scope="col" className="num">Count</th>
                  <th scope="col" className="num">Share</th>
                  <th scope="col" className="num">Expected</th>
                  <th scope="col">
                    <span className="visually-hidden">Share against expected, drawn</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {set.gaps.map((gap, k) => {
                  const share = total ? gap.n / total : 0;
                  return (
                    <tr key={k}>
                      <th scope="row">{gapName(set.levels, k)}</th>
                      <td className="num">{formatCount(gap.n)}</td>
                      <td className="num">{pct(share)}</td>
                      <td className="num">{pct(gap.expected)}</td>
                      <td aria-hidden="true">
                        <span className="sc-landed__bar">
                          <span className="sc-landed__share" style={{ width: `${share * 100}%` }} />
                          <span className="sc-landed__expected" style={{ left: `${gap.expected * 100}%` }} />
                        </span>
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
            </div>
          );
        })}
      </section>
      <section className="sc-stack" aria-labelledby="sc-wis">
        <h3 id="sc-wis" className="sc-subhead">
          Each question’s score, in its own unit
        </h3>
        <p className="muted sc-small">
          Weighted interval score (WIS): the average miss over your quantiles, in the question’s unit (days for dates); 0 is perfect.
          Units differ, so these are never averaged.
        </p>
        <div className="table-card" data-testid="numeric-questions">
          <table className="sc-wis-table">
            <caption className="visually-hidden">Numeric questions scored</caption>
            <thead>
              <tr>
                <th scope="col">Question</th>
                <th scope="col">Your final range</th>
                <th scope="col">Outcome</th>
                <th scope="col" className="num">WIS</th>
                <th scope="col" className="num">Interval score</th>
              </tr>
            </thead>
            <tbody ref={body}>
              {rows.slice(0, shown).map((row) => {
                const m = row.quantiles.length;
                const median = row.levels.indexOf(0.5);
                return (
                  <tr key={row.id}>
                    <th scope="row" tabIndex={-1}>
                      {row.title}
                    </th>
                    <td>
                      {m > 1
                        ? `${show(row, row.quantiles[0]!)} – ${show(row, row.quantiles[m - 1]!)} (median ${show(row, row.quantiles[median]!)})`
                        : `median ${show(row, row.quantiles[0]!)}`}
                    </td>
                    <td>{show(row, row.value)}</td>
                    <td className="num">{scoreIn(row, row.wis)}</td>
                    <td className="num">
                      {scoreIn(row, row.interval_score)}
                      {row.interval_level !== null ? <span className="muted"> ({pct(row.interval_level)})</span> : null}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
        <ShowMore shown={Math.min(shown, rows.length)} total={rows.length} page={WIS_PAGE} onMore={more} />
      </section>
    </div>
  );
});
