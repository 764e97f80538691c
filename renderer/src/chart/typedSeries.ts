/**
 * What the history charts of choice and numeric questions show, computed apart from Chart.js
 * so the same numbers feed the chart, its description and the figure's `data-points`.
 * A forecast holds from the moment it is stated until the next one, so each series is a step
 * line carried to its end: the resolution, or else the earlier of now and the close.
 */
import { extent } from '../../../shared/extent';

export interface TimeFrame {
  opened_at: string;
  closes_at: string;
  resolved_at: string | null;
}

/** A point on a time chart; `hold` marks the extra point that carries the last value to the end. */
export interface TimeXY {
  x: number;
  y: number;
  hold?: boolean;
}

export interface TimeAxis {
  xMin: number;
  xMax: number;
  closeMs: number;
  resolvedMs: number | null;
  /** Where step lines end. */
  end: number;
}

/**
 * The time axis for a question: from its opening to its close, the resolution and every
 * point, with a little room either side so the first point and the close line are not on the frame.
 */
export function timeAxis(frame: TimeFrame, pointTimes: readonly number[], nowMs: number): TimeAxis {
  const closeMs = Date.parse(frame.closes_at);
  const openMs = Date.parse(frame.opened_at);
  const resolvedMs = frame.resolved_at === null ? null : Date.parse(frame.resolved_at);
  const end = resolvedMs ?? Math.min(nowMs, closeMs);
  const xs = [openMs, closeMs, end, ...pointTimes];
  if (resolvedMs !== null) xs.push(resolvedMs);
  const { min: lo, max: hi } = extent(xs);
  const pad = Math.max((hi - lo) * 0.03, 3_600_000);
  return { xMin: lo - pad, xMax: hi + pad, closeMs, resolvedMs, end };
}

/** A step series carried to `end`. */
export function carry(points: TimeXY[], end: number): TimeXY[] {
  const last = points[points.length - 1];
  return last && last.x < end ? [...points, { x: end, y: last.y, hold: true }] : points;
}

/** Sorted by time, entry order breaking ties (the later entry stands). */
function byTime<T extends { at: string; seq?: number }>(list: readonly T[]): T[] {
  return [...list].sort((a, b) => Date.parse(a.at) - Date.parse(b.at) || (a.seq ?? 0) - (b.seq ?? 0));
}

// ---- Choice ------------------------------------------------------------------------------

export interface ChoiceHistoryInput extends TimeFrame {
  options: string[];
  option_base_rates: number[] | null;
  forecasts: { at: string; probs: number[]; seq: number }[];
  references: { at: string; probs: number[]; source: string }[];
  /** The option that came true (0-based); null while open or when void. */
  outcome_option: number | null;
  void: boolean;
}

export interface ChoiceSeries {
  axis: TimeAxis;
  /** One step line per option, in option order. */
  options: { label: string; points: TimeXY[]; baseRate: number | null }[];
  /** Each source's points per option (markers only: a reference is a snapshot). */
  references: { source: string; perOption: TimeXY[][] }[];
}

export function choiceSeries(input: ChoiceHistoryInput, nowMs: number): ChoiceSeries {
  const forecasts = byTime(input.forecasts);
  const references = byTime(input.references);
  const axis = timeAxis(input, [...forecasts, ...references].map((f) => Date.parse(f.at)), nowMs);
  const options = input.options.map((label, k) => ({
    label,
    points: carry(forecasts.map((f) => ({ x: Date.parse(f.at), y: f.probs[k] ?? 0 })), axis.end),
    baseRate: input.option_base_rates?.[k] ?? null,
  }));
  const sources = new Map<string, TimeXY[][]>();
  for (const r of references) {
    const perOption = sources.get(r.source) ?? input.options.map(() => []);
    r.probs.forEach((p, k) => perOption[k]?.push({ x: Date.parse(r.at), y: p }));
    sources.set(r.source, perOption);
  }
  return { axis, options, references: [...sources].map(([source, perOption]) => ({ source, perOption })) };
}

// ---- Numeric -----------------------------------------------------------------------------

export interface NumericHistoryInput extends TimeFrame {
  unit: string;
  value_kind: 'number' | 'date';
  levels: number[];
  /** Quantiles in the order of `levels`; dates as whole days since 1970-01-01. */
  forecasts: { at: string; quantiles: number[]; seq: number }[];
  references: { at: string; quantiles: number[]; source: string }[];
  /** The outcome; null while open or when void. */
  value: number | null;
  void: boolean;
}

export interface NumericSeries {
  axis: TimeAxis;
  /** Step lines of the lowest and highest quantile (the band between them is filled). */
  low: TimeXY[];
  high: TimeXY[];
  /** The inner band (e.g. P25–P75) when the question has five or more levels; else empty. */
  innerLow: TimeXY[];
  innerHigh: TimeXY[];
  median: TimeXY[];
  /** Each source's forecasts: the median as the point, the outer range as a whisker. */
  references: { source: string; points: { x: number; y: number; low: number; high: number }[] }[];
  yMin: number;
  yMax: number;
}

export function numericSeries(input: NumericHistoryInput, nowMs: number): NumericSeries {
  const forecasts = byTime(input.forecasts);
  const references = byTime(input.references);
  const axis = timeAxis(input, [...forecasts, ...references].map((f) => Date.parse(f.at)), nowMs);
  const m = input.levels.length;
  const median = input.levels.indexOf(0.5);
  const line = (k: number) => carry(forecasts.map((f) => ({ x: Date.parse(f.at), y: f.quantiles[k]! })), axis.end);
  const inner = m >= 5;
  const sources = new Map<string, { x: number; y: number; low: number; high: number }[]>();
  for (const r of references) {
    const list = sources.get(r.source) ?? [];
    list.push({ x: Date.parse(r.at), y: r.quantiles[median]!, low: r.quantiles[0]!, high: r.quantiles[m - 1]! });
    sources.set(r.source, list);
  }
  const values = [...forecasts.flatMap((f) => f.quantiles), ...references.flatMap((r) => r.quantiles)];
  if (input.value !== null) values.push(input.value);
  const { min, max } = values.length ? extent(values) : { min: 0, max: 1 };
  const pad = Math.max((max - min) * 0.08, input.value_kind === 'date' ? 1 : Math.abs(max) * 0.05 || 1);
  return {
    axis,
    low: m > 1 ? line(0) : [],
    high: m > 1 ? line(m - 1) : [],
    innerLow: inner ? line(1) : [],
    innerHigh: inner ? line(m - 2) : [],
    median: line(median),
    references: [...sources].map(([source, points]) => ({ source, points })),
    yMin: min - pad,
    yMax: max + pad,
  };
}
