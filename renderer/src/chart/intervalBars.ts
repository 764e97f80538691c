/**
 * An interval as a capped vertical bar through its point: the Wilson intervals of the
 * calibration diagrams and the reference ranges of the numeric history chart are drawn alike.
 */
import type { ChartType, Plugin } from 'chart.js';

/** Where a bar stands across, and its two ends up, in the chart's data units. */
export interface Interval {
  x: number;
  low: number;
  high: number;
}

/**
 * A plugin drawing every interval `intervals()` gives at the time of drawing (so a chart that
 * swaps its data keeps its plugin). `layer` 'under' draws before the datasets, behind the
 * points; 'over' after them, so filled bands cannot hide the bars.
 */
export function intervalBars<T extends ChartType>(id: string, layer: 'under' | 'over', intervals: () => Iterable<Interval>, color: string): Plugin<T> {
  const draw = (chart: { ctx: CanvasRenderingContext2D; scales: Record<string, { getPixelForValue(value: number): number } | undefined> }) => {
    const { ctx, scales } = chart;
    const x = scales.x;
    const y = scales.y;
    if (!x || !y) return;
    ctx.save();
    ctx.strokeStyle = color;
    ctx.lineWidth = 1.5;
    for (const interval of intervals()) {
      const px = x.getPixelForValue(interval.x);
      const top = y.getPixelForValue(interval.high);
      const bottom = y.getPixelForValue(interval.low);
      ctx.beginPath();
      ctx.moveTo(px, top);
      ctx.lineTo(px, bottom);
      ctx.moveTo(px - 5, top);
      ctx.lineTo(px + 5, top);
      ctx.moveTo(px - 5, bottom);
      ctx.lineTo(px + 5, bottom);
      ctx.stroke();
    }
    ctx.restore();
  };
  return layer === 'under' ? { id, beforeDatasetsDraw: draw } : { id, afterDatasetsDraw: draw };
}
