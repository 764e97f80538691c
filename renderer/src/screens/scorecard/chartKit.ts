/**
 * What every Scorecard chart shares: the Chart.js parts they use (registered once), colours
 * read from the design tokens so both themes work, and `useChart`, which creates a chart once
 * and afterwards only swaps its data and redraws without animation. Re-creating a chart on
 * every filter change costs far more than updating it, and the Scorecard must redraw all its
 * figures within a quarter of a second on a large diary.
 */
import { useEffect, useRef, type RefObject } from 'react';
import {
  BarController,
  BarElement,
  CategoryScale,
  Chart,
  Legend,
  LinearScale,
  LineController,
  LineElement,
  PointElement,
  ScatterController,
  Tooltip,
  type ChartConfiguration,
  type ChartType,
} from 'chart.js';
import { useColorScheme } from '../../hooks';
import { pct } from './format';

Chart.register(BarController, BarElement, CategoryScale, LinearScale, LineController, LineElement, PointElement, ScatterController, Tooltip, Legend);

export interface Palette {
  own: string;
  reference: string;
  baseRate: string;
  grid: string;
  text: string;
  success: string;
  danger: string;
  surface: string;
  font: string;
}

/** The chart colours of the theme in force (tokens.css switches them with the system setting). */
export function palette(): Palette {
  const style = getComputedStyle(document.documentElement);
  const v = (name: string) => style.getPropertyValue(name).trim();
  return {
    own: v('--chart-own'),
    reference: v('--chart-reference'),
    baseRate: v('--chart-base-rate'),
    grid: v('--chart-grid'),
    text: v('--chart-text'),
    success: v('--color-success'),
    danger: v('--color-danger'),
    surface: v('--color-surface'),
    font: v('--font-sans') || 'system-ui',
  };
}

/** Axis styling every chart shares. */
export function axisStyle(colors: Palette, title?: string) {
  return {
    ticks: { color: colors.text },
    grid: { color: colors.grid },
    border: { color: colors.grid },
    ...(title ? { title: { display: true, text: title, color: colors.text } } : {}),
  };
}

/** A linear 0–100 % axis (probabilities, rates, cost ratios) with percent tick labels. */
export function percentAxis(colors: Palette, title: string, stepSize: number) {
  const style = axisStyle(colors, title);
  return {
    type: 'linear' as const,
    min: 0,
    max: 1,
    ...style,
    ticks: { ...style.ticks, stepSize, callback: (value: string | number) => pct(Number(value)) },
  };
}

/**
 * Charts waiting to be drawn, in page order, and whether a task to draw the next is queued.
 * A diary with every question type gives the Scorecard nine charts over some eight screens'
 * height; creating them all before the first paint made the screen appear a quarter of a
 * second later. The charts in view are drawn with the page; the others one per task right
 * after, so the page stays responsive and every chart is there a moment later, scrolled to or
 * not (a full-page capture or a printout included).
 */
const waiting: (() => void)[] = [];
let queued = false;

function drawNextWaiting(): void {
  queued = false;
  waiting.shift()?.();
  if (waiting.length > 0) queueNext();
}

function queueNext(): void {
  if (queued) return;
  queued = true;
  setTimeout(drawNextWaiting, 0);
}

/**
 * Calls `draw` at once when `target` is within one viewport height of the visible part of the
 * page, otherwise in a task of its own soon after. Returns a function that cancels the wait.
 */
function drawSoon(target: Element, draw: () => void): () => void {
  const box = target.getBoundingClientRect();
  const screen = window.innerHeight;
  if (box.bottom >= -screen && box.top <= 2 * screen) {
    draw();
    return () => undefined;
  }
  const job = () => draw();
  waiting.push(job);
  queueNext();
  return () => {
    const at = waiting.indexOf(job);
    if (at >= 0) waiting.splice(at, 1);
  };
}

// A printout started before the queue has run still shows every chart.
if (typeof window !== 'undefined') {
  window.addEventListener('beforeprint', () => {
    for (const job of waiting.splice(0)) job();
  });
}

/**
 * Creates the chart at once when its canvas is near view, otherwise just after (and again
 * when the colour scheme changes); whenever `data` changes afterwards, calls `apply` to put it
 * into the existing chart and redraws at once (`update('none')`: no animation, drawn before
 * the effect returns). Until the chart exists the latest data waits in `latest`, so it is
 * drawn with what is current when created. The canvas carries `data-drawn="true"` once drawn.
 *
 * @param create the chart's configuration without data (colours given)
 * @param apply puts `data` into the chart: datasets, labels, axis limits
 */
export function useChart<TType extends ChartType, D>(
  canvasRef: RefObject<HTMLCanvasElement | null>,
  create: (colors: Palette) => ChartConfiguration<TType>,
  apply: (chart: Chart<TType>, data: D, colors: Palette) => void,
  data: D,
): void {
  const scheme = useColorScheme();
  const chartRef = useRef<{ chart: Chart<TType>; colors: Palette; data: D } | null>(null);
  // The latest callbacks and data, read by the creating effect without re-running it.
  const latest = useRef({ create, apply, data });
  latest.current = { create, apply, data };

  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas) return;
    const cancel = drawSoon(canvas, () => {
      const colors = palette();
      const { create: make, apply: put, data: current } = latest.current;
      const chart = new Chart<TType>(canvas, make(colors));
      put(chart, current, colors);
      chart.update('none');
      chartRef.current = { chart, colors, data: current };
      canvas.setAttribute('data-drawn', 'true');
    });
    return () => {
      cancel();
      chartRef.current?.chart.destroy();
      chartRef.current = null;
      canvas.removeAttribute('data-drawn');
    };
  }, [canvasRef, scheme]);

  useEffect(() => {
    const held = chartRef.current;
    if (!held || held.data === data) return;
    latest.current.apply(held.chart, data, held.colors);
    held.chart.update('none');
    held.data = data;
  }, [data]);
}

/**
 * At most `max` items, evenly spread, always keeping the first and the last. A chart a few
 * hundred pixels wide cannot show more points than that, and the table beside it stays short
 * enough to read.
 */
export function thin<T>(items: readonly T[], max: number): T[] {
  if (items.length <= max) return items.slice();
  const out: T[] = [];
  const step = (items.length - 1) / (max - 1);
  for (let i = 0; i < max; i++) out.push(items[Math.round(i * step)]!);
  return out;
}

/** Options every chart on the screen shares: no animation, sized by its box. */
export const BASE_OPTIONS = {
  animation: false,
  responsive: true,
  maintainAspectRatio: false,
} as const;
