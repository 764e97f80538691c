/**
 * What the probability-history chart shows, computed apart from Chart.js so the same numbers
 * feed the chart, the table beside it and the figure's `data-points` attribute.
 */
import type { Outcome, BinaryQuestion } from '../../../shared/domain';
import { extent } from '../../../shared/extent';
import { addCalendarDays, wallTimeAt, wallTimeToInstant } from '../../../shared/time';
import { glideSeries } from '../tools/glide';

export interface OwnPoint {
  at: string;
  p: number;
}

export interface ReferencePoint {
  at: string;
  p: number;
  source: string;
}

/** The chart's data in plain terms (this is what `data-points` carries). */
export interface HistoryData {
  own: OwnPoint[];
  reference: ReferencePoint[];
  base_rate: number | null;
  opened_at: string;
  closes_at: string;
  resolution: { outcome: Outcome; at: string } | null;
  /** Glide path of the latest forecast to the close; empty unless the question has one. */
  glide: OwnPoint[];
}

export function historyData(question: BinaryQuestion): HistoryData {
  const own = [...question.forecasts]
    .sort((a, b) => Date.parse(a.at) - Date.parse(b.at) || a.seq - b.seq)
    .map((f) => ({ at: f.at, p: f.p }));
  const reference = [...question.references]
    .sort((a, b) => Date.parse(a.at) - Date.parse(b.at))
    .map((r) => ({ at: r.at, p: r.p, source: r.source }));
  return {
    own,
    reference,
    base_rate: question.base_rate,
    opened_at: question.opened_at,
    closes_at: question.closes_at,
    resolution: question.resolution ? { outcome: question.resolution.outcome, at: question.resolution.at } : null,
    glide: glideSeries(question),
  };
}

/** A chart point; `hold` marks the extra point that carries the last value to the end. */
export interface XY {
  x: number;
  y: number;
  hold?: boolean;
}

export interface ChartSeries {
  own: XY[];
  references: { source: string; points: XY[] }[];
  baseRate: XY[];
  glide: XY[];
  xMin: number;
  xMax: number;
  closeMs: number;
  resolvedMs: number | null;
}

/**
 * A probability holds from the moment it is stated until the next one, so each series is a
 * step line carried to its end: the resolution, or else the earlier of now and the close.
 */
export function chartSeries(data: HistoryData, nowMs: number): ChartSeries {
  const closeMs = Date.parse(data.closes_at);
  const openMs = Date.parse(data.opened_at);
  const resolvedMs = data.resolution ? Date.parse(data.resolution.at) : null;
  const end = resolvedMs ?? Math.min(nowMs, closeMs);

  const carry = (points: XY[]): XY[] => {
    const last = points[points.length - 1];
    return last && last.x < end ? [...points, { x: end, y: last.y, hold: true }] : points;
  };

  const own = carry(data.own.map((f) => ({ x: Date.parse(f.at), y: f.p })));
  const bySource = new Map<string, XY[]>();
  for (const r of data.reference) {
    const list = bySource.get(r.source) ?? [];
    list.push({ x: Date.parse(r.at), y: r.p });
    bySource.set(r.source, list);
  }
  const references = [...bySource].map(([source, points]) => ({ source, points: carry(points) }));

  const xs = [openMs, closeMs, end, ...own.map((p) => p.x), ...references.flatMap((r) => r.points.map((p) => p.x))];
  if (resolvedMs !== null) xs.push(resolvedMs);
  const { min: lo, max: hi } = extent(xs);
  // A little room either side so the first point and the close line are not on the frame.
  const pad = Math.max((hi - lo) * 0.03, 3_600_000);
  const xMin = lo - pad;
  const xMax = hi + pad;
  const baseRate = data.base_rate === null ? [] : [
    { x: xMin, y: data.base_rate },
    { x: xMax, y: data.base_rate },
  ];
  const glide = data.glide.map((g) => ({ x: Date.parse(g.at), y: g.p }));
  return { own, references, baseRate, glide, xMin, xMax, closeMs, resolvedMs };
}

const DAY_STEPS = [1, 2, 3, 7, 14, 28, 56, 91, 182, 364, 728];
const HOUR_STEPS = [1, 2, 3, 6, 12];

/**
 * Tick positions for a time axis in `timeZone`: whole hours or local midnights, with a step
 * chosen so at most `maxTicks` fit. Chart.js's own time scale needs a date adapter package,
 * so the axis is a linear one in epoch ms with these ticks.
 */
export function timeTicks(minMs: number, maxMs: number, timeZone: string, maxTicks = 7): { values: number[]; unit: 'hour' | 'day' } {
  const span = maxMs - minMs;
  const hourStep = HOUR_STEPS.find((h) => span / (h * 3_600_000) <= maxTicks);
  if (hourStep !== undefined && span < 2 * 86_400_000) {
    const stepMs = hourStep * 3_600_000;
    const values: number[] = [];
    for (let t = Math.ceil(minMs / stepMs) * stepMs; t <= maxMs; t += stepMs) values.push(t);
    return { values, unit: 'hour' };
  }
  const dayStep = DAY_STEPS.find((d) => span / (d * 86_400_000) <= maxTicks) ?? Math.ceil(span / (maxTicks * 86_400_000));
  const startWall = wallTimeAt(minMs, timeZone);
  let wall = { ...startWall, hour: 0, minute: 0, second: 0 };
  if (wallTimeToInstant(wall, timeZone) < minMs) wall = addCalendarDays(wall, 1);
  const values: number[] = [];
  for (let t = wallTimeToInstant(wall, timeZone); t <= maxMs; t = wallTimeToInstant(wall, timeZone)) {
    values.push(t);
    wall = addCalendarDays(wall, dayStep);
  }
  return { values, unit: 'day' };
}
