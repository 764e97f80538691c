/**
 * What the two calibration diagrams share (probability bins, and a numeric question's stated
 * levels): the dashed diagonal where stated and observed agree, see-through dots, each with
 * its Wilson 95% interval as a bar behind it, a tooltip per dot, and the table under it.
 */
import { useRef, type ReactNode, type RefObject } from 'react';
import type { ChartConfiguration } from 'chart.js';
import { cssColor, withAlpha } from '../../chart/colors';
import { intervalBars, type Interval } from '../../chart/intervalBars';
import { DASHED, lineStyle, type LegendItem } from '../../chart/Legend';
import { BASE_OPTIONS, percentAxis, useChart, type Palette } from './chartKit';

/** The dots are see-through with a solid ring, so overlapping dots and their bars all show. */
const DOT_OPACITY = 0.55;

/** The diagonal, then the dots under the given label. */
export function calibrationLegend(dotLabel: string): LegendItem[] {
  return [
    { label: 'Perfect calibration', color: '--chart-base-rate', dash: DASHED, marker: 'none', lineWidth: 1.5 },
    { label: dotLabel, color: '--chart-own', dash: null, marker: 'circle', markerOpacity: DOT_OPACITY },
  ];
}

export interface CalibrationSpec<T> {
  /** The plugin id of the interval bars. */
  barsId: string;
  legend: readonly LegendItem[];
  xTitle: string;
  yTitle: string;
  /** One size for every dot, or a size per dot (items in drawing order). */
  dotRadius: number | ((items: readonly T[]) => number[]);
  /** The items in drawing order (later ones on top); as given when absent. */
  order?: (items: readonly T[]) => T[];
  point: (item: T) => { x: number; y: number };
  interval: (item: T) => Interval;
  tooltipTitle: (item: T) => string;
  tooltipLabel: (item: T) => string;
}

/** Draws `items` as a calibration diagram on the canvas; updates in place when they change. */
export function useCalibrationChart<T>(canvasRef: RefObject<HTMLCanvasElement | null>, items: T[], spec: CalibrationSpec<T>): void {
  // The items as drawn, read by the tooltip and the bars at the time they draw.
  const holder = useRef<{ items: readonly T[] }>({ items }).current;
  const fixedRadius = typeof spec.dotRadius === 'number' ? { pointRadius: spec.dotRadius, pointHoverRadius: spec.dotRadius + 2 } : {};

  useChart<'scatter', T[]>(
    canvasRef,
    (colors: Palette): ChartConfiguration<'scatter'> => ({
      type: 'scatter',
      data: {
        datasets: [
          {
            ...lineStyle(spec.legend[0]!, cssColor),
            data: [
              { x: 0, y: 0 },
              { x: 1, y: 1 },
            ],
            pointRadius: 0,
            pointHoverRadius: 0,
          },
          {
            ...lineStyle(spec.legend[1]!, cssColor),
            data: [],
            backgroundColor: withAlpha(colors.own, DOT_OPACITY),
            borderColor: colors.own,
            borderWidth: 2,
            ...fixedRadius,
            // Dots at 0% or 100% sit on the frame; draw the whole dot rather than half of it.
            clip: false,
          },
        ],
      },
      options: {
        ...BASE_OPTIONS,
        font: { family: colors.font },
        layout: { padding: { top: 14, right: 14 } },
        scales: { x: percentAxis(colors, spec.xTitle, 0.1), y: percentAxis(colors, spec.yTitle, 0.25) },
        plugins: {
          legend: { display: false },
          tooltip: {
            filter: (item) => item.datasetIndex === 1,
            callbacks: {
              title: (tooltipItems) => {
                const item = holder.items[tooltipItems[0]?.dataIndex ?? -1];
                return item ? spec.tooltipTitle(item) : '';
              },
              label: (tooltipItem) => {
                const item = holder.items[tooltipItem.dataIndex];
                return item ? spec.tooltipLabel(item) : '';
              },
            },
          },
        },
      },
      plugins: [intervalBars<'scatter'>(spec.barsId, 'under', () => holder.items.map(spec.interval), colors.text)],
    }),
    (chart, data) => {
      const drawn = spec.order ? spec.order(data) : data;
      holder.items = drawn;
      const dataset = chart.data.datasets[1]!;
      dataset.data = drawn.map(spec.point);
      if (typeof spec.dotRadius === 'function') {
        const r = spec.dotRadius(drawn);
        dataset.pointRadius = r;
        dataset.pointHoverRadius = r.map((v) => v + 2);
      }
    },
    items,
  );
}

/** The diagram's data as a table: a heading per row, then numbers; `headings` names every column. */
export function CalibrationTable({ caption, headings, rows }: { caption: string; headings: readonly string[]; rows: { key: string | number; label: string; cells: ReactNode[] }[] }) {
  return (
    <table>
      <caption className="visually-hidden">{caption}</caption>
      <thead>
        <tr>
          <th scope="col">{headings[0]}</th>
          {headings.slice(1).map((heading, k) => (
            <th key={k} scope="col" className="num">
              {heading}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {rows.map((row) => (
          <tr key={row.key}>
            <th scope="row">{row.label}</th>
            {row.cells.map((cell, k) => (
              <td key={k} className="num">
                {cell}
              </td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
