/**
 * The CSV record reader (main/files/csv-records.ts) reads a row with no quote and no
 * carriage return in one piece. Whatever the text and however it is cut into chunks, it
 * must read the same records, rows and lines — or refuse with the same words — as when it
 * goes field by field (one character per chunk never holds a whole row).
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import fc from 'fast-check';
import { readCsvRecords } from '../../main/files/csv-records';

function read(chunks: string[]): unknown {
  try {
    return [...readCsvRecords(chunks)];
  } catch (err) {
    return { error: (err as Error).message };
  }
}

const text = fc.array(fc.constantFrom('a', 'bc', ',', ',', '"', '""', '\n', '\n', '\r', '\r\n', 'é', ' '), { maxLength: 40 }).map((parts) => parts.join(''));

test('rows read in one piece come out as field by field, in any chunks', () => {
  fc.assert(
    fc.property(text, fc.array(fc.integer({ min: 1, max: 9 }), { minLength: 1, maxLength: 8 }), (csv, sizes) => {
      const byChar = read([...csv]);
      assert.deepEqual(read([csv]), byChar);
      const chunks: string[] = [];
      for (let at = 0, k = 0; at < csv.length; k++) {
        const size = sizes[k % sizes.length]!;
        chunks.push(csv.slice(at, at + size));
        at += size;
      }
      assert.deepEqual(read(chunks), byChar);
    }),
    { seed: 20261202, numRuns: 5000 },
  );
});

test('plain rows, with LF or CRLF ends, an empty row and a last row without a line break', () => {
  assert.deepEqual(read(['a,b,\r\n\nc,"d,e"\nf']), [
    { fields: ['a', 'b', ''], row: 1, line: 1 },
    { fields: [''], row: 2, line: 2 },
    { fields: ['c', 'd,e'], row: 3, line: 3 },
    { fields: ['f'], row: 4, line: 4 },
  ]);
});
