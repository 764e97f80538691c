/**
 * One table of a question's history, as the yes/no and the typed pages both show it: a row
 * per revision or reference forecast with its time, its figures (a probability, a chance per
 * option or a value per level), its note or source, and a delete action.
 */
import { useRef, type ReactNode } from 'react';
import { Button } from '../../components/Button';
import { ShowMore, usePages } from '../../components/ShowMore';
import { formatCount, formatInstant } from '../../dates';

export interface EntryRow {
  id: string;
  at: string;
  /** One formatted figure per column of `headers`. */
  cells: string[];
  detail: ReactNode;
  deleteLabel: string;
}

interface EntryTableProps {
  /** Names the table's and the rows' test ids: `revisions-table`, `<kind>-row`. */
  kind: 'revision' | 'reference';
  caption: string;
  /** The figures' column headings. */
  headers: readonly string[];
  /** The figures' cell class, and their test id where a test reads them. */
  cellClassName: string;
  cellTestId?: string;
  detailHeader: string;
  empty: string;
  zone: string;
  rows: EntryRow[];
  onDelete: (id: string) => void;
}

/**
 * Rows drawn at first, the latest, and added above them by each "Show earlier": a question
 * revised every day for years would otherwise draw thousands of rows before its page shows.
 */
const HISTORY_PAGE = 100;

export function EntryTable({ kind, caption, headers, cellClassName, cellTestId, detailHeader, empty, zone, rows, onDelete }: EntryTableProps) {
  // After "Show earlier", focus moves to the earliest row now shown: reading on goes forward in time.
  const body = useRef<HTMLTableSectionElement>(null);
  const { shown, more } = usePages(HISTORY_PAGE, () => body.current?.rows[0]?.querySelector<HTMLElement>('td'));
  const hidden = Math.max(0, rows.length - shown);
  return (
    <div className="table-card">
      <ShowMore shown={rows.length - hidden} total={rows.length} page={HISTORY_PAGE} direction="earlier" onMore={more} />
      <table data-testid={kind === 'revision' ? 'revisions-table' : 'references-table'}>
        <caption className="table-card__caption">
          {caption} ({formatCount(rows.length)})
        </caption>
        <thead>
          <tr>
            <th scope="col">Time</th>
            {headers.map((h, k) => (
              <th key={k} scope="col" className="num">
                {h}
              </th>
            ))}
            <th scope="col">{detailHeader}</th>
            <th scope="col">
              <span className="visually-hidden">Actions</span>
            </th>
          </tr>
        </thead>
        <tbody ref={body}>
          {rows.length === 0 ? (
            <tr>
              <td colSpan={headers.length + 3} className="muted">
                {empty}
              </td>
            </tr>
          ) : (
            rows.slice(hidden).map((row) => (
              <tr key={row.id} data-testid={`${kind}-row`}>
                <td className="nowrap" tabIndex={-1}>
                  <time dateTime={row.at}>{formatInstant(row.at, zone, false)}</time>
                </td>
                {row.cells.map((cell, k) => (
                  <td key={k} className={cellClassName} data-testid={cellTestId}>
                    {cell}
                  </td>
                ))}
                <td>{row.detail}</td>
                <td className="row-actions">
                  <Button size="sm" variant="ghost" onClick={() => onDelete(row.id)} aria-label={row.deleteLabel}>
                    Delete
                  </Button>
                </td>
              </tr>
            ))
          )}
        </tbody>
      </table>
    </div>
  );
}
