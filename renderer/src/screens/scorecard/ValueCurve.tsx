/**
 * The value curve (Richardson 2000; SCORING.md "Relative value"): for every cost ratio α from
 * 1% to 99%, how much of the saving perfect foresight would bring the forecasts captured
 * against the better of always or never acting. Gaps are cost ratios where the value is not
 * defined. The dashed line marks the threshold in force.
 */
import { memo, useMemo, useRef } from 'react';
import type { ChartConfiguration } from 'chart.js';
import type { ValuePoint } from '../../../../shared/scoring/types';
import { verticalMarkers, type VerticalMarker } from '../../chart/markers';
import { ChartFigure } from './ChartFigure';
import { BASE_OPTIONS, axisStyle, percentAxis, useChart, type Palette } from './chartKit';
import { pct, score2, tick } from './format';

/** Values below this are drawn at the bottom edge (they run to −∞ near the ends); the table has them all. */
const FLOOR = -1;

function describe(curve: readonly ValuePoint[], alpha: number): string {
  const defined = curve.filter((p): p is { alpha: number; value: number } => p.value !== null);
  if (defined.length === 0) return 'Value curve: not defined at any cost ratio (needs both Yes and No questions).';
  const best = defined.reduce((a, b) => (b.value > a.value ? b : a));
  const at = curve.find((p) => Math.abs(p.alpha - alpha) < 0.005);
  return `Value curve over cost ratios 1% to 99%: highest ${score2(best.value)} at ${pct(best.alpha)}${at ? `; at your threshold ${pct(alpha)}: ${score2(at.value)}` : ''}. The table below lists every point.`;
}

export const ValueCurve = memo(function ValueCurve({ curve, alpha }: { curve: ValuePoint[]; alpha: number }) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const markers = useRef<VerticalMarker[]>([]).current;
  const data = useMemo(() => ({ curve, alpha }), [curve, alpha]);

  useChart<'line', typeof data>(
    canvasRef,
    (colors: Palette): ChartConfiguration<'line'> => ({
      type: 'line',
      data: {
        datasets: [
          {
            label: 'Relative value',
            data: [],
            spanGaps: false,
            borderColor: colors.own,
            backgroundColor: colors.own,
            borderWidth: 2.5,
            pointRadius: 0,
            pointHoverRadius: 4,
          },
        ],
      },
      options: {
        ...BASE_OPTIONS,
        font: { family: colors.font },
        interaction: { mode: 'nearest', intersect: false, axis: 'x' },
        scales: {
          x: percentAxis(colors, 'Cost ratio α = false-alarm cost / (false-alarm cost + miss cost)', 0.1),
          y: {
            type: 'linear',
            max: 1,
            ...axisStyle(colors, 'Relative value (1: perfect foresight)'),
            ticks: { color: colors.text, stepSize: 0.25, callback: (v) => tick(v) },
          },
        },
        plugins: {
          legend: { display: false },
          tooltip: {
            callbacks: {
              title: (items) => `α = ${pct(items[0]?.parsed.x ?? 0)}`,
              label: (item) => `Value ${score2(item.parsed.y)}`,
            },
          },
        },
      },
      plugins: [verticalMarkers(markers, colors.font, colors.surface)],
    }),
    (chart, { curve: points, alpha: threshold }, colors) => {
      const values = points.map((p) => p.value).filter((v): v is number => v !== null);
      const lowest = values.length ? Math.min(...values) : 0;
      const y = chart.options.scales?.y;
      if (y) y.min = lowest < 0 ? Math.max(FLOOR, Math.floor(lowest * 4) / 4) : 0;
      chart.data.datasets[0]!.data = points.map((p) => ({ x: p.alpha, y: p.value as number }));
      markers.length = 0;
      markers.push({ at: threshold, label: `Your threshold ${pct(threshold)}`, color: colors.reference });
    },
    data,
  );

  return (
    <ChartFigure
      testId="value-curve-chart"
      canvasRef={canvasRef}
      points={curve}
      description={describe(curve, alpha)}
      caption="Value curve: for each cost ratio, the share of perfect foresight’s saving your forecasts would have captured (0: no better than always or never acting; values below −1 are drawn at the edge)."
      table={
        <table>
          <caption className="visually-hidden">Relative value by cost ratio</caption>
          <thead>
            <tr>
              <th scope="col" className="num">Cost ratio α</th>
              <th scope="col" className="num">Relative value</th>
            </tr>
          </thead>
          <tbody>
            {curve.map((p) => (
              <tr key={p.alpha}>
                <td className="num">{pct(p.alpha)}</td>
                <td className="num">{p.value === null ? 'not defined' : score2(p.value)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      }
    />
  );
});
