/**
 * The selection's calibration beside its confident calls: how many questions were scored,
 * their Brier score, how often each level of stated probability came true (with the Wilson
 * interval, so a bin of two reads as the guess it is), and the calibration slope in words or
 * the reason it is missing. Figures come from the same filter's `ScoreReport`; the Brier
 * score's 95% interval is the Scorecard's own (`Hindsight.brier_interval`).
 */
import type { ScoreReport } from '../../../../shared/scoring/types';
import { ALWAYS_HALF_BRIER, pctInterval, score3 } from '../scorecard/format';
import { slopeReading, wholePercent } from './wording';
import { formatCount } from '../../dates';

export function CalibrationSummary({ report, brierInterval, subject }: { report: ScoreReport; brierInterval: [number, number] | null; subject: string }) {
  const notCounted = [
    report.open ? `${formatCount(report.open)} open` : '',
    report.void ? `${formatCount(report.void)} void` : '',
    report.unscored ? `${formatCount(report.unscored)} resolved without a forecast before the window end` : '',
  ].filter(Boolean);
  return (
    <section className="hs-summary card" aria-labelledby="hs-summary-title" data-testid="calibration-summary">
      <h2 id="hs-summary-title" className="hs-summary__title">
        Calibration in this selection
      </h2>
      <p className="hs-summary__subject">{subject}</p>
      <dl className="hs-summary__figures">
        <div>
          <dt>Scored</dt>
          <dd data-testid="scored-n">n = {formatCount(report.scored)}</dd>
        </div>
        <div>
          <dt>Brier score</dt>
          <dd data-testid="brier">{score3(report.brier)}</dd>
          {/* The interval beside the figure, as on the Scorecard: a Brier of few questions is a rough guess. */}
          {brierInterval ? (
            <dd className="hs-summary__interval" data-testid="brier-interval">
              95% interval {score3(brierInterval[0])}–{score3(brierInterval[1])}
            </dd>
          ) : null}
        </div>
      </dl>
      <p className="hs-summary__note">
        Brier: mean squared distance from what happened; 0 is perfect, always saying 50% scores {ALWAYS_HALF_BRIER}.
        {notCounted.length ? ` Not counted here: ${notCounted.join(', ')}.` : ''}
      </p>
      {report.bins.length ? (
        <table className="hs-bins" data-testid="calibration-bins">
          <caption className="hs-bins__caption">How often your final forecasts came true</caption>
          <thead>
            <tr>
              <th scope="col">You said</th>
              <th scope="col" className="num">
                n
              </th>
              <th scope="col" className="num">
                Came true
              </th>
              <th scope="col" className="num">
                95% interval
              </th>
            </tr>
          </thead>
          <tbody>
            {report.bins.map((bin) => (
              <tr key={bin.index}>
                <th scope="row">~{wholePercent(bin.mean_p)}</th>
                <td className="num">{formatCount(bin.n)}</td>
                <td className="num">{wholePercent(bin.observed)}</td>
                <td className="num">{pctInterval(bin.wilson_low, bin.wilson_high)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : null}
      <p className="hs-summary__slope" data-testid="slope-reading">
        {slopeReading(report.calibration)}
      </p>
      <p className="hs-summary__note">
        Rows group final forecasts in tenths (around 10%, 20%, …); “you said” is each group’s average. The interval is Wilson’s
        95% score interval for how often that row came true: the fewer questions in a row, the wider it is.
      </p>
    </section>
  );
}
