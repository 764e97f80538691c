/**
 * Field rules shared by the API contract and the diary file: one home for what a valid
 * probability, instant, tag, time zone and title are, each with the message a user sees.
 */
import { z } from 'zod';
import { MAX_OPTIONS, MIN_OPTIONS, sumMiss, sumsToOne } from './choice-vector';
import { QUESTION_TYPES, VALUE_KINDS } from './domain';
import { dateToDays } from './numeric-value';
import { groupedDigits } from './grouped-digits';
import { quantileLevelsProblem, quantilesProblem } from './quantile-levels';
import { INSTANT_RANGE_RULE, isInstantInRange, parseInstant, parseRangeBound, zoneName } from './time';

/**
 * zod's own words for a wrong shape ("Invalid input: expected object, received array",
 * "Unrecognized key") reach users wherever a schema gives none of its own: a request body
 * that is a list, a lens that is null, a diary record that is not an object. These say
 * the same in the words the rest of the messages use. A schema's own message still wins.
 */
const SHAPES: Record<string, string> = {
  object: 'must be an object of named fields ({ … })',
  array: 'must be a list ([ … ])',
  string: 'must be text',
  number: 'must be a number',
  boolean: 'must be true or false',
};
z.config({
  customError: (issue) => {
    if (issue.code === 'invalid_type') {
      if (issue.input === undefined || issue.expected === 'nonoptional') return 'is required';
      const got = issue.input === null ? 'null' : Array.isArray(issue.input) ? 'a list' : typeof issue.input === 'object' ? 'an object' : typeof issue.input === 'string' ? 'text' : `a ${typeof issue.input}`;
      return `${SHAPES[issue.expected] ?? `must be ${issue.expected}`}, not ${got}`;
    }
    if (issue.code === 'unrecognized_keys') {
      return `names ${issue.keys.map((k) => `"${k}"`).join(', ')}, which ${issue.keys.length === 1 ? 'is not a field' : 'are not fields'} here; check the spelling, or leave ${issue.keys.length === 1 ? 'it' : 'them'} out`;
    }
    return undefined;
  },
});

export const TAG_PATTERN = /^[a-z0-9][a-z0-9_\-:./]{0,63}$/;
export const TAG_RULE =
  'a tag is 1–64 lower-case letters, digits or - _ : . / starting with a letter or digit (e.g. client:northgate)';

export const probability = z
  .number({ error: 'must be a number between 0 and 1' })
  .refine((v) => Number.isFinite(v) && v >= 0 && v <= 1, { message: 'must be a probability between 0 and 1' });

const INSTANT_TYPE = 'must be an ISO 8601 date-time text';

/** The instant rule, once: epoch ms of a valid instant text inside `INSTANT_RANGE` (shared/time.ts), or the reason it is not one. */
export function readInstant(text: string): number | string {
  const ms = parseInstant(text);
  if (ms === null) return 'must be an ISO 8601 date-time with an offset or Z, e.g. 2026-03-31T17:00:00+01:00';
  return isInstantInRange(ms) ? ms : INSTANT_RANGE_RULE;
}

export const instant = z.string({ error: INSTANT_TYPE }).superRefine((text, ctx) => {
  const read = readInstant(text);
  if (typeof read === 'string') ctx.addIssue({ code: 'custom', message: read });
});

/**
 * The same rule as `instant`, read into epoch milliseconds: the diary file's times, which
 * are stored as numbers, are parsed once (a large import reads millions of them).
 */
export const instantMs = z.string({ error: INSTANT_TYPE }).transform((text, ctx) => {
  const read = readInstant(text);
  if (typeof read !== 'string') return read;
  ctx.addIssue({ code: 'custom', message: read });
  return z.NEVER;
});

/** A filter bound: a bare date (that whole day in UTC) or an instant, inside `INSTANT_RANGE`. */
export const rangeBound = (end: 'from' | 'to') =>
  z.string({ error: 'must be a date (YYYY-MM-DD) or an ISO 8601 date-time' }).superRefine((text, ctx) => {
    const ms = parseRangeBound(text, end);
    if (ms === null) ctx.addIssue({ code: 'custom', message: 'must be a date (YYYY-MM-DD, the whole day in UTC) or an ISO 8601 date-time with an offset' });
    else if (!isInstantInRange(ms)) ctx.addIssue({ code: 'custom', message: INSTANT_RANGE_RULE });
  });

