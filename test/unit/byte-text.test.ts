/**
 * The exports' byte buffer (shared/byte-text.ts): what it writes is the UTF-8 Node writes
 * for the same text, however the pieces arrive and however often the buffer has to grow.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { ByteText, copyInto, numberBytes, utf8 } from '../../shared/byte-text';
import { ISO_MAX_BYTES, toIso, writeIso } from '../../shared/time';

const decoded = (bytes: Uint8Array) => Buffer.from(bytes).toString('utf8');

test('text, raw and again write the UTF-8 of the same text, through the buffer growing', () => {
  // Four bytes to start with: every write below makes it grow.
  const out = new ByteText(4);
  const texts = ['', 'plain', 'é and ü', '日本語のメモ', '😀 outside the BMP', 'x'.repeat(200) + 'é', 'lone \ud800 surrogate', '\ufeffstarts with a BOM'];
  let expected = '';
  for (const text of texts) {
    out.text(text);
    expected += text;
  }
  out.raw(utf8('“quoted” '.repeat(10)));
  out.raw(utf8('0.5'));
  expected += `${'“quoted” '.repeat(10)}0.5`;
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

test('numberBytes is String(x) as bytes, the first time and from its memory after', () => {
  const values = [0, -0, 1, 0.5, 0.7, 0.1 + 0.2, 1e-7, 1.5e-7, 1e21, 123456789012345680000, 5e-324, Number.MAX_VALUE, -0.25, 0.30000000000000004];
  for (let round = 0; round < 2; round++) {
    for (const x of values) assert.equal(Buffer.from(numberBytes(x)).toString('latin1'), String(x), `${x}, round ${round}`);
  }
});

test('writing in place: reserve gives room, copyInto and writeIso fill it, advance says where it ends', () => {
  const out = new ByteText(2);
  out.text('{');
  const buffer = out.reserve(100 + ISO_MAX_BYTES);
  // A piece longer than a loop is worth (copied with set) and a short one.
  let at = copyInto(utf8('"a longer piece": 1, '), buffer, out.written);
  at = copyInto(utf8('"p": '), buffer, at);
  at = copyInto(numberBytes(0.35), buffer, at);
  out.advance(writeIso(Date.UTC(2026, 11, 2, 15, 4, 5, 6), buffer, at));
  out.text('}');
  assert.equal(decoded(out.take()), `{"a longer piece": 1, "p": 0.35${toIso(Date.UTC(2026, 11, 2, 15, 4, 5, 6))}}`);
});
