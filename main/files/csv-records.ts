/**
 * CSV records (RFC 4180 §2) from text that arrives in chunks, so a file of any size is read
 * in the memory of one record. Fields are separated by commas; a field that starts with a
 * double quote runs to the next lone double quote and may hold commas, line breaks and
 * doubled double quotes (`""` reads as `"`); records end at CRLF, LF or a lone CR. Blank
 * lines come out as records with one empty field, so row numbers stay those a
 * spreadsheet shows. A double quote anywhere else is an error with its row and line.
 */
import { LONGEST_TEXT } from '../../shared/longest-text';

/** Text that is not CSV; `row` counts records from 1 (the header), `line` physical lines from 1. */
export class CsvSyntaxError extends Error {
  constructor(
    message: string,
    readonly row: number,
    readonly line: number,
  ) {
    super(message);
    this.name = 'CsvSyntaxError';
  }
}

export interface CsvRecord {
  fields: string[];
  /** 1-based record number: the header is row 1. */
  row: number;
  /** The physical line the record starts on. */
  line: number;
}

const QUOTE = 0x22;
const COMMA = 0x2c;
const CR = 0x0d;
const LF = 0x0a;

const enum State {
  /** At the start of a field. */
  Start,
  /** Inside a field that did not start with a quote. */
  Plain,
  /** Inside a quoted field. */
  Quoted,
  /** Just after a quote inside a quoted field: a doubled quote, or the field's end. */
  Quote,
}

/** Line breaks in text[from, to): LF, CRLF and lone CR each count once. */
function lineBreaks(text: string, from: number, to: number): number {
  let n = 0;
  for (let i = from; i < to; i++) {
    const c = text.charCodeAt(i);
    if (c === LF || (c === CR && text.charCodeAt(i + 1) !== LF)) n++;
  }
  return n;
}

/** Where `search` next occurs in `text` from `from`, or text.length when it does not. */
function nextIndex(text: string, search: string, from: number): number {
  const at = text.indexOf(search, from);
  return at === -1 ? text.length : at;
}

const SHOWN = 20;
/** A bit of the file as the message shows it: the last characters read, quoted as they are. */
const shown = (text: string) => `"${text.length > SHOWN ? `…${text.slice(-SHOWN)}` : text}"`;

