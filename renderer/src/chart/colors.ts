/**
 * Colours for canvases, read from the design tokens so both themes work (tokens.css switches
 * them with the system setting). Every chart, history or Scorecard, takes them from here.
 */

/** A colour token's value in the theme in force, e.g. cssColor('--chart-own'). */
export function cssColor(name: string): string {
  return getComputedStyle(document.documentElement).getPropertyValue(name).trim();
}

/** A "#rrggbb" token colour made see-through, for canvas fills ("#1f3a6b", 0.6 → "rgba(31, 58, 107, 0.6)"). */
export function withAlpha(color: string, alpha: number): string {
  const hex = /^#([0-9a-f]{6})$/i.exec(color.trim());
  if (!hex) return color;
  const n = Number.parseInt(hex[1]!, 16);
  return `rgba(${(n >> 16) & 255}, ${(n >> 8) & 255}, ${n & 255}, ${alpha})`;
}
