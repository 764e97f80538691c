/**
 * The frame every Scorecard chart sits in: a <figure> with its caption, the canvas (described
 * in words for screen readers), the plotted data as JSON in `data-points` (tests read that
 * rather than pixels), and the same data as a table in a <details> for anyone who cannot or
 * would rather not read the picture.
 */
import { useMemo, useState, type ReactNode, type RefObject } from 'react';
import { ChartLegend, type LegendItem } from '../../chart/Legend';

export interface ChartFigureProps {
  testId: string;
  caption: ReactNode;
  /** What the chart plots, serialised into `data-points`. */
  points: unknown;
  /** One or two sentences saying what the picture shows. */
  description: string;
  canvasRef: RefObject<HTMLCanvasElement | null>;
  /** The data table alternative. */
  table: ReactNode;
  /** The legend under the canvas: each series' own line and marker (none for a single series). */
  legend?: readonly LegendItem[];
  /** A note under the canvas about how it is drawn (e.g. what is clipped at the edge). */
  note?: ReactNode;
  tableLabel?: string;
  /** Show the table under the chart rather than folded away (when it carries readings too). */
  openTable?: boolean;
  /** Height of the plot area: 'md' for most charts, 'sm' for short bar charts. */
  size?: 'sm' | 'md';
  className?: string;
}

/**
 * The folded table is built only once it is opened: a closed <details> shows nothing to anyone
 * (screen readers included), and leaving hundreds of rows out keeps a filter change fast.
 */
function FoldedTable({ label, children }: { label: string; children: ReactNode }) {
  const [open, setOpen] = useState(false);
  return (
    <details className="sc-figure__data" onToggle={(event) => setOpen(event.currentTarget.open)}>
      <summary>{label}</summary>
      {open ? <div className="sc-figure__table">{children}</div> : null}
    </details>
  );
}

export function ChartFigure({ testId, caption, points, description, canvasRef, table, legend = [], note, tableLabel = 'Show the data as a table', size = 'md', openTable = false, className }: ChartFigureProps) {
  const json = useMemo(() => JSON.stringify(points), [points]);
  return (
    <figure className={['sc-figure', className ?? ''].filter(Boolean).join(' ')} data-testid={testId} data-points={json}>
      <figcaption className="sc-figure__caption">{caption}</figcaption>
      <div className={`sc-figure__canvas sc-figure__canvas--${size}`}>
        <canvas ref={canvasRef} role="img" aria-label={description} />
      </div>
      <ChartLegend items={legend} />
      {note ? <p className="sc-figure__note">{note}</p> : null}
      {openTable ? (
        <div className="sc-figure__table sc-figure__table--open">{table}</div>
      ) : (
        <FoldedTable label={tableLabel}>{table}</FoldedTable>
      )}
    </figure>
  );
}
