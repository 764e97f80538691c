/**
 * The history of a choice question: one step line per option (your chance for it over time),
 * each option's base rate as a dashed line in its colour, reference forecasts as markers
 * (one shape per source), the close and the resolution as labelled vertical lines, and the
 * option that came true drawn thicker. `data-points` carries the plotted data as JSON.
 */
import { useMemo } from 'react';
import { Chart, LinearScale, LineController, LineElement, PointElement, Tooltip, type ChartDataset, type TooltipItem } from 'chart.js';
import { formatPercent } from '../percent';
import { cssColor } from './colors';
import { chanceScale, historyOptions, HistoryFigure, optionLegend, timeScale, useHistoryChart } from './historyChartKit';
import { DASHED, lineStyle, type LegendItem, type Marker } from './Legend';
import { verticalMarkers, type VerticalMarker } from './markers';
import { choiceSeries, type ChoiceHistoryInput, type TimeXY } from './typedSeries';
import '../tools/tools.css';
import './typedCharts.css';

Chart.register(LineController, LineElement, PointElement, LinearScale, Tooltip);

const REFERENCE_MARKERS: Marker[] = ['crossRot', 'star', 'rect'];

function describe(input: ChoiceHistoryInput): string {
  const last = [...input.forecasts].sort((a, b) => Date.parse(a.at) - Date.parse(b.at) || a.seq - b.seq).pop();
  const parts: string[] = [];
  if (last) {
    parts.push(`Latest forecast of ${input.forecasts.length}: ${input.options.map((o, k) => `${o} ${formatPercent(last.probs[k])}`).join(', ')}.`);
  } else {
    parts.push('No forecasts yet.');
  }
  if (input.option_base_rates) parts.push(`Base rates: ${input.options.map((o, k) => `${o} ${formatPercent(input.option_base_rates?.[k])}`).join(', ')}.`);
  if (input.references.length) parts.push(`${input.references.length} reference forecast${input.references.length === 1 ? '' : 's'}.`);
  if (input.outcome_option !== null) parts.push(`Came true: ${input.options[input.outcome_option]}.`);
  parts.push('The tables below list every point.');
  return `Choice history, one line per option. ${parts.join(' ')}`;
}

export function choiceLegend(input: ChoiceHistoryInput): LegendItem[] {
  const sources = [...new Set(input.references.map((r) => r.source))];
  return [
    ...input.options.map((label, k) => optionLegend(k === input.outcome_option ? `${label} (came true)` : label, k, k === input.outcome_option)),
    ...(input.option_base_rates ? [{ label: 'Base rate (in the option’s colour)', color: '--chart-base-rate', dash: DASHED, marker: 'none', lineWidth: 1.5 } satisfies LegendItem] : []),
    ...sources.map<LegendItem>((source, i) => ({ label: `Reference: ${source}`, color: '--chart-text', dash: null, marker: REFERENCE_MARKERS[i % REFERENCE_MARKERS.length] ?? 'crossRot' })),
  ];
}

export function ChoiceHistoryChart({ input, timeZone }: { input: ChoiceHistoryInput; timeZone: string }) {
  const legend = useMemo(() => choiceLegend(input), [input]);

  const canvasRef = useHistoryChart<TimeXY[]>((colors) => {
    const series = choiceSeries(input, Date.now());
    const radius = (points: TimeXY[]) => points.map((p) => (p.hold ? 0 : 4));
    const datasets: ChartDataset<'line', TimeXY[]>[] = [];
    series.options.forEach((option, k) => {
      const item = legend[k]!;
      const style = lineStyle(item, cssColor);
      datasets.push({ ...style, label: option.label, data: option.points, stepped: 'before', pointRadius: radius(option.points), pointHoverRadius: 6 });
      if (option.baseRate !== null) {
        datasets.push({
          ...style,
          label: `Base rate: ${option.label}`,
          data: [
            { x: series.axis.xMin, y: option.baseRate },
            { x: series.axis.xMax, y: option.baseRate },
          ],
          borderDash: DASHED,
          borderWidth: 1.5,
          pointRadius: 0,
          pointHoverRadius: 0,
        });
      }
    });
    series.references.forEach((ref, i) => {
      ref.perOption.forEach((points, k) => {
        const color = cssColor(`--chart-option-${k % 6}`);
        const marker = REFERENCE_MARKERS[i % REFERENCE_MARKERS.length]!;
        datasets.push({
          label: `${ref.source}: ${input.options[k]}`,
          data: points,
          showLine: false,
          pointStyle: marker,
          borderColor: color,
          backgroundColor: color,
          borderWidth: 2,
          pointRadius: 6,
          pointHoverRadius: 8,
        });
      });
    });
    const markers: VerticalMarker[] = [{ at: series.axis.closeMs, label: 'Close', color: colors.close }];
    if (series.axis.resolvedMs !== null) {
      const label = input.void ? 'Resolved Void' : `Resolved: ${input.options[input.outcome_option ?? 0]}`;
      markers.push({ at: series.axis.resolvedMs, label, color: colors.resolved });
    }
    return {
      type: 'line',
      data: { datasets },
      options: historyOptions({
        colors,
        zone: timeZone,
        x: timeScale(series.axis, timeZone, colors),
        y: chanceScale('Chance', colors),
        tooltipFilter: (item: TooltipItem<'line'>) => !(item.raw as TimeXY).hold && !String(item.dataset.label).startsWith('Base rate:'),
        tooltipLabel: (item) => `${item.dataset.label ?? ''}: ${formatPercent(item.parsed.y)}`,
      }),
      plugins: [verticalMarkers(markers, colors.font, colors.surface)],
    };
  }, [input, legend, timeZone]);

  return (
    <HistoryFigure
      kind="choice"
      points={input}
      canvasRef={canvasRef}
      description={describe(input)}
      legend={legend}
      caption={
        <>
          Chance of each option over time
          {input.option_base_rates ? <span className="history-chart__note"> · dashed: each option’s base rate</span> : null}
        </>
      }
    />
  );
}