export const tag = z.string({ error: 'must be text' }).refine((v) => TAG_PATTERN.test(v), { message: `is not a valid tag: ${TAG_RULE}` });

export const tags = z
  .array(tag, { error: 'must be a list of tags' })
  .max(32, { message: 'at most 32 tags per question' })
  .refine((list) => new Set(list).size === list.length, { message: 'lists the same tag twice' });

/** An IANA zone name, in the spelling `zoneName` keeps (its usual case). */
export const timeZone = z.string({ error: 'must be an IANA time zone name' }).transform((text, ctx) => {
  const name = zoneName(text);
  if (name !== null) return name;
  ctx.addIssue({ code: 'custom', message: 'is not a time zone this system knows (use an IANA name such as Europe/London)' });
  return z.NEVER;
});

/**
 * Control characters in text. One-line fields (titles, names, sources, ids, search text)
 * take none of the C0 controls U+0000–U+001F or DEL U+007F; notes may also hold tab, line
 * feed and carriage return. Why: nobody types them, they hide on screen and in CSV, and
 * SQLite's length() stops at a NUL, so the store would see "\u0000" as an empty title
 * that the validator thought was full.
 *
 * Neither takes half of a UTF-16 surrogate pair (a JSON "\ud800" escape without its
 * partner): it is no character, SQLite keeps text as UTF-8, which cannot hold it, and it
 * would come back as three U+FFFD, a different and longer text than the one accepted.
 * With the u flag a class of the surrogate range matches only such unpaired halves.
 */
const ONE_LINE_CONTROLS = /[\u0000-\u001f\u007f\ud800-\udfff]/u;
const NOTE_CONTROLS = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f\ud800-\udfff]/u;

const hex = (code: number) => `U+${code.toString(16).toUpperCase().padStart(4, '0')}`;

/** The first forbidden character in `text` (a control character or an unpaired surrogate), as a reason naming it and its place; null when none. */
export function controlCharacterProblem(text: string, lines: 'one' | 'many'): string | null {
  const m = (lines === 'one' ? ONE_LINE_CONTROLS : NOTE_CONTROLS).exec(text);
  if (!m) return null;
  const code = m[0].charCodeAt(0);
  const found = `found ${hex(code)} at character ${m.index + 1}`;
  if (code >= 0xd800) return `must be Unicode text: ${found}, half of a surrogate pair without its other half; remove it or write the whole character`;
  return lines === 'one'
    ? `must be one line without control characters such as NUL, tab or line breaks (${found})`
    : `must not contain control characters other than tab and line breaks (${found})`;
}

/** Text of `lines` lines; a control-character problem stops the field's other checks (one reason is enough). */
function text(lines: 'one' | 'many', typeError = 'must be text') {
  return z.string({ error: typeError }).superRefine((value, ctx) => {
    const problem = controlCharacterProblem(value, lines);
    if (problem) ctx.addIssue({ code: 'custom', message: problem, continue: false });
  });
}

/**
 * A text's length limit, with the length it has ("must be at most 300 characters; it has
 * 704"), so the writer knows how much to cut.
 */
const atMost = (max: number) => ({
  error: (issue: { input?: unknown }) =>
    `must be at most ${grouped(max)} characters${typeof issue.input === 'string' ? `; it has ${grouped(issue.input.length)}` : ''}`,
});

const grouped = groupedDigits;

/**
 * Text that shows nothing: white space and the characters Unicode says a renderer may leave
 * undrawn (zero-width spaces and joiners, the word joiner, soft hyphens, variation selectors,
 * the Hangul fillers), plus the blank Braille pattern. trim() keeps these, so a title of
 * zero-width spaces passed as filled and then showed as an empty row nobody could read.
 */
const INVISIBLE_ONLY = /^[\p{White_Space}\p{Default_Ignorable_Code_Point}\u2800]*$/u;

/** True when `text` has at least one character that shows (the filled-line rule below; the diary file's fast path reuses it). */
export const showsSomething = (text: string): boolean => !INVISIBLE_ONLY.test(text);

/** One line of text, trimmed, not empty once trimmed, with something visible: after this rule SQLite's length(trim(x)) > 0 holds too. */
const filledLine = (max: number, empty = 'must not be empty') =>
  text('one')
    .trim()
    .min(1, { message: empty })
    .max(max, atMost(max))
    .refine(showsSomething, { message: `${empty}: it holds only invisible characters (such as zero-width spaces); write some visible text` });

export const title = filledLine(300);

