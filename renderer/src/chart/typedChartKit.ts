/**
 * What the choice and numeric history charts share: the canvas colours of the theme in force,
 * the time axis with local-midnight ticks (as the yes/no history chart has), and each
 * option's look, so an option's line, its base rate and its legend entry always agree.
 */
import type { ScaleOptions } from 'chart.js';
import { formatTick } from '../dates';
import type { LegendItem, Marker } from './Legend';
import { timeTicks } from './series';
import type { TimeAxis } from './typedSeries';

export interface TypedPalette {
  close: string;
  resolved: string;
  grid: string;
  text: string;
  surface: string;
  font: string;
}

export function cssColor(name: string): string {
  return getComputedStyle(document.documentElement).getPropertyValue(name).trim();
}

export function typedPalette(): TypedPalette {
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
export function timeScale(axis: TimeAxis, zone: string, colors: TypedPalette): ScaleOptions<'linear'> {
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
