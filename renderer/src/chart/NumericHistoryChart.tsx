/**
 * The history of a numeric question: your range over time as a shaded band between the
 * lowest and highest quantile (a second, darker band for P25–P75 when the question has
 * them), the median as a line, reference forecasts as markers with their range as a
 * whisker, the close and the resolution as labelled vertical lines, and the outcome as a
 * horizontal line. A date question's values are days, drawn on a date axis.
 * `data-points` carries the plotted data as JSON.
 */
import { useMemo } from 'react';
import { Chart, Filler, LinearScale, LineController, LineElement, PointElement, Tooltip, type ChartDataset, type TooltipItem } from 'chart.js';
import { levelName, formatValue } from '../forecastEntry/numericEntry';
import { cssColor, withAlpha } from './colors';
import { historyOptions, HistoryFigure, timeScale, useHistoryChart } from './historyChartKit';
import { intervalBars } from './intervalBars';
import { DOTTED, lineStyle, type LegendItem, type Marker } from './Legend';
import { verticalMarkers, type VerticalMarker } from './markers';
import { numericSeries, type NumericHistoryInput, type TimeXY } from './typedSeries';
import '../tools/tools.css';
import './typedCharts.css';

Chart.register(LineController, LineElement, PointElement, LinearScale, Tooltip, Filler);

const REFERENCE_MARKERS: Marker[] = ['rectRot', 'triangle', 'rect'];

function rangeName(levels: readonly number[]): string {
  return levels.length > 1 ? `${levelName(levels[0]!)}–${levelName(levels[levels.length - 1]!)}` : 'P50';
}

function describe(input: NumericHistoryInput): string {
  const show = (v: number) => formatValue(v, input.value_kind, input.unit);
  const last = [...input.forecasts].sort((a, b) => Date.parse(a.at) - Date.parse(b.at) || a.seq - b.seq).pop();
  const median = input.levels.indexOf(0.5);
  const parts: string[] = [];
  if (last) {
    const m = input.levels.length;
    parts.push(
      m > 1
        ? `Latest of ${input.forecasts.length} forecasts: median ${show(last.quantiles[median]!)}, ${rangeName(input.levels)} range ${show(last.quantiles[0]!)} to ${show(last.quantiles[m - 1]!)}.`
        : `Latest of ${input.forecasts.length} forecasts: median ${show(last.quantiles[0]!)}.`,
    );
  } else {
    parts.push('No forecasts yet.');
  }
  if (input.references.length) parts.push(`${input.references.length} reference forecast${input.references.length === 1 ? '' : 's'}.`);
  if (input.value !== null) parts.push(`Outcome: ${show(input.value)}.`);
  parts.push('The tables below list every point.');
  return `Range history. ${parts.join(' ')}`;
}

export function numericLegend(input: NumericHistoryInput): LegendItem[] {
  const sources = [...new Set(input.references.map((r) => r.source))];
  const m = input.levels.length;
  return [
    ...(m > 1 ? [{ label: `Your ${rangeName(input.levels)} range`, color: '--chart-band-outer', dash: [], marker: 'none', lineWidth: 10 } satisfies LegendItem] : []),
    ...(m >= 5 ? [{ label: `Your ${levelName(input.levels[1]!)}–${levelName(input.levels[m - 2]!)} range`, color: '--chart-band-inner', dash: [], marker: 'none', lineWidth: 10 } satisfies LegendItem] : []),
    { label: 'Your median', color: '--chart-own', dash: [], marker: 'circle', lineWidth: 2.5 },
    ...sources.map<LegendItem>((source, i) => ({ label: `Reference: ${source}`, color: '--chart-reference', dash: null, marker: REFERENCE_MARKERS[i % REFERENCE_MARKERS.length] ?? 'rectRot' })),
    ...(input.value !== null ? [{ label: `Outcome: ${formatValue(input.value, input.value_kind, input.unit)}`, color: '--color-success', dash: [10, 4], marker: 'none', lineWidth: 2 } satisfies LegendItem] : []),
  ];
}

