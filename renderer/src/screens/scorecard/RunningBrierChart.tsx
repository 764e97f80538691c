/**
 * The running Brier score: after each window end, the mean Brier score of every question
 * whose window had ended by then, so the user sees how the average settled as questions were
 * resolved. The dashed line is what always saying 50% scores (0.25).
 */
import { memo, useMemo, useRef } from 'react';
import type { ChartConfiguration } from 'chart.js';
import type { RunningBrierPoint } from '../../../../shared/scoring/types';
import { DASHED, lineStyle, type LegendItem } from '../../chart/Legend';
import { timeTicks } from '../../chart/series';
import { formatCount, formatDay, formatTick } from '../../dates';
import { ChartFigure } from './ChartFigure';
import { cssColor } from '../../chart/colors';
import { BASE_OPTIONS, axisStyle, thin, useChart, type Palette } from './chartKit';
import { ALWAYS_HALF_BRIER, score3 } from './format';

/** More points than this cannot be told apart on a chart this wide. */
const MAX_POINTS = 200;
const DAY_MS = 86_400_000;

const LEGEND: LegendItem[] = [
  { label: 'Your running Brier score', color: '--chart-own', dash: [], marker: 'circle', lineWidth: 2.5 },
  { label: `Always 50% (${ALWAYS_HALF_BRIER})`, color: '--chart-base-rate', dash: DASHED, marker: 'none', lineWidth: 1.5 },
];

/** What the axis and tooltip callbacks (set once, at creation) read for the data drawn now. */
interface Holder {
  points: readonly RunningBrierPoint[];
  ticks: number[];
  timeZone: string;
  span: number;
}

function describe(points: readonly RunningBrierPoint[]): string {
  const first = points[0];
  const last = points[points.length - 1];
  if (!first || !last) return 'Running Brier score: no scored questions.';
  return `Running Brier score by window end: ${score3(first.brier)} after the first ${first.n === 1 ? 'question' : `${formatCount(first.n)} questions`}, ${score3(last.brier)} after all ${formatCount(last.n)}. The table below lists the points.`;
}

export const RunningBrierChart = memo(function RunningBrierChart({ running, timeZone }: { running: RunningBrierPoint[]; timeZone: string }) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const points = useMemo(() => thin(running, MAX_POINTS), [running]);
  const holder = useRef<Holder>({ points, ticks: [], timeZone, span: 0 }).current;
  const data = useMemo(() => ({ points, timeZone }), [points, timeZone]);

  useChart<'line', typeof data>(
    canvasRef,
    (colors: Palette): ChartConfiguration<'line'> => ({
      type: 'line',
      data: {
        datasets: [
          {
            ...lineStyle(LEGEND[0]!, cssColor),
            data: [],
            pointRadius: 2.5,
            pointHoverRadius: 5,
            // Already {x, y} and sorted by window end: skip Chart.js's parsing.
            parsing: false,
            normalized: true,
          },
          {
            ...lineStyle(LEGEND[1]!, cssColor),
            data: [],
            pointRadius: 0,
            pointHoverRadius: 0,
          },
        ],
      },
      options: {
        ...BASE_OPTIONS,
        font: { family: colors.font },
        interaction: { mode: 'nearest', intersect: false, axis: 'x' },
        scales: {
          x: {
            type: 'linear',
            ...axisStyle(colors, 'Window end'),
            afterBuildTicks: (axis) => {
              axis.ticks = holder.ticks.map((value) => ({ value }));
            },
            ticks: { color: colors.text, maxRotation: 0, autoSkip: true, callback: (v) => formatTick(Number(v), holder.timeZone, 'day', holder.span) },
          },
          y: {
            type: 'linear',
            min: 0,
            suggestedMax: 0.5,
            ...axisStyle(colors, 'Brier score (lower is better)'),
            ticks: { color: colors.text, stepSize: 0.1 },
          },
        },
        plugins: {
          legend: { display: false },
          tooltip: {
            filter: (item) => item.datasetIndex === 0,
            callbacks: {
              title: (items) => formatDay(items[0]?.parsed.x ?? 0, holder.timeZone),
              label: (item) => {
                const point = holder.points[item.dataIndex];
                return point ? `Brier ${score3(point.brier)} over ${point.n} question${point.n === 1 ? '' : 's'}` : '';
              },
            },
          },
        },
      },
    }),
    (chart, { points: shown, timeZone: zone }) => {
      const first = shown[0]?.T ?? 0;
      const last = shown[shown.length - 1]?.T ?? 0;
      const pad = Math.max((last - first) * 0.03, DAY_MS);
      const min = first - pad;
      const max = last + pad;
      const ticks = timeTicks(min, max, zone, 6);
      holder.points = shown;
      holder.ticks = ticks.values;
      holder.timeZone = zone;
      holder.span = max - min;
      const x = chart.options.scales?.x;
      if (x) {
        x.min = min;
        x.max = max;
      }
      chart.data.datasets[0]!.data = shown.map((p) => ({ x: p.T, y: p.brier }));
      chart.data.datasets[1]!.data = [
        { x: min, y: 0.25 },
        { x: max, y: 0.25 },
      ];
    },
    data,
  );

  return (
    <ChartFigure
      testId="running-brier-chart"
      canvasRef={canvasRef}
      points={points}
      description={describe(points)}
      legend={LEGEND}
      caption={
        running.length > points.length
          ? `Running Brier score by window end (${points.length} of ${running.length} points drawn, evenly spread).`
          : 'Running Brier score by window end: the mean over every question whose window had ended by then.'
      }
      table={
        <table>
          <caption className="visually-hidden">Running Brier score</caption>
          <thead>
            <tr>
              <th scope="col">Window end</th>
              <th scope="col" className="num">Questions so far</th>
              <th scope="col" className="num">Running Brier</th>
            </tr>
          </thead>
          <tbody>
            {points.map((p) => (
              <tr key={p.T}>
                <td>
                  <time dateTime={new Date(p.T).toISOString()}>{formatDay(p.T, timeZone)}</time>
                </td>
                <td className="num">{formatCount(p.n)}</td>
                <td className="num">{score3(p.brier)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      }
    />
  );
});
