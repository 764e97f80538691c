/**
 * The least any `score --json` over this storage could cost, for the benchmark to print
 * beside the real one: start Node, load better-sqlite3, open the diary read-only and pass
 * every yes/no revision's numbers (question, time, probability, entry order) to JavaScript
 * once, as main/service/scoring-source.ts reads them, plus the questions' own row.
 * No validation, no scoring, no output: what is left above this in `score --json` is
 * Forelog's own code.
 *
 * Run: node test/bench/reading-floor.cjs DIARY.sqlite   (prints the revision count)
 */
'use strict';
const Database = require('better-sqlite3');

const db = new Database(process.argv[2], { readonly: true, fileMustExist: true });
let revisions = 0;
let sum = 0;
// Four named parameters: better-sqlite3 takes the function's arity from them. The sum keeps
// each value used, as the real reader stores it.
db.function('floor_take', { directOnly: true }, (rowid, at, p, seq) => {
  revisions++;
  sum += rowid + at + p + seq;
  return null;
});
db.prepare(
  `SELECT count(floor_take(q.rowid, f.at, f.p, f.seq)) FROM questions q CROSS JOIN forecasts f ON f.question_id = q.id WHERE q.type = 'binary'`,
)
  .pluck()
  .get();
const questions = db
  .prepare(
    `SELECT q.rowid, q.id, q.title, q.kind, q.closes_at, q.base_rate, q.false_alarm_cost, q.miss_cost, r.outcome, r.at
     FROM questions q LEFT JOIN resolutions r ON r.question_id = q.id WHERE q.type = 'binary'`,
  )
  .raw()
  .all();
db.close();
process.stdout.write(`${questions.length} questions, ${revisions} revisions (checksum ${sum})\n`);
