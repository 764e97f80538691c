/**
 * Every date and time the window shows or reads, in one place: written in the user's own
 * locale (a UK user reads 31/03/2026 and "31 Mar 2026", a US user 03/31/2026 and
 * "Mar 31, 2026"), on the clocks of the time zone the figure belongs to (a question's own
 * zone, or the diary's), with one style of zone label everywhere: the offset in force at
 * that instant, as the locale writes it ("GMT+1", "GMT−4"). Short names mix styles across
 * locales ("BST" beside "GMT-4" in one locale, "GMT+1" beside "EDT" in another), so they are
 * never used.
 *
 * The arithmetic lives in shared/time (RFC 5545 rules for repeated and skipped wall times).
 */
import { addCalendarDays, daysInMonth, isValidTimeZone, parseLocalDateTime, toIso, toLocalInputValue, wallTimeAt, wallTimeToInstant } from '../../shared/time';

let knownLocale: string | null = null;
// The user may change the language while the app runs; the next format reads it afresh.
(globalThis as { addEventListener?: (type: string, listener: () => void) => void }).addEventListener?.('languagechange', () => (knownLocale = null));

/**
 * The locale every format uses: the user's own (the browser's or the operating system's).
 * Functions take it as a parameter only so tests can check other locales. Asked once and
 * kept: building a formatter to ask costs far more than the format itself, and a screen
 * formats thousands of dates.
 */
export function userLocale(): string {
  knownLocale ??= new Intl.DateTimeFormat().resolvedOptions().locale;
  return knownLocale;
}

const countFormats = new Map<string, Intl.NumberFormat>();

/**
 * A count as the user's locale groups its digits: 8988 → "8,988" (en-GB), "8.988" (de-DE),
 * "8 988" (fr-FR). Counts of questions run to 100,000; ungrouped they are hard to read.
 */
export function formatCount(n: number, locale = userLocale()): string {
  let format = countFormats.get(locale);
  if (!format) {
    format = new Intl.NumberFormat(locale);
    countFormats.set(locale, format);
  }
  return format.format(n);
}

const decimalFormats = new Map<string, Intl.NumberFormat>();

/**
 * A measured value (a numeric question's forecast or outcome, a chart tick) to at most
 * `significant` significant digits, grouped and with the decimal mark of the user's locale:
 * 1500 → "1,500", 0.1 + 0.2 → "0.3" (12 digits), 1234.5 → "1.234,5" (de-DE).
 */
export function formatDecimal(value: number, significant: number, locale = userLocale()): string {
  const key = `${locale}|${significant}`;
  let format = decimalFormats.get(key);
  if (!format) {
    format = new Intl.NumberFormat(locale, { maximumSignificantDigits: significant });
    decimalFormats.set(key, format);
  }
  return format.format(value);
}

/** A count and its noun, the count grouped: "1 day", "8,988 questions". */
export function plural(n: number, one: string, many = `${one}s`, locale = userLocale()): string {
  return `${formatCount(n, locale)} ${n === 1 ? one : many}`;
}

const formats = new Map<string, Intl.DateTimeFormat>();

function cached(locale: string, timeZone: string, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  const key = `${locale}|${timeZone}|${JSON.stringify(options)}`;
  let format = formats.get(key);
  if (!format) {
    format = new Intl.DateTimeFormat(locale, { ...options, timeZone });
    formats.set(key, format);
  }
  return format;
}

function toMs(at: string | number): number {
  return typeof at === 'number' ? at : Date.parse(at);
}

const pad = (n: number) => String(n).padStart(2, '0');

const DAY = { day: 'numeric', month: 'short', year: 'numeric' } as const;
/**
 * The time in a displayed instant: "17:05" on a 24-hour clock, "5:05 PM" on a 12-hour one,
 * written without a leading zero as such clocks are (and as the time boxes write it).
 */
const clock = (locale: string) => (uses12Hour(locale) ? ({ hour: 'numeric', minute: '2-digit' } as const) : ({ hour: '2-digit', minute: '2-digit' } as const));

/** Intl writes a zero offset "GMT+0"; people write "GMT". */
function tidyOffset(label: string): string {
  return label.replace(/^(GMT|UTC)[+\u2212-]0$/, '$1').replace('-', '\u2212');
}

