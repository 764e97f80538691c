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
import type { ExportBatch, ExportedQuestion, PackedRevisions } from '../../shared/diary-file';
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

/** The lenses of a revision without any: one shared empty list, not two million. */
const NO_LENSES: Lens[] = [];

/** Likewise the history of a question never corrected or reopened (replaced, never pushed to). */
const NO_HISTORY: BinaryExport['resolution_history'] = [];

type BinaryExport = Extract<ExportedQuestion, { type: 'binary' }>;

/** What the revision-collecting SQL function hands each revision to; see `revisionSinkOf`. */
type RevisionSink = (k: number, at: number, p: number, note: string, seq: number) => void;

const REVISION_FN = 'forelog_export_revision';
const revisionSinks = new WeakMap<Db, { current: RevisionSink | null }>();

/**
 * Revisions are nearly all of an export's rows, and better-sqlite3 builds a JavaScript
 * array per row it returns, which costs several times SQLite's own reading. So they come
 * through a function SQL calls once per row (as main/service/scoring-source.ts reads them
 * for scoring): each value arrives as SQLite holds it, with no row array in between.
 * Registered once per connection; directOnly, so no view or trigger can call it.
 */
function revisionSinkOf(db: Db): { current: RevisionSink | null } {
  const known = revisionSinks.get(db);
  if (known) return known;
  const holder: { current: RevisionSink | null } = { current: null };
  db.function(REVISION_FN, { directOnly: true }, (k: unknown, at: unknown, p: unknown, note: unknown, seq: unknown) => {
    if (holder.current === null) throw new Error(`${REVISION_FN} belongs to the export reader and cannot be called on its own`);
    holder.current(k as number, at as number, p as number, note as string, seq as number);
    return null;
  });
  revisionSinks.set(db, holder);
  return holder;
}

/** A batch's revisions as read, column by column; `seq` only when some have lenses. */
interface ReadRevisions extends PackedRevisions {
  seq: number[];
}

/**
 * The seqs of the revisions that have a note, as bits (seq 8n + b is bit b of byte n), or
 * null when seqs run too high for that. Most revisions have none, and finding the few
 * that do from their own index (forecasts_noted, which holds only those) costs less than
 * reading each revision's table row (for its note) beside the index that holds everything
 * else, at random places in a large diary. Valid for one snapshot: read inside the
 * export's transaction.
 */
function notedRevisions(db: Db): Uint8Array | null {
  const last = db.prepare('SELECT max(seq) FROM forecasts').pluck().get() as number | null;
  if (last === null || last >= 2 ** 31) return null;
  const bits = new Uint8Array((last >> 3) + 1);
  for (const seq of db.prepare("SELECT seq FROM forecasts WHERE note <> ''").pluck().iterate() as IterableIterator<number>) bits[seq >> 3]! |= 1 << (seq & 7);
  return bits;
}

/**
 * Reads questions as the export writes them. `always` reads lenses, resolution history
 * and each revision's note for every batch; otherwise lenses and history are read only
 * when the diary has any at the start (most diaries have few lenses or none, and few
 * corrections), and notes only for the revisions found with one at the start
 * (notedRevisions), which holds for one snapshot (the export's) but not for a diary being
 * written meanwhile (an import's merge).
 */