/** The longest note, in UTF-16 code units (what zod's max and a string's length count). */
export const NOTE_MAX = 20_000;

export const note = text('many').max(NOTE_MAX, atMost(NOTE_MAX));

/** Whose reference forecast it is. */
export const source = filledLine(200, 'must name the source');

/** A record's id, as requests name it and diary files carry it. */
export const id = (typeError = 'must be text') =>
  text('one', typeError).min(1, { message: 'must not be empty' }).max(200, { message: 'must be at most 200 characters' });

/** The longest search the question list takes, in UTF-16 code units (the Questions screen searches for this much of a longer text). */
export const SEARCH_MAX_CHARS = 200;

/** Search text for the question list. */
export const searchText = text('one').max(SEARCH_MAX_CHARS, { message: `must be at most ${SEARCH_MAX_CHARS} characters` });

/** A whole number from `min` to `max` (paging: an offset or a page size). */
export function count(max: number, min = 0) {
  // Past 2^53 − 1 whole numbers are no longer told apart; say so rather than "0 or more" to a 2^53.
  const [low, high] = [groupedDigits(min), groupedDigits(max)];
  const rule = max === Number.MAX_SAFE_INTEGER ? `must be a whole number, ${low} or more (at most ${high})` : `must be a whole number from ${low} to ${high}`;
  return z
    .number({ error: rule })
    .refine((n) => Number.isInteger(n) && n >= min && n <= max, { message: rule });
}

export const positiveCost = z
  .number({ error: 'must be a number' })
  .refine((v) => Number.isFinite(v) && v > 0, { message: 'must be a cost greater than 0' });

export const costs = z.object({ false_alarm: positiveCost, miss: positiveCost }, { error: 'must be { false_alarm, miss }' });

export const checkinDays = z
  .number({ error: 'must be a whole number of days' })
  .int({ message: 'must be a whole number of days' })
  .min(0, { message: 'must be 0 (no check-ins) or more' })
  .max(365, { message: 'must be at most 365 days' });

export const lens = z.object({
  name: filledLine(80),
  p: probability,
  weight: z
    .number({ error: 'must be a number' })
    .refine((v) => Number.isFinite(v) && v >= 0, { message: 'must be a weight of 0 or more' })
    .default(1),
});

export const lenses = z
  .array(lens, { error: 'must be a list of lenses' })
  .max(20, { message: 'at most 20 lenses per revision' })
  .refine((list) => list.length === 0 || list.some((l) => l.weight > 0), {
    message: 'at least one lens needs a weight above 0',
  });

export const kind = z.enum(['event_by_deadline', 'state_at_deadline'], { error: 'must be event_by_deadline or state_at_deadline' });

// ---- question types (INTERFACES.md "Question types"; SCORING.md) ---------------------

export const questionType = z.enum(QUESTION_TYPES, { error: 'must be binary, choice or numeric' });

/** A refused sum as a user reads it, with what to change: "90 % (10 % short)", "100.00011 % (0.00011 % over)". */
function refusedSum(sum: number): string {
  const miss = sumMiss(sum);
  return `${miss.percent} % (${miss.off} % ${miss.side})`;
}

/**
 * A probability vector over a choice question's options, as the user gave it: each entry
 * a probability, 2–12 entries, summing to 1 within 1e-6 (shared/choice-vector.ts holds the
 * tolerance). Whether it has one entry per option is the service's check: only it knows
 * the question.
 */
export const probs = z
  .array(probability, { error: 'must be a list of probabilities, one per option' })
  .superRefine((list, ctx) => {
    if (list.length < MIN_OPTIONS || list.length > MAX_OPTIONS) {
      ctx.addIssue({ code: 'custom', message: `must give one probability per option (${MIN_OPTIONS} to ${MAX_OPTIONS}), not ${list.length}` });
      return;
    }
    let sum = 0;
    for (const p of list) sum += p;
    if (!Number.isNaN(sum) && !sumsToOne(sum)) ctx.addIssue({ code: 'custom', message: `must sum to 100 %, they sum to ${refusedSum(sum)}` });
  });

/** A choice question's option: one line, trimmed, not empty. */
export const optionLabel = filledLine(200, 'must not be empty (every option needs a label)');

