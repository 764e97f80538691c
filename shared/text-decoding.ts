/**
 * Bytes of a text file, as people have them, into text: UTF-8 with or without a byte order
 * mark, or UTF-16 (little or big endian) recognised by its byte order mark. Anything else
 * is refused with the line, column and byte offset of the first byte that is not text in
 * that encoding, and a hint to save the file as UTF-8, instead of being read with U+FFFD
 * where the characters were (which would import silently corrupted notes).
 *
 * One decoder for every reader: the command line and the desktop app stream a file through
 * `createTextDecoder` chunk by chunk; the renderer decodes a picked file with `decodeText`.
 * Pure: only the standard TextDecoder, which Node and browsers both have.
 */

export type TextEncodingName = 'utf-8' | 'utf-16le' | 'utf-16be';

/** A file that is not text in an encoding Forelog reads; says where and what to do. */
export class TextDecodingError extends Error {
  constructor(
    message: string,
    /** 1-based line of the first bad byte (null when the whole file is refused). */
    readonly line: number | null,
    /** 1-based column, in characters, of the first bad byte on that line. */
    readonly column: number | null,
    /** 0-based byte offset of the first bad byte in the file. */
    readonly byte: number | null,
  ) {
    super(message);
    this.name = 'TextDecodingError';
  }
}

export interface TextChunkDecoder {
  /** Decodes the next bytes; returns the text they complete (possibly ''). Throws TextDecodingError. */
  write(bytes: Uint8Array): string;
  /** Ends the input and returns any text still held back. Throws when the file ends inside a character. */
  end(): string;
  /** The encoding, once the first bytes have decided it. */
  readonly encoding: TextEncodingName | null;
}

const SAVE_AS_UTF8 = 'Save the file as UTF-8 (in a spreadsheet: "CSV UTF-8") and try again.';

const hex = (b: number) => `0x${b.toString(16).toUpperCase().padStart(2, '0')}`;

/**
 * Where the first ill-formed UTF-8 sequence starts (Unicode §3.9, Table 3-7: no overlong
 * forms, no surrogates, nothing above U+10FFFF), or -1. An unfinished sequence at the end
 * counts only when `final`, since the next chunk may finish it.
 */
export function firstInvalidUtf8(bytes: Uint8Array, final: boolean): number {
  const n = bytes.length;
  let i = 0;
  while (i < n) {
    const b = bytes[i]!;
    if (b < 0x80) {
      i++;
      continue;
    }
    let need: number;
    let lo = 0x80;
    let hi = 0xbf;
    if (b >= 0xc2 && b <= 0xdf) need = 1;
    else if (b === 0xe0) [need, lo] = [2, 0xa0];
    else if (b === 0xed) [need, hi] = [2, 0x9f];
    else if (b >= 0xe1 && b <= 0xef) need = 2;
    else if (b === 0xf0) [need, lo] = [3, 0x90];
    else if (b >= 0xf1 && b <= 0xf3) need = 3;
    else if (b === 0xf4) [need, hi] = [3, 0x8f];
    else return i;
    for (let k = 1; k <= need; k++) {
      if (i + k >= n) return final ? i : -1;
      const c = bytes[i + k]!;
      if (k === 1 ? c < lo || c > hi : c < 0x80 || c > 0xbf) return i;
    }
    i += need + 1;
  }
  return -1;
}

/** Where the first unpaired surrogate (or, when `final`, a trailing odd byte) of UTF-16LE bytes is, or -1. */
function firstInvalidUtf16le(bytes: Uint8Array, final: boolean): number {
  const n = bytes.length;
  let i = 0;
  while (i + 1 < n) {
    const unit = bytes[i]! | (bytes[i + 1]! << 8);
    if (unit >= 0xdc00 && unit <= 0xdfff) return i;
    if (unit >= 0xd800 && unit <= 0xdbff) {
      if (i + 3 >= n) return final ? i : -1;
      const next = bytes[i + 2]! | (bytes[i + 3]! << 8);
      if (next < 0xdc00 || next > 0xdfff) return i;
      i += 4;
    } else i += 2;
  }
  return final && i < n ? i : -1;
}

