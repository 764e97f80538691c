/**
 * One table of a question's history, as the yes/no and the typed pages both show it: a row
 * per revision or reference forecast with its time, its figures (a probability, a chance per
 * option or a value per level), its note or source, and a delete action.
 */
import type { ReactNode } from 'react';
import { Button } from '../../components/Button';
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

export function EntryTable({ kind, caption, headers, cellClassName, cellTestId, detailHeader, empty, zone, rows, onDelete }: EntryTableProps) {
  return (
    <div className="table-card">
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
        <tbody>
          {rows.length === 0 ? (
            <tr>
              <td colSpan={headers.length + 3} className="muted">
                {empty}
              </td>
            </tr>
          ) : (
            rows.map((row) => (
              <tr key={row.id} data-testid={`${kind}-row`}>
                <td className="nowrap">
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