export const options = z
  .array(optionLabel, { error: 'must be a list of option labels' })
  .min(MIN_OPTIONS, { message: `must list at least ${MIN_OPTIONS} options` })
  .max(MAX_OPTIONS, { message: `must list at most ${MAX_OPTIONS} options` })
  .superRefine((list, ctx) => {
    const seen = new Map<string, number>();
    list.forEach((label, i) => {
      const key = optionLook(label);
      const first = seen.get(key);
      if (first === undefined) seen.set(key, i);
      else {
        // Two labels that look the same on screen cannot be told apart when forecasting or resolving.
        const how = list[first] === label ? '' : ' (they differ only in characters that do not show, or in how an accent is written)';
        ctx.addIssue({ code: 'custom', message: `repeats option ${first} ("${list[first]}")${how}; each option must be different`, path: [i] });
      }
    });
  });

/** How an option's label looks, what two options must not share: composed accents (NFC), without the characters that show nothing. */
export const optionLook = (label: string): string => label.normalize('NFC').replace(/\p{Default_Ignorable_Code_Point}/gu, '');

/** A choice question's option, by its 0-based place in the list. */
export const optionIndex = z
  .number({ error: 'must be the 0-based index of an option' })
  .int({ message: 'must be the 0-based index of an option (a whole number)' })
  .min(0, { message: 'must be the 0-based index of an option (0 or more)' });

export const ordered = z.boolean({ error: 'must be true or false' });

/** Shown beside a numeric question's values ("weeks", "£k"); may be empty. */
export const unit = text('one').trim().max(40, atMost(40));

export const valueKind = z.enum(VALUE_KINDS, { error: 'must be number or date' });

export const levels = z
  .array(z.number({ error: 'must be a number' }), { error: 'must be a list of quantile levels such as [0.1, 0.5, 0.9]' })
  .superRefine((list, ctx) => {
    const problem = quantileLevelsProblem(list);
    if (problem) ctx.addIssue({ code: 'custom', message: problem });
  });

const NUMERIC_VALUE_TYPE = 'must be a number, or a date YYYY-MM-DD for a question about a date';

/** One value of a numeric question: a finite number or a calendar date `YYYY-MM-DD`; which of the two the question takes is the service's check. */
export const numericValue = z.union([z.number(), z.string()], { error: NUMERIC_VALUE_TYPE }).superRefine((value, ctx) => {
  if (typeof value === 'number' && !Number.isFinite(value)) ctx.addIssue({ code: 'custom', message: 'must be a finite number' });
  if (typeof value === 'string' && dateToDays(value) === null) {
    // Text shaped like a date is a date that does not exist; other text ("5") was meant as a number.
    const shown = value.length > 40 ? `${value.slice(0, 40)}…` : value;
    const message = /^\d{4}-\d{2}-\d{2}$/.test(value)
      ? `must be a real calendar date YYYY-MM-DD (got "${shown}")`
      : `${NUMERIC_VALUE_TYPE} (got the text "${shown}")`;
    ctx.addIssue({ code: 'custom', message });
  }
});

/**
 * A numeric forecast's quantiles: one value per level (the service checks the count
 * against the question), all numbers or all dates, never decreasing from one level to the
 * next (equal neighbours are allowed).
 */
export const quantiles = z
  .array(numericValue, { error: 'must be a list of values, one per quantile level' })
  .min(1, { message: 'must give one value per quantile level' })
  .superRefine((list, ctx) => {
    const dates = list.filter((x) => typeof x === 'string').length;
    if (dates > 0 && dates < list.length) {
      ctx.addIssue({ code: 'custom', message: 'must be all numbers or all dates YYYY-MM-DD, not a mix' });
      return;
    }
    const values = list.map((x) => (typeof x === 'string' ? dateToDays(x) : x));
    if (values.some((x) => x === null || !Number.isFinite(x))) return; // the entry's own issue says why
    const problem = quantilesProblem(values as number[], values.length);
    if (!problem) return;
    const at = values.findIndex((x, i) => i > 0 && x! < values[i - 1]!);
    ctx.addIssue({
      code: 'custom',
      message: at > 0 ? `must not decrease from one level to the next: entry ${at} (${String(list[at])}) is below entry ${at - 1} (${String(list[at - 1])})` : problem,
    });
  });

/**
 * The type's own fields, the same in the API and the diary file: `type` (binary when
 * absent; fixed at creation); a choice question's `options` (required), `ordered` and
 * `option_base_rates`; a numeric question's `unit` (default ''), `value_kind` (default
 * number) and `levels` (default [0.1, 0.5, 0.9]). Which go with which type is checked by
 * shared/question-types.ts.
 */