/** The zone label of an instant: the offset in force then, e.g. "GMT+1" (London in summer), "GMT−4". */
export function zoneLabel(at: string | number, timeZone: string, locale = userLocale()): string {
  const ms = toMs(at);
  const part = cached(locale, timeZone, { timeZoneName: 'shortOffset' })
    .formatToParts(ms)
    .find((p) => p.type === 'timeZoneName');
  return tidyOffset(part?.value ?? timeZone);
}

/** A zone's own name, for pickers and "on this zone's clocks" hints: "America/New York". */
export function zoneName(timeZone: string): string {
  return timeZone.replaceAll('_', ' ');
}

export interface InstantOptions {
  /** Add the zone label (default true). Leave it off where the zone is stated once nearby. */
  zone?: boolean;
  /** Start with the weekday, for read-backs where the day matters ("Tue 31 Mar 2026, 17:00"). */
  weekday?: boolean;
}

/**
 * e.g. "31 Mar 2026, 17:00 GMT+1": the instant as `timeZone`'s clocks show it. `false` for
 * `options` is short for `{ zone: false }`.
 */
export function formatInstant(at: string | number, timeZone: string, options: InstantOptions | false = {}, locale = userLocale()): string {
  if (options === false) return formatInstant(at, timeZone, { zone: false }, locale);
  const ms = toMs(at);
  if (!Number.isFinite(ms)) return String(at);
  const text = cached(locale, timeZone, { ...(options.weekday ? { weekday: 'short' } : {}), ...DAY, ...clock(locale) }).format(ms);
  return options.zone === false ? text : `${text} ${zoneLabel(ms, timeZone, locale)}`;
}

/** e.g. "31 Mar 2026" (or "31 Mar" with `year: false`): the calendar day of an instant on `timeZone`'s clocks. */
export function formatDay(at: string | number, timeZone: string, { year = true }: { year?: boolean } = {}, locale = userLocale()): string {
  const ms = toMs(at);
  if (!Number.isFinite(ms)) return String(at);
  return cached(locale, timeZone, year ? DAY : { day: 'numeric', month: 'short' }).format(ms);
}

/** e.g. "Tue". */
export function formatWeekday(at: string | number, timeZone: string, locale = userLocale()): string {
  return cached(locale, timeZone, { weekday: 'short' }).format(toMs(at));
}

/** e.g. "17:00" (or "5:00 PM" where the locale uses a 12-hour clock). */
export function formatClock(at: string | number, timeZone: string, locale = userLocale()): string {
  return cached(locale, timeZone, clock(locale)).format(toMs(at));
}

/** Calendar days from the date of `from` to the date of `to` on `timeZone`'s calendar (tomorrow = 1). */
export function calendarDayDiff(from: number, to: number, timeZone: string): number {
  const a = wallTimeAt(from, timeZone);
  const b = wallTimeAt(to, timeZone);
  return Math.round((Date.UTC(b.year, b.month - 1, b.day) - Date.UTC(a.year, a.month - 1, a.day)) / 86_400_000);
}

/** "today", "tomorrow", "yesterday", a weekday within a week either side, else "26 Mar" (with the year if not this one). */
export function dayWord(ms: number, now: number, timeZone: string, locale = userLocale()): string {
  const diff = calendarDayDiff(now, ms, timeZone);
  if (diff === 0) return 'today';
  if (diff === 1) return 'tomorrow';
  if (diff === -1) return 'yesterday';
  if (Math.abs(diff) < 7) return formatWeekday(ms, timeZone, locale);
  const sameYear = wallTimeAt(ms, timeZone).year === wallTimeAt(now, timeZone).year;
  return formatDay(ms, timeZone, { year: !sameYear }, locale);
}

/** "tomorrow 17:00 GMT+1": a nearby instant in words, with its zone label. */
export function formatNearby(ms: number, now: number, timeZone: string, locale = userLocale()): string {
  return `${dayWord(ms, now, timeZone, locale)} ${formatClock(ms, timeZone, locale)} ${zoneLabel(ms, timeZone, locale)}`;
}

/**
 * A time axis's tick label: the day ("31 Mar", with the year when the axis spans most of one)
 * or, on an axis of hours, the day and the time.
 */
