/**
 * The 2×2 table of what acting on the forecasts would have meant (SCORING.md "Consequences";
 * Wilks, ch. 7): a forecast above the threshold counts as acting. With the hit rate H, the
 * false-alarm rate F and the Peirce skill score H − F beside it.
 */
import { memo } from 'react';
import type { DecisionSummary } from '../../../../shared/scoring/types';
import { plural } from '../../tools/format';
import { pct, score2 } from './format';

export const DecisionTable = memo(function DecisionTable({ decisions: d }: { decisions: DecisionSummary }) {
  const yes = d.hits + d.misses;
  const no = d.false_alarms + d.correct_rejections;
  return (
    <div className="sc-decisions">
      <div className="table-card">
        <table className="sc-contingency" data-testid="decision-table">
          <caption className="table-card__caption">
            What acting on your forecasts would have meant ({plural(yes + no, 'scored question')})
          </caption>
          <thead>
            <tr>
              <td />
              <th scope="col" className="num">Happened (Yes)</th>
              <th scope="col" className="num">Did not happen (No)</th>
            </tr>
          </thead>
          <tbody>
            <tr>
              <th scope="row">Forecast above the threshold (act)</th>
              <td className="num" data-testid="hits">
                <span className="sc-count">{d.hits}</span> hits
              </td>
              <td className="num" data-testid="false-alarms">
                <span className="sc-count">{d.false_alarms}</span> false alarms
              </td>
            </tr>
            <tr>
              <th scope="row">At or below it (do not act)</th>
              <td className="num" data-testid="misses">
                <span className="sc-count">{d.misses}</span> misses
              </td>
              <td className="num" data-testid="correct-rejections">
                <span className="sc-count">{d.correct_rejections}</span> correct rejections
              </td>
            </tr>
          </tbody>
        </table>
      </div>
      <dl className="sc-rates" data-testid="decision-rates">
        <div>
          <dt>Hit rate H</dt>
          <dd>
            {pct(d.hit_rate)} <span className="muted">of {yes} Yes</span>
          </dd>
        </div>
        <div>
          <dt>False-alarm rate F</dt>
          <dd>
            {pct(d.false_alarm_rate)} <span className="muted">of {no} No</span>
          </dd>
        </div>
        <div>
          <dt>Peirce skill H − F</dt>
          <dd>
            {score2(d.peirce)} <span className="muted">(0: no better than chance, 1: perfect)</span>
          </dd>
        </div>
      </dl>
    </div>
  );
});
