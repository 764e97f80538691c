/**
 * What the three history charts (yes/no, choice, numeric) share: the canvas colours of the
 * theme in force, the time axis with local-midnight ticks, the chart options around the
 * series, the figure they sit in, and each option's look, so an option's line, its base
 * rate and its legend entry always agree.
 */
import { useEffect, useRef, type ReactNode, type RefObject } from 'react';
import { Chart, type ChartConfiguration, type ChartOptions, type ScaleOptions, type TooltipItem } from 'chart.js';
import { formatInstant, formatTick } from '../dates';
import { useColorScheme } from '../hooks';
import { cssColor } from './colors';
import { ChartLegend, type LegendItem, type Marker } from './Legend';
import { timeTicks } from './series';
import type { TimeAxis } from './typedSeries';

/** The colours drawn on the canvas itself; the series' colours come from their legend items. */
export interface HistoryPalette {
  close: string;
  resolved: string;
  grid: string;
  text: string;
  surface: string;
  font: string;
}

export function historyPalette(): HistoryPalette {
  return {
    close: cssColor('--chart-close'),
    resolved: cssColor('--color-success'),
    grid: cssColor('--chart-grid'),
    text: cssColor('--chart-text'),
    surface: cssColor('--color-surface'),
    font: cssColor('--font-sans') || 'system-ui',
  };
}

/** Six option colours (typedCharts.css, light and dark); options 7–12 repeat them dashed. */
export const OPTION_COLORS = 6;
const OPTION_MARKERS: Marker[] = ['circle', 'rectRot', 'triangle', 'rect', 'star', 'triangleDown'];

/** Option k's line: its colour, marker and (for k ≥ 6) a dash, so no two options look alike. */
export function optionLegend(label: string, k: number, cameTrue: boolean): LegendItem {
  return {
    label,
    color: `--chart-option-${k % OPTION_COLORS}`,
    dash: k < OPTION_COLORS ? [] : [8, 3],
    marker: OPTION_MARKERS[k % OPTION_MARKERS.length] ?? 'circle',
    lineWidth: cameTrue ? 4 : 2,
  };
}

/** The x axis: epoch ms on a linear scale with ticks at local midnights or whole hours. */
export function timeScale(axis: Pick<TimeAxis, 'xMin' | 'xMax'>, zone: string, colors: HistoryPalette): ScaleOptions<'linear'> {
  const ticks = timeTicks(axis.xMin, axis.xMax, zone);
  return {
    type: 'linear',
    min: axis.xMin,
    max: axis.xMax,
    afterBuildTicks: (scale) => {
      scale.ticks = ticks.values.map((value) => ({ value }));
    },
    ticks: { color: colors.text, callback: (value) => formatTick(Number(value), zone, ticks.unit, axis.xMax - axis.xMin), maxRotation: 0, autoSkip: true },
    grid: { color: colors.grid },
    border: { color: colors.grid },
  } as ScaleOptions<'linear'>;
}

/** A 0–100 % y axis with ticks every quarter, for the charts that plot a chance. */
export function chanceScale(title: string, colors: HistoryPalette): ScaleOptions<'linear'> {
  return {
    type: 'linear',
    min: 0,
    max: 1,
    ticks: { color: colors.text, stepSize: 0.25, callback: (value) => `${Math.round(Number(value) * 100)}%` },
    grid: { color: colors.grid },
    border: { color: colors.grid },
    title: { display: true, text: title, color: colors.text },
  } as ScaleOptions<'linear'>;
}

export interface HistoryOptions {
  colors: HistoryPalette;
  zone: string;
  x: ScaleOptions<'linear'>;
  y: ScaleOptions<'linear'>;
  /** Which points the tooltip names (held steps and reference lines are not points). */
  tooltipFilter: (item: TooltipItem<'line'>) => boolean;
  /** A point's tooltip line. */
  tooltipLabel: (item: TooltipItem<'line'>) => string;
}

/** The options around a history chart's series: drawn at once, sized by its box, the tooltip titled with the point's time. */
export function historyOptions({ colors, zone, x, y, tooltipFilter, tooltipLabel }: HistoryOptions): ChartOptions<'line'> {
  return {
    animation: false,
    responsive: true,
    maintainAspectRatio: false,
    interaction: { mode: 'nearest', intersect: false, axis: 'x' },
    font: { family: colors.font },
    scales: { x, y },
    plugins: {
      // Our own legend under the canvas draws each line's dash and marker (chart/Legend.tsx).
      legend: { display: false },
      tooltip: {
        filter: tooltipFilter,
        callbacks: {
          title: (items) => (items[0] ? formatInstant(new Date(items[0].parsed.x ?? 0).toISOString(), zone) : ''),
          label: tooltipLabel,
        },
      },
    },
  };
}

/**
 * Draws the chart `configure` describes (given the theme's colours) on the canvas it returns,
 * and draws it anew whenever one of `deps` or the colour scheme changes.
 */
export function useHistoryChart<D extends unknown[]>(configure: (colors: HistoryPalette) => ChartConfiguration<'line', D>, deps: readonly unknown[]): RefObject<HTMLCanvasElement | null> {
  const scheme = useColorScheme();
  const canvasRef = useRef<HTMLCanvasElement>(null);
  // The latest `configure`, read when a change of `deps` or scheme draws the chart anew.
  const latest = useRef(configure);
  latest.current = configure;
  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas) return;
    const chart = new Chart<'line', D>(canvas, latest.current(historyPalette()));
    return () => chart.destroy();
  }, [...deps, scheme]);
  return canvasRef;
}

export interface HistoryFigureProps {
  /** 'choice' or 'numeric'; the yes/no chart has none. */
  kind?: string;
  /** The plotted data, serialised into `data-points` (tests read that rather than pixels). */
  points: unknown;
  caption: ReactNode;
  canvasRef: RefObject<HTMLCanvasElement | null>;
  /** A few words for screen readers, pointing to the tables for the full detail. */
  description: string;
  legend: readonly LegendItem[];
}

/** The figure a history chart sits in: caption, the described canvas and the legend under it. */
export function HistoryFigure({ kind, points, caption, canvasRef, description, legend }: HistoryFigureProps) {
  return (
    <figure className="history-chart" data-testid="history-chart" data-kind={kind} data-points={JSON.stringify(points)}>
      <figcaption className="history-chart__caption">{caption}</figcaption>
      <div className="history-chart__canvas">
        <canvas ref={canvasRef} role="img" aria-label={description} />
      </div>
      <ChartLegend items={legend} />
    </figure>
  );
}
