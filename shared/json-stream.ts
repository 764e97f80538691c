/**
 * A JSON object read member by member from text that arrives in chunks, with one member —
 * a long array — handed over element by element. A file of any size is read in the memory
 * of its largest element: the diary file's `questions` list is never built whole.
 *
 * The scanner here only finds where each value's text ends (strings with their escapes,
 * brackets, nesting depth); `JSON.parse` then builds the value from that text, so numbers
 * (bit-exact doubles), strings and escapes read exactly as JSON.parse reads them, and the
 * grammar inside a value is JSON.parse's. Nesting is bounded before anything is parsed, so
 * a file nested thousands of levels deep is refused with its position, not a stack overflow.
 */
import { BACKSLASH, CLOSE_BRACE, CLOSE_BRACKET, COLON, COMMA, OPEN_BRACE, OPEN_BRACKET, QUOTE } from './json-codes';
import { duplicateMember, memberCount } from './json-duplicates';
import { LONGEST_TEXT } from './longest-text';

/** Why the text could not be read; `line` and `column` (1-based) say where. */
export class JsonStreamError extends Error {
  constructor(
    message: string,
    readonly kind: 'syntax' | 'depth' | 'not-object' | 'duplicate' | 'too-long',
    readonly line: number,
    readonly column: number,
  ) {
    super(message);
    this.name = 'JsonStreamError';
  }
}

export type ObjectPart =
  /** A member other than the streamed one, built whole. */
  | { kind: 'member'; key: string; value: unknown }
  /** The streamed member's array begins (its elements follow). */
  | { kind: 'array'; key: string }
  /** An element of the streamed array; `line` is where its text starts. */
  | { kind: 'element'; key: string; index: number; value: unknown; line: number };

export interface ObjectStreamOptions {
  /** The member whose array value is handed over element by element. */
  streamed: string;
  /** The deepest nesting accepted, counting the outer object as 1. */
  maxDepth: number;
}

const END = -1;

const isSpace = (c: number) => c === 0x20 || c === 0x0a || c === 0x0d || c === 0x09;

/** Line and column just after `text`, starting from `line`/`column` (column 0-based). */
function advance(line: number, column: number, text: string, length = text.length): { line: number; column: number } {
  let last = -1;
  for (let at = text.indexOf('\n'); at !== -1 && at < length; at = text.indexOf('\n', at + 1)) {
    line++;
    last = at;
  }
  return { line, column: last === -1 ? column + length : length - last - 1 };
}

function describeChar(c: number): string {
  if (c === END) return 'the end of the file';
  // An invisible character (NUL, a control, a byte order mark in the middle) is named by its
  // code point: written as itself it would show as nothing, or end the message in a terminal.
  if (c < 0x20 || (c >= 0x7f && c <= 0xa0) || c === 0xfeff || (c >= 0xd800 && c <= 0xdfff)) return `the character U+${c.toString(16).toUpperCase().padStart(4, '0')}`;
  return `"${String.fromCharCode(c)}"`;
}

class Scanner {
  private buf = '';
  private pos = 0;
  /** Position of buf[0]: 1-based line, 0-based column. */
  private line = 1;
  private column = 0;
  /** The line on which the last value read starts. */
  valueLine = 1;
  /** The closing brackets a value being read still needs (reused from value to value). */
  private readonly closers: number[] = [];

  constructor(
    private readonly source: Iterator<string>,
    private readonly maxDepth: number,
  ) {}

  /** Forgets buf[0..n), which has been read, keeping the position of what follows. */
  private drop(n: number): void {
    if (n === 0) return;
    ({ line: this.line, column: this.column } = advance(this.line, this.column, this.buf, n));
    this.buf = this.buf.slice(n);
    this.pos -= n;
  }

  /** Appends the next non-empty chunk; false at the end of the input. */
  private pull(): boolean {
    for (;;) {
      const next = this.source.next();
      if (next.done) return false;
      if (next.value.length) {
        this.buf += next.value;
        return true;
      }
    }
  }

  /** Line and 1-based column of buf[at]. */
  where(at = this.pos): { line: number; column: number } {
    const p = advance(this.line, this.column, this.buf, at);
    return { line: p.line, column: p.column + 1 };
  }