function exportReader(db: Db, always: boolean) {
  const tags = db.prepare(forBatch('tag', 'question_tags', 'position')).raw();
  const sink = revisionSinkOf(db);
  // Which revisions have a note, by seq, when it can be known once for the whole read.
  const noted = always ? null : notedRevisions(db);
  // No ORDER BY: SQLite walks the batch's ids in order and each question's revisions by the
  // index on (question_id, at, seq), which is the file's order; the sink checks that it was,
  // and a batch that came otherwise is read again with the order spelled out. Without the
  // notes, SQLite reads the revisions from that index alone, not the table row of each.
  const collect = db.prepare(
    `SELECT count(${REVISION_FN}(j.key, f.at, f.p, ${noted ? "''" : 'f.note'}, f.seq)) FROM json_each(?) j JOIN forecasts f ON f.question_id = j.value`,
  );
  const notes = db.prepare('SELECT j.key, f.note FROM json_each(?) j JOIN forecasts f ON f.seq = j.value').raw();
  const ordered = db.prepare(forBatch('at, p, note, seq', 'forecasts', 'at, seq')).raw();
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

  /**
   * The batch's revisions (every question's, as if all were yes/no), each question's
   * together and in time order then entry order, column by column. The sink runs once per
   * revision, millions of times: plain local arrays, no object or call per revision.
   */
  function readRevisions(n: number, ids: string, withSeq: boolean): ReadRevisions {
    const from = new Array<number>(n).fill(0);
    const to = new Array<number>(n).fill(0);
    const at: number[] = [];
    const p: number[] = [];
    const note: string[] = [];
    const seq: number[] = [];
    // The revisions with a note: their place in the columns, and their seq.
    const notedAt: number[] = [];
    const notedSeq: number[] = [];
    let inOrder = true;
    let lastK = -1;
    let lastAt = 0;
    let lastSeq = 0;
    sink.current = (k, t, value, text, s) => {
      if (noted !== null && (noted[s >> 3]! & (1 << (s & 7))) !== 0) {
        notedAt.push(at.length);
        notedSeq.push(s);
      }
      const i = at.length;
      if (k !== lastK) {
        // A question met again after another's revisions (to[k] is past 0 once it has any).
        if (to[k] !== 0) inOrder = false;
        from[k] = i;
        lastK = k;
      } else if (t < lastAt || (t === lastAt && s < lastSeq)) inOrder = false;
      to[k] = i + 1;
      at.push(t);
      p.push(value);
      note.push(text);
      if (withSeq) seq.push(s);
      lastAt = t;
      lastSeq = s;
    };
    try {
      collect.get(ids);
    } finally {
      sink.current = null;
    }
    if (inOrder && notedSeq.length > 0) {
      for (const [j, text] of notes.all(JSON.stringify(notedSeq)) as [number, string][]) note[notedAt[j]!] = text;
    }
    if (!inOrder) {
      from.fill(0);
      to.fill(0);
      at.length = p.length = note.length = seq.length = 0;
      lastK = -1;
      for (const [k, t, value, text, s] of ordered.all(ids) as [number, number, number, string, number][]) {
        if (k !== lastK) from[k] = at.length;
        lastK = k;
        to[k] = at.length + 1;
        at.push(t);
        p.push(value);
        note.push(text);
        if (withSeq) seq.push(s);
      }
    }
    return { from, to, at, p, note, seq };
  }

  /** The questions of `rows` (in that order), whole but for the packed revisions. */
  return (rows: QuestionTuple[]): ExportBatch & { packed: PackedRevisions } => {
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
        opened_at: toIso(opened),
        closes_at: toIso(closes),
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
    const packed = readRevisions(rows.length, ids, lensesOf.size > 0);
    // A question with a revision that has lenses has all its revisions as objects instead.
    if (lensesOf.size > 0) {
      for (let k = 0; k < batch.length; k++) {
        let lensed = false;
        for (let i = packed.from[k]!; i < packed.to[k]! && !lensed; i++) lensed = lensesOf.has(packed.seq[i]!);
        if (!lensed) continue;
        for (let i = packed.from[k]!; i < packed.to[k]!; i++) {
          batch[k]!.forecasts.push({ at: toIso(packed.at[i]!), p: packed.p[i]!, note: packed.note[i]!, lenses: lensesOf.get(packed.seq[i]!) ?? NO_LENSES });
        }
        packed.to[k] = packed.from[k]!;
      }
    }
    for (const [k, at, p, source] of references.all(ids) as [number, number, number, string][]) batch[k]!.references.push({ at: toIso(at), p, source });
    for (const [k, outcome, at, note] of resolutions.all(ids) as [number, Outcome, number, string][]) batch[k]!.resolution = { outcome, at: toIso(at), note };
    if (anyHistory) {
      type HistoryTuple = [number, Outcome, number, string, number, number, ResolutionChangeKind, string];
      for (const [k, outcome, at, note, recorded, replaced, change, change_note] of history.all(ids) as HistoryTuple[]) {
        const q = batch[k]!;
        if (q.resolution_history === NO_HISTORY) q.resolution_history = [];
        q.resolution_history.push({ outcome, at: toIso(at), note, recorded_at: toIso(recorded), replaced_at: toIso(replaced), change, change_note });
      }
    }
    // Choice and numeric questions (fewer, and with values in their own tables) are read whole,
    // as the API reads them, in place of what the yes/no reading above made of them.
    const typed = rows.filter((r) => r[12] !== 'binary').map((r) => r[0]);
    if (typed.length === 0) return { questions: batch, packed };
    const whole = new Map(loadBundles(db, typed).map((b) => [b.row.id, exported(toQuestion(b, 0))]));
    const questions = rows.map((r, k): ExportedQuestion => {
      const q = whole.get(r[0]);
      if (q === undefined) return batch[k]!;
      packed.to[k] = packed.from[k]!;
      return q;
    });
    return { questions, packed };
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
export function* exportBatches(db: Db, size: number): Generator<ExportBatch> {
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
    if (!found) return null;
    const { questions, packed } = read([found]);
    const q = questions[0]!;
    if (q.type !== 'binary') return q;
    // Compared field by field, so its revisions are objects like every other field.
    for (let i = packed.from[0]!; i < packed.to[0]!; i++) q.forecasts.push({ at: toIso(packed.at[i]!), p: packed.p[i]!, note: packed.note[i]!, lenses: NO_LENSES });
    return q;
  };
}
