/**
 * The calibration diagram: each probability bin's mean forecast against how often its
 * questions came true, with the Wilson 95% interval as a vertical bar, the point's size
 * growing with the number of questions in the bin, and the diagonal where the two agree.
 */
import { memo, useRef, type ReactNode } from 'react';
import type { Chart, ChartConfiguration, Plugin } from 'chart.js';
import type { ReportBin } from '../../../../shared/scoring/types';
import { DASHED, lineStyle, type LegendItem } from '../../chart/Legend';
import { ChartFigure } from './ChartFigure';
import { BASE_OPTIONS, cssColor, percentAxis, useChart, withAlpha, type Palette } from './chartKit';
import { binLabel, pct, pctInterval, questions } from './format';

/** The bins the interval bars are drawn for; the plugin reads whatever the chart shows now. */
interface Holder {
  bins: readonly ReportBin[];
}

/** Our own small plugin: the Wilson interval of each bin as a capped vertical bar behind its point. */
function wilsonBars(holder: Holder, color: () => string): Plugin<'scatter'> {
  return {
    id: 'forelogWilsonBars',
    beforeDatasetsDraw(chart: Chart<'scatter'>) {
      const { ctx, scales } = chart;
      const x = scales.x;
      const y = scales.y;
      if (!x || !y) return;
      ctx.save();
      ctx.strokeStyle = color();
      ctx.lineWidth = 1.5;
      for (const bin of holder.bins) {
        const px = x.getPixelForValue(bin.mean_p);
        const top = y.getPixelForValue(bin.wilson_high);
        const bottom = y.getPixelForValue(bin.wilson_low);
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

/** Radius 4 px for the smallest bin up to 12 px for the largest, by area. */
function radii(bins: readonly ReportBin[]): number[] {
  const most = Math.max(1, ...bins.map((b) => b.n));
  return bins.map((b) => 4 + 8 * Math.sqrt(b.n / most));
}

/**
 * The bins in drawing order: biggest first, so a small bin lying on a big one is drawn on top
 * of it and stays visible (the dots are also see-through with a ring, so both show).
 */
function drawingOrder(bins: readonly ReportBin[]): ReportBin[] {
  return [...bins].sort((a, b) => b.n - a.n || a.index - b.index);
}

/** The dots are see-through with a solid ring, so overlapping dots and their bars all show. */
const DOT_OPACITY = 0.55;

const LEGEND: LegendItem[] = [
  { label: 'Perfect calibration', color: '--chart-base-rate', dash: DASHED, marker: 'none', lineWidth: 1.5 },
  { label: 'Your forecasts, by bin (bar: 95% interval)', color: '--chart-own', dash: null, marker: 'circle', markerOpacity: DOT_OPACITY },
];



function describe(bins: readonly ReportBin[]): string {
  if (bins.length === 0) return 'Calibration diagram: no scored questions.';
  const parts = bins.map((b) => `${binLabel(b.index)} bin: came true ${pct(b.observed)} of ${questions(b.n)}`);
  return `Calibration diagram, forecast against how often it came true. ${parts.join('; ')}. The table below has the intervals.`;
}

export interface CalibrationChartProps {
  bins: ReportBin[];
  /** Another use of the same diagram (choice options, one-vs-rest) gets its own test id and caption. */
  testId?: string;
  caption?: ReactNode;
}

export const CalibrationChart = memo(function CalibrationChart({ bins, testId = 'calibration-chart', caption }: CalibrationChartProps) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const holder = useRef<Holder>({ bins }).current;

  useChart<'scatter', ReportBin[]>(
    canvasRef,
    (colors: Palette): ChartConfiguration<'scatter'> => ({
      type: 'scatter',
      data: {
        datasets: [
          {
            ...lineStyle(LEGEND[0]!, cssColor),
            data: [
              { x: 0, y: 0 },
              { x: 1, y: 1 },
            ],
            pointRadius: 0,
            pointHoverRadius: 0,
          },
          {
            ...lineStyle(LEGEND[1]!, cssColor),
            data: [],
            backgroundColor: withAlpha(colors.own, DOT_OPACITY),
            borderColor: colors.own,
            borderWidth: 2,
            // Bins at 0% or 100% sit on the frame; draw the whole dot rather than half of it.
            clip: false,
          },
        ],
      },
      options: {
        ...BASE_OPTIONS,
        font: { family: colors.font },
        layout: { padding: { top: 14, right: 14 } },
        scales: {
          x: percentAxis(colors, 'Forecast (mean of the bin)', 0.1),
          y: percentAxis(colors, 'Share that came true', 0.25),
        },
        plugins: {
          legend: { display: false },
          tooltip: {
            filter: (item) => item.datasetIndex === 1,
            callbacks: {
              title: (items) => {
                const bin = holder.bins[items[0]?.dataIndex ?? -1];
                return bin ? `${binLabel(bin.index)} bin (${questions(bin.n)})` : '';
              },
              label: (item) => {
                const bin = holder.bins[item.dataIndex];
                return bin
                  ? `Mean forecast ${pct(bin.mean_p)}, came true ${pct(bin.observed)} (95% interval ${pctInterval(bin.wilson_low, bin.wilson_high)})`
                  : '';
              },
            },
          },
        },
      },
      plugins: [wilsonBars(holder, () => colors.text)],
    }),
    (chart, data) => {
      const ordered = drawingOrder(data);
      holder.bins = ordered;
      const dataset = chart.data.datasets[1]!;
      dataset.data = ordered.map((b) => ({ x: b.mean_p, y: b.observed }));
      const r = radii(ordered);
      dataset.pointRadius = r;
      dataset.pointHoverRadius = r.map((v) => v + 2);
    },
    bins,
  );

  return (
    <ChartFigure
      testId={testId}
      canvasRef={canvasRef}
      points={bins}
      description={describe(bins)}
      legend={LEGEND}
      caption={
        caption ?? <>
          Calibration diagram: each dot is a 10-point probability bin; bars are 95% Wilson intervals; bigger dots hold more
          questions. Dots on the dashed diagonal came true exactly as often as stated.
        </>
      }
      table={
        <table>
          <caption className="visually-hidden">Calibration by bin</caption>
          <thead>
            <tr>
              <th scope="col">Bin</th>
              <th scope="col" className="num">n</th>
              <th scope="col" className="num">Mean forecast</th>
              <th scope="col" className="num">Came true</th>
              <th scope="col" className="num">95% interval (Wilson)</th>
            </tr>
          </thead>
          <tbody>
            {bins.map((b) => (
              <tr key={b.index}>
                <th scope="row">{binLabel(b.index)}</th>
                <td className="num">{b.n}</td>
                <td className="num">{pct(b.mean_p)}</td>
                <td className="num">{pct(b.observed)}</td>
                <td className="num">{pctInterval(b.wilson_low, b.wilson_high)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      }
    />
  );
});