  error(kind: JsonStreamError['kind'], reason: string, at = this.pos): JsonStreamError {
    const { line, column } = this.where(at);
    return new JsonStreamError(`line ${line}, column ${column}: ${reason}`, kind, line, column);
  }

  /** The next character that is not white space (not consumed), or END. */
  peek(): number {
    for (;;) {
      while (this.pos < this.buf.length) {
        const c = this.buf.charCodeAt(this.pos);
        if (!isSpace(c)) return c;
        this.pos++;
      }
      this.drop(this.pos);
      if (!this.pull()) return END;
    }
  }

  /** Consumes `expected` (after white space) or throws naming what was found instead. */
  expect(expected: number, what: string): void {
    const c = this.peek();
    if (c !== expected) throw this.error('syntax', `expected ${what} but found ${describeChar(c)}`);
    this.pos++;
  }

  /**
   * Reads the value that starts at the next non-space character and builds it with
   * JSON.parse. `depth` is the nesting of the container holding it.
   */
  value(depth: number): unknown {
    if (this.peek() === END) throw this.error('syntax', 'the file ends where a value should be');
    this.drop(this.pos);
    const startLine = (this.valueLine = this.line);
    const startColumn = this.column;
    // Text of the value from earlier chunks, when it spans more than one, and its length.
    let pieces: string[] | null = null;
    let held = 0;
    const tooLong = () =>
      new JsonStreamError(
        `line ${startLine}, column ${startColumn + 1}: the value that starts here is longer than ${LONGEST_TEXT.toLocaleString('en-GB')} characters, the most that can be read as one piece`,
        'too-long',
        startLine,
        startColumn + 1,
      );
    const closers = this.closers;
    closers.length = 0;
    const first = this.buf.charCodeAt(0);
    const scalar = first !== QUOTE && first !== OPEN_BRACE && first !== OPEN_BRACKET;
    let inString = false;
    // Members written, one ":" outside strings each: JSON.parse keeps one of two with the same name.
    let colons = 0;
    let i = 0;
    for (;;) {
      if (i >= this.buf.length) {
        // The value goes on in the next chunk: keep what was read and go on there. An
        // escape's backslash at the very end carries over as i = length + 1.
        const length = this.buf.length;
        held += length;
        if (held > LONGEST_TEXT) throw tooLong();
        (pieces ??= []).push(this.buf);
        this.drop(length);
        if (!this.pull()) {
          if (scalar) {
            i = 0;
            break;
          }
          throw this.error('syntax', inString ? 'the file ends inside a text value (a closing " is missing)' : 'the file ends before this value is closed');
        }
        i -= length;
        continue;
      }
      const c = this.buf.charCodeAt(i);
      if (inString) {
        if (c === BACKSLASH) i += 2;
        else {
          i++;
          if (c === QUOTE) {
            inString = false;
            if (closers.length === 0) break;
          }
        }
      } else if (scalar) {
        if (c === COMMA || c === CLOSE_BRACE || c === CLOSE_BRACKET || isSpace(c)) break;
        i++;
      } else if (c === QUOTE) {
        inString = true;
        i++;
      } else if (c === OPEN_BRACE || c === OPEN_BRACKET) {
        closers.push(c === OPEN_BRACE ? CLOSE_BRACE : CLOSE_BRACKET);
        if (depth + closers.length > this.maxDepth) {
          throw this.error('depth', `the data is nested more than ${this.maxDepth} levels deep here`, i);
        }
        i++;
      } else if (c === CLOSE_BRACE || c === CLOSE_BRACKET) {
        const wanted = closers.pop();
        if (wanted !== c) {
          throw this.error('syntax', `found "${String.fromCharCode(c)}" where ${wanted === undefined ? 'no bracket is open' : `"${String.fromCharCode(wanted)}" should close the open bracket`}`, i);
        }
        i++;
        if (closers.length === 0) break;
      } else {
        if (c === COLON) colons++;
        i++;
      }
    }
    if (held + i > LONGEST_TEXT) throw tooLong();
    const text = pieces ? pieces.join('') + this.buf.slice(0, i) : this.buf.slice(0, i);
    this.pos = i;
    let value: unknown;
    try {
      value = JSON.parse(text);
    } catch (err) {
      throw this.parseError(err as Error, text, startLine, startColumn);
    }
    if (colons > 0 && memberCount(value) !== colons) {
      const twice = duplicateMember(text);
      if (twice) {
        const p = advance(startLine, startColumn, text, twice.offset);
        throw new JsonStreamError(`line ${p.line}, column ${p.column + 1}: the member "${twice.key}" appears a second time in its object; keep one of them`, 'duplicate', p.line, p.column + 1);
      }
    }
    return value;
  }

