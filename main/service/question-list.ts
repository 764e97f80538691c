/**
 * The question list, a page at a time: filtering, counting, ordering and paging are done by
 * SQLite over the indexed tables, so a page of a 100,000-question diary costs about what a
 * page of a small one does, and only the questions on the page are read in full (tags, number
 * of revisions, the stale flag).
 *
 * Status is worked out in SQL with exactly the arithmetic of `questionStatus` (shared/domain):
 * both sides compute `closes_at − closing_soon_hours × 3,600,000` in doubles. Whether a
 * check-in is due (for the `attention` order) is the nudge planner's own `checkinAt`, called
 * from SQL, so the list and the Desk agree on it.
 */
import type { ListSort, QuestionList, SortDirection, ValidRequest } from '../../shared/contract';
import type { AnyOutcome, QuestionKind, QuestionStatus, QuestionSummary, QuestionType, Settings, ValueKind } from '../../shared/domain';
import { fromStoredValue } from '../../shared/numeric-value';
import { QUESTION_STATUSES } from '../../shared/domain';
import { toIso } from '../../shared/time';
import { checkinAt } from '../nudges/plan';
import { readSnapshot, type Db } from '../store/open';
import * as qs from '../store/questions';

const CHECKIN_FN = 'forelog_checkin_at';
const planners = new WeakMap<Db, { settings: Settings | null }>();

/** Registers the check-in function on this connection once (directOnly: no view or trigger can call it). */
function plannerFor(db: Db): { settings: Settings | null } {
  const known = planners.get(db);
  if (known) return known;
  const holder: { settings: Settings | null } = { settings: null };
  db.function(CHECKIN_FN, { directOnly: true, deterministic: false }, (opened: unknown, lastAt: unknown, days: unknown, zone: unknown) => {
    const settings = holder.settings;
    if (settings === null) throw new Error(`${CHECKIN_FN} belongs to the question list and cannot be called on its own`);
    return checkinAt(
      {
        id: '',
        title: '',
        opened_at: opened as number,
        closes_at: Number.POSITIVE_INFINITY,
        time_zone: zone as string,
        checkin_days: days as number | null,
        last_forecast_at: lastAt as number | null,
      },
      settings,
    );
  });
  planners.set(db, holder);
  return holder;
}

/** Index into QUESTION_STATUSES: 0 open, 1 closing, 2 awaiting, 3 resolved, 4 void. */
const STATUS_SQL = `CASE WHEN r.outcome = 'void' THEN 4 WHEN r.outcome IS NOT NULL THEN 3
  WHEN @now >= q.closes_at THEN 2 WHEN @now >= q.closes_at - @soon THEN 1 ELSE 0 END`;

/**
 * Attention rank: 0 closed and waiting for an outcome, 1 a check-in due (window still open),
 * 2 closing soon, 3 other open questions, 4 resolved or void.
 */
const ATTENTION_SQL = `CASE WHEN status = 2 THEN 0 WHEN status >= 3 THEN 4
  WHEN checkin <= @now AND checkin < closes_at THEN 1 WHEN status = 1 THEN 2 ELSE 3 END`;

/** The ORDER BY for each sort key, ascending; every one ends in `id` so pages never overlap. */
function orderBy(sort: ListSort, direction: SortDirection): string {
  const d = direction === 'asc' ? 'ASC' : 'DESC';
  // Unknown values (no forecast, no base rate) go last whichever the direction.
  const nullsLast = (column: string) => `(${column} IS NULL), ${column} ${d}`;
  const then = `closes_at ${d}, title COLLATE NOCASE ${d}, id ${d}`;
  switch (sort) {
    case 'title':
      return `title COLLATE NOCASE ${d}, closes_at ${d}, id ${d}`;
    case 'status':
      return `status ${d}, ${then}`;
    case 'closes':
      return `closes_at ${d}, title COLLATE NOCASE ${d}, id ${d}`;
    case 'last_p':
      return `${nullsLast('last_p')}, ${then}`;
    case 'base_rate':
      return `${nullsLast('base_rate')}, ${then}`;
    case 'attention':
      // Within a rank the longest-waiting first; resolved ones most recently closed first.
      return `attention ${d}, (CASE WHEN attention = 4 THEN -closes_at ELSE closes_at END) ${d}, title COLLATE NOCASE ${d}, id ${d}`;
  }
}

interface PageRow {
  id: string;
  title: string;
  type: QuestionType;
  unit: string | null;
  value_kind: ValueKind | null;
  kind: QuestionKind;
  opened_at: number;
  closes_at: number;
  time_zone: string;
  base_rate: number | null;
  checkin_days: number | null;
  outcome: AnyOutcome | null;
  resolved_option: number | null;
  resolved_value: number | null;
  last_p: number | null;
  last_at: number | null;
  status: number;
}