/** How many bytes at the end of valid UTF-8 begin a character that is not finished yet. */
function unfinishedUtf8(tail: Uint8Array): number {
  for (let k = 1; k <= Math.min(3, tail.length); k++) {
    const b = tail[tail.length - k]!;
    if ((b & 0xc0) === 0x80) continue;
    const length = b >= 0xf0 ? 4 : b >= 0xe0 ? 3 : b >= 0xc0 ? 2 : 1;
    return length > k ? k : 0;
  }
  return 0;
}

function concat(a: Uint8Array, b: Uint8Array): Uint8Array {
  if (a.length === 0) return b;
  const out = new Uint8Array(a.length + b.length);
  out.set(a);
  out.set(b, a.length);
  return out;
}

/** The last `n` bytes of `a` followed by `b`, without copying `b` when it is long enough. */
function lastBytes(a: Uint8Array, b: Uint8Array, n: number): Uint8Array {
  return b.length >= n ? b.subarray(b.length - n) : concat(a, b).subarray(Math.max(0, a.length + b.length - n));
}

/** Counts lines and the column (in characters) as decoded text goes by, for error positions. */
class Position {
  line = 1;
  /** Characters since the last line break. */
  column = 0;

  advance(text: string): void {
    let last = -1;
    for (let at = text.indexOf('\n'); at !== -1; at = text.indexOf('\n', at + 1)) {
      this.line++;
      last = at;
    }
    let chars = 0;
    for (let i = last + 1; i < text.length; i++) {
      const c = text.charCodeAt(i);
      if (c < 0xdc00 || c > 0xdfff) chars++;
    }
    this.column = last === -1 ? this.column + chars : chars;
  }

  /** Line and 1-based column after `text`, leaving this position as it was. */
  after(text: string): { line: number; column: number } {
    const copy = new Position();
    copy.line = this.line;
    copy.column = this.column;
    copy.advance(text);
    return { line: copy.line, column: copy.column + 1 };
  }
}

/** The encoding a file's first bytes announce; throws for encodings Forelog does not read. */
function sniff(head: Uint8Array): { encoding: TextEncodingName; bom: number } {
  const [b0, b1, b2, b3] = head;
  if ((b0 === 0xff && b1 === 0xfe && b2 === 0 && b3 === 0) || (b0 === 0 && b1 === 0 && b2 === 0xfe && b3 === 0xff)) {
    throw new TextDecodingError(`This file is UTF-32 text, which Forelog does not read. ${SAVE_AS_UTF8}`, null, null, null);
  }
  if (b0 === 0xef && b1 === 0xbb && b2 === 0xbf) return { encoding: 'utf-8', bom: 3 };
  if (b0 === 0xff && b1 === 0xfe) return { encoding: 'utf-16le', bom: 2 };
  if (b0 === 0xfe && b1 === 0xff) return { encoding: 'utf-16be', bom: 2 };
  // Neither JSON nor CSV text ever holds a NUL byte; NULs in every other byte mean UTF-16
  // written without the byte order mark that would say which byte order it uses.
  if (head.length >= 4 && ((b0 !== 0 && b1 === 0 && b2 !== 0 && b3 === 0) || (b0 === 0 && b1 !== 0 && b2 === 0 && b3 !== 0))) {
    throw new TextDecodingError(
      `This file looks like UTF-16 text without a byte order mark, so its byte order is unknown. ${SAVE_AS_UTF8}`,
      null,
      null,
      null,
    );
  }
  return { encoding: 'utf-8', bom: 0 };
}

