/**
 * Every point of a choice or numeric question's history chart as rows: one column per option
 * (its chance) or per quantile level (its value), with the note or source and a delete action.
 */
import { toStoredValue } from '../../../../shared/numeric-value';
import { formatInstant } from '../../dates';
import { formatValue, levelLabel } from '../../forecastEntry/numericEntry';
import { formatPercent } from '../../percent';
import type { TypedQuestion } from './TypedEntryDialog';
import { EntryTable, type EntryRow } from './EntryTable';
import { byTime } from './typedFacts';

interface Props {
  question: TypedQuestion;
  onDeleteForecast: (id: string) => void;
  onDeleteReference: (id: string) => void;
}

export function TypedHistoryTables({ question: q, onDeleteForecast, onDeleteReference }: Props) {
  const zone = q.time_zone;
  const when = (at: string) => formatInstant(at, zone, false);
  const headers = q.type === 'choice' ? q.options : q.levels.map((level) => levelLabel(level, q.levels));
  const cells = (values: readonly (number | string)[]): string[] =>
    q.type === 'choice'
      ? values.map((p) => formatPercent(p as number))
      : values.map((v) => formatValue(toStoredValue(v, q.value_kind), q.value_kind, q.unit));
  // With five levels a value may wrap before its unit ("118,000 / pallets"): five of them on
  // one line pushed the Note and Delete columns out of a 1024-wide window. Three levels fit
  // whole, and the table would otherwise give their room to a long note; percents never wrap.
  const cellClassName = q.type === 'numeric' && q.levels.length > 3 ? 'num' : 'num nowrap';
  const forecasts: EntryRow[] = byTime<{ id: string; at: string; seq: number; note: string; values: readonly (number | string)[] }>(
    q.type === 'choice' ? q.forecasts.map((f) => ({ ...f, values: f.probs })) : q.forecasts.map((f) => ({ ...f, values: f.quantiles })),
  ).map((f) => ({
    id: f.id,
    at: f.at,
    cells: cells(f.values),
    detail: f.note ? <span className="note">{f.note}</span> : <span className="muted">—</span>,
    deleteLabel: `Delete your forecast of ${when(f.at)}`,
  }));
  const references: EntryRow[] = byTime<{ id: string; at: string; source: string; values: readonly (number | string)[] }>(
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
      <EntryTable
        kind="revision"
        caption="Your forecasts"
        headers={headers}
        cellClassName={cellClassName}
        detailHeader="Note"
        empty="No forecasts yet — use Revise to give yours."
        zone={zone}
        rows={forecasts}
        onDelete={onDeleteForecast}
      />
      <EntryTable
        kind="reference"
        caption="Reference forecasts"
        headers={headers}
        cellClassName={cellClassName}
        detailHeader="Source"
        empty="None yet — add a client’s view or a plan’s figures to compare against."
        zone={zone}
        rows={references}
        onDelete={onDeleteReference}
      />
    </div>
  );
}

