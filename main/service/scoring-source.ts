/**
 * Reads the diary straight into the scoring engine's input: numeric times, no ISO
 * strings, one pass per table, so scoring a large diary costs little more than the engine.
 */
import type { ScoringQuestion } from '../../shared/scoring';
import type { Db } from '../store/open';

export function loadScoringQuestions(db: Db): ScoringQuestion[] {
  const byId = new Map<string, ScoringQuestion>();
  const rows = db
    .prepare(
      `SELECT q.id, q.title, q.kind, q.closes_at, q.base_rate, q.false_alarm_cost, q.miss_cost, r.outcome, r.at AS resolved_at
       FROM questions q LEFT JOIN resolutions r ON r.question_id = q.id`,
    )
    .raw()
    .all() as [string, string, ScoringQuestion['kind'], number, number | null, number | null, number | null, 'yes' | 'no' | 'void' | null, number | null][];
  for (const [id, title, kind, closes, baseRate, fa, miss, outcome, resolvedAt] of rows) {
    byId.set(id, {
      id,
      title,
      tags: [],
      kind,
      closes_at: closes,
      resolution: outcome ? { outcome, at: resolvedAt! } : null,
      base_rate: baseRate,
      costs: fa !== null && miss !== null ? { false_alarm: fa, miss } : null,
      forecasts: [],
      references: [],
    });
  }
  for (const [qid, tag] of db.prepare('SELECT question_id, tag FROM question_tags ORDER BY question_id, position').raw().all() as [string, string][]) {
    byId.get(qid)?.tags.push(tag);
  }
  // One row per question with its revisions packed by SQLite as a flat JSON array
  // [at, p, seq, at, p, seq, …]: materialising 200,000 rows one by one costs about twice
  // as much. %.17g keeps p to within one unit in the last place of what was stored.
  for (const [qid, packed] of db
    .prepare(
      `SELECT question_id, '[' || group_concat(at || ',' || printf('%.17g', p) || ',' || seq, ',') || ']'
       FROM forecasts GROUP BY question_id`,
    )
    .raw()
    .all() as [string, string][]) {
    const q = byId.get(qid);
    if (!q) continue;
    const flat = JSON.parse(packed) as number[];
    for (let i = 0; i < flat.length; i += 3) q.forecasts.push({ at: flat[i]!, p: flat[i + 1]!, seq: flat[i + 2]! });
  }
  for (const [qid, at, p] of db.prepare('SELECT question_id, at, p FROM reference_forecasts ORDER BY question_id, at, seq').raw().all() as [
    string,
    number,
    number,
  ][]) {
    byId.get(qid)?.references.push({ at, p });
  }
  return [...byId.values()];
}
