/**
 * Export with bounded memory: the diary streams out a batch of questions at a time, and the
 * bytes are exactly those of the whole-diary exporter it replaced — JSON is
 * `JSON.stringify(exportDiary, null, 2) + "\n"` (the API's exportDiary still builds the
 * object whole), CSV is what an independent RFC 4180 writer (Python's csv module) writes
 * for the same cells — on the example diary and on a random diary with every awkward shape.
 * The stream is one snapshot of the diary, and export → import → export is identical.
 */
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { after, test } from 'node:test';
import { openDiary } from '../../main/service/index';
import type { QuestionList } from '../../shared/contract';
import { buildDemoDiary } from '../../main/service/demo';
import { CSV_ALL_COLUMNS, CSV_COLUMNS } from '../../main/service/csv';
import { ISO_MAX_BYTES, toIso, writeIso } from '../../shared/time';
import { randomDiaryFile } from '../support/random-diary';
import { exportJson, openTestDiary, tempDir, type TestDiary } from '../support/temp-diary';
import { backupTo } from '../../main/service/backup';
import { callOrThrow } from '../../main/service/dispatch';

interface FileQuestionJson {
  id: string;
  title: string;
  rule: string;
  kind: string;
  tags: string[];
  opened_at: string;
  closes_at: string;
  time_zone: string;
  base_rate?: number;
  base_rate_note?: string;
  costs?: { false_alarm: number; miss: number };
  checkin_days?: number;
  forecasts: { at: string; p?: number; probs?: number[]; quantiles?: (number | string)[]; note: string; lenses?: { name: string; p: number; weight: number }[] }[];
  references: { at: string; p?: number; probs?: number[]; quantiles?: (number | string)[]; source: string }[];
  resolution: { outcome: string; at: string; note: string; option?: number; value?: number | string } | null;
  type?: 'choice' | 'numeric';
  options?: string[];
  ordered?: boolean;
  option_base_rates?: number[];
  unit?: string;
  value_kind?: string;
  levels?: number[];
}

/** A list cell: numbers (or dates) separated by spaces, each as String writes it (docs/csv-format.md). */
const spaced = (xs: readonly (number | string)[] | undefined) => (xs ? xs.map(String).join(' ') : '');

/** The CSV of the export object, written by Python's csv module (QUOTE_MINIMAL, CRLF), cells as docs/csv-format.md lays them out. */
function pythonCsv(questions: FileQuestionJson[]): string {
  // The type columns follow the others when some question is not yes/no.
  const columns: readonly string[] = questions.some((q) => q.type !== undefined) ? CSV_ALL_COLUMNS : CSV_COLUMNS;
  const rows: string[][] = [[...columns]];
  for (const q of questions) {
    const base: Record<string, string> = {
      question_id: q.id,
      title: q.title,
      rule: q.rule,
      kind: q.kind,
      tags: q.tags.join(' '),
      opened_at: q.opened_at,
      closes_at: q.closes_at,
      time_zone: q.time_zone,
      base_rate: q.base_rate === undefined ? '' : String(q.base_rate),
      base_rate_note: q.base_rate_note ?? '',
      false_alarm_cost: q.costs ? String(q.costs.false_alarm) : '',
      miss_cost: q.costs ? String(q.costs.miss) : '',
      checkin_days: q.checkin_days === undefined ? '' : String(q.checkin_days),
      outcome: q.resolution?.outcome ?? '',
      resolved_at: q.resolution?.at ?? '',
      resolution_note: q.resolution?.note ?? '',
      type: q.type ?? 'binary',
      options: q.options ? JSON.stringify(q.options) : '',
      ordered: q.ordered === undefined ? '' : String(q.ordered),
      option_base_rates: spaced(q.option_base_rates),
      unit: q.unit ?? '',
      value_kind: q.value_kind ?? '',
      levels: spaced(q.levels),
      outcome_option: q.resolution?.option === undefined ? '' : q.options![q.resolution.option]!,
      outcome_value: q.resolution?.value === undefined ? '' : String(q.resolution.value),
    };
    const value = (entry: { p?: number; probs?: number[]; quantiles?: (number | string)[] }, prefix: string) =>
      entry.p !== undefined ? { [`${prefix}p`]: String(entry.p) } : entry.probs ? { [`${prefix}probs`]: spaced(entry.probs) } : { [`${prefix}quantiles`]: spaced(entry.quantiles) };
    const lines: Record<string, string>[] = [
      ...q.forecasts.map((f) => ({ ...base, forecast_at: f.at, ...value(f, ''), note: f.note, lenses: f.lenses ? JSON.stringify(f.lenses) : '' })),
      ...q.references.map((r) => ({ ...base, reference_at: r.at, ...value(r, 'reference_'), reference_source: r.source })),
    ];
    if (lines.length === 0) lines.push(base);
    for (const cells of lines) rows.push(columns.map((c) => cells[c] ?? ''));
  }
  const script =
    'import csv, io, json, sys\n' +
    'out = io.TextIOWrapper(sys.stdout.buffer, encoding="utf-8", newline="")\n' +
    'csv.writer(out, lineterminator="\\r\\n").writerows(json.load(sys.stdin))\n' +
    'out.flush()';
  const r = spawnSync('/usr/bin/python3', ['-c', script], { input: JSON.stringify(rows), encoding: 'utf8', maxBuffer: 1 << 28 });
  assert.equal(r.status, 0, r.stderr);
  return r.stdout;
}