export function formatTick(ms: number, timeZone: string, unit: 'hour' | 'day', spanMs: number, locale = userLocale()): string {
  const withYear = spanMs > 300 * 86_400_000;
  const day = withYear ? DAY : ({ day: 'numeric', month: 'short' } as const);
  return cached(locale, timeZone, unit === 'hour' ? { ...day, ...clock(locale) } : day).format(ms);
}

// ---------------------------------------------------------------------------------------
// Reading dates and times typed in the user's own order.

export interface DateOrder {
  /** The order the locale writes a numeric date in, e.g. day, month, year for en-GB. */
  order: ('day' | 'month' | 'year')[];
  separator: string;
  /** What the box shows while empty, e.g. "dd/mm/yyyy". */
  placeholder: string;
}

const dateOrders = new Map<string, DateOrder>();

/** How the locale writes a numeric date (31/03/2026, 03/31/2026, 2026-03-31, 31.03.2026); worked out once per locale. */
export function dateOrder(locale = userLocale()): DateOrder {
  let known = dateOrders.get(locale);
  if (!known) {
    known = readDateOrder(locale);
    dateOrders.set(locale, known);
  }
  return known;
}

function readDateOrder(locale: string): DateOrder {
  const parts = new Intl.DateTimeFormat(locale, { day: '2-digit', month: '2-digit', year: 'numeric', timeZone: 'UTC' }).formatToParts(Date.UTC(2026, 2, 31));
  const order = parts.filter((p) => p.type === 'day' || p.type === 'month' || p.type === 'year').map((p) => p.type as 'day' | 'month' | 'year');
  const literal = parts.find((p) => p.type === 'literal')?.value.trim() || '/';
  const separator = /^[./-]$/.test(literal) ? literal : '/';
  const complete = order.length === 3 && new Set(order).size === 3 ? order : (['day', 'month', 'year'] as DateOrder['order']);
  const letters = { day: 'dd', month: 'mm', year: 'yyyy' } as const;
  return { order: complete, separator, placeholder: complete.map((k) => letters[k]).join(separator) };
}

/** A calendar date as the locale writes it numerically, e.g. "31/03/2026". */
export function formatDateText(date: { year: number; month: number; day: number }, locale = userLocale()): string {
  const { order, separator } = dateOrder(locale);
  const text = { day: String(date.day).padStart(2, '0'), month: String(date.month).padStart(2, '0'), year: String(date.year).padStart(4, '0') };
  return order.map((k) => text[k]).join(separator);
}

export type Read<T> = { ok: true; value: T } | { ok: false; error: string };

const nameMaps = new Map<string, { months: Map<string, number>; weekdays: Set<string> }>();

/**
 * The month and weekday names a date box reads, lower case without a final point: the
 * locale's own short and long ones ("nov", "november", "sept") and the English ones.
 */
function dateNames(locale: string): { months: Map<string, number>; weekdays: Set<string> } {
  let names = nameMaps.get(locale);
  if (!names) {
    const months = new Map<string, number>();
    const weekdays = new Set<string>();
    const plain = (text: string) => text.toLowerCase().replace(/\.$/, '');
    for (const loc of [locale, 'en-GB', 'en-US']) {
      for (const style of ['short', 'long'] as const) {
        const month = new Intl.DateTimeFormat(loc, { month: style, timeZone: 'UTC' });
        for (let m = 0; m < 12; m++) months.set(plain(month.format(Date.UTC(2026, m, 15))), m + 1);
        const weekday = new Intl.DateTimeFormat(loc, { weekday: style, timeZone: 'UTC' });
        for (let d = 0; d < 7; d++) weekdays.add(plain(weekday.format(Date.UTC(2026, 0, 4 + d))));
      }
    }
    names = { months, weekdays };
    nameMaps.set(locale, names);
  }
  return names;
}

/**
 * A date written with its month's name, as the window itself writes dates ("20 Nov 2026",
 * "Nov 20, 2026", "Fri, 20 Nov 2026", "20th November 2026"); null when `text` is not one.
 */
