/**
 * Hindsight: confident calls with the notes written at the time, and how far ahead of the
 * reference forecasts the user's calls settled on the right side. The scoring rules (which
 * forecasts count, the final forecast, the window end) come from shared/scoring, once.
 */
import type { HindsightEntry, ReferenceLeadSummary } from '../../shared/contract';
import type { BinaryQuestion } from '../../shared/domain';
import { confidentVerdict, referenceLead, type ScoredSet } from '../../shared/scoring';
import { toIso } from '../../shared/time';

/**
 * The confident calls of the selection (the scored set of its filter), misses first (the most confident, i.e. worst, first),
 * then hits (most confident first), with the counts of each; only the page from `offset`
 * (`limit` entries, all when undefined) is read in full.
 */
export function confidentCalls(
  set: ScoredSet,
  threshold: number,
  includeHits: boolean,
  details: (ids: string[]) => BinaryQuestion[],
  page: { offset: number; limit?: number } = { offset: 0 },
): { entries: HindsightEntry[]; misses: number; hits: number } {
  const picked: { i: number; verdict: 'miss' | 'hit'; distance: number }[] = [];
  for (let i = 0; i < set.n; i++) {
    const verdict = confidentVerdict(set.p[i]!, set.o[i]!, threshold);
    if (verdict === null || (verdict === 'hit' && !includeHits)) continue;
    picked.push({ i, verdict, distance: Math.abs(set.p[i]! - set.o[i]!) });
  }
  // Array.prototype.sort is stable: equal distances keep the scored set's order.
  picked.sort((a, b) =>
    a.verdict !== b.verdict ? (a.verdict === 'miss' ? -1 : 1) : a.verdict === 'miss' ? b.distance - a.distance : a.distance - b.distance,
  );
  const misses = picked.filter((x) => x.verdict === 'miss').length;
  const shown = picked.slice(page.offset, page.limit === undefined ? undefined : page.offset + page.limit);
  const byId = new Map(details(shown.map(({ i }) => set.questions[i]!.id)).map((q) => [q.id, q]));
  const entries = shown.map(({ i, verdict }): HindsightEntry => {
    const q = byId.get(set.questions[i]!.id)!;
    const T = set.T[i]!;
    return {
      id: q.id,
      title: q.title,
      rule: q.rule,
      tags: q.tags,
      verdict,
      outcome: set.o[i] === 1 ? 'yes' : 'no',
      final_p: set.p[i]!,
      window_end: toIso(T),
      base_rate: q.base_rate,
      resolution: { at: q.resolution!.at, note: q.resolution!.note },
      forecasts: q.forecasts.map((f) => ({ at: f.at, p: f.p, note: f.note, counted: Date.parse(f.at) <= T })),
    };
  });
  return { entries, misses, hits: picked.length - misses };
}

/**
 * Mean lead in days over the filter and per tag: for each scored question with reference
 * forecasts, when the user's standing forecast reached and stayed on the right side of 50%
 * versus when the reference did (positive: the user was earlier).
 */
export function referenceLeads(set: ScoredSet): ReferenceLeadSummary[] {
  const all: number[] = [];
  const byTag = new Map<string, number[]>();
  for (let i = 0; i < set.n; i++) {
    const q = set.questions[i]!;
    if (!q.references.length) continue;
    const lead = referenceLead(q.forecasts, q.references, set.o[i] === 1 ? 'yes' : 'no', set.T[i]!);
    if (lead.lead_days === null) continue;
    all.push(lead.lead_days);
    for (const tag of q.tags) {
      const list = byTag.get(tag) ?? [];
      list.push(lead.lead_days);
      byTag.set(tag, list);
    }
  }
  const summary = (tag: string | null, xs: number[]): ReferenceLeadSummary => ({
    tag,
    n: xs.length,
    mean_days: xs.length ? xs.reduce((a, b) => a + b, 0) / xs.length : null,
  });
  return [summary(null, all), ...[...byTag.entries()].sort(([a], [b]) => a.localeCompare(b)).map(([t, xs]) => summary(t, xs))];
}
