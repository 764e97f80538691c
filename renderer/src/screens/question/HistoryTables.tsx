/** Every point of the history chart as rows: the user's revisions and the reference forecasts. */
import type { BinaryQuestion } from '../../../../shared/domain';
import { formatInstant } from '../../dates';
import { formatPercent } from '../../percent';
import { EntryTable } from './EntryTable';
import { sortedForecasts } from './questionFacts';

interface Props {
  question: BinaryQuestion;
  onDeleteForecast: (id: string) => void;
  onDeleteReference: (id: string) => void;
}

/** Each row's one figure, its probability. */
const PROBABILITY = ['Probability'];

export function HistoryTables({ question, onDeleteForecast, onDeleteReference }: Props) {
  const zone = question.time_zone;
  const when = (at: string) => formatInstant(at, zone, false);
  const forecasts = sortedForecasts(question);
  const references = [...question.references].sort((a, b) => Date.parse(a.at) - Date.parse(b.at));
  return (
    <div className="history-tables">
      <EntryTable
        kind="revision"
        caption="Your forecasts"
        headers={PROBABILITY}
        cellClassName="num"
        cellTestId="revision-p"
        detailHeader="Note"
        empty="No forecasts yet — use Revise to state your probability."
        zone={zone}
        rows={forecasts.map((f) => ({
          id: f.id,
          at: f.at,
          cells: [formatPercent(f.p)],
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
      <EntryTable
        kind="reference"
        caption="Reference forecasts"
        headers={PROBABILITY}
        cellClassName="num"
        cellTestId="reference-p"
        detailHeader="Source"
        empty="None yet — add a client’s view or a consensus figure to compare against."
        zone={zone}
        rows={references.map((r) => ({
          id: r.id,
          at: r.at,
          cells: [formatPercent(r.p)],
          deleteLabel: `Delete ${r.source}’s ${formatPercent(r.p)} of ${when(r.at)}`,
          detail: <span className="user-text">{r.source}</span>,
        }))}
        onDelete={onDeleteReference}
      />
    </div>
  );
}

