/**
 * Stated level against what happened, for numeric questions: each row is a level (a range's
 * nominal coverage, or a quantile's τ) drawn at its stated value across and its observed
 * share up, with the Wilson 95% interval as a bar and the diagonal where the two agree.
 * Coverage per range and quantile calibration both use it.
 */
import { memo, useRef, type ReactNode } from 'react';
import type { Chart, ChartConfiguration, Plugin } from 'chart.js';
import { DASHED, lineStyle, type LegendItem } from '../../chart/Legend';
import { ChartFigure } from './ChartFigure';
import { BASE_OPTIONS, cssColor, percentAxis, useChart, withAlpha, type Palette } from './chartKit';
import { pct, pctInterval } from './format';

export interface LevelRow {
  /** Row label, e.g. "80% range" or "P90". */
  label: string;
  stated: number;
  observed: number;
  n: number;
  low: number;
  high: number;
}

interface Holder {
  rows: readonly LevelRow[];
}

function wilsonBars(holder: Holder, color: () => string): Plugin<'scatter'> {
  return {
    id: 'forelogLevelWilsonBars',
    beforeDatasetsDraw(chart: Chart<'scatter'>) {
      const { ctx, scales } = chart;
      const x = scales.x;
      const y = scales.y;
      if (!x || !y) return;
      ctx.save();
      ctx.strokeStyle = color();
      ctx.lineWidth = 1.5;
      for (const row of holder.rows) {
        const px = x.getPixelForValue(row.stated);
        const top = y.getPixelForValue(row.high);
        const bottom = y.getPixelForValue(row.low);
        ctx.beginPath();
        ctx.moveTo(px, top);
        ctx.lineTo(px, bottom);
        ctx.moveTo(px - 5, top);
        ctx.lineTo(px + 5, top);
        ctx.moveTo(px - 5, bottom);
        ctx.lineTo(px + 5, bottom);
        ctx.stroke();
      }
      ctx.restore();
    },
  };
}

export interface LevelCalibrationChartProps {
  testId: string;
  rows: LevelRow[];
  caption: ReactNode;
  xTitle: string;
  yTitle: string;
  /** Column headings of the table: the row label and the observed share. */
  rowHeading: string;
  observedHeading: string;
  /** The readings under the chart (one sentence per row). */
  readings: ReactNode;
}

export const LevelCalibrationChart = memo(function LevelCalibrationChart({ testId, rows, caption, xTitle, yTitle, rowHeading, observedHeading, readings }: LevelCalibrationChartProps) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const holder = useRef<Holder>({ rows }).current;
  const legend: LegendItem[] = [
    { label: 'Perfect calibration', color: '--chart-base-rate', dash: DASHED, marker: 'none', lineWidth: 1.5 },
    { label: 'Your forecasts (bar: 95% interval)', color: '--chart-own', dash: null, marker: 'circle', markerOpacity: 0.55 },
  ];

  useChart<'scatter', LevelRow[]>(
    canvasRef,
    (colors: Palette): ChartConfiguration<'scatter'> => ({
      type: 'scatter',
      data: {
        datasets: [
          {
            ...lineStyle(legend[0]!, cssColor),
            data: [
              { x: 0, y: 0 },
              { x: 1, y: 1 },
            ],
            pointRadius: 0,
            pointHoverRadius: 0,
          },
          {
            ...lineStyle(legend[1]!, cssColor),
            data: [],
            backgroundColor: withAlpha(colors.own, 0.55),
            borderColor: colors.own,
            borderWidth: 2,
            pointRadius: 7,
            pointHoverRadius: 9,
            clip: false,
          },
        ],
      },
      options: {
        ...BASE_OPTIONS,
        font: { family: colors.font },
        layout: { padding: { top: 14, right: 14 } },
        scales: { x: percentAxis(colors, xTitle, 0.1), y: percentAxis(colors, yTitle, 0.25) },
        plugins: {
          legend: { display: false },
          tooltip: {
            filter: (item) => item.datasetIndex === 1,
            callbacks: {
              title: (items) => holder.rows[items[0]?.dataIndex ?? -1]?.label ?? '',
              label: (item) => {
                const row = holder.rows[item.dataIndex];
                return row ? `${pct(row.observed)} of ${row.n} (95% interval ${pctInterval(row.low, row.high)}); stated ${pct(row.stated)}` : '';
              },
            },
          },
        },
      },
      plugins: [wilsonBars(holder, () => colors.text)],
    }),
    (chart, data) => {
      holder.rows = data;
      chart.data.datasets[1]!.data = data.map((r) => ({ x: r.stated, y: r.observed }));
    },
    rows,
  );

  const description = rows.length
    ? `${yTitle} against ${xTitle.toLowerCase()}: ${rows.map((r) => `${r.label} ${pct(r.observed)} of ${r.n}`).join('; ')}.`
    : `${yTitle}: nothing scored.`;
  return (
    <ChartFigure
      testId={testId}
      canvasRef={canvasRef}
      points={rows}
      description={description}
      legend={legend}
      caption={caption}
      openTable
      note={readings}
      table={
        <table>
          <caption className="visually-hidden">{yTitle}</caption>
          <thead>
            <tr>
              <th scope="col">{rowHeading}</th>
              <th scope="col" className="num">n</th>
              <th scope="col" className="num">{observedHeading}</th>
              <th scope="col" className="num">Stated</th>
              <th scope="col" className="num">95% interval (Wilson)</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.label}>
                <th scope="row">{r.label}</th>
                <td className="num">{r.n}</td>
                <td className="num">{pct(r.observed)}</td>
                <td className="num">{pct(r.stated)}</td>
                <td className="num">{pctInterval(r.low, r.high)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      }
    />
  );
});