export const typeFields = {
  type: questionType.optional(),
  options: options.optional(),
  ordered: ordered.optional(),
  option_base_rates: probs.nullable().optional(),
  unit: unit.optional(),
  value_kind: valueKind.optional(),
  levels: levels.optional(),
};

/**
 * A forecast's or a reference's value: `p` for a yes/no question, `probs` for a choice
 * question, `quantiles` for a numeric question; which one a record must give is checked
 * against its question (shared/question-types.ts).
 */
export const entryValue = {
  p: probability.optional(),
  probs: probs.optional(),
  quantiles: quantiles.optional(),
};

/** Reports issues `{ path, message }` on a zod refinement, under `prefix`. */
export function addIssues(ctx: z.RefinementCtx, issues: { path: (string | number)[]; message: string }[], prefix: (string | number)[] = []): void {
  for (const issue of issues) ctx.addIssue({ code: 'custom', message: issue.message, path: [...prefix, ...issue.path] });
}

/** The fields of a question a user writes: the same in the API and in the diary file. */
export const questionFields = {
  title,
  rule: note.optional(),
  kind: kind.optional(),
  tags: tags.optional(),
  opened_at: instant.optional(),
  closes_at: instant,
  time_zone: timeZone.optional(),
  base_rate: probability.nullable().optional(),
  base_rate_note: note.optional(),
  costs: costs.nullable().optional(),
  checkin_days: checkinDays.nullable().optional(),
};

const instantValue = (t: string | number): number => (typeof t === 'number' ? t : Date.parse(t));

/** What a window that does not close after it opens is told (on its closes_at). */
export const CLOSES_AFTER_OPENS_RULE = 'must be after the opening time (opened_at)';

/** The window must close after it opens (checked when both are given; as text or as epoch ms). */
export function closesAfterOpening(q: { opened_at?: string | number; closes_at: string | number }): boolean {
  return q.opened_at === undefined || instantValue(q.closes_at) > instantValue(q.opened_at);
}

/** `closesAfterOpening` as arguments for a schema's refine (zod rewrites the options object, so read the rule above). */
export const closesAfterOpens: [typeof closesAfterOpening, { message: string; path: PropertyKey[] }] = [
  closesAfterOpening,
  { message: CLOSES_AFTER_OPENS_RULE, path: ['closes_at'] },
];

/** A filter's range must not end before it starts (checked when both ends are given and readable). */
export const toNotBeforeFrom: [(r: { from?: string; to?: string }) => boolean, { message: string; path: PropertyKey[] }] = [
  (r) => {
    if (r.from === undefined || r.to === undefined) return true;
    const from = parseRangeBound(r.from, 'from');
    const to = parseRangeBound(r.to, 'to');
    return from === null || to === null || from <= to;
  },
  { message: 'must not be before from', path: ['to'] },
];

const HHMM_RULE = 'must be a time of day HH:MM (24-hour)';
export const hhmm = z.string({ error: HHMM_RULE }).regex(/^([01]\d|2[0-3]):[0-5]\d$/, { message: HHMM_RULE });

/**
 * The diary's settings, each with the message a user reads: one home for the API's
 * `updateSettings` (shared/contract.ts) and a diary file's `settings` (shared/diary-file.ts).
 */
export const settingsFields = {
  default_false_alarm_cost: positiveCost,
  default_miss_cost: positiveCost,
  default_checkin_days: checkinDays,
  closing_soon_hours: z
    .number({ error: 'must be whole hours' })
    .int({ message: 'must be whole hours' })
    .min(1, { message: 'must be at least 1 hour' })
    .max(24 * 14, { message: 'must be at most 336 hours (14 days)' }),
  overdue_after_days: z
    .number({ error: 'must be whole days' })
    .int({ message: 'must be whole days' })
    .min(0, { message: 'must be 0 days or more' })
    .max(90, { message: 'must be at most 90 days' }),
  time_zone: timeZone,
  quiet_hours: z.object({ start: hhmm, end: hhmm }, { error: 'must be { "start": "HH:MM", "end": "HH:MM" } or null' }).nullable(),
};

/**
 * How deep lists and objects may nest in a request or a diary file. The deepest real shape
 * (a diary file's lens: request → diary → questions → question → forecasts → forecast →
 * lenses → lens) is 8 levels; refusing past 64 keeps every recursive reader (schema
 * checks, error formatting, JSON.stringify) far from the stack's end, and JSON.parse from
 * spending seconds on a body of nothing but brackets.
 */