export function NumericHistoryChart({ input, timeZone }: { input: NumericHistoryInput; timeZone: string }) {
  const legend = useMemo(() => numericLegend(input), [input]);

  const canvasRef = useHistoryChart<TimeXY[]>((colors) => {
    const series = numericSeries(input, Date.now());
    const band = cssColor('--chart-band');
    const show = (v: number) => formatValue(v, input.value_kind, input.unit);
    // Chart.js draws a higher `order` first: the bands lie under the median, the references and the outcome.
    const edge = { borderColor: withAlpha(band, 0.6), borderWidth: 1, borderDash: DOTTED, pointRadius: 0, pointHoverRadius: 3, stepped: 'before' as const, order: 10 };
    const datasets: ChartDataset<'line', TimeXY[]>[] = [];
    const m = input.levels.length;
    if (series.low.length) {
      datasets.push({ ...edge, label: levelName(input.levels[0]!), data: series.low, fill: false });
      datasets.push({ ...edge, label: levelName(input.levels[m - 1]!), data: series.high, fill: '-1', backgroundColor: withAlpha(cssColor('--chart-band-outer'), 0.75) });
    }
    if (series.innerLow.length) {
      datasets.push({ ...edge, label: levelName(input.levels[1]!), data: series.innerLow, fill: false });
      datasets.push({ ...edge, label: levelName(input.levels[m - 2]!), data: series.innerHigh, fill: '-1', backgroundColor: withAlpha(cssColor('--chart-band-inner'), 0.75) });
    }
    const medianItem = legend.find((item) => item.label === 'Your median')!;
    datasets.push({
      ...lineStyle(medianItem, cssColor),
      label: 'Median',
      data: series.median,
      stepped: 'before',
      pointRadius: series.median.map((p) => (p.hold ? 0 : 4)),
      pointHoverRadius: 6,
    });
    series.references.forEach((ref, i) => {
      const item = legend.find((l) => l.label === `Reference: ${ref.source}`)!;
      datasets.push({ ...lineStyle(item, cssColor), label: `Reference: ${ref.source}`, data: ref.points.map((p) => ({ x: p.x, y: p.y })), pointRadius: 6, pointHoverRadius: 8, order: -i - 1 });
    });
    if (input.value !== null) {
      const item = legend[legend.length - 1]!;
      datasets.push({
        ...lineStyle(item, cssColor),
        label: 'Outcome',
        data: [
          { x: series.axis.xMin, y: input.value },
          { x: series.axis.xMax, y: input.value },
        ],
        pointRadius: 0,
        pointHoverRadius: 0,
      });
    }
    const markers: VerticalMarker[] = [{ at: series.axis.closeMs, label: 'Close', color: colors.close }];
    if (series.axis.resolvedMs !== null) {
      markers.push({ at: series.axis.resolvedMs, label: input.void ? 'Resolved Void' : `Resolved: ${show(input.value ?? 0)}`, color: colors.resolved });
    }
    const date = input.value_kind === 'date';
    return {
      type: 'line',
      data: { datasets },
      options: historyOptions({
        colors,
        zone: timeZone,
        x: timeScale(series.axis, timeZone, colors),
        y: {
          type: 'linear',
          suggestedMin: series.yMin,
          suggestedMax: series.yMax,
          ticks: {
            color: colors.text,
            // A date axis ticks on whole days.
            ...(date ? { precision: 0 } : {}),
            callback: (value) => (date ? formatValue(Math.round(Number(value)), 'date', '') : formatValue(Number(Number(value).toPrecision(6)), 'number', '')),
          },
          grid: { color: colors.grid },
          border: { color: colors.grid },
          title: { display: true, text: date ? 'Date' : input.unit || 'Value', color: colors.text },
        },
        tooltipFilter: (item: TooltipItem<'line'>) => !(item.raw as TimeXY).hold && item.dataset.label !== 'Outcome',
        tooltipLabel: (item) => `${item.dataset.label ?? ''}: ${show(item.parsed.y ?? 0)}`,
      }),
      plugins: [
        // Each reference's range as a capped whisker through its marker, over the range bands.
        intervalBars<'line'>('forelogReferenceWhiskers', 'over', () => series.references.flatMap((ref) => ref.points), cssColor('--chart-reference')),
        verticalMarkers(markers, colors.font, colors.surface),
      ],
    };
  }, [input, legend, timeZone]);

  return (
    <HistoryFigure
      kind="numeric"
      points={input}
      canvasRef={canvasRef}
      description={describe(input)}
      legend={legend}
      caption={
        <>
          {input.levels.length > 1 ? `Your ${rangeName(input.levels)} range and median over time` : 'Your median over time'}
          {input.unit && input.value_kind === 'number' ? <span className="history-chart__note"> · in {input.unit}</span> : null}
        </>
      }
    />
  );
}
