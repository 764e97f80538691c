/** Every point of the history chart as rows: the user's revisions and the reference forecasts. */
import type { Question } from '../../../../shared/domain';
import { Button } from '../../components/Button';
import { formatInstant } from '../../dates';
import { formatPercent } from '../../percent';
import { sortedForecasts } from './questionFacts';

interface Props {
  question: Question;
  onDeleteForecast: (id: string) => void;
  onDeleteReference: (id: string) => void;
}

export function HistoryTables({ question, onDeleteForecast, onDeleteReference }: Props) {
  const zone = question.time_zone;
  const forecasts = sortedForecasts(question);
  const references = [...question.references].sort((a, b) => Date.parse(a.at) - Date.parse(b.at));
  return (
    <div className="history-tables">
      <div className="table-card">
        <table data-testid="revisions-table">
          <caption className="table-card__caption">Your forecasts ({forecasts.length})</caption>
          <thead>
            <tr>
              <th scope="col">Time</th>
              <th scope="col" className="num">
                Probability
              </th>
              <th scope="col">Note</th>
              <th scope="col">
                <span className="visually-hidden">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {forecasts.length === 0 ? (
              <tr>
                <td colSpan={4} className="muted">
                  No forecasts yet — use Revise to state your probability.
                </td>
              </tr>
            ) : (
              forecasts.map((f) => (
                <tr key={f.id} data-testid="revision-row">
                  <td className="nowrap">
                    <time dateTime={f.at}>{formatInstant(f.at, zone, false)}</time>
                  </td>
                  <td className="num" data-testid="revision-p">
                    {formatPercent(f.p)}
                  </td>
                  <td>
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
                  </td>
                  <td className="row-actions">
                    <Button size="sm" variant="ghost" onClick={() => onDeleteForecast(f.id)} aria-label={`Delete the ${formatPercent(f.p)} forecast of ${formatInstant(f.at, zone, false)}`}>
                      Delete
                    </Button>
                  </td>
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
      <div className="table-card">
        <table data-testid="references-table">
          <caption className="table-card__caption">Reference forecasts ({references.length})</caption>
          <thead>
            <tr>
              <th scope="col">Time</th>
              <th scope="col" className="num">
                Probability
              </th>
              <th scope="col">Source</th>
              <th scope="col">
                <span className="visually-hidden">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {references.length === 0 ? (
              <tr>
                <td colSpan={4} className="muted">
                  None yet — add a client’s view or a consensus figure to compare against.
                </td>
              </tr>
            ) : (
              references.map((r) => (
                <tr key={r.id} data-testid="reference-row">
                  <td className="nowrap">
                    <time dateTime={r.at}>{formatInstant(r.at, zone, false)}</time>
                  </td>
                  <td className="num" data-testid="reference-p">
                    {formatPercent(r.p)}
                  </td>
                  <td>{r.source}</td>
                  <td className="row-actions">
                    <Button size="sm" variant="ghost" onClick={() => onDeleteReference(r.id)} aria-label={`Delete ${r.source}’s ${formatPercent(r.p)} of ${formatInstant(r.at, zone, false)}`}>
                      Delete
                    </Button>
                  </td>
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