export interface ListContext {
  read: Db;
  settings: Settings;
  now: number;
  /** The stale flag (glide path) of an unresolved question's latest forecast. */
  stale: (q: PageRow, last: { p: number; at: number } | null) => boolean;
}

/** A query's whole order, kept for its later pages: `version` is the diary's data_version it was read at. */
interface KeptOrder {
  version: number;
  rows: { id: string; status: number }[];
}

// Scrolling asks for page after page of one query, and each page's order costs a pass over
// the whole diary (the attention order plans every open question's check-in). So the first
// later page reads the query's whole order once, and the pages after it are cut from that
// until the diary changes (the read handle's data_version moves on any other connection's
// commit) or the query is asked again from the start. A few queries are kept per diary: a
// second window may scroll another one.
const keptOrders = new WeakMap<Db, Map<string, KeptOrder>>();
const ORDERS_KEPT = 4;

function keptOrdersOf(db: Db): Map<string, KeptOrder> {
  let orders = keptOrders.get(db);
  if (!orders) {
    orders = new Map();
    keptOrders.set(db, orders);
  }
  return orders;
}

// Every page answers with the diary's tags (with their counts) and its question count, which
// do not depend on the query: on a large diary the tag counts are a pass over every tag row,
// so they are kept until the diary changes, like the orders above. As with every answer the
// service keeps, callers must not change it (the windows get copies: JSON or IPC).
const keptTotals = new WeakMap<Db, { version: number; tags: { tag: string; count: number }[]; total: number }>();

/** The diary's tag counts and question count, read again only after a change; inside the caller's snapshot. */
function diaryTotals(read: Db): { tags: { tag: string; count: number }[]; total: number } {
  const version = read.pragma('data_version', { simple: true }) as number;
  let kept = keptTotals.get(read);
  if (kept?.version !== version) {
    kept = { version, tags: qs.allTagCounts(read), total: qs.questionCount(read) };
    keptTotals.set(read, kept);
  }
  return kept;
}