function namedMonthDate(text: string, locale: string): { year: number; month: number; day: number } | null {
  const { months, weekdays } = dateNames(locale);
  const tokens = text.toLowerCase().match(/\p{L}+\.?|\d+/gu) ?? [];
  let month: number | undefined;
  const numbers: string[] = [];
  for (const token of tokens) {
    if (/^\d/.test(token)) numbers.push(token);
    else {
      const word = token.replace(/\.$/, '');
      const m = months.get(word);
      if (m !== undefined && month === undefined) month = m;
      else if (!weekdays.has(word) && !['st', 'nd', 'rd', 'th'].includes(word)) return null;
    }
  }
  if (month === undefined || numbers.length !== 2) return null;
  const yearText = numbers.find((n) => n.length === 4);
  const dayText = numbers.find((n) => n.length <= 2);
  return yearText && dayText ? { year: Number(yearText), month, day: Number(dayText) } : null;
}

/**
 * A date typed in the locale's order ("31/03/2026" in the UK), as ISO "2026-03-31", or with
 * its month's name as the window writes dates ("31 Mar 2026", "Mar 31, 2026"), so a date
 * copied from a list or a heading goes back into a date box. The year must have four
 * digits: "03/04/26" could be read three ways.
 */
export function parseDateText(text: string, locale = userLocale()): Read<{ year: number; month: number; day: number }> {
  const { order, placeholder } = dateOrder(locale);
  const trimmed = text.trim();
  if (/\p{L}/u.test(trimmed)) {
    const named = namedMonthDate(trimmed, locale);
    if (!named) return { ok: false, error: `write the date as ${placeholder}` };
    if (named.day < 1 || named.day > daysInMonth(named.year, named.month)) {
      return { ok: false, error: `that month has no day ${named.day}; write the date as ${placeholder}` };
    }
    return { ok: true, value: named };
  }
  // Year first is always year, month, day ("2026-12-04", "2026/12/04", "2026.12.04"): no one writes year, day, month.
  const iso = /^(\d{4})[-/.](\d{1,2})[-/.](\d{1,2})$/.exec(trimmed);
  const groups = iso ? [iso[1]!, iso[2]!, iso[3]!] : trimmed.split(/[^0-9]+/).filter(Boolean);
  const keys: DateOrder['order'] = iso ? ['year', 'month', 'day'] : order;
  if (groups.length !== 3) return { ok: false, error: `write the date as ${placeholder}` };
  const value = { year: 0, month: 0, day: 0 };
  keys.forEach((k, i) => {
    value[k] = Number(groups[i]);
  });
  const yearText = groups[keys.indexOf('year')]!;
  if (yearText.length !== 4) return { ok: false, error: `write the year with four digits (${placeholder})` };
  if (value.month < 1 || value.month > 12) return { ok: false, error: `${value.month} is not a month; write the date as ${placeholder}` };
  if (value.day < 1 || value.day > daysInMonth(value.year, value.month)) {
    return { ok: false, error: `that month has no day ${value.day}; write the date as ${placeholder}` };
  }
  return { ok: true, value };
}

const twelveHour = new Map<string, boolean>();

/** Whether the locale writes times on a 12-hour clock (5:00 PM) or a 24-hour one (17:00); asked once per locale. */
export function uses12Hour(locale = userLocale()): boolean {
  let known = twelveHour.get(locale);
  if (known === undefined) {
    const cycle = new Intl.DateTimeFormat(locale, { hour: 'numeric', timeZone: 'UTC' }).resolvedOptions().hourCycle;
    known = cycle === 'h11' || cycle === 'h12';
    twelveHour.set(locale, known);
  }
  return known;
}

const dayPeriods = new Map<string, readonly [string, string]>();

/**
 * How the locale marks morning and afternoon on a 12-hour clock, when it writes them in a
 * form `parseTimeText` reads ("AM"/"PM" in en-US, "am"/"pm" in en-AU), so a time box shows
 * the same marks as the times displayed around it; otherwise "am"/"pm" ("오전" is not read).
 */
function periodMarks(locale: string): readonly [string, string] {
  let marks = dayPeriods.get(locale);
  if (!marks) {
    const mark = (hour: number) =>
      new Intl.DateTimeFormat(locale, { hour: 'numeric', hourCycle: 'h12', timeZone: 'UTC' }).formatToParts(Date.UTC(2000, 0, 1, hour)).find((p) => p.type === 'dayPeriod')?.value ?? '';
    const [am, pm] = [mark(5), mark(17)];
    const readable = (m: string, half: 'a' | 'p') => new RegExp(`^${half}\\.?\\s*m\\.?$`, 'i').test(m);
    marks = readable(am, 'a') && readable(pm, 'p') ? [am, pm] : ['am', 'pm'];
    dayPeriods.set(locale, marks);
  }
  return marks;
}

