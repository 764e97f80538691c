/**
 * The Scorecard's section for choice questions (SCORING.md "Multiple-choice questions"):
 * multi-category Brier, log score, RPS when some questions are ordered, skill against
 * spreading evenly / the option base rates / the first forecast, top-choice confidence
 * against hit rate, and the option calibration diagram (every option a yes/no forecast).
 * Every figure shows the number of questions it rests on.
 */
import { memo } from 'react';
import type { ChoiceReport, ChoiceSkillScores } from '../../../../shared/scoring/types';
import { CalibrationChart } from './CalibrationChart';
import { pct, pctInterval, questions, score2, score3 } from './format';
import { Tile } from './Headline';
import { choiceSkillSentence, topChoiceSentence } from './typedReadings';
import { formatCount } from '../../dates';

const SKILL_LABELS: Record<keyof ChoiceSkillScores, string> = {
  vs_uniform: 'vs spreading evenly',
  vs_base_rate: 'vs your option base rates',
  vs_first: 'vs never revising your first forecast',
};

export const ChoiceSection = memo(function ChoiceSection({ report }: { report: ChoiceReport }) {
  const n = report.scored;
  if (n === 0) {
    return (
      <p className="sc-note" data-testid="choice-nothing-scored">
        No choice question is scored in this view: {report.open} open, {report.unscored} resolved without a forecast before the window ended,{' '}
        {report.void} void.
      </p>
    );
  }
  const top = report.top_choice;
  return (
    <div className="sc-stack" data-testid="choice-section">
      <div className="sc-tiles">
        <Tile id="choice-brier" label="Brier score (all options)" value={score3(report.brier)} n={n} tone="ink">
          Brier {score2(report.brier)} over {questions(n)}: the squared misses summed over the options, 0 is perfect and 2 the worst;
          spreading evenly over K options scores 1 − 1/K (0.67 with three).
        </Tile>
        <Tile id="choice-log" label="Log score" value={score3(report.log_score)} n={n}>
          Lower is better: minus the log of the chance you gave the option that came true; spreading evenly over three options scores
          1.099 (ln 3).
        </Tile>
        {report.rps_n > 0 ? (
          <Tile id="choice-rps" label="Ranked probability score" value={score3(report.rps)} n={`${formatCount(report.rps_n)} ordered`}>
            For ordered options only: 0 is perfect, and a chance placed next to the outcome costs less than one placed far from it.
          </Tile>
        ) : null}
        <Tile
          id="choice-top"
          label="Top choice: confidence vs hit rate"
          value={`${pct(top.mean_confidence)} vs ${pct(top.hit_rate)}`}
          n={top.n}
          interval={top.wilson_low !== null && top.wilson_high !== null ? pctInterval(top.wilson_low, top.wilson_high) : null}
          tone="amber"
        >
          {topChoiceSentence(top)}
        </Tile>
        <Tile id="choice-counts" label="Choice questions in this view" value={formatCount(n)} n={`${formatCount(n + report.unscored + report.void + report.open)} in view`}>
          {formatCount(n)} scored, {formatCount(report.unscored)} resolved without a forecast before the window ended, {formatCount(report.void)} void, {formatCount(report.open)} still open.
        </Tile>
      </div>
      <section className="sc-stack" aria-labelledby="sc-choice-skill">
        <h3 id="sc-choice-skill" className="sc-subhead">
          Skill against baselines (Brier over all options; above 0 is better than the baseline)
        </h3>
        <div className="table-card" data-testid="choice-skill">
        <table>
          <caption className="visually-hidden">Choice skill scores</caption>
          <thead>
            <tr>
              <th scope="col">Baseline</th>
              <th scope="col" className="num">Skill</th>
              <th scope="col">Reading</th>
            </tr>
          </thead>
          <tbody>
            {(Object.keys(SKILL_LABELS) as (keyof ChoiceSkillScores)[]).map((key) => (
              <tr key={key}>
                <th scope="row">{SKILL_LABELS[key]}</th>
                <td className="num">{score2(report.skill[key])}</td>
                <td>{choiceSkillSentence(key, report.skill[key], n)}</td>
              </tr>
            ))}
          </tbody>
        </table>
        </div>
      </section>
      <CalibrationChart
        bins={report.bins}
        testId="choice-calibration-chart"
        caption={
          <>
            Option calibration: every option of every scored choice question counts as a yes/no forecast ({questions(n)}); each dot is a
            10-point bin of those chances, bars are 95% Wilson intervals. Dots on the dashed diagonal came true as often as stated.
          </>
        }
      />
    </div>
  );
});
