/**
 * The printable briefing's stylesheet and its Content-Security-Policy hash. Kept apart,
 * with no imports of ours, so the one CSP definition (main/shell/csp.ts) can admit it and
 * the renderer's build config can load that definition cheaply.
 */
import { createHash } from 'node:crypto';

// Dark ink on white, one accent (a deep petrol blue, used for rules, the calibration
// points and the confident-call markers), serif headings over a plain sans body.
// Every colour is written out here: the SVG uses classes, never style attributes.
export const BRIEFING_CSS = `
:root { --ink: #1b1e23; --muted: #5b6068; --rule: #d5d8dc; --faint: #f3f4f5; --accent: #1f5c6e; }
* { box-sizing: border-box; }
html { color-scheme: light; -webkit-print-color-adjust: exact; print-color-adjust: exact; }
body { margin: 0; background: #fff; color: var(--ink); font: 10.5pt/1.45 "Helvetica Neue", Helvetica, Arial, "Liberation Sans", sans-serif; }
.sheet { max-width: 46rem; margin: 0 auto; padding: 2.2rem 1.6rem 3rem; }
h1, h2, h3 { font-family: Georgia, "Iowan Old Style", "Palatino Linotype", "DejaVu Serif", serif; font-weight: 600; line-height: 1.2; margin: 0; }
h1 { font-size: 22pt; letter-spacing: -0.01em; }
h2 { font-size: 14pt; margin: 2rem 0 0.6rem; padding-bottom: 0.25rem; border-bottom: 2px solid var(--accent); break-after: avoid; }
h3 { font-size: 11.5pt; }
p { margin: 0.35rem 0; }
.kicker { font-size: 8.5pt; letter-spacing: 0.12em; text-transform: uppercase; color: var(--accent); font-weight: 700; margin-bottom: 0.3rem; }
.meta { color: var(--muted); }
.counts strong { color: var(--ink); }
.caution { margin-top: 0.8rem; padding: 0.5rem 0.75rem; border-left: 3px solid var(--accent); background: var(--faint); }
.headline { font-size: 12pt; margin: 0.2rem 0 0.8rem; }
.lede { color: var(--muted); margin-bottom: 0.8rem; }
.muted { color: var(--muted); }
.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
table { width: 100%; border-collapse: collapse; margin: 0.4rem 0 0.6rem; }
thead { display: table-header-group; }
tr { break-inside: avoid; }
th, td { text-align: left; vertical-align: top; padding: 0.28rem 0.5rem 0.28rem 0; border-bottom: 1px solid var(--rule); }
th { font-size: 8.5pt; font-weight: 700; letter-spacing: 0.04em; text-transform: uppercase; color: var(--muted); }
tbody th { font-size: inherit; font-weight: 600; letter-spacing: normal; text-transform: none; color: var(--ink); }
.figures tbody th { width: 13rem; }
td.figure { font-weight: 700; width: 5rem; }
td.reading { color: var(--muted); }
caption { text-align: left; font-size: 8.5pt; color: var(--muted); padding-bottom: 0.2rem; break-after: avoid; }
figure { margin: 0.4rem 0 0.2rem; }
figure svg { display: block; width: 100%; max-width: 27rem; height: auto; margin: 0 auto; }
figcaption { font-size: 9pt; color: var(--muted); text-align: center; }
.calibration-block, table.bins, #open { break-inside: avoid; }
.cal-grid { stroke: #e3e5e8; stroke-width: 1; }
.cal-frame { fill: none; stroke: #8d929a; stroke-width: 1; }
.cal-diagonal { stroke: #8d929a; stroke-width: 1; stroke-dasharray: 4 3; }
.cal-bar { stroke: var(--ink); stroke-width: 1.2; }
.cal-point { fill: var(--accent); fill-opacity: 0.8; stroke: #fff; stroke-width: 1; }
.cal-tick { font-size: 12px; fill: var(--muted); }
.cal-axis { font-size: 13px; fill: var(--ink); }
.cal-empty { font-size: 12px; fill: var(--muted); }
.entry { break-inside: avoid; border-top: 1px solid var(--rule); padding: 0.8rem 0 0.6rem; }
.keep { break-inside: avoid; }
.keep .entry { border-top: none; }
.verdict { margin-top: 0.25rem; }
.verdict .said, .verdict .outcome { font-weight: 700; }
.marker { display: inline-block; min-width: 3.6rem; padding: 0.05rem 0.35rem; margin-right: 0.4rem; border: 1.5px solid var(--accent); color: var(--accent); font-size: 8pt; font-weight: 700; letter-spacing: 0.06em; text-transform: uppercase; text-align: center; }
.entry.hit .marker { border-style: dashed; }
.label { font-size: 8.5pt; font-weight: 700; letter-spacing: 0.04em; text-transform: uppercase; color: var(--muted); margin-right: 0.35rem; }
.note { white-space: pre-line; }
.path td.date { white-space: nowrap; width: 9.5rem; color: var(--muted); }
.path td.num { width: 3.5rem; font-weight: 700; }
.tags { font-size: 8.5pt; color: var(--muted); }
footer { margin-top: 2.5rem; padding-top: 0.5rem; border-top: 1px solid var(--rule); font-size: 8.5pt; color: var(--muted); }
@page { size: A4; margin: 16mm 15mm 18mm; }
@media print {
  body { font-size: 10pt; }
  .sheet { max-width: none; padding: 0; }
  h2 { margin-top: 1.2rem; }
  .headline { font-size: 11pt; margin-bottom: 0.5rem; }
  .figures th, .figures td { padding-top: 0.18rem; padding-bottom: 0.18rem; }
  td.reading { font-size: 9pt; }
  figure svg { max-width: 18rem; }
}
`;

/**
 * The CSP source expression (`'sha256-…'`, W3C CSP Level 3 §8.3) that admits the
 * briefing's one <style> element. A document shown in an `<iframe srcdoc>` inherits the
 * embedding page's policy, so a page whose `style-src` lacks 'unsafe-inline' can show the
 * briefing by adding this hash to `style-src` and nothing else.
 */
export const BRIEFING_STYLE_HASH = `'sha256-${createHash('sha256').update(BRIEFING_CSS, 'utf8').digest('base64')}'`;