export function listQuestionPage(ctx: ListContext, req: ValidRequest<'listQuestions'>): QuestionList {
  const { read, settings, now } = ctx;
  const sort: ListSort = req.sort ?? 'attention';
  const direction: SortDirection = req.direction ?? 'asc';
  const offset = req.offset ?? 0;
  const where: string[] = [];
  const params: Record<string, unknown> = { now, soon: settings.closing_soon_hours * 3_600_000 };
  if (req.tag) {
    where.push('q.id IN (SELECT question_id FROM question_tags WHERE tag = @tag)');
    params.tag = req.tag;
  }
  const text = req.text?.trim();
  // Each word is looked for on its own ("tollmere backlog" finds "Tollmere's post-go-live
  // incident backlog"): a question matches when every word is somewhere in its title, rule,
  // tags, a choice question's options or the notes written with revisions. LIKE's own
  // wildcards in the text are taken literally. SQLite's LIKE ignores case for A–Z as its
  // lower() does, so the columns are compared as they are (no function call per row).
  const words = text ? [...new Set(text.toLowerCase().split(/\s+/))] : [];
  words.forEach((word, k) => {
    const like = `like${k}`;
    params[like] = `%${word.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    where.push(
      `(q.title LIKE @${like} ESCAPE '\\' OR q.rule LIKE @${like} ESCAPE '\\'
        OR q.id IN (SELECT question_id FROM question_tags WHERE tag LIKE @${like} ESCAPE '\\')
        OR q.id IN (SELECT question_id FROM question_options WHERE label LIKE @${like} ESCAPE '\\')
        OR q.id IN (SELECT question_id FROM forecasts WHERE note <> '' AND note LIKE @${like} ESCAPE '\\'))`,
    );
  });
  if (req.status) {
    where.push(`(${STATUS_SQL}) = @status`);
    params.status = QUESTION_STATUSES.indexOf(req.status as QuestionStatus);
  }
  const filter = where.length ? `WHERE ${where.join(' AND ')}` : '';
  const from = `FROM questions q LEFT JOIN resolutions r ON r.question_id = q.id ${filter}`;

  const holder = plannerFor(read);
  holder.settings = settings;
  try {
    return readSnapshot(read, () => {
      // One pass picks the page and counts the matches; the latest revision is looked up
      // per row only when the order needs it (one index step each), and for the page.
      const latest = (column: string) => `(SELECT ${column} FROM forecasts WHERE question_id = b.id ORDER BY at DESC, seq DESC LIMIT 1)`;
      const extra =
        sort === 'last_p'
          ? `, ${latest('p')} AS last_p`
          : sort === 'attention'
            ? `, CASE WHEN status < 2 THEN ${CHECKIN_FN}(opened_at, ${latest('at')}, checkin_days, time_zone) END AS checkin`
            : '';
      const ordered = (limit: string) =>
        `WITH b AS (SELECT q.id, q.title, q.opened_at, q.closes_at, q.time_zone, q.base_rate, q.checkin_days, ${STATUS_SQL} AS status ${from}),
             c AS (SELECT b.*${extra} FROM b)
           SELECT id, status, count(*) OVER () AS matched${sort === 'attention' ? `, ${ATTENTION_SQL} AS attention` : ''}
           FROM c ORDER BY ${orderBy(sort, direction)} ${limit}`;
      const orders = keptOrdersOf(read);
      const queryKey = JSON.stringify([req.tag ?? null, text ?? null, req.status ?? null, sort, direction]);
      let page: { id: string; status: number }[];
      let matched: number;
      if (offset === 0) {
        // The first page: only it is read (the query may change at the next keystroke).
        orders.delete(queryKey);
        const first = read
          .prepare(ordered(req.limit !== undefined ? 'LIMIT @limit' : ''))
          .all({ ...params, ...(req.limit !== undefined ? { limit: req.limit } : {}) }) as { id: string; status: number; matched: number }[];
        page = first;
        matched = first[0]?.matched ?? 0;
      } else {
        const version = read.pragma('data_version', { simple: true }) as number;
        let kept = orders.get(queryKey);
        if (kept?.version !== version) {
          kept = { version, rows: read.prepare(ordered('')).all(params) as { id: string; status: number }[] };
          orders.delete(queryKey);
          if (orders.size >= ORDERS_KEPT) orders.delete(orders.keys().next().value!);
          orders.set(queryKey, kept);
        }
        page = kept.rows.slice(offset, req.limit !== undefined ? offset + req.limit : undefined);
        matched = kept.rows.length;
      }
      const byId = new Map(
        (
          read
            .prepare(
              `SELECT q.id, q.title, q.type, q.unit, q.value_kind, q.kind, q.opened_at, q.closes_at, q.time_zone, q.base_rate, q.checkin_days, r.outcome, r.option AS resolved_option, r.value AS resolved_value, f.p AS last_p, f.at AS last_at
               FROM questions q LEFT JOIN resolutions r ON r.question_id = q.id
               LEFT JOIN forecasts f ON f.seq = (SELECT seq FROM forecasts WHERE question_id = q.id ORDER BY at DESC, seq DESC LIMIT 1)
               WHERE q.id IN (SELECT value FROM json_each(?))`,
            )
            .all(JSON.stringify(page.map((r) => r.id))) as Omit<PageRow, 'status'>[]
        ).map((r) => [r.id, r]),
      );
      const rows: PageRow[] = page.map((r) => ({ ...byId.get(r.id)!, status: r.status }));
      const ids = rows.map((r) => r.id);
      const tags = qs.tagsOf(read, ids);
      const counts = qs.forecastCountsOf(read, ids);
      // Choice and numeric questions' options, levels and last values, for the page's.
      const typed = qs.summaryTypeRows(read, rows.filter((r) => r.type !== 'binary').map((r) => r.id));
      const questions = rows.map((r): QuestionSummary => {
        const extra = typed.get(r.id);
        const kind: ValueKind = r.value_kind ?? 'number';
        return {
          id: r.id,
          title: r.title,
          type: r.type,
          kind: r.kind,
          tags: tags.get(r.id) ?? [],
          opened_at: toIso(r.opened_at),
          closes_at: toIso(r.closes_at),
          time_zone: r.time_zone,
          base_rate: r.base_rate,
          last_p: r.last_p,
          options: r.type === 'choice' ? (extra?.options ?? []) : null,
          last_probs: r.type === 'choice' && extra?.last.length ? extra.last : null,
          unit: r.type === 'numeric' ? (r.unit ?? '') : null,
          value_kind: r.type === 'numeric' ? kind : null,
          levels: r.type === 'numeric' ? (extra?.levels ?? []) : null,
          last_quantiles: r.type === 'numeric' && extra?.last.length ? extra.last.map((x) => fromStoredValue(x, kind)) : null,
          last_forecast_at: r.last_at === null ? null : toIso(r.last_at),
          forecast_count: counts.get(r.id) ?? 0,
          status: QUESTION_STATUSES[r.status]!,
          outcome: r.outcome,
          resolved_option: r.type === 'choice' && r.outcome === 'option' ? r.resolved_option : null,
          resolved_value: r.type === 'numeric' && r.outcome === 'value' && r.resolved_value !== null ? fromStoredValue(r.resolved_value, kind) : null,
          stale: !r.outcome && ctx.stale(r, r.last_p !== null && r.last_at !== null ? { p: r.last_p, at: r.last_at } : null),
        };
      });
      const { tags: tagCounts, total } = diaryTotals(read);
      return { questions, tags: tagCounts, total, matched, offset, sort, direction };
    });
  } finally {
    holder.settings = null;
  }
}
