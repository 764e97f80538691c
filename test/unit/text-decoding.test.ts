/**
 * Files as people have them (shared/text-decoding.ts): UTF-8 with or without a byte order
 * mark and UTF-16 with one read the same text, in chunks of any size; anything else is
 * refused at the line, column and byte offset of its first bad byte, never turned into U+FFFD.
 * Well-formed UTF-8 is Unicode §3.9 Table 3-7; the edges of each row are tested with their
 * one-byte neighbours, and the validator is compared with the platform's own TextDecoder.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { createTextDecoder, decodeText, firstInvalidUtf8, TextDecodingError } from '../../shared/text-decoding';

const TEXT = '{"note": "Zürich ≥ ½ 日本 🙂"}\r\nline two\n';

function utf16(text: string, order: 'le' | 'be', bom = true): Uint8Array {
  const units = [...(bom ? '\ufeff' : ''), ...text].join('');
  const out = new Uint8Array(units.length * 2);
  for (let i = 0; i < units.length; i++) {
    const u = units.charCodeAt(i);
    out[2 * i + (order === 'le' ? 0 : 1)] = u & 0xff;
    out[2 * i + (order === 'le' ? 1 : 0)] = u >> 8;
  }
  return out;
}

const utf8 = (text: string) => new TextEncoder().encode(text);
const bytes = (...parts: (string | number[])[]) => Uint8Array.from(parts.flatMap((p) => (typeof p === 'string' ? [...utf8(p)] : p)));

/** Decodes in chunks of `size` bytes. */
function chunked(data: Uint8Array, size: number): string {
  const d = createTextDecoder();
  let out = '';
  for (let i = 0; i < data.length; i += size) out += d.write(data.subarray(i, i + size));
  return out + d.end();
}

function refused(data: Uint8Array, size: number): TextDecodingError {
  try {
    chunked(data, size);
  } catch (err) {
    assert.ok(err instanceof TextDecodingError, `a TextDecodingError, got ${String(err)}`);
    return err;
  }
  assert.fail('the bytes were accepted');
}

test('UTF-8 with and without a byte order mark, UTF-16 LE and BE with one: the same text, in chunks of any size', () => {
  const files: [string, Uint8Array, string][] = [
    ['utf-8', utf8(TEXT), 'utf-8'],
    ['utf-8 + BOM', bytes([0xef, 0xbb, 0xbf], TEXT), 'utf-8'],
    ['utf-16le', utf16(TEXT, 'le'), 'utf-16le'],
    ['utf-16be', utf16(TEXT, 'be'), 'utf-16be'],
  ];
  for (const [name, data, encoding] of files) {
    for (const size of [1, 2, 3, 5, 7, data.length]) assert.equal(chunked(data, size), TEXT, `${name} in chunks of ${size}`);
    const d = createTextDecoder();
    d.write(data);
    assert.equal(d.encoding, encoding);
  }
  assert.equal(decodeText(new Uint8Array(0)), '', 'an empty file is empty text');
  assert.equal(decodeText(bytes([0xef, 0xbb, 0xbf])), '', 'a byte order mark alone is empty text');
  assert.equal(decodeText(utf8('{}')), '{}', 'a file shorter than the byte order mark check');
});

test('a Latin-1 file is refused at the line, column and byte offset of its first non-UTF-8 byte, with the fix', () => {
  // "Zürich" in Latin-1 (ü = 0xFC) on the third line, after two lines of UTF-8-compatible text.
  const data = bytes('title,closes_at\n', 'Caf', [0xc3, 0xa9], ' ok,2026\n', 'Z', [0xfc], 'rich,2026\n');
  for (const size of [1, 4, data.length]) {
    const err = refused(data, size);
    assert.equal(err.line, 3);
    assert.equal(err.column, 2);
    assert.equal(err.byte, 31);
    assert.equal(
      err.message,
      'This file is not UTF-8 text: at line 3, column 2 (byte offset 31) it holds the byte 0xFC, which UTF-8 does not allow there. It was probably saved in another encoding (such as Windows-1252 or Latin-1). Save the file as UTF-8 (in a spreadsheet: "CSV UTF-8") and try again.',
    );
  }
  // Columns count characters, not bytes: "é" and "🙂" are one each.
  const err = refused(bytes('é🙂x', [0xe9], 'y'), 2);
  assert.deepEqual([err.line, err.column, err.byte], [1, 4, 7]);
  // With a byte order mark, offsets still count from the file's first byte.
  assert.equal(refused(bytes([0xef, 0xbb, 0xbf], 'ab', [0x80]), 1).byte, 5);
});

test('a sequence split across chunks that turns out wrong is reported where it starts', () => {
  // E2 82 begins a three-byte character; "A" cannot finish it.
  const data = bytes('ab\ncd', [0xe2, 0x82], 'A');
  for (const size of [1, 2, 6, 7, data.length]) {
    const err = refused(data, size);
    assert.deepEqual([err.line, err.column, err.byte], [2, 3, 5], `chunks of ${size}`);
  }
});

