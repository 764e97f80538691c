/**
 * The value curve (Richardson 2000; SCORING.md "Relative value"): for every cost ratio α from
 * 1% to 99%, how much of the saving perfect foresight would bring the forecasts captured
 * against the better of always or never acting. Gaps are cost ratios where the value is not
 * defined. The dashed line marks the threshold in force.
 *
 * Near the ends the value runs towards −∞, which no axis can show. Values below −1 are drawn
 * on the bottom edge, marked as such (▼ on each, dotted between them, a legend entry and a
 * note); the table under the chart has every value.
 */
import { memo, useMemo, useRef } from 'react';
import type { ChartConfiguration, ScriptableLineSegmentContext } from 'chart.js';
import type { ValuePoint } from '../../../../shared/scoring/types';
import { DOTTED, lineStyle, type LegendItem } from '../../chart/Legend';
import { verticalMarkers, type VerticalMarker } from '../../chart/markers';
import { ChartFigure } from './ChartFigure';
import { cssColor } from '../../chart/colors';
import { BASE_OPTIONS, axisStyle, percentAxis, useChart, type Palette } from './chartKit';
import { pct, score2, tick } from './format';

/** The lowest value the axis shows; lower ones are drawn on it, marked as clipped. */
export const FLOOR = -1;

const CURVE: LegendItem = { label: 'Relative value', color: '--chart-own', dash: [], marker: 'none', lineWidth: 2.5 };
const CLIPPED: LegendItem = { label: `Below ${tick(FLOOR)}: drawn on the bottom edge`, color: '--chart-own', dash: null, marker: 'triangleDown' };

/** What the chart draws: the value, or the floor for a value below it (flagged). */
export function plotted(curve: readonly ValuePoint[]): { x: number; y: number | null; clipped: boolean }[] {
  return curve.map((p) => ({ x: p.alpha, y: p.value === null ? null : Math.max(FLOOR, p.value), clipped: p.value !== null && p.value < FLOOR }));
}

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
  const points = useMemo(() => plotted(curve), [curve]);
  // Read by the segment styling and the tooltip, which Chart.js calls while drawing.
  const drawnNow = useRef<{ curve: readonly ValuePoint[]; clipped: boolean[] }>({ curve, clipped: [] });
  const clippedAt = (i: number) => drawnNow.current.clipped[i] === true;
  const clippedCount = points.filter((p) => p.clipped).length;

  useChart<'line', typeof data>(
    canvasRef,
    (colors: Palette): ChartConfiguration<'line'> => ({
      type: 'line',
      data: {
        datasets: [
          {
            ...lineStyle(CURVE, cssColor),
            pointStyle: 'triangle',
            pointRotation: 180,
            data: [],
            spanGaps: false,
            pointRadius: 0,
            pointHoverRadius: 4,
            // Markers on the bottom edge are drawn whole.
            clip: false,
            segment: {
              // Between two clipped values the line runs along the edge: dotted, not a real reading.
              borderDash: (ctx: ScriptableLineSegmentContext) => (clippedAt(ctx.p0DataIndex) && clippedAt(ctx.p1DataIndex) ? DOTTED : undefined),
            },
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
              label: (item) => {
                const value = drawnNow.current.curve[item.dataIndex]?.value;
                return value !== undefined && value !== null && value < FLOOR ? `Value ${score2(value)} (below the chart, drawn on its edge)` : `Value ${score2(item.parsed.y)}`;
              },
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
      const drawn = plotted(points);
      drawnNow.current = { curve: points, clipped: drawn.map((p) => p.clipped) };
      const dataset = chart.data.datasets[0]!;
      dataset.data = drawn.map((p) => ({ x: p.x, y: p.y as number }));
      dataset.pointRadius = drawn.map((p) => (p.clipped ? 3.5 : 0));
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
      caption="Value curve: for each cost ratio, the share of perfect foresight’s saving your forecasts would have captured (0: no better than always or never acting; 1: perfect foresight)."
      legend={clippedCount > 0 ? [CURVE, CLIPPED] : []}
      note={
        clippedCount > 0
          ? `${clippedCount} cost ratio${clippedCount === 1 ? ' has a value' : 's have values'} below ${tick(FLOOR)}, drawn on the bottom edge as ▼ and joined by a dotted line. The table has the exact values.`
          : undefined
      }
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