async function checkExports(d: TestDiary, label: string): Promise<void> {
  const whole = await d.call('exportDiary', {});
  const json = d.service.diary.exportText('json').text;
  assert.equal(json, `${JSON.stringify(whole, null, 2)}\n`, `${label}: JSON, byte for byte`);
  assert.equal(d.service.diary.exportText('csv').text, pythonCsv(whole.questions), `${label}: CSV, byte for byte`);
}

test('the streamed exports are byte-identical to the whole-diary JSON and to an independent CSV writer', async () => {
  const demo = openTestDiary();
  await demo.call('loadDemo', {});
  await checkExports(demo, 'example diary');

  // 1,234 questions: three export batches, with a third of them closing at the same instant,
  // so batch boundaries fall inside a tie broken by id.
  const random = openTestDiary();
  const file = randomDiaryFile(1234, 20261202);
  assert.equal((await random.call('importDiary', { diary: file })).added, 1234);
  await checkExports(random, 'random diary');

  const empty = openTestDiary();
  await checkExports(empty, 'empty diary');
});

test('export → import → export is identical, in JSON and in CSV', async () => {
  const source = openTestDiary();
  await source.call('importDiary', { diary: randomDiaryFile(700, 7) });
  await source.call('importDiary', { diary: buildDemoDiary(source.clock.now) });
  for (const format of ['json', 'csv'] as const) {
    const first = source.service.diary.exportText(format).text;
    const copy = openTestDiary();
    await copy.call('importText', { format, text: first });
    assert.equal(copy.service.diary.exportText(format).text, first, format);
  }
});

test('an export is one snapshot: a change committed while it streams is not half in the file', async () => {
  const d = openTestDiary();
  await d.call('importDiary', { diary: randomDiaryFile(1200, 11) });
  const before = d.service.diary.exportText('json').text;
  // Another connection to the same file (another process, or the app beside the command line).
  const other = openDiary({ dbPath: d.dbPath, now: () => d.clock.now, timeZone: 'UTC' });
  after(() => other.close());
  const ids = (other.diary.handlers.listQuestions({}) as QuestionList).questions.map((q) => q.id);
  const pieces: Uint8Array[] = [];
  d.service.diary.exportTo('json', (piece) => {
    if (pieces.length === 0) {
      // Between the first batch and the rest: a question that sorts last, a revision on one
      // already written and on one not yet written, and a question deleted from a later batch.
      const h = other.diary.handlers;
      h.createQuestion({ title: 'Added meanwhile', closes_at: '2199-01-01T00:00:00Z' } as never);
      h.addForecast({ question_id: ids[0]!, p: 0.9 } as never);
      h.addForecast({ question_id: ids[ids.length - 1]!, p: 0.1 } as never);
      h.deleteQuestion({ id: ids[ids.length - 2]! } as never);
    }
    pieces.push(Buffer.from(piece)); // a copy: the exporter reuses its buffer
  });
  assert.equal(Buffer.concat(pieces).toString('utf8'), before);
  assert.notEqual(d.service.diary.exportText('json').text, before, 'the changes are there for the next export');
});

