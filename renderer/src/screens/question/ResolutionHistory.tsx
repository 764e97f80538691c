/**
 * What the resolution used to say: every earlier resolution, kept when it was corrected or
 * the question reopened (docs/api.md, "Correcting a resolution, reopening"), oldest first,
 * with when it changed and why. Shown only once there is something to show.
 */
import type { AnyResolution, Question, ResolutionChangeKind } from '../../../../shared/domain';
import { toStoredValue } from '../../../../shared/numeric-value';
import { OutcomeIcon } from '../../components/OutcomeMark';
import { OUTCOME_LABELS } from '../../components/StatusPill';
import { formatInstant } from '../../dates';
import { formatValue } from '../../forecastEntry/numericEntry';
import '../../forgiving/forgiving.css';

const CHANGE_LABELS: Record<ResolutionChangeKind, string> = {
  corrected: 'Corrected',
  reopened: 'Reopened',
};

/** What an earlier resolution said: Yes, No, Void, the option that came true, or the value. */
function pastOutcomeText(question: Question, entry: AnyResolution): string {
  if (entry.outcome === 'option') return question.type === 'choice' ? (question.options[entry.option] ?? `option ${entry.option + 1}`) : '';
  if (entry.outcome === 'value') return question.type === 'numeric' ? formatValue(toStoredValue(entry.value, question.value_kind), question.value_kind, question.unit) : '';
  return OUTCOME_LABELS[entry.outcome];
}

export function ResolutionHistory({ question }: { question: Question }) {
  const history = question.resolution_history;
  if (history.length === 0) return null;
  const zone = question.time_zone;
  return (
    <section className="resolution-history" aria-labelledby="resolution-history-heading">
      <h2 id="resolution-history-heading">Resolution history</h2>
      <p className="muted">
        Earlier resolutions of this question, oldest first. {question.resolution ? 'The one in force is shown above.' : 'The question is open again.'}
      </p>
      <div className="table-card">
        <table data-testid="resolution-history">
          <caption className="visually-hidden">Earlier resolutions, oldest first</caption>
          <thead>
            <tr>
              <th scope="col">Was</th>
              <th scope="col">Resolved at</th>
              <th scope="col">Note</th>
              <th scope="col">Changed</th>
              <th scope="col">Why</th>
            </tr>
          </thead>
          <tbody>
            {history.map((entry, i) => (
              // The history only grows at its end, so the position keys the row.
              <tr key={i} data-testid="resolution-history-row">
                <td className="nowrap">
                  <span className={`resolution-history__outcome resolution-history__outcome--${entry.outcome}`}>
                    {entry.outcome === 'option' || entry.outcome === 'value' ? null : <OutcomeIcon outcome={entry.outcome} />}
                    {pastOutcomeText(question, entry)}
                  </span>
                </td>
                <td className="nowrap">
                  <time dateTime={entry.at}>{formatInstant(entry.at, zone, false)}</time>
                </td>
                <td>{entry.note ? <span className="note">{entry.note}</span> : <span className="muted">—</span>}</td>
                <td className="nowrap">
                  {CHANGE_LABELS[entry.change]} <time dateTime={entry.replaced_at}>{formatInstant(entry.replaced_at, zone, false)}</time>
                </td>
                <td>{entry.change_note ? <span className="note">{entry.change_note}</span> : <span className="muted">No reason given</span>}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
