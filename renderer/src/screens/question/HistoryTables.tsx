/** Every point of the history chart as rows: the user's revisions and the reference forecasts. */
import type { ReactNode } from 'react';
import type { BinaryQuestion } from '../../../../shared/domain';
import { Button } from '../../components/Button';
import { formatInstant } from '../../dates';
import { formatPercent } from '../../percent';
import { sortedForecasts } from './questionFacts';

interface Props {
  question: BinaryQuestion;
  onDeleteForecast: (id: string) => void;
  onDeleteReference: (id: string) => void;
}

export function HistoryTables({ question, onDeleteForecast, onDeleteReference }: Props) {
  const zone = question.time_zone;
  const when = (at: string) => formatInstant(at, zone, false);
  const forecasts = sortedForecasts(question);
  const references = [...question.references].sort((a, b) => Date.parse(a.at) - Date.parse(b.at));
  return (
    <div className="history-tables">
      <PointTable
        kind="revision"
        tableTestId="revisions-table"
        caption="Your forecasts"
        detailHeader="Note"
        empty="No forecasts yet — use Revise to state your probability."
        zone={zone}
        points={forecasts.map((f) => ({
          id: f.id,
          at: f.at,
          p: f.p,
          deleteLabel: `Delete the ${formatPercent(f.p)} forecast of ${when(f.at)}`,
          detail: (
            <>
              {f.note ? <span className="note">{f.note}</span> : <span className="muted">—</span>}
              {f.lenses.length > 0 ? (
                <ul className="lenses" aria-label="Lenses">
                  {f.lenses.map((l, i) => (
                    // Lens names need not be unique, so the position keys the row.
                    <li key={i}>
                      {l.name}: {formatPercent(l.p)}
                      {l.weight !== 1 ? <span className="muted"> ×{l.weight}</span> : null}
                    </li>
                  ))}
                </ul>
              ) : null}
            </>
          ),
        }))}
        onDelete={onDeleteForecast}
      />
      <PointTable
        kind="reference"
        tableTestId="references-table"
        caption="Reference forecasts"
        detailHeader="Source"
        empty="None yet — add a client’s view or a consensus figure to compare against."
        zone={zone}
        points={references.map((r) => ({
          id: r.id,
          at: r.at,
          p: r.p,
          deleteLabel: `Delete ${r.source}’s ${formatPercent(r.p)} of ${when(r.at)}`,
          detail: <span className="user-text">{r.source}</span>,
        }))}
        onDelete={onDeleteReference}
      />
    </div>
  );
}

interface Point {
  id: string;
  at: string;
  p: number;
  detail: ReactNode;
  deleteLabel: string;
}

interface PointTableProps {
  /** Names the rows' test ids: `<kind>-row`, `<kind>-p`. */
  kind: 'revision' | 'reference';
  tableTestId: string;
  caption: string;
  detailHeader: string;
  empty: string;
  zone: string;
  points: Point[];
  onDelete: (id: string) => void;
}

/** One table of time-stamped probabilities with a detail column and a delete action per row. */
function PointTable({ kind, tableTestId, caption, detailHeader, empty, zone, points, onDelete }: PointTableProps) {
  return (
    <div className="table-card">
      <table data-testid={tableTestId}>
        <caption className="table-card__caption">
          {caption} ({points.length})
        </caption>
        <thead>
          <tr>
            <th scope="col">Time</th>
            <th scope="col" className="num">
              Probability
            </th>
            <th scope="col">{detailHeader}</th>
            <th scope="col">
              <span className="visually-hidden">Actions</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {points.length === 0 ? (
            <tr>
              <td colSpan={4} className="muted">
                {empty}
              </td>
            </tr>
          ) : (
            points.map((point) => (
              <tr key={point.id} data-testid={`${kind}-row`}>
                <td className="nowrap">
                  <time dateTime={point.at}>{formatInstant(point.at, zone, false)}</time>
                </td>
                <td className="num" data-testid={`${kind}-p`}>
                  {formatPercent(point.p)}
                </td>
                <td>{point.detail}</td>
                <td className="row-actions">
                  <Button size="sm" variant="ghost" onClick={() => onDelete(point.id)} aria-label={point.deleteLabel}>
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
