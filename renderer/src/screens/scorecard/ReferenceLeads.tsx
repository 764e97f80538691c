/**
 * The average lead over reference forecasts: on questions where both the user and the
 * reference ended up on the right side of 50% and stayed there, how many days earlier the
 * user got there (negative: later). Over the whole view and per tag.
 */
import { memo } from 'react';
import type { ReferenceLeadSummary } from '../../../../shared/contract';
import { days, questions } from './format';
import { formatCount } from '../../dates';

export function leadSentence(lead: ReferenceLeadSummary): string {
  if (lead.mean_days === null || lead.n === 0) {
    return 'No lead to report: no scored question here has both your forecasts and a reference settling on the right side of 50%.';
  }
  const on = `on average over ${questions(lead.n)}`;
  if (Math.abs(lead.mean_days) < 0.05) return `Your calls settled on the right side at the same time as the reference, ${on}.`;
  return lead.mean_days > 0
    ? `Your calls settled on the right side ${days(lead.mean_days)} before the reference, ${on}.`
    : `Your calls settled on the right side ${days(lead.mean_days)} after the reference, ${on}.`;
}

export const ReferenceLeads = memo(function ReferenceLeads({ leads }: { leads: ReferenceLeadSummary[] }) {
  const overall = leads.find((l) => l.tag === null) ?? { tag: null, n: 0, mean_days: null };
  const byTag = leads.filter((l) => l.tag !== null);
  return (
    <div className="sc-stack" data-testid="reference-leads">
      <p className="sc-lead" data-testid="lead-sentence">
        {leadSentence(overall)}
      </p>
      {byTag.length > 0 ? (
        <div className="table-card sc-leads-table">
          <table>
            <caption className="table-card__caption">Average lead over the reference, by tag</caption>
            <thead>
              <tr>
                <th scope="col">Tag</th>
                <th scope="col" className="num">n</th>
                <th scope="col" className="num">Average lead</th>
              </tr>
            </thead>
            <tbody>
              {byTag.map((l) => (
                <tr key={l.tag}>
                  <th scope="row">{l.tag}</th>
                  <td className="num">{formatCount(l.n)}</td>
                  <td className="num">
                    {l.mean_days === null ? '—' : `${days(l.mean_days)} ${l.mean_days >= 0 ? 'earlier' : 'later'}`}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
    </div>
  );
});