/** The records of the CSV text in `chunks`, in order. Throws CsvSyntaxError. */
export function* readCsvRecords(chunks: Iterable<string>): Generator<CsvRecord> {
  let fields: string[] = [];
  /** The current field's text read so far in earlier chunks (or before a doubled quote). */
  let carry = '';
  let state = State.Start;
  let row = 1;
  let line = 1;
  let rowLine = 1;
  let quoteLine = 1;
  /** The last chunk ended with a CR that ended a record: a LF opening the next one belongs to it. */
  let skipLf = false;
  /** The last chunk ended inside a quoted field with a CR, counted as a line break. */
  let quotedCr = false;
  /** Adds `piece` to the field being read; a field too long to hold as one string is refused by its place. */
  const gather = (piece: string): void => {
    if (carry.length + piece.length > LONGEST_TEXT) {
      throw new CsvSyntaxError(
        `The file cannot be read at row ${row}, line ${rowLine}: field ${fields.length + 1} is longer than ${LONGEST_TEXT.toLocaleString('en-GB')} characters, the most that can be read as one piece (no column holds nearly that much). Correct it and import again.`,
        row,
        rowLine,
      );
    }
    carry += piece;
  };

  for (const text of chunks) {
    const n = text.length;
    let i = 0;
    if (skipLf && n > 0) {
      if (text.charCodeAt(0) === LF) i = 1;
      skipLf = false;
    }
    let from = i;
    // Where the next double quote and carriage return are in this chunk (n: none), found
    // once and moved on only when passed: a row with neither is read in one piece.
    let nextQuote = -1;
    let nextCr = -1;
    while (i < n) {
      if (state === State.Start && fields.length === 0 && carry === '') {
        // A whole row in this chunk with no quote and no line break but its own LF (or
        // CRLF): nothing to unquote, so split at the commas natively. Export writes nearly
        // every row so, and reading field by field here was most of a CSV import's reading.
        const lf = text.indexOf('\n', i);
        if (lf !== -1) {
          if (nextQuote < i) nextQuote = nextIndex(text, '"', i);
          if (nextCr < i) nextCr = nextIndex(text, '\r', i);
          if (nextQuote > lf && nextCr >= lf - 1) {
            const record = text.slice(i, nextCr === lf - 1 ? lf - 1 : lf).split(',');
            i = from = lf + 1;
            yield { fields: record, row, line: rowLine };
            row++;
            line++;
            rowLine = line;
            continue;
          }
        }
      }
      if (state === State.Quoted) {
        const q = text.indexOf('"', i);
        const end = q === -1 ? n : q;
        line += lineBreaks(text, i, end);
        // A CRLF inside a quoted field, cut between two chunks, is one line break, not two.
        if (quotedCr && i === 0 && end > 0 && text.charCodeAt(0) === LF) line--;
        quotedCr = end === n && n > i && text.charCodeAt(n - 1) === CR;
        gather(text.slice(from, end));
        if (q === -1) {
          i = n;
          break;
        }
        state = State.Quote;
        i = from = q + 1;
        continue;
      }
      if (state === State.Quote) {
        const c = text.charCodeAt(i);
        if (c === QUOTE) {
          gather('"');
          state = State.Quoted;
          i = from = i + 1;
          continue;
        }
        if (c !== COMMA && c !== CR && c !== LF) {
          throw new CsvSyntaxError(
            `The file is not valid CSV at row ${row}, line ${line}: in a quoted field, the double quote before ${shown(text.charAt(i))} ends the field early (a comma or the end of the line should follow it). A double quote inside a quoted field must be written twice (""); correct it and import again.`,
            row,
            line,
          );
        }
        // The quote closed the field; the comma or line break is read below.
        state = State.Plain;
        from = i;
      } else if (state === State.Start && text.charCodeAt(i) === QUOTE) {
        state = State.Quoted;
        quoteLine = line;
        i = from = i + 1;
        continue;
      }
      // A plain field (or the end of a quoted one): up to the next comma or line break.
      let j = i;
      let c = 0;
      while (j < n) {
        c = text.charCodeAt(j);
        if (c === COMMA || c === CR || c === LF || c === QUOTE) break;
        j++;
      }
      if (j === n) {
        gather(text.slice(from, n));
        state = State.Plain;
        i = n;
        break;
      }
      if (c === QUOTE) {
        throw new CsvSyntaxError(
          `The file is not valid CSV at row ${row}, line ${line}: field ${fields.length + 1} (${shown(carry + text.slice(from, j + 1))}) holds a double quote but does not start with one. A field holding commas, double quotes or line breaks must be enclosed in double quotes, with each double quote inside it doubled (""); correct it and import again.`,
          row,
          line,
        );
      }
      gather(text.slice(from, j));
      fields.push(carry);
      carry = '';
      state = State.Start;
      i = from = j + 1;
      if (c === COMMA) continue;
      yield { fields, row, line: rowLine };
      fields = [];
      row++;
      line++;
      rowLine = line;
      if (c === CR) {
        if (i < n) {
          if (text.charCodeAt(i) === LF) i = from = i + 1;
        } else skipLf = true;
      }
    }
  }

  if (state === State.Quoted) {
    throw new CsvSyntaxError(
      `The file is not valid CSV: the quoted field that starts in row ${row}, line ${quoteLine} is never closed. Add the missing closing double quote and import it again.`,
      row,
      quoteLine,
    );
  }
  // The last record has no line break after it: it ends with the file.
  if (state !== State.Start || fields.length > 0) {
    fields.push(carry);
    yield { fields, row, line: rowLine };
  }
}