/** The placeholder of a time box: "hh:mm", or "hh:mm AM" where the locale uses a 12-hour clock (its own mark). */
export function timePlaceholder(locale = userLocale()): string {
  return uses12Hour(locale) ? `hh:mm ${periodMarks(locale)[0]}` : 'hh:mm';
}

/**
 * A time of day for a time box: "17:00", or "5:00 PM" where the locale uses a 12-hour clock.
 * Written by hand rather than by Intl, whose 12-hour forms vary by locale ("오후 5:00"), so
 * whatever the box shows, `parseTimeText` reads back; the marks are the locale's own when
 * it writes them in Latin letters, so the box matches the times displayed beside it.
 */
export function formatTimeText(time: { hour: number; minute: number }, locale = userLocale()): string {
  if (!uses12Hour(locale)) return `${pad(time.hour)}:${pad(time.minute)}`;
  const [am, pm] = periodMarks(locale);
  return `${time.hour % 12 === 0 ? 12 : time.hour % 12}:${pad(time.minute)} ${time.hour < 12 ? am : pm}`;
}

/** A time of day typed as "17:00", "17.00", "1700", "5:00 pm" or "5pm". */
export function parseTimeText(text: string, locale = userLocale()): Read<{ hour: number; minute: number }> {
  const m = /^(\d{1,2})(?:[:.h]?(\d{2}))?\s*(?:([ap])\.?\s*m\.?)?$/i.exec(text.trim());
  const example = timePlaceholder(locale);
  if (!m) return { ok: false, error: `write the time as ${example}` };
  let hour = Number(m[1]);
  const minute = m[2] === undefined ? 0 : Number(m[2]);
  const half = m[3]?.toLowerCase();
  if (half) {
    if (hour < 1 || hour > 12) return { ok: false, error: `${hour} is not an hour on a 12-hour clock` };
    hour = (hour % 12) + (half === 'p' ? 12 : 0);
  }
  if (hour > 23) return { ok: false, error: `${hour} is not an hour; use 0 to 23 (or add am/pm)` };
  if (minute > 59) return { ok: false, error: `${minute} is not a minute; use 00 to 59` };
  return { ok: true, value: { hour, minute } };
}

/** The "YYYY-MM-DDTHH:MM" wall-time text forms keep, from its parts. */
export function wallText(date: { year: number; month: number; day: number }, time: { hour: number; minute: number }): string {
  return `${String(date.year).padStart(4, '0')}-${pad(date.month)}-${pad(date.day)}T${pad(time.hour)}:${pad(time.minute)}`;
}

/**
 * A date, a time and perhaps seconds or the zone label, written in one box: typed in the
 * locale's order ("04/12/2026 14:30"), ISO ("2026-12-04T14:30:00"), or copied from a read-back
 * line ("Fri, 4 Dec 2026, 14:30 GMT"). Split into what the date and time boxes show; null when
 * `text` is not both. A zone label must be the one `timeZone` shows at that time (or the
 * zone's name): a time copied from another zone is left for the user to place, never moved.
 * Seconds are dropped — the boxes hold minutes. On a 12-hour clock an hour from 1 to 12 needs
 * its am/pm, which may still be on its way while the text is typed.
 */
export function splitDateTimeText(text: string, timeZone: string, locale = userLocale()): { date: string; time: string } | null {
  const m = /^(.*?\d)(?:\s*,\s*|\s+|T)(\d{1,2}[:.]\d{2})(?::\d{2}(?:\.\d+)?)?(\s*[ap]\.?\s*m\.?)?(?:\s+(\S+))?$/i.exec(text.trim());
  if (!m) return null;
  const day = parseDateText(m[1]!, locale);
  const clock = parseTimeText(`${m[2]!}${m[3] ?? ''}`, locale);
  if (!day.ok || !clock.ok) return null;
  // On a 12-hour clock "2:30" may be the start of "2:30 pm" still being typed: wait for the mark.
  if (m[3] === undefined && uses12Hour(locale) && clock.value.hour >= 1 && clock.value.hour <= 12) return null;
  const zone = m[4];
  if (zone !== undefined) {
    const at = wallTimeToInstant({ ...day.value, ...clock.value, second: 0 }, timeZone);
    if (zone !== zoneLabel(at, timeZone, locale) && zone !== timeZone && zone !== zoneName(timeZone)) return null;
  }
  return { date: formatDateText(day.value, locale), time: formatTimeText(clock.value, locale) };
}

