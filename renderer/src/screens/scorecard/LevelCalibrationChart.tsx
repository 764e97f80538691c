/**
 * Stated level against what happened, for numeric questions: each row is a level (a range's
 * nominal coverage, or a quantile's τ) drawn at its stated value across and its observed
 * share up, with the Wilson 95% interval as a bar and the diagonal where the two agree.
 * Coverage per range and quantile calibration both use it.
 */
import { memo, useRef, type ReactNode } from 'react';
import { CalibrationTable, calibrationLegend, useCalibrationChart } from './calibrationKit';
import { ChartFigure } from './ChartFigure';
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

const LEGEND = calibrationLegend('Your forecasts (bar: 95% interval)');

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
  useCalibrationChart(canvasRef, rows, {
    barsId: 'forelogLevelWilsonBars',
    legend: LEGEND,
    xTitle,
    yTitle,
    dotRadius: 7,
    point: (row) => ({ x: row.stated, y: row.observed }),
    interval: (row) => ({ x: row.stated, low: row.low, high: row.high }),
    tooltipTitle: (row) => row.label,
    tooltipLabel: (row) => `${pct(row.observed)} of ${row.n} (95% interval ${pctInterval(row.low, row.high)}); stated ${pct(row.stated)}`,
  });

  const description = rows.length
    ? `${yTitle} against ${xTitle.toLowerCase()}: ${rows.map((r) => `${r.label} ${pct(r.observed)} of ${r.n}`).join('; ')}.`
    : `${yTitle}: nothing scored.`;
  return (
    <ChartFigure
      testId={testId}
      canvasRef={canvasRef}
      points={rows}
      description={description}
      legend={LEGEND}
      caption={caption}
      openTable
      note={readings}
      table={
        <CalibrationTable
          caption={yTitle}
          headings={[rowHeading, 'n', observedHeading, 'Stated', '95% interval (Wilson)']}
          rows={rows.map((r) => ({ key: r.label, label: r.label, cells: [r.n, pct(r.observed), pct(r.stated), pctInterval(r.low, r.high)] }))}
        />
      }
    />
  );
});
