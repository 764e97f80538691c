/**
 * A diary file whose one value (a JSON record, a CSV field) is longer than JavaScript can
 * hold as one string: the import is refused with the place in the file and what is wrong,
 * not with JavaScript's bare "Invalid string length".
 *
 * The files are generators repeating one 1 Mi-character piece, so the test holds one copy
 * of it, however long the value it stands for.
 */
import assert from 'node:assert/strict';
import { constants } from 'node:buffer';
import { test } from 'node:test';
import { readCsvRecords } from '../../main/files/csv-records';
import { readCsvDiary } from '../../main/service/csv';
import { DiaryFileError, readDiaryText } from '../../shared/diary-file';
import { LONGEST_TEXT } from '../../shared/longest-text';

const PIECE = 'x'.repeat(1 << 20);
/** Just enough pieces to pass the limit. */
const PIECES = Math.floor(LONGEST_TEXT / PIECE.length) + 1;

function* file(head: string, tail: string, pieces = PIECES): Generator<string> {
  yield head;
  for (let k = 0; k < pieces; k++) yield PIECE;
  yield tail;
}

test('the limit is the longest string this JavaScript engine holds', () => {
  assert.equal(LONGEST_TEXT, constants.MAX_STRING_LENGTH);
});

test('a JSON diary file with a question too long to hold is refused at the line and column where it starts', () => {
  const head = '{"format": "forelog-diary", "version": 1,\n"questions": [\n  {"title": "Long", "closes_at": "2026-02-01T00:00:00Z", "forecasts": [{"at": "2026-01-01T00:00:00Z", "p": 0.5, "note": "';
  assert.throws(
    () => [...readDiaryText(file(head, '"}]}]}'))],
    (err: unknown) =>
      err instanceof DiaryFileError &&
      err.message ===
        "The file cannot be read at line 3, column 3: the value that starts here is longer than 536,870,888 characters, the most that can be read as one piece; a question's record (with all its revisions and notes) must fit in that. Nothing was imported.",
  );
});

test('a CSV field too long to hold is refused with its row, line and field, quoted or not', () => {
  const header = 'question_id,title,closes_at,forecast_at,p,note\r\nq1,Short,2026-02-01T00:00:00Z,2026-01-01T00:00:00Z,0.5,ok\r\n';
  const expected = (field: number) =>
    `The file cannot be read at row 3, line 3: field ${field} is longer than 536,870,888 characters, the most that can be read as one piece (no column holds nearly that much). Correct it and import again.`;
  assert.throws(() => [...readCsvRecords(file(`${header}q1,Short,2026-02-01T00:00:00Z,2026-01-01T00:00:00Z,0.5,"`, '"\r\n'))], { message: expected(6) });
  // Unquoted, through the diary reader: the same words, and that nothing was imported.
  assert.throws(() => [...readCsvDiary(file(`${header}q1,`, ',2026-02-01T00:00:00Z\r\n'))], { message: `${expected(2)} Nothing was imported.` });
});

test('a value just within the limit is read as before', () => {
  // One piece fewer than the limit allows, as a plain CSV field: read whole.
  const records = [...readCsvRecords(file('a,', ',b\n', PIECES - 1))];
  assert.equal(records.length, 1);
  assert.equal(records[0]!.fields[1]!.length, (PIECES - 1) * PIECE.length);
});
