/**
 * The exports' byte buffer (shared/byte-text.ts): what it writes is the UTF-8 Node writes
 * for the same text, however the pieces arrive and however often the buffer has to grow.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { ByteText, utf8 } from '../../shared/byte-text';
import { toIso } from '../../shared/time';

const decoded = (bytes: Uint8Array) => Buffer.from(bytes).toString('utf8');

test('text, ascii, raw, iso and again write the UTF-8 of the same text, through the buffer growing', () => {
  // Four bytes to start with: every write below makes it grow.
  const out = new ByteText(4);
  const texts = ['', 'plain', 'é and ü', '日本語のメモ', '😀 outside the BMP', 'x'.repeat(200) + 'é', 'lone \ud800 surrogate', '\ufeffstarts with a BOM'];
  let expected = '';
  for (const text of texts) {
    out.text(text);
    expected += text;
  }
  out.ascii('0.30000000000000004');
  out.raw(utf8('“quoted” '.repeat(10)));
  out.iso(Date.UTC(2026, 11, 2, 15, 4, 5, 6));
  expected += `0.30000000000000004${'“quoted” '.repeat(10)}${toIso(Date.UTC(2026, 11, 2, 15, 4, 5, 6))}`;
  const start = out.written;
  out.text('a row, with “its” cells\r\n');
  const end = out.written;
  for (let i = 0; i < 50; i++) out.again(start, end);
  out.again(start, start + 3);
  expected += 'a row, with “its” cells\r\n'.repeat(51) + 'a r';
  assert.ok(Buffer.from(out.take()).equals(Buffer.from(expected, 'utf8')), 'the bytes Node writes for the same text');

  // After take() writing starts again from the beginning.
  out.text('next');
  assert.equal(out.written, 4);
  assert.equal(decoded(out.take()), 'next');
});
