/**
 * The probability history of one question as a step chart: the user's own forecasts, each
 * reference source, the base rate (dashed) and the close (dashed vertical line). The figure
 * carries the plotted data as JSON in `data-points`, and the tables beside it list the same
 * points for anyone who cannot read the canvas.
 */
import { useMemo } from 'react';
import { Chart, LinearScale, LineController, LineElement, PointElement, Tooltip, type ChartDataset, type TooltipItem } from 'chart.js';
import type { BinaryQuestion } from '../../../shared/domain';
import { OUTCOME_LABELS } from '../components/StatusPill';
import { formatPercent } from '../percent';
import { cssColor } from './colors';
import { chanceScale, historyOptions, HistoryFigure, timeScale, useHistoryChart } from './historyChartKit';
import { DASHED, DOTTED, lineStyle, type LegendItem, type Marker } from './Legend';
import { verticalMarkers, type VerticalMarker } from './markers';
import { chartSeries, historyData, type HistoryData, type XY } from './series';
import '../tools/tools.css';

Chart.register(LineController, LineElement, PointElement, LinearScale, Tooltip);

/** A few words for screen readers, pointing to the tables for the full detail. */
function describe(data: HistoryData): string {
  const parts: string[] = [];
  const first = data.own[0];
  const last = data.own[data.own.length - 1];
  if (first && last) {
    parts.push(
      data.own.length === 1
        ? `One forecast of ${formatPercent(first.p)}.`
        : `Your forecast went from ${formatPercent(first.p)} to ${formatPercent(last.p)} over ${data.own.length} forecasts.`,
    );
  } else {
    parts.push('No forecasts yet.');
  }
  if (data.reference.length) parts.push(`${data.reference.length} reference forecast${data.reference.length === 1 ? '' : 's'}.`);
  if (data.base_rate !== null) parts.push(`Base rate ${formatPercent(data.base_rate)}.`);
  const glideFrom = data.glide[0];
  if (glideFrom) parts.push(`Glide path from ${formatPercent(glideFrom.p)} down to 0% at the close.`);
  parts.push('The tables below list every point.');
  return `Probability history step chart. ${parts.join(' ')}`;
}

/** Each reference source gets its own line pattern and marker, so two sources never look alike. */
const REFERENCE_DASHES: number[][] = [[], [8, 3, 2, 3], [2, 3]];
const REFERENCE_MARKERS: Marker[] = ['rectRot', 'triangle', 'rect', 'star'];

/** What each series looks like: the canvas and the legend under it both draw from this. */
export function historyLegend(data: HistoryData): LegendItem[] {
  const sources = [...new Set(data.reference.map((r) => r.source))];
  return [
    { label: 'Your forecasts', color: '--chart-own', dash: [], marker: 'circle', lineWidth: 2.5 },
    ...sources.map<LegendItem>((source, i) => ({
      label: `Reference: ${source}`,
      color: '--chart-reference',
      dash: REFERENCE_DASHES[i % REFERENCE_DASHES.length] ?? [],
      marker: REFERENCE_MARKERS[i % REFERENCE_MARKERS.length] ?? 'rectRot',
    })),
    ...(data.glide.length ? [{ label: 'Glide path', color: '--chart-own', dash: DOTTED, marker: 'none', lineWidth: 1.5 } satisfies LegendItem] : []),
    ...(data.base_rate !== null ? [{ label: 'Base rate', color: '--chart-base-rate', dash: DASHED, marker: 'none', lineWidth: 1.5 } satisfies LegendItem] : []),
  ];
}

export function HistoryChart({ question }: { question: BinaryQuestion }) {
  const data = useMemo(() => historyData(question), [question]);
  const legend = useMemo(() => historyLegend(data), [data]);
  const zone = question.time_zone;

  const canvasRef = useHistoryChart<XY[]>((colors) => {
    const series = chartSeries(data, Date.now());
    const pointRadius = (points: XY[], size: number) => points.map((p) => (p.hold ? 0 : size));
    const style = (label: string) => lineStyle(legend.find((item) => item.label === label)!, cssColor);

    const datasets: ChartDataset<'line', XY[]>[] = [
      {
        ...style('Your forecasts'),
        data: series.own,
        stepped: 'before',
        pointRadius: pointRadius(series.own, 4),
        pointHoverRadius: 6,
      },
      ...series.references.map((r) => ({
        ...style(`Reference: ${r.source}`),
        data: r.points,
        stepped: 'before' as const,
        pointRadius: pointRadius(r.points, 5),
        pointHoverRadius: 7,
      })),
    ];
    if (series.glide.length) {
      datasets.push({ ...style('Glide path'), data: series.glide, pointRadius: 0, pointHoverRadius: 0, tension: 0 });
    }
    if (series.baseRate.length) {
      datasets.push({ ...style('Base rate'), data: series.baseRate, pointRadius: 0, pointHoverRadius: 0 });
    }

    const markers: VerticalMarker[] = [{ at: series.closeMs, label: 'Close', color: colors.close }];
    if (series.resolvedMs !== null && data.resolution) {
      markers.push({ at: series.resolvedMs, label: `Resolved ${OUTCOME_LABELS[data.resolution.outcome]}`, color: colors.resolved });
    }

    return {
      type: 'line',
      data: { datasets },
      options: historyOptions({
        colors,
        zone,
        x: timeScale(series, zone, colors),
        y: chanceScale('Probability', colors),
        tooltipFilter: (item: TooltipItem<'line'>) => !(item.raw as XY).hold && item.dataset.label !== 'Base rate',
        tooltipLabel: (item) => `${item.dataset.label ?? ''}: ${formatPercent(item.parsed.y)}`,
      }),
      plugins: [verticalMarkers(markers, colors.font, colors.surface)],
    };
  }, [data, legend, zone]);

  return (
    <HistoryFigure
      points={data}
      canvasRef={canvasRef}
      description={describe(data)}
      legend={legend}
      caption={
        <>
          Probability history
          {data.glide.length ? (
            <span className="history-chart__note">
              {' '}
              · dotted: the glide path, where your latest forecast drifts by the close if nothing happens (constant hazard)
            </span>
          ) : null}
        </>
      }
    />
  );
}
