/**
 * The diary as the export writes it, read a batch of questions at a time in export order
 * (close time, then id), so an export of any size holds one batch in memory. Lean on
 * purpose: a few queries per batch, rows as arrays, and only the columns the file holds
 * (no revision ids, no stamps): reading is most of an export's time.
 *
 * Reads the tables of main/store/migrations.ts directly; a schema change must update these
 * queries too (and a table added for a question's data, the file format with them). The caller holds the read transaction that makes the batches one snapshot.
 */
import type { Lens, Outcome, Question, QuestionKind, QuestionType, ResolutionChangeKind } from '../../shared/domain';
import type { ExportedQuestion } from '../../shared/diary-file';
import { toIso } from '../../shared/time';
import type { Db } from '../store/open';
import { loadBundles, toQuestion } from '../store/questions';

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
  type: QuestionType,
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

/** Likewise the history of a question never corrected or reopened (replaced, never pushed to). */
const NO_HISTORY: BinaryExport['resolution_history'] = [];

type BinaryExport = Extract<ExportedQuestion, { type: 'binary' }>;

/**
 * Reads questions as the export writes them. `always` reads lenses and resolution
 * history for every batch; otherwise each is read only when the diary has any at the
 * start (most diaries have few lenses or none, and few corrections), which holds for one
 * snapshot (the export's) but not for a diary being written meanwhile (an import's merge).
 */
function exportReader(db: Db, always: boolean) {
  const tags = db.prepare(forBatch('tag', 'question_tags', 'position')).raw();
  // The revision's seq matters only to attach lenses, so it is read only when there are lenses.
  const forecasts = db.prepare(forBatch('at, p, note, seq', 'forecasts', 'at, seq')).raw();
  const forecastsOnly = db.prepare(forBatch('at, p, note', 'forecasts', 'at, seq')).raw();
  const references = db.prepare(forBatch('at, p, source', 'reference_forecasts', 'at, seq')).raw();
  const resolutions = db.prepare(forBatch('outcome, at, note', 'resolutions', '')).raw();
  const history = db
    .prepare(forBatch('outcome, at, note, recorded_at, replaced_at, change, change_note', 'resolution_history', 'seq'))
    .raw();
  const exists = (table: string) => always || db.prepare(`SELECT EXISTS (SELECT 1 FROM ${table})`).pluck().get() === 1;
  const anyLenses = exists('forecast_lenses');
  const anyHistory = exists('resolution_history');
  const lenses = db
    .prepare(
      `SELECT f.seq, l.name, l.p, l.weight FROM json_each(?) j JOIN forecasts f ON f.question_id = j.value
       JOIN forecast_lenses l ON l.forecast_id = f.id ORDER BY f.seq, l.position`,
    )
    .raw();
  const iso = isoFormatter();

  /** The questions of `rows` (in that order), whole. */
  return (rows: QuestionTuple[]): ExportedQuestion[] => {
    // Every question is first read as a yes/no one; the others are replaced below.
    const ids = JSON.stringify(rows.map((r) => r[0]));
    const batch: BinaryExport[] = rows.map(
      ([id, title, rule, kind, opened, closes, time_zone, base_rate, base_rate_note, falseAlarm, miss, checkin_days]): BinaryExport => ({
        type: 'binary',
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
        resolution_history: NO_HISTORY,
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
    if (anyHistory) {
      type HistoryTuple = [number, Outcome, number, string, number, number, ResolutionChangeKind, string];
      for (const [k, outcome, at, note, recorded, replaced, change, change_note] of history.all(ids) as HistoryTuple[]) {
        const q = batch[k]!;
        if (q.resolution_history === NO_HISTORY) q.resolution_history = [];
        q.resolution_history.push({ outcome, at: iso(at), note, recorded_at: iso(recorded), replaced_at: iso(replaced), change, change_note });
      }
    }
    // Choice and numeric questions (fewer, and with values in their own tables) are read whole,
    // as the API reads them, in place of what the yes/no reading above made of them.
    const typed = rows.filter((r) => r[12] !== 'binary').map((r) => r[0]);
    if (typed.length === 0) return batch;
    const whole = new Map(loadBundles(db, typed).map((b) => [b.row.id, exported(toQuestion(b, 0))]));
    return rows.map((r, k) => whole.get(r[0]) ?? batch[k]!);
  };
}

const QUESTION_SELECT =
  'SELECT id, title, rule, kind, opened_at, closes_at, time_zone, base_rate, base_rate_note, false_alarm_cost, miss_cost, checkin_days, type FROM questions';

/** A whole question as the export writes it: without its internal ids, entry order, snoozes and stamps. */
function exported(q: Question): ExportedQuestion {
  const { snoozes: _snoozes, created_at: _created, updated_at: _updated, ...rest } = q;
  return {
    ...rest,
    forecasts: q.forecasts.map(({ id: _id, seq: _seq, ...f }) => f),
    references: q.references.map(({ id: _id, ...r }) => r),
  } as ExportedQuestion;
}

/** The questions in export order, `size` at a time. */
export function* exportBatches(db: Db, size: number): Generator<ExportedQuestion[]> {
  // Keyset pagination: each page starts after the last one's (closes_at, id), by the index on closes_at.
  const page = db.prepare(`${QUESTION_SELECT} WHERE (closes_at, id) > (?, ?) ORDER BY closes_at, id LIMIT ?`).raw();
  const read = exportReader(db, false);
  let after: [number, string] = [-Infinity, ''];
  for (;;) {
    const rows = page.all(after[0], after[1], size) as QuestionTuple[];
    if (rows.length === 0) return;
    const last = rows[rows.length - 1]!;
    after = [last[5], last[0]];
    yield read(rows);
  }
}

/**
 * One question at a time as the export writes it, by id (null when there is none): what a
 * merging import compares. Statements are prepared once, so each question costs a few
 * indexed lookups however large the diary.
 */
export function exportedQuestionReader(db: Db): (id: string) => ExportedQuestion | null {
  const row = db.prepare(`${QUESTION_SELECT} WHERE id = ?`).raw();
  const read = exportReader(db, true);
  return (id) => {
    const found = row.get(id) as QuestionTuple | undefined;
    return found ? read([found])[0]! : null;
  };
}