/** A decoder for one file's bytes, given in order, in chunks of any size. */
export function createTextDecoder(): TextChunkDecoder {
  let head: Uint8Array | null = new Uint8Array(0);
  let encoding: TextEncodingName | null = null;
  let inner: { decode(input?: Uint8Array, options?: { stream?: boolean }): string } | null = null;
  /** Bytes of the file whose characters have been returned (the BOM included). */
  let consumed = 0;
  /** Bytes given to `inner` that it holds back: an unfinished character (UTF-16: little-endian order). */
  let pending: Uint8Array = new Uint8Array(0);
  /** UTF-16BE: an odd byte waiting for its partner before the pair is swapped. */
  let oddByte: number | null = null;
  const position = new Position();

  function fail(region: Uint8Array, final: boolean): never {
    const utf8 = encoding === 'utf-8';
    let bad = utf8 ? firstInvalidUtf8(region, final) : firstInvalidUtf16le(region, final);
    if (bad < 0) bad = 0;
    const before = new TextDecoder(utf8 ? 'utf-8' : 'utf-16le', { ignoreBOM: true }).decode(region.subarray(0, bad));
    const { line, column } = position.after(before);
    const byte = consumed + bad;
    const where = `line ${line}, column ${column} (byte offset ${byte})`;
    // At the end, a sequence that is only unfinished (not wrong) means the file was cut off.
    const rest = region.subarray(bad);
    const unfinished = final && (utf8 ? firstInvalidUtf8(rest, false) : firstInvalidUtf16le(rest, false)) === -1;
    let message: string;
    if (utf8) {
      message = unfinished
        ? `This file is not UTF-8 text: it ends in the middle of a character, at ${where}. It may have been cut off, or saved in another encoding. ${SAVE_AS_UTF8}`
        : `This file is not UTF-8 text: at ${where} it holds the byte ${hex(region[bad]!)}, which UTF-8 does not allow there. It was probably saved in another encoding (such as Windows-1252 or Latin-1). ${SAVE_AS_UTF8}`;
    } else {
      const order = encoding === 'utf-16be' ? 'big-endian' : 'little-endian';
      message = unfinished
        ? `This file starts with the byte order mark of UTF-16 (${order}) but ends in the middle of a character, at ${where}. ${SAVE_AS_UTF8}`
        : `This file starts with the byte order mark of UTF-16 (${order}) but at ${where} holds half of a character pair (an unpaired surrogate), which is not text. ${SAVE_AS_UTF8}`;
    }
    throw new TextDecodingError(message, line, column, byte);
  }

  /** Feeds bytes (UTF-16: already in little-endian order) to the inner decoder. */
  function feed(bytes: Uint8Array, final: boolean): string {
    const region = concat(pending, bytes);
    const text = inner!.decode(bytes, { stream: !final });
    // The inner decoder replaces what is not text with U+FFFD (its fast path; a strict one is
    // several times slower). Only then are the bytes checked: U+FFFD may also be in the file.
    if (text.indexOf('\uFFFD') !== -1 && (encoding === 'utf-8' ? firstInvalidUtf8(region, final) : firstInvalidUtf16le(region, final)) !== -1) {
      fail(region, final);
    }
    let held = 0;
    if (!final) {
      if (encoding === 'utf-8') held = unfinishedUtf8(lastBytes(pending, bytes, 3));
      else held = region.length - text.length * 2;
    }
    consumed += region.length - held;
    pending = held ? region.slice(region.length - held) : new Uint8Array(0);
    position.advance(text);
    return text;
  }

  function start(bytes: Uint8Array, final: boolean): string {
    // A copy: the caller may reuse its buffer for the next chunk while these wait.
    head = head!.length ? concat(head!, bytes) : bytes.slice();
    if (head.length < 4 && !final) return '';
    const found = sniff(head);
    encoding = found.encoding;
    inner = new TextDecoder(encoding === 'utf-8' ? 'utf-8' : 'utf-16le', { ignoreBOM: true });
    consumed = found.bom;
    const rest = head.subarray(found.bom);
    head = null;
    return write(rest, final);
  }

  function write(bytes: Uint8Array, final = false): string {
    if (head !== null) return start(bytes, final);
    if (encoding !== 'utf-16be') return feed(bytes, final);
    // Big-endian pairs are swapped into little-endian ones, an odd byte waiting for its partner.
    const all = oddByte === null ? bytes : concat(Uint8Array.of(oddByte), bytes);
    const even = all.length - (all.length % 2);
    oddByte = even < all.length ? all[even]! : null;
    const swapped = new Uint8Array(even);
    for (let i = 0; i < even; i += 2) {
      swapped[i] = all[i + 1]!;
      swapped[i + 1] = all[i]!;
    }
    if (final && oddByte !== null) {
      const text = feed(swapped, false);
      pending = concat(pending, Uint8Array.of(oddByte));
      return text + fail(pending, true);
    }
    return feed(swapped, final);
  }

  return {
    write: (bytes) => write(bytes, false),
    end: () => write(new Uint8Array(0), true),
    get encoding() {
      return encoding;
    },
  };
}

/** Decodes a whole file's bytes (UTF-8, or UTF-16 with a byte order mark). Throws TextDecodingError. */
export function decodeText(bytes: Uint8Array): string {
  const decoder = createTextDecoder();
  return decoder.write(bytes) + decoder.end();
}
