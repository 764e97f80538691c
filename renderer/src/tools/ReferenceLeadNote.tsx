/**
 * "Did you see it first?" on a resolved question's page: when the user's forecast settled on
 * the right side of 50% (and stayed there to the window end) against when each reference
 * source did, by shared/scoring `referenceLead`. Sources are compared one at a time, since a
 * client's view and a consensus figure are different yardsticks.
 */
import type { BinaryQuestion } from '../../../shared/domain';
import { referenceLead, type ReferenceLead } from '../../../shared/scoring';
import { formatDay, plural } from './format';
import './tools.css';

interface SourceLead {
  source: string;
  lead: ReferenceLead;
}

/** Per reference source, for a question resolved Yes or No; empty otherwise. */
export function sourceLeads(question: BinaryQuestion): SourceLead[] {
  const outcome = question.resolution?.outcome;
  if ((outcome !== 'yes' && outcome !== 'no') || !question.resolution) return [];
  // Window end T = min(close, resolution time): SCORING.md "Which forecasts count".
  const T = Math.min(Date.parse(question.closes_at), Date.parse(question.resolution.at));
  const own = question.forecasts.map((f) => ({ at: Date.parse(f.at), p: f.p, seq: f.seq }));
  const sources = [...new Set(question.references.map((r) => r.source))];
  return sources.map((source) => ({
    source,
    lead: referenceLead(
      own,
      question.references.filter((r) => r.source === source).map((r) => ({ at: Date.parse(r.at), p: r.p })),
      outcome,
      T,
    ),
  }));
}

function gap(days: number): string {
  const whole = Math.round(Math.abs(days));
  if (days === 0) return 'at the same time';
  if (whole === 0) return days > 0 ? 'you were less than a day earlier' : 'the reference was less than a day earlier';
  return days > 0 ? `you were ${plural(whole, 'day')} earlier` : `the reference was ${plural(whole, 'day')} earlier`;
}

/** One sentence per source, in the question's own time zone. */
export function leadSentence({ source, lead }: SourceLead, timeZone: string): string {
  const ref = `the reference (${source})`;
  const { own_at, ref_at, lead_days } = lead;
  if (own_at !== null && ref_at !== null && lead_days !== null) {
    return `Your forecast settled on the right side of 50% on ${formatDay(own_at, timeZone)}; ${ref} on ${formatDay(ref_at, timeZone)} — ${gap(lead_days)}.`;
  }
  if (own_at !== null) return `Your forecast settled on the right side of 50% on ${formatDay(own_at, timeZone)}; ${ref} never did before the window ended.`;
  if (ref_at !== null) return `Your forecast never settled on the right side of 50% before the window ended; ${ref} did on ${formatDay(ref_at, timeZone)}.`;
  return `Neither your forecast nor ${ref} settled on the right side of 50% before the window ended.`;
}

export function ReferenceLeadNote({ question }: { question: BinaryQuestion }) {
  const leads = sourceLeads(question);
  if (leads.length === 0) return null;
  return (
    <section className="card" aria-labelledby="lead-heading" data-testid="reference-lead">
      <h2 id="lead-heading" className="card__title">
        Did you see it first?
      </h2>
      <ul className="lead-list">
        {leads.map((l) => (
          <li key={l.source}>{leadSentence(l, question.time_zone)}</li>
        ))}
      </ul>
      <p className="tool__explain">
        Settled means the forecast reached the side that came true and stayed there until the window ended; later forecasts do not count.
      </p>
    </section>
  );
}
