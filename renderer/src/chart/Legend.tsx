/**
 * A chart's legend, drawn by us under the canvas rather than by Chart.js, whose legend shows
 * a dot or a box for every series: here each entry is a short piece of the series' own line
 * (solid, dashed or dotted, as drawn) with its own marker, so a legend entry can be matched
 * to its line by shape as well as by colour. The same description feeds the chart's dataset
 * (`lineStyle`), so the two cannot drift apart.
 */
import type { PointStyle } from 'chart.js';

/** Chart.js point styles we use, plus 'triangleDown' (a triangle turned over: "below the edge"). */
export type Marker = Extract<PointStyle, 'circle' | 'rectRot' | 'triangle' | 'rect' | 'crossRot' | 'star'> | 'triangleDown' | 'none';

export interface LegendItem {
  label: string;
  /** A colour the legend and the chart both understand: a CSS custom property, e.g. "--chart-own". */
  color: string;
  /** Canvas dash pattern; [] or undefined for a solid line; null for no line (markers only). */
  dash?: number[] | null;
  marker?: Marker;
  /** How solid the marker's fill is (default 1); a see-through marker also gets a solid ring. */
  markerOpacity?: number;
  lineWidth?: number;
}

/** Dash patterns the history and scorecard charts use, named so a legend says the same. */
export const DASHED = [6, 5];
export const DOTTED = [2, 4];

const MARKER_PATHS: Record<Exclude<Marker, 'none' | 'circle'>, string> = {
  rectRot: 'M16 2 L21 7 L16 12 L11 7 Z',
  triangle: 'M16 2 L21.5 11 L10.5 11 Z',
  triangleDown: 'M16 12 L21.5 3 L10.5 3 Z',
  rect: 'M12 3 H20 V11 H12 Z',
  crossRot: 'M12 3 L20 11 M20 3 L12 11',
  star: 'M16 2 L17.5 5.5 L21 7 L17.5 8.5 L16 12 L14.5 8.5 L11 7 L14.5 5.5 Z',
};

function Swatch({ item }: { item: LegendItem }) {
  const stroke = `var(${item.color})`;
  const marker = item.marker ?? 'none';
  return (
    <svg className="chart-legend__swatch" width="32" height="14" viewBox="0 0 32 14" aria-hidden="true" focusable="false">
      {item.dash === null ? null : (
        <line x1="1" y1="7" x2="31" y2="7" stroke={stroke} strokeWidth={item.lineWidth ?? 2} strokeDasharray={item.dash && item.dash.length ? item.dash.join(' ') : undefined} />
      )}
      {marker === 'circle' ? (
        <circle cx="16" cy="7" r="4.5" fill={stroke} fillOpacity={item.markerOpacity ?? 1} stroke={item.markerOpacity === undefined ? 'none' : stroke} strokeWidth="1.5" />
      ) : null}
      {marker !== 'none' && marker !== 'circle' ? (
        <path d={MARKER_PATHS[marker]} fill={marker === 'crossRot' ? 'none' : stroke} stroke={stroke} strokeWidth={marker === 'crossRot' ? 2 : 1} />
      ) : null}
    </svg>
  );
}

export function ChartLegend({ items }: { items: readonly LegendItem[] }) {
  if (items.length === 0) return null;
  return (
    <ul className="chart-legend" data-testid="chart-legend">
      {items.map((item) => (
        <li
          key={item.label}
          className="chart-legend__item"
          data-dash={item.dash === null ? 'none' : (item.dash ?? []).join(',') || 'solid'}
          data-marker={item.marker ?? 'none'}
        >
          <Swatch item={item} />
          <span>{item.label}</span>
        </li>
      ))}
    </ul>
  );
}

/** The Chart.js dataset styling a legend item describes, with the colour resolved for the canvas. */
export function lineStyle(item: LegendItem, resolve: (cssVariable: string) => string) {
  const color = resolve(item.color);
  return {
    label: item.label,
    borderColor: color,
    backgroundColor: color,
    borderWidth: item.lineWidth ?? 2,
    borderDash: item.dash ?? [],
    showLine: item.dash !== null,
    pointStyle: pointStyleOf(item.marker),
    pointRotation: item.marker === 'triangleDown' ? 180 : 0,
  };
}

function pointStyleOf(marker: Marker | undefined): PointStyle {
  if (marker === undefined || marker === 'none') return 'circle';
  return marker === 'triangleDown' ? 'triangle' : marker;
}
