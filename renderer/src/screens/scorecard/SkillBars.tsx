/**
 * Skill against each baseline, `1 − BS / BS_ref` (SCORING.md, "Skill against baselines"), as
 * horizontal bars: right of zero the user's Brier score was lower than the baseline's, left of
 * zero higher. A baseline with no value gets no bar and says why in the table.
 */
import { memo, useMemo, useRef } from 'react';
import type { ChartConfiguration } from 'chart.js';
import { MIN_CALIBRATION_N } from '../../../../shared/scoring/index';
import type { SkillScores } from '../../../../shared/scoring/types';
import { ChartFigure } from './ChartFigure';
import { BASE_OPTIONS, axisStyle, useChart, type Palette } from './chartKit';
import { pct, questions, score2, tick } from './format';

type Baseline = keyof SkillScores;

interface BaselineText {
  label: string;
  /** "… than <compared>" */
  compared: string;
  /** Why the figure is missing when questions were scored. */
  missing: string;
  /** Whether the skill score covers every scored question (the others cover a subset). */
  coversAll: boolean;
}

const BASELINES: Record<Baseline, BaselineText> = {
  vs_base_rate: {
    label: 'vs your stated base rates',
    compared: 'your stated base rates',
    missing: 'No scored question here has a stated base rate, or the base rates alone scored a perfect 0, leaving nothing to beat.',
    coversAll: false,
  },
  vs_climatology: {
    label: 'vs hindsight frequency (climatology)',
    compared: 'the frequency these questions turned out to have',
    missing: 'Every question here resolved the same way, so the hindsight frequency scores a perfect 0 and leaves nothing to beat.',
    coversAll: true,
  },
  vs_even: {
    label: 'vs always 50%',
    compared: 'always saying 50%',
    missing: 'Nothing is scored here.',
    coversAll: true,
  },
  vs_first: {
    label: 'vs never revising your first number',
    compared: 'your first forecasts left unrevised',
    missing: 'Your first forecasts already scored a perfect 0, so revising had nothing to improve on.',
    coversAll: true,
  },
  vs_reference: {
    label: 'vs reference forecasts',
    compared: 'the reference forecasts (both time-averaged)',
    missing: 'No scored question here has a reference forecast made before its window ended, or the reference scored a perfect 0.',
    coversAll: false,
  },
};

const ORDER: Baseline[] = ['vs_base_rate', 'vs_climatology', 'vs_even', 'vs_first', 'vs_reference'];

export interface SkillRow {
  baseline: Baseline;
  label: string;
  value: number | null;
}

/**
 * The plain-language reading of one skill score, or why there is none. A skill score comes
 * without an interval, and on a handful of questions one outcome swings it: "84% lower than
 * always saying 50%" after a single question reads as a verdict, so below the size at which
 * the calibration slope is fitted the reading says how few questions it rests on.
 */
export function skillReading(baseline: Baseline, value: number | null, scored: number): string {
  const text = BASELINES[baseline];
  if (scored === 0) return 'Not enough data: nothing is scored here.';
  if (value === null) return `Not enough data: ${text.missing}`;
  const reading =
    Math.abs(value) < 0.005
      ? `About the same Brier score as ${text.compared}.`
      : value > 0
        ? `Your Brier score was ${pct(value)} lower than ${text.compared}.`
        : `Your Brier score was ${pct(-value)} higher than ${text.compared}.`;
  return scored < MIN_CALIBRATION_N ? `${reading} Only ${questions(scored)} so far: one more outcome can swing it a lot.` : reading;
}

/** Axis from −1 (or lower values' floor, whichever is higher) to 1; lower values sit at the edge. */
const AXIS_MIN = -1;

export const SkillBars = memo(function SkillBars({ skill, scored }: { skill: SkillScores; scored: number }) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const rows = useMemo<SkillRow[]>(() => ORDER.map((b) => ({ baseline: b, label: BASELINES[b].label, value: skill[b] })), [skill]);

  useChart<'bar', SkillRow[]>(
    canvasRef,
    (colors: Palette): ChartConfiguration<'bar'> => ({
      type: 'bar',
      data: {
        labels: ORDER.map((b) => BASELINES[b].label),
        datasets: [{ label: 'Skill score', data: [], borderWidth: 0, barPercentage: 0.7, categoryPercentage: 0.9 }],
      },
      options: {
        ...BASE_OPTIONS,
        indexAxis: 'y',
        font: { family: colors.font },
        scales: {
          x: {
            type: 'linear',
            min: AXIS_MIN,
            max: 1,
            ...axisStyle(colors, 'Skill score (0: same as the baseline, 1: perfect)'),
            ticks: { color: colors.text, stepSize: 0.25, callback: (v) => tick(v) },
          },
          y: { type: 'category', ...axisStyle(colors), ticks: { color: colors.text, font: { size: 13 } } },
        },
        plugins: {
          legend: { display: false },
          tooltip: {
            callbacks: { label: (item) => `Skill ${score2(item.parsed.x)}` },
          },
        },
      },
    }),
    (chart, data, colors) => {
      const dataset = chart.data.datasets[0]!;
      // Values below the axis start at its edge; the table has the exact number.
      dataset.data = data.map((r) => (r.value === null ? null : Math.max(AXIS_MIN, r.value))) as number[];
      dataset.backgroundColor = data.map((r) => ((r.value ?? 0) < 0 ? colors.danger : colors.own));
    },
    rows,
  );

  const shown = rows.filter((r) => r.value !== null);
  return (
    <ChartFigure
      testId="skill-chart"
      canvasRef={canvasRef}
      points={rows}
      size="sm"
      openTable
      description={
        shown.length === 0
          ? 'Skill bar chart: no baseline has a value. The table below says why.'
          : `Skill bar chart. ${shown.map((r) => `${r.label}: ${score2(r.value)}`).join('; ')}. The table below has the readings.`
      }
      caption="Skill score against each baseline: bars right of 0 mean a lower (better) Brier score than the baseline, left of 0 a higher one."
      table={
        <table className="sc-skill-table">
          <caption className="visually-hidden">Skill against each baseline</caption>
          <thead>
            <tr>
              <th scope="col">Baseline</th>
              <th scope="col" className="num">Skill</th>
              <th scope="col" className="num">n</th>
              <th scope="col">Reading</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.baseline} data-baseline={r.baseline}>
                <th scope="row">{r.label}</th>
                <td className="num nowrap">{r.value === null ? 'not enough data' : score2(r.value)}</td>
                <td className="num nowrap">{BASELINES[r.baseline].coversAll ? scored : `up to ${scored}`}</td>
                <td>{skillReading(r.baseline, r.value, scored)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      }
    />
  );
});