test('a file cut off inside a character says so', () => {
  const err = refused(bytes('ok\n', [0xf0, 0x9f, 0x99]), 2);
  assert.deepEqual([err.line, err.column, err.byte], [2, 1, 3]);
  assert.match(err.message, /^This file is not UTF-8 text: it ends in the middle of a character, at line 2, column 1 \(byte offset 3\)/);
  const odd = refused(Uint8Array.of(...utf16('ab', 'le'), 0x41), 1);
  assert.match(odd.message, /UTF-16 \(little-endian\) but ends in the middle of a character, at line 1, column 3 \(byte offset 6\)/);
  assert.equal(refused(Uint8Array.of(...utf16('ab', 'be'), 0xd8, 0x3d), 3).byte, 6, 'a lone high surrogate at the end');
});

test('UTF-16 with an unpaired surrogate is refused at it', () => {
  // BOM, "a", "\n", "b", then a low surrogate with no high one before it.
  const le = Uint8Array.of(0xff, 0xfe, 0x61, 0, 0x0a, 0, 0x62, 0, 0x00, 0xdc, 0x63, 0);
  for (const size of [1, 3, le.length]) {
    const err = refused(le, size);
    assert.deepEqual([err.line, err.column, err.byte], [2, 2, 8]);
    assert.match(err.message, /UTF-16 \(little-endian\) but at line 2, column 2 \(byte offset 8\) holds half of a character pair/);
  }
  const be = Uint8Array.of(0xfe, 0xff, 0, 0x61, 0xd8, 0x3d, 0, 0x62);
  assert.equal(refused(be, 1).byte, 4, 'a high surrogate followed by a plain character');
});

test('UTF-32 and UTF-16 without a byte order mark are refused whole, with the fix', () => {
  assert.match(refused(Uint8Array.of(0xff, 0xfe, 0, 0, 0x7b, 0, 0, 0), 8).message, /^This file is UTF-32 text, which Forelog does not read\. Save the file as UTF-8/);
  assert.match(refused(Uint8Array.of(0, 0, 0xfe, 0xff, 0, 0, 0, 0x7b), 8).message, /^This file is UTF-32 text/);
  for (const order of ['le', 'be'] as const) {
    assert.match(refused(utf16('{"a":1}', order, false), 3).message, /^This file looks like UTF-16 text without a byte order mark/);
  }
});

test('UTF-8 validity follows Unicode Table 3-7 at every edge, and agrees with the platform decoder', () => {
  const valid = (b: number[]) => firstInvalidUtf8(Uint8Array.from(b), true) === -1;
  const edges: [number[], boolean][] = [
    [[0x7f], true],
    [[0x80], false],
    [[0xc1, 0xbf], false],
    [[0xc2, 0x80], true],
    [[0xdf, 0xbf], true],
    [[0xe0, 0x9f, 0xbf], false],
    [[0xe0, 0xa0, 0x80], true],
    [[0xec, 0xbf, 0xbf], true],
    [[0xed, 0x9f, 0xbf], true],
    [[0xed, 0xa0, 0x80], false],
    [[0xee, 0x80, 0x80], true],
    [[0xef, 0xbf, 0xbf], true],
    [[0xf0, 0x8f, 0xbf, 0xbf], false],
    [[0xf0, 0x90, 0x80, 0x80], true],
    [[0xf3, 0xbf, 0xbf, 0xbf], true],
    [[0xf4, 0x8f, 0xbf, 0xbf], true],
    [[0xf4, 0x90, 0x80, 0x80], false],
    [[0xf5, 0x80, 0x80, 0x80], false],
    [[0xc2, 0x7f], false],
    [[0xc2, 0xc0], false],
  ];
  for (const [b, ok] of edges) assert.equal(valid(b), ok, b.map((x) => x.toString(16)).join(' '));

  const strict = new TextDecoder('utf-8', { fatal: true });
  const platform = (b: Uint8Array) => {
    try {
      strict.decode(b);
      return true;
    } catch {
      return false;
    }
  };
  // Every two-byte pair, then random sequences biased towards high bytes.
  for (let a = 0; a < 256; a++) for (let b = 0; b < 256; b++) assert.equal(valid([a, b]), platform(Uint8Array.of(a, b)), `${a} ${b}`);
  let seed = 7;
  const next = () => (seed = (seed * 1103515245 + 12345) & 0x7fffffff);
  for (let n = 0; n < 20_000; n++) {
    const b = Uint8Array.from({ length: 1 + (next() % 6) }, () => (next() % 3 === 0 ? next() % 128 : 0x80 + (next() % 128)));
    assert.equal(firstInvalidUtf8(b, true) === -1, platform(b), [...b].join(' '));
  }
});