// ---------------------------------------------------------------------------------------
// Wall-clock text and instants.

/** The instant a "YYYY-MM-DDTHH:MM" wall time means in `timeZone`, as an ISO string; null if it is not one. */
export function localToIso(local: string, timeZone: string): string | null {
  const wall = parseLocalDateTime(local);
  if (!wall) return null;
  return toIso(wallTimeToInstant(wall, timeZone));
}

/** The "YYYY-MM-DDTHH:MM" wall time showing `iso` on `timeZone`'s clocks. */
export function isoToLocal(iso: string, timeZone: string): string {
  return toLocalInputValue(Date.parse(iso), timeZone);
}

/** Every IANA zone this runtime knows, with the given ones (e.g. "UTC") guaranteed present. */
export function timeZoneNames(...mustInclude: string[]): string[] {
  let names: string[] = [];
  try {
    names = Intl.supportedValuesOf('timeZone');
  } catch {
    names = [];
  }
  const all = new Set([...names, 'UTC', ...mustInclude.filter(Boolean)]);
  return [...all].sort((a, b) => a.localeCompare(b));
}

/** The first instant of `date` ("YYYY-MM-DD") or its last millisecond, on `timeZone`'s clocks. */
function dayBound(date: string, timeZone: string, end: 'start' | 'end'): number | null {
  const wall = parseLocalDateTime(`${date}T00:00`);
  if (!wall) return null;
  if (end === 'start') return wallTimeToInstant(wall, timeZone);
  return wallTimeToInstant(addCalendarDays(wall, 1), timeZone) - 1;
}

export interface DayRange {
  /** ISO instants, or undefined when that end is open. */
  from?: string;
  to?: string;
  problems: { from?: string; to?: string };
}

/**
 * A From/To pair of whole days on the diary's clocks (the user thinks "windows that ended in
 * March", not "in March UTC") as the instants the API filters by: From's first instant, To's
 * last millisecond. Empty text leaves that end open.
 */
export function dayRange(fromText: string, toText: string, timeZone: string): DayRange {
  const problems: DayRange['problems'] = {};
  const from = fromText ? dayBound(fromText, timeZone, 'start') : null;
  const to = toText ? dayBound(toText, timeZone, 'end') : null;
  if (fromText && from === null) problems.from = 'must be a date';
  if (toText && to === null) problems.to = 'must be a date';
  if (from !== null && to !== null && to < from) problems.to = 'must not be before From';
  return { ...(from !== null ? { from: toIso(from) } : {}), ...(to !== null ? { to: toIso(to) } : {}), problems };
}

/**
 * A time as the diary writes it in its messages for every caller ("2027-03-13 17:00
 * Europe/London", shared/time-rules.ts `onClock`): a date, a 24-hour wall time and its zone.
 */
// Seconds appear when the time has them (a question opened "now" from a form): shown, like
// every time in the window, to the minute.
const ON_CLOCK = /\b(\d{4}-\d{2}-\d{2}) (\d{2}:\d{2})(?::\d{2})? ([A-Za-z_]+(?:\/[A-Za-z0-9_+-]+)+|UTC)\b/g;

/**
 * The diary's message with its times written as every other date in the window ("13 Mar
 * 2027, 17:00 GMT", the user's locale and clock) rather than as the diary's neutral text.
 */
export function clockTimesAsShown(message: string, locale = userLocale()): string {
  return message.replace(ON_CLOCK, (whole, date: string, time: string, zone: string) => {
    if (!isValidTimeZone(zone)) return whole;
    const iso = localToIso(`${date}T${time}`, zone);
    return iso === null ? whole : formatInstant(iso, zone, {}, locale);
  });
}

