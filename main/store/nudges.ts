/** What the nudge scheduler has delivered, and what the user has snoozed. */
import type { NudgeKind } from '../../shared/domain';
import type { Db } from './open';

export type StoredNudgeKind = NudgeKind;

export interface SnoozeRow {
  question_id: string;
  kind: StoredNudgeKind;
  until: number;
}

export function wasDelivered(db: Db, key: string): boolean {
  return db.prepare('SELECT 1 FROM nudge_log WHERE key = ?').get(key) !== undefined;
}

export function recordDelivered(db: Db, key: string, questionId: string | null, kind: string, at: number): void {
  db.prepare('INSERT OR IGNORE INTO nudge_log (key, question_id, kind, delivered_at) VALUES (?, ?, ?, ?)').run(
    key,
    questionId,
    kind,
    at,
  );
}

export function deliveredCount(db: Db): number {
  return (db.prepare('SELECT count(*) AS n FROM nudge_log').get() as { n: number }).n;
}

export function allSnoozes(db: Db): SnoozeRow[] {
  return db.prepare('SELECT question_id, kind, until FROM snoozes').all() as SnoozeRow[];
}

export function upsertSnooze(db: Db, s: SnoozeRow): void {
  db.prepare(
    'INSERT INTO snoozes (question_id, kind, until) VALUES (@question_id, @kind, @until) ON CONFLICT (question_id, kind) DO UPDATE SET until = excluded.until',
  ).run(s);
}

export function clearSnoozes(db: Db, questionId: string, kind?: StoredNudgeKind): void {
  if (kind) db.prepare('DELETE FROM snoozes WHERE question_id = ? AND kind = ?').run(questionId, kind);
  else db.prepare('DELETE FROM snoozes WHERE question_id = ?').run(questionId);
}

/** The question's snoozes still running at `now` (of one kind, when given). */
export function activeSnoozes(db: Db, questionId: string, now: number, kind?: StoredNudgeKind): SnoozeRow[] {
  return db
    .prepare('SELECT question_id, kind, until FROM snoozes WHERE question_id = ? AND until > ? AND (? IS NULL OR kind = ?)')
    .all(questionId, now, kind ?? null, kind ?? null) as SnoozeRow[];
}