export const MAX_NESTING = 64;

export const NESTING_RULE = `lists and objects may nest at most ${MAX_NESTING} levels deep`;

/** True when `value` holds lists or objects nested deeper than `limit`; walks without recursion, stops at the first. */
export function nestedDeeperThan(value: unknown, limit = MAX_NESTING): boolean {
  const stack: [unknown, number][] = [[value, 1]];
  while (stack.length > 0) {
    const [item, depth] = stack.pop()!;
    if (typeof item !== 'object' || item === null) continue;
    if (depth > limit) return true;
    for (const child of Array.isArray(item) ? item : Object.values(item)) {
      if (typeof child === 'object' && child !== null) stack.push([child, depth + 1]);
    }
  }
  return false;
}

/**
 * The same question asked of JSON text before parsing it: counts brackets outside strings
 * in one pass. Exact for valid JSON; for invalid JSON the parser's own error follows.
 */
export function jsonTextNestedDeeperThan(text: string, limit = MAX_NESTING): boolean {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 0x5c) i++; // backslash: the next character is escaped
      else if (c === 0x22) inString = false;
    } else if (c === 0x22) inString = true;
    else if (c === 0x5b || c === 0x7b) {
      if (++depth > limit) return true;
    } else if (c === 0x5d || c === 0x7d) depth--;
  }
  return false;
}

const isRecord = (value: unknown): value is Record<string, unknown> =>
  typeof value === 'object' && value !== null && !Array.isArray(value);

/**
 * The paths of the object keys in `raw` that validation dropped from `parsed` (zod objects
 * strip keys they do not know), list places and nested fields included. Keys holding
 * undefined are not fields a caller gave. A value kept whole (z.unknown) is the same on
 * both sides, so nothing inside it is reported.
 */
export function droppedFields(raw: unknown, parsed: unknown): string[] {
  const out: string[] = [];
  const walk = (r: unknown, p: unknown, path: PropertyKey[]) => {
    if (r === p) return;
    if (Array.isArray(r) && Array.isArray(p)) {
      for (let i = 0; i < Math.min(r.length, p.length); i++) walk(r[i], p[i], [...path, i]);
    } else if (isRecord(r) && isRecord(p)) {
      for (const key of Object.keys(r)) {
        if (r[key] === undefined) continue;
        if (Object.hasOwn(p, key)) walk(r[key], p[key], [...path, key]);
        else out.push(formatPath([...path, key]));
      }
    }
  };
  walk(raw, parsed, []);
  return out;
}

/** Said of a number written beyond ±Number.MAX_VALUE, which JSON reads as ±Infinity. */
const TOO_LARGE = 'the one given is beyond about ±1.8e308, too large to hold';

/**
 * The reason an issue gives a user. A field left out is "required", whatever its type's
 * message says ("title: must be text" reads as if a wrong title had been given). Only a
 * parse run with `reportInput: true` tells a missing field (no input) from a wrong one, so
 * `withInputs` says the error came from one; it also tells a number too large to hold
 * (`TOO_LARGE`) from a value of the wrong type.
 */
export function issueReason(issue: z.core.$ZodIssue, withInputs = false): string {
  // JSON reads a number beyond the largest double (1e400) as Infinity, which the schemas refuse
  // as "not a number": say what is wrong with the number the user wrote.
  if (withInputs && issue.code !== 'custom' && (issue.input === Infinity || issue.input === -Infinity)) return `${issue.message}: ${TOO_LARGE}`;
  if (!withInputs || issue.code !== 'invalid_type' || issue.input !== undefined || issue.message === 'is required') return issue.message;
  return issue.message.startsWith('must ') ? `is required (it ${issue.message})` : `is required (${issue.message})`;
}

/** Turns a zod error into one line per problem: `field.path: reason` (see `issueReason` for `withInputs`). */
export function describeIssues(error: z.ZodError, prefix = '', withInputs = false): string[] {
  return error.issues.map((issue) => {
    const path = formatPath(issue.path);
    const field = prefix && path ? `${prefix}.${path}` : prefix || path;
    const reason = issueReason(issue, withInputs);
    return field ? `${field}: ${reason}` : reason;
  });
}

export function formatPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const part of path) {
    if (typeof part === 'number') out += `[${part}]`;
    else out += out ? `.${String(part)}` : String(part);
  }
  return out;
}
