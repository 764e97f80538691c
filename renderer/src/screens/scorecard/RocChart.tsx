/**
 * The ROC curve: for every threshold on the final forecasts, the share of Yes questions above
 * it (hit rate) against the share of No questions above it (false-alarm rate). The area under
 * it is the AUC; the diagonal is what forecasts that cannot tell Yes from No would trace.
 */
import { memo, useMemo, useRef } from 'react';
import type { ChartConfiguration } from 'chart.js';
import type { RocPoint } from '../../../../shared/scoring/types';
import { DASHED, lineStyle, type LegendItem } from '../../chart/Legend';
import { ChartFigure } from './ChartFigure';
import { cssColor } from '../../chart/colors';
import { BASE_OPTIONS, percentAxis, thin, useChart, type Palette } from './chartKit';
import { pct, score2 } from './format';
import { formatCount } from '../../dates';

const MAX_POINTS = 200;

const LEGEND: LegendItem[] = [
  { label: 'Your final forecasts', color: '--chart-own', dash: [], marker: 'circle', lineWidth: 2.5 },
  { label: 'No discrimination (AUC 0.5)', color: '--chart-base-rate', dash: DASHED, marker: 'none', lineWidth: 1.5 },
];

export interface RocChartProps {
  roc: RocPoint[];
  auc: number | null;
  yes: number;
  no: number;
}

export const RocChart = memo(function RocChart({ roc, auc, yes, no }: RocChartProps) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const points = useMemo(() => thin(roc, MAX_POINTS), [roc]);

  useChart<'scatter', RocPoint[]>(
    canvasRef,
    (colors: Palette): ChartConfiguration<'scatter'> => ({
      type: 'scatter',
      data: {
        datasets: [
          {
            ...lineStyle(LEGEND[0]!, cssColor),
            data: [],
            pointRadius: 2.5,
            pointHoverRadius: 5,
            clip: false,
            // The points are already {x, y}; skipping Chart.js's parsing saves time on big diaries.
            parsing: false,
          },
          {
            ...lineStyle(LEGEND[1]!, cssColor),
            data: [
              { x: 0, y: 0 },
              { x: 1, y: 1 },
            ],
            pointRadius: 0,
            pointHoverRadius: 0,
          },
        ],
      },
      options: {
        ...BASE_OPTIONS,
        font: { family: colors.font },
        layout: { padding: { top: 8, right: 10 } },
        scales: {
          x: percentAxis(colors, 'False-alarm rate (No questions above the threshold)', 0.25),
          y: percentAxis(colors, 'Hit rate', 0.25),
        },
        plugins: {
          legend: { display: false },
          tooltip: {
            filter: (item) => item.datasetIndex === 0,
            callbacks: {
              label: (item) => `Hit rate ${pct(item.parsed.y)}, false-alarm rate ${pct(item.parsed.x)}`,
            },
          },
        },
      },
    }),
    (chart, data) => {
      chart.data.datasets[0]!.data = data.map((p) => ({ x: p.fpr, y: p.tpr }));
    },
    points,
  );

  const counts = `${formatCount(yes)} Yes, ${formatCount(no)} No`;
  return (
    <ChartFigure
      testId="roc-chart"
      canvasRef={canvasRef}
      points={points}
      legend={LEGEND}
      description={`ROC curve of your final forecasts: AUC ${score2(auc)} (${counts}). The table below lists the points.`}
      caption={`ROC curve: AUC ${score2(auc)} over ${counts}. 1 means every Yes question got a higher forecast than every No question; 0.5 is the diagonal.`}
      table={
        <table>
          <caption className="visually-hidden">ROC curve points</caption>
          <thead>
            <tr>
              <th scope="col" className="num">False-alarm rate</th>
              <th scope="col" className="num">Hit rate</th>
            </tr>
          </thead>
          <tbody>
            {points.map((p, i) => (
              <tr key={i}>
                <td className="num">{pct(p.fpr)}</td>
                <td className="num">{pct(p.tpr)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      }
    />
  );
});
