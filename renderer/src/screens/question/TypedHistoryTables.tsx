/**
 * Every point of a choice or numeric question's history chart as rows: one column per option
 * (its chance) or per quantile level (its value), with the note or source and a delete action.
 */
import type { ReactNode } from 'react';
import { toStoredValue } from '../../../../shared/numeric-value';
import { Button } from '../../components/Button';
import { formatInstant } from '../../dates';
import { formatValue, levelLabel } from '../../forecastEntry/numericEntry';
import { formatPercent } from '../../percent';
import type { TypedQuestion } from './TypedEntryDialog';
import { byTime } from './typedFacts';

interface Props {
  question: TypedQuestion;
  onDeleteForecast: (id: string) => void;
  onDeleteReference: (id: string) => void;
}

interface Row {
  id: string;
  at: string;
  cells: string[];
  detail: ReactNode;
  deleteLabel: string;
}

export function TypedHistoryTables({ question: q, onDeleteForecast, onDeleteReference }: Props) {
  const zone = q.time_zone;
  const when = (at: string) => formatInstant(at, zone, false);
  const headers = q.type === 'choice' ? q.options : q.levels.map(levelLabel);
  const cells = (values: readonly (number | string)[]): string[] =>
    q.type === 'choice'
      ? values.map((p) => formatPercent(p as number))
      : values.map((v) => formatValue(toStoredValue(v, q.value_kind), q.value_kind, q.unit));
  const forecasts: Row[] = byTime<{ id: string; at: string; seq: number; note: string; values: readonly (number | string)[] }>(
    q.type === 'choice' ? q.forecasts.map((f) => ({ ...f, values: f.probs })) : q.forecasts.map((f) => ({ ...f, values: f.quantiles })),
  ).map((f) => ({
    id: f.id,
    at: f.at,
    cells: cells(f.values),
    detail: f.note ? <span className="note">{f.note}</span> : <span className="muted">—</span>,
    deleteLabel: `Delete your forecast of ${when(f.at)}`,
  }));
  const references: Row[] = byTime<{ id: string; at: string; source: string; values: readonly (number | string)[] }>(
    q.type === 'choice' ? q.references.map((r) => ({ ...r, values: r.probs })) : q.references.map((r) => ({ ...r, values: r.quantiles })),
  ).map((r) => ({
    id: r.id,
    at: r.at,
    cells: cells(r.values),
    detail: <span className="user-text">{r.source}</span>,
    deleteLabel: `Delete ${r.source}’s forecast of ${when(r.at)}`,
  }));
  return (
    <div className="history-tables">
      <RowTable kind="revision" caption="Your forecasts" headers={headers} detailHeader="Note" empty="No forecasts yet — use Revise to give yours." zone={zone} rows={forecasts} onDelete={onDeleteForecast} />
      <RowTable
        kind="reference"
        caption="Reference forecasts"
        headers={headers}
        detailHeader="Source"
        empty="None yet — add a client’s view or a plan’s figures to compare against."
        zone={zone}
        rows={references}
        onDelete={onDeleteReference}
      />
    </div>
  );
}

interface RowTableProps {
  kind: 'revision' | 'reference';
  caption: string;
  headers: readonly string[];
  detailHeader: string;
  empty: string;
  zone: string;
  rows: Row[];
  onDelete: (id: string) => void;
}

function RowTable({ kind, caption, headers, detailHeader, empty, zone, rows, onDelete }: RowTableProps) {
  return (
    <div className="table-card">
      <table data-testid={kind === 'revision' ? 'revisions-table' : 'references-table'}>
        <caption className="table-card__caption">
          {caption} ({rows.length})
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
                  <td key={k} className="num nowrap">
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