  /** JSON.parse's complaint, at the line and column of the file it refers to. */
  private parseError(err: Error, text: string, line: number, column: number): JsonStreamError {
    const at = /^(.*) in JSON at position (\d+)/s.exec(err.message);
    const token = /^Unexpected token '(.+)', .* is not valid JSON$/s.exec(err.message);
    const offset = at ? Math.min(Number(at[2]), text.length) : 0;
    const p = advance(line, column, text, offset);
    const reason = at
      ? at[1]!.charAt(0).toLowerCase() + at[1]!.slice(1)
      : token
        ? `unexpected "${token[1]}" in the value that starts here`
        : `${err.message} (in the value that starts here)`;
    return new JsonStreamError(`line ${p.line}, column ${p.column + 1}: ${reason}`, 'syntax', p.line, p.column + 1);
  }

  /** A member name: a JSON string. */
  key(): string {
    if (this.peek() !== QUOTE) throw this.error('syntax', `expected a member name in double quotes but found ${describeChar(this.peek())}`);
    return this.value(1) as string;
  }

  consume(): void {
    this.pos++;
  }
}

/** Reads `{ … }` from `chunks`; see ObjectPart for what comes out, in file order. */
export function* readObjectStream(chunks: Iterable<string>, options: ObjectStreamOptions): Generator<ObjectPart> {
  const source = chunks[Symbol.iterator]();
  try {
    const s = new Scanner(source, options.maxDepth);
    const first = s.peek();
    if (first !== OPEN_BRACE) {
      throw s.error('not-object', first === END ? 'the file is empty' : `expected a JSON object ("{") but found ${describeChar(first)}`);
    }
    s.consume();
    const seen = new Set<string>();
    if (s.peek() === CLOSE_BRACE) s.consume();
    else {
      for (;;) {
        s.peek();
        const at = s.where();
        const key = s.key();
        if (seen.has(key)) {
          throw new JsonStreamError(`line ${at.line}, column ${at.column}: the member "${key}" appears a second time; keep one of them`, 'duplicate', at.line, at.column);
        }
        seen.add(key);
        s.expect(COLON, '":" after the member name');
        if (key === options.streamed && s.peek() === OPEN_BRACKET) {
          s.consume();
          yield { kind: 'array', key };
          if (s.peek() === CLOSE_BRACKET) s.consume();
          else {
            for (let index = 0; ; index++) {
              const value = s.value(2);
              yield { kind: 'element', key, index, value, line: s.valueLine };
              const next = s.peek();
              if (next === CLOSE_BRACKET) {
                s.consume();
                break;
              }
              if (next !== COMMA) throw s.error('syntax', `expected "," or "]" after element ${index} of "${key}" but found ${describeChar(next)}`);
              s.consume();
              if (s.peek() === CLOSE_BRACKET) throw s.error('syntax', `expected element ${index + 1} of "${key}" after "," but found "]"`);
            }
          }
        } else yield { kind: 'member', key, value: s.value(1) };
        const next = s.peek();
        if (next === CLOSE_BRACE) {
          s.consume();
          break;
        }
        if (next !== COMMA) throw s.error('syntax', `expected "," or "}" after the member "${key}" but found ${describeChar(next)}`);
        s.consume();
      }
    }
    const after = s.peek();
    if (after !== END) throw s.error('syntax', `expected the end of the file after the closing "}" but found ${describeChar(after)}`);
  } finally {
    source.return?.();
  }
}
