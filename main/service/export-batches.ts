/**
 * The diary as the export writes it, read a batch of questions at a time in export order
 * (close time, then id), so an export of any size holds one batch in memory. Lean on
 * purpose: a few queries per batch, rows as arrays, and only the columns the file holds
 * (no revision ids, no stamps): reading is most of an export's time.
 *
 * Reads the tables of main/store/migrations.ts directly; a schema change must update these
 * queries too. The caller holds the read transaction that makes the batches one snapshot.
 */
import type { Lens, Outcome, QuestionKind } from '../../shared/domain';
import type { ExportedQuestion } from '../../shared/diary-file';
import { toIso } from '../../shared/time';
import type { Db } from '../store/open';

type QuestionTuple = [
  id: string,
  title: string,
  rule: string,
  kind: QuestionKind,
  opened_at: number,
  closes_at: number,
  time_zone: string,
  base_rate: number | null,
  base_rate_note: string,
  false_alarm_cost: number | null,
  miss_cost: number | null,
  checkin_days: number | null,
];

/** Rows of `table` for the batch's questions, each with its question's position in the batch. */
const forBatch = (columns: string, table: string, order: string) =>
  `SELECT j.key, ${columns} FROM json_each(?) j JOIN ${table} ON question_id = j.value ORDER BY j.key${order ? `, ${order}` : ''}`;

/**
 * `toIso` for the many times of one export, faster: the date part comes from toIso itself,
 * once per day (a diary's times fall on a few thousand days), and the time of day is plain
 * arithmetic.
 */
export function isoFormatter(): (ms: number) => string {
  const DAY = 86_400_000;
  const two = Array.from({ length: 100 }, (_, i) => String(i).padStart(2, '0'));
  const three = Array.from({ length: 1000 }, (_, i) => String(i).padStart(3, '0'));
  const dates = new Map<number, string>();
  return (ms) => {
    if (!Number.isInteger(ms)) return toIso(ms);
    const d = Math.floor(ms / DAY);
    let date = dates.get(d);
    if (date === undefined) dates.set(d, (date = toIso(d * DAY).slice(0, -13)));
    const t = ms - d * DAY;
    return `${date}${two[Math.floor(t / 3_600_000)]}:${two[Math.floor(t / 60_000) % 60]}:${two[Math.floor(t / 1000) % 60]}.${three[t % 1000]}Z`;
  };
}

/** The lenses of a revision without any: one shared empty list, not two million. */
const NO_LENSES: Lens[] = [];

/** The questions in export order, `size` at a time. */
export function* exportBatches(db: Db, size: number): Generator<ExportedQuestion[]> {
  // Keyset pagination: each page starts after the last one's (closes_at, id), by the index on closes_at.
  const page = db
    .prepare(
      `SELECT id, title, rule, kind, opened_at, closes_at, time_zone, base_rate, base_rate_note, false_alarm_cost, miss_cost, checkin_days
       FROM questions WHERE (closes_at, id) > (?, ?) ORDER BY closes_at, id LIMIT ?`,
    )
    .raw();
  const tags = db.prepare(forBatch('tag', 'question_tags', 'position')).raw();
  // The revision's seq matters only to attach lenses, so it is read only when there are lenses.
  const forecasts = db.prepare(forBatch('at, p, note, seq', 'forecasts', 'at, seq')).raw();
  const forecastsOnly = db.prepare(forBatch('at, p, note', 'forecasts', 'at, seq')).raw();
  const references = db.prepare(forBatch('at, p, source', 'reference_forecasts', 'at, seq')).raw();
  const resolutions = db.prepare(forBatch('outcome, at, note', 'resolutions', '')).raw();
  // Most diaries have few lenses or none; then their query is not run at all.
  const anyLenses = db.prepare('SELECT EXISTS (SELECT 1 FROM forecast_lenses)').pluck().get() === 1;
  const lenses = db
    .prepare(
      `SELECT f.seq, l.name, l.p, l.weight FROM json_each(?) j JOIN forecasts f ON f.question_id = j.value
       JOIN forecast_lenses l ON l.forecast_id = f.id ORDER BY f.seq, l.position`,
    )
    .raw();
  const iso = isoFormatter();

  let after: [number, string] = [-Infinity, ''];
  for (;;) {
    const rows = page.all(after[0], after[1], size) as QuestionTuple[];
    if (rows.length === 0) return;
    const last = rows[rows.length - 1]!;
    after = [last[5], last[0]];
    const ids = JSON.stringify(rows.map((r) => r[0]));
    const batch = rows.map(
      ([id, title, rule, kind, opened, closes, time_zone, base_rate, base_rate_note, falseAlarm, miss, checkin_days]): ExportedQuestion => ({
        id,
        title,
        rule,
        kind,
        tags: [],
        opened_at: iso(opened),
        closes_at: iso(closes),
        time_zone,
        base_rate,
        base_rate_note,
        costs: falseAlarm !== null && miss !== null ? { false_alarm: falseAlarm, miss } : null,
        checkin_days,
        forecasts: [],
        references: [],
        resolution: null,
      }),
    );
    for (const [k, tag] of tags.all(ids) as [number, string][]) batch[k]!.tags.push(tag);
    const lensesOf = new Map<number, Lens[]>();
    if (anyLenses) {
      for (const [seq, name, p, weight] of lenses.all(ids) as [number, string, number, number][]) {
        const list = lensesOf.get(seq);
        if (list) list.push({ name, p, weight });
        else lensesOf.set(seq, [{ name, p, weight }]);
      }
    }
    for (const [k, at, p, note, seq] of (anyLenses ? forecasts : forecastsOnly).all(ids) as [number, number, number, string, number?][]) {
      batch[k]!.forecasts.push({ at: iso(at), p, note, lenses: (seq !== undefined && lensesOf.get(seq)) || NO_LENSES });
    }
    for (const [k, at, p, source] of references.all(ids) as [number, number, number, string][]) batch[k]!.references.push({ at: iso(at), p, source });
    for (const [k, outcome, at, note] of resolutions.all(ids) as [number, Outcome, number, string][]) batch[k]!.resolution = { outcome, at: iso(at), note };
    yield batch;
  }
}
