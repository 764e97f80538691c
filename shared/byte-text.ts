/**
 * UTF-8 text built in a byte buffer, for the exports. An export writes millions of small
 * pieces (a time, a number, a comma); as strings each would be an object to concatenate,
 * flatten, collect and encode again before writing, which was most of an export's time.
 * Here each piece is written once, as the bytes that go to the file.
 */
const encoder = new TextEncoder();

/** Below this length a text is copied a character at a time: cheaper than calling the encoder. */
const SHORT_TEXT = 64;

/** Below this length bytes are copied one at a time: cheaper than a call to set() (measured). */
const SHORT_BYTES = 16;

/** `text`'s UTF-8 bytes, for a piece written many times (encode it once, copy it each time). */
export const utf8 = (text: string): Uint8Array => encoder.encode(text);

/** Copies `bytes` into `out` at `at` (which has the room); returns the position after them. */
export function copyInto(bytes: Uint8Array, out: Uint8Array, at: number): number {
  if (bytes.length > SHORT_BYTES) out.set(bytes, at);
  else for (let i = 0; i < bytes.length; i++) out[at + i] = bytes[i]!;
  return at + bytes.length;
}

/** Numbers' texts as bytes, by value: a diary's probabilities are a few hundred values written millions of times. */
const numberTexts = new Map<number, Uint8Array>();
const NUMBER_TEXTS_LIMIT = 10_000;

/** The bytes of String(x) (a finite number's JSON text too), each value's formatted once. */
export function numberBytes(x: number): Uint8Array {
  let bytes = numberTexts.get(x);
  if (bytes === undefined) {
    if (numberTexts.size >= NUMBER_TEXTS_LIMIT) numberTexts.clear();
    const text = String(x);
    bytes = new Uint8Array(text.length);
    for (let i = 0; i < text.length; i++) bytes[i] = text.charCodeAt(i);
    numberTexts.set(x, bytes);
  }
  return bytes;
}

export class ByteText {
  private bytes: Uint8Array;
  private length = 0;

  constructor(capacity = 1 << 20) {
    this.bytes = new Uint8Array(capacity);
  }

  /** Makes room for `n` more bytes. */
  private room(n: number): void {
    const need = this.length + n;
    if (need <= this.bytes.length) return;
    const bigger = new Uint8Array(Math.max(need, this.bytes.length * 2));
    bigger.set(this.bytes.subarray(0, this.length));
    this.bytes = bigger;
  }

  /** Any text, as UTF-8 (a lone surrogate becomes U+FFFD, as Node writes it). */
  text(s: string): void {
    this.room(s.length * 3);
    const out = this.bytes;
    if (s.length < SHORT_TEXT) {
      let at = this.length;
      let i = 0;
      for (; i < s.length; i++) {
        const c = s.charCodeAt(i);
        if (c >= 0x80) break;
        out[at++] = c;
      }
      this.length = at;
      if (i === s.length) return;
      s = s.slice(i);
    }
    this.length += encoder.encodeInto(s, out.subarray(this.length)).written;
  }

  /** Bytes encoded before (see utf8). */
  raw(b: Uint8Array): void {
    this.room(b.length);
    if (b.length > SHORT_BYTES) this.bytes.set(b, this.length);
    else {
      const out = this.bytes;
      const at = this.length;
      for (let i = 0; i < b.length; i++) out[at + i] = b[i]!;
    }
    this.length += b.length;
  }

  /** How many bytes are written since the last take(): where the next byte goes. */
  get written(): number {
    return this.length;
  }

  /**
   * For writing in place, where calls per piece cost more than the piece: the buffer, with
   * room for `n` more bytes from `written` on. Write them, then say where they end (`advance`).
   */
  reserve(n: number): Uint8Array {
    this.room(n);
    return this.bytes;
  }

  /** After writing in place into reserve()'s buffer: the bytes up to `end` are written. */
  advance(end: number): void {
    this.length = end;
  }

  /** Writes again the bytes written at [start, end) since the last take(): a row's text that repeats on the next rows. */
  again(start: number, end: number): void {
    const n = end - start;
    this.room(n);
    if (n > SHORT_BYTES) this.bytes.copyWithin(this.length, start, end);
    else {
      const out = this.bytes;
      const at = this.length;
      for (let i = 0; i < n; i++) out[at + i] = out[start + i]!;
    }
    this.length += n;
  }

  /**
   * The bytes written so far, and a fresh start. The bytes are a view of the buffer, which
   * the next writes reuse: use them (write them out, decode them) before writing more, or
   * copy them. One buffer for a whole export, not a new one per piece.
   */
  take(): Uint8Array {
    const done = this.bytes.subarray(0, this.length);
    this.length = 0;
    return done;
  }
}