test('the fast time formatters (toIso, and writeIso as bytes) write exactly what Date’s toISOString writes', () => {
  const bytes = new Uint8Array(ISO_MAX_BYTES + 1);
  const iso = (ms: number) => {
    const text = toIso(ms);
    // writeIso stops where the text does and leaves the byte after it alone.
    bytes.fill(0x23);
    const end = writeIso(ms, bytes, 1);
    assert.equal(Buffer.from(bytes.subarray(1, end)).toString('latin1'), text, `writeIso(${ms})`);
    assert.equal(bytes[0], 0x23);
    return text;
  };
  const DAY = 86_400_000;
  const edges = [0, -0, -1, 1, DAY - 1, DAY, -DAY, -DAY - 1, Date.UTC(1900, 0, 1), Date.UTC(2199, 11, 31, 23, 59, 59, 999), Date.UTC(2000, 1, 29, 12), Date.UTC(2024, 1, 29, 23, 59, 59, 999)];
  let seed = 3;
  const next = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
  const random = Array.from({ length: 20_000 }, () => Math.floor((next() - 0.3) * 7e12));
  // Sorted and shuffled: the formatter keeps the last day's date, so both orders matter.
  for (const ms of [...edges, ...random, ...[...random].sort((a, b) => a - b), 1.5, -0.5]) assert.equal(iso(ms), new Date(ms).toISOString(), String(ms));
  // More days than it remembers (it forgets them all at 100,000 and starts again).
  for (let d = -60_000; d < 60_000; d++) assert.equal(iso(d * DAY + 1234), new Date(d * DAY + 1234).toISOString(), String(d));
  // Years of six digits, the most room writeIso takes.
  for (const ms of [8.64e15, -8.64e15, 8.64e15 - 1, Date.UTC(10_000, 0, 1)]) assert.equal(iso(ms), new Date(ms).toISOString(), String(ms));
});

test('an export keeps each question’s revisions in time order even when SQLite finds them in another order', async () => {
  // The random file lists revisions out of time order, so entry order (seq) differs from time
  // order. Without the index on (question_id, at, seq) SQLite finds them in entry order, and
  // the export must notice and read them again in the file's order.
  const d = openTestDiary();
  await d.call('importDiary', { diary: randomDiaryFile(600, 17) });
  const before = { json: d.service.diary.exportText('json').text, csv: d.service.diary.exportText('csv').text };
  const other = new Database(d.dbPath);
  other.exec('DROP INDEX forecasts_question');
  other.close();
  assert.equal(d.service.diary.exportText('json').text, before.json, 'JSON');
  assert.equal(d.service.diary.exportText('csv').text, before.csv, 'CSV');
});

test('an export or a backup onto the diary itself, a link to it, or a file SQLite keeps beside it is refused and the diary stays whole', async () => {
  const d = openTestDiary();
  await d.call('createQuestion', { title: 'Kept', closes_at: '2027-01-01T00:00:00Z', first_forecast: { p: 0.3 } });
  const before = exportJson(d.service);
  const link = path.join(tempDir(), 'diary-link.json');
  fs.symlinkSync(d.dbPath, link);
  // The same file by another spelling: through ".." in the path.
  const roundabout = path.join(path.dirname(d.dbPath), '..', path.basename(path.dirname(d.dbPath)), path.basename(d.dbPath));
  for (const target of [d.dbPath, roundabout, link, `${d.dbPath}-wal`, `${d.dbPath}-shm`, `${d.dbPath}-journal`]) {
    for (const format of ['json', 'csv'] as const) {
      assert.throws(() => d.service.exportDiaryFile(target, format), /is the diary itself \(or a file SQLite keeps beside it\); export to another file name\. Nothing was written/, target);
    }
    await assert.rejects(backupTo(d.service.store, target), /cannot be the diary itself/, target);
  }
  assert.ok(fs.lstatSync(link).isSymbolicLink());
  assert.equal(exportJson(d.service), before);
  // Still a diary that opens, with its question.
  const again = openDiary({ dbPath: d.dbPath, timeZone: 'UTC' });
  try {
    assert.equal((await callOrThrow(again.dispatch, 'listQuestions', {}) as QuestionList).total, 1);
  } finally {
    again.close();
  }
});
