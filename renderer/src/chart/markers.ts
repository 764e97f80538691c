/**
 * A Chart.js plugin of our own that draws labelled dashed vertical lines (the close, the
 * resolution) across the plot, so no annotation package is needed.
 */
import type { Chart, Plugin } from 'chart.js';

export interface VerticalMarker {
  at: number;
  label: string;
  color: string;
}

/** `background` goes behind each label so it stays legible where it crosses a series. */
export function verticalMarkers(markers: readonly VerticalMarker[], font: string, background: string): Plugin<'line'> {
  return {
    id: 'forelogVerticalMarkers',
    afterDatasetsDraw(chart: Chart<'line'>) {
      const { ctx, chartArea, scales } = chart;
      const x = scales.x;
      if (!x) return;
      markers.forEach((marker, index) => {
        const px = x.getPixelForValue(marker.at);
        if (px < chartArea.left || px > chartArea.right) return;
        ctx.save();
        ctx.strokeStyle = marker.color;
        ctx.fillStyle = marker.color;
        ctx.lineWidth = 1.5;
        ctx.setLineDash([5, 4]);
        ctx.beginPath();
        ctx.moveTo(px, chartArea.top);
        ctx.lineTo(px, chartArea.bottom);
        ctx.stroke();
        ctx.setLineDash([]);
        ctx.font = `600 12px ${font}`;
        // A label that would run past the right edge goes on the line's left; a second label sits lower.
        const width = ctx.measureText(marker.label).width;
        const onLeft = px + 6 + width + 3 > chartArea.right;
        const textX = px + (onLeft ? -6 - width : 6);
        const baseline = chartArea.top + 14 + index * 18;
        ctx.fillStyle = background;
        ctx.fillRect(textX - 3, baseline - 12, width + 6, 16);
        ctx.fillStyle = marker.color;
        ctx.textAlign = 'left';
        ctx.fillText(marker.label, textX, baseline);
        ctx.restore();
      });
    },
  };
}
