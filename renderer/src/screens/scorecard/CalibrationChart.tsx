/**
 * The calibration diagram: each probability bin's mean forecast against how often its
 * questions came true, with the Wilson 95% interval as a vertical bar, the point's size
 * growing with the number of questions in the bin, and the diagonal where the two agree.
 */
import { memo, useRef, type ReactNode } from 'react';
import type { ReportBin } from '../../../../shared/scoring/types';
import { CalibrationTable, calibrationLegend, useCalibrationChart, type CalibrationSpec } from './calibrationKit';
import { ChartFigure } from './ChartFigure';
import { binLabel, pct, pctInterval, questions } from './format';

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

const LEGEND = calibrationLegend('Your forecasts, by bin (bar: 95% interval)');

const SPEC: CalibrationSpec<ReportBin> = {
  barsId: 'forelogWilsonBars',
  legend: LEGEND,
  xTitle: 'Forecast (mean of the bin)',
  yTitle: 'Share that came true',
  dotRadius: radii,
  order: drawingOrder,
  point: (bin) => ({ x: bin.mean_p, y: bin.observed }),
  interval: (bin) => ({ x: bin.mean_p, low: bin.wilson_low, high: bin.wilson_high }),
  tooltipTitle: (bin) => `${binLabel(bin.index)} bin (${questions(bin.n)})`,
  tooltipLabel: (bin) => `Mean forecast ${pct(bin.mean_p)}, came true ${pct(bin.observed)} (95% interval ${pctInterval(bin.wilson_low, bin.wilson_high)})`,
};

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
  useCalibrationChart(canvasRef, bins, SPEC);

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
        <CalibrationTable
          caption="Calibration by bin"
          headings={['Bin', 'n', 'Mean forecast', 'Came true', '95% interval (Wilson)']}
          rows={bins.map((b) => ({ key: b.index, label: binLabel(b.index), cells: [b.n, pct(b.mean_p), pct(b.observed), pctInterval(b.wilson_low, b.wilson_high)] }))}
        />
      }
    />
  );
});
