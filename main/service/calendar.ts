/**
 * The diary's deadlines as an iCalendar file (RFC 5545), so the closes of open questions
 * can sit in the user's own calendar with a reminder the day before.
 *
 * Conformance notes, by section of RFC 5545:
 * - §3.1: content lines end in CRLF and are folded so no line exceeds 75 octets (the
 *   leading space of a continuation counts); folding happens between characters, never
 *   inside a UTF-8 multi-octet sequence.
 * - §3.3.11: TEXT values escape backslash, semicolon and comma, and write line breaks as
 *   `\n`; other control characters are not allowed in TEXT and are dropped.
 * - §3.3.5: times are written in UTC form (`…Z`), so no VTIMEZONE is needed.
 * - §3.6.1 / §3.8.7.2 / §3.8.4.7: each VEVENT carries UID and DTSTAMP; UIDs are stable
 *   per question, so re-importing updates events instead of duplicating them.
 * - §3.6.6: the VALARM has ACTION:DISPLAY with its required DESCRIPTION and TRIGGER.
 */
import type { Question } from '../../shared/domain';
import { choiceForecastText, numericForecastText, percentText } from '../../shared/forecast-text';
import { isValidTimeZone, parseInstant, toIso, toLocalInputValue } from '../../shared/time';

export const DEFAULT_PRODID = '-//Forelog//Forelog diary//EN';

export interface CalendarOptions {
  /** Epoch ms written as each event's DTSTAMP (when this file was made). */
  now: number;
  prodId?: string;
  /** Hours before the close at which calendar apps remind; default 24. */
  alarmHours?: number;
}

const MAX_LINE_OCTETS = 75;
const EVENT_MINUTES = 15;

/** RFC 5545 §3.3.5 UTC date-time, "YYYYMMDDTHHMMSSZ" (seconds precision). */
export function icalUtc(ms: number): string {
  return toIso(ms).replace(/[-:]/g, '').replace(/\.\d{3}Z$/, 'Z');
}

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;
// Every C0 control except HTAB and the line breaks (turned into \n below), plus DEL.
const DISALLOWED_CONTROLS = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/g;

/** RFC 5545 §3.3.11 TEXT escaping of one value. */
export function escapeText(text: string): string {
  return text
    .replace(LONE_SURROGATE, '\uFFFD') // not encodable as UTF-8
    .replace(DISALLOWED_CONTROLS, '')
    .replace(/\\/g, '\\\\')
    .replace(/;/g, '\\;')
    .replace(/,/g, '\\,')
    .replace(/\r\n|\r|\n/g, '\\n');
}

function utf8Octets(codePoint: number): number {
  if (codePoint < 0x80) return 1;
  if (codePoint < 0x800) return 2;
  if (codePoint < 0x10000) return 3;
  return 4;
}

/**
 * RFC 5545 §3.1 folding: at most 75 octets per physical line, continuation lines start
 * with one space. Iterating by code point keeps every multi-octet character whole.
 */
export function foldLine(line: string): string {
  const lines: string[] = [];
  let current = '';
  let octets = 0;
  for (const ch of line) {
    const n = utf8Octets(ch.codePointAt(0) ?? 0);
    if (octets + n > MAX_LINE_OCTETS) {
      lines.push(current);
      current = ' ';
      octets = 1;
    }
    current += ch;
    octets += n;
  }
  lines.push(current);
  return lines.join('\r\n');
}

/** RFC 5545 §3.3.6 duration before an instant, e.g. -PT24H (or minutes when not whole hours). */
function triggerBefore(hours: number): string {
  const minutes = Math.round(Math.max(0, hours) * 60);
  return minutes % 60 === 0 ? `-PT${minutes / 60}H` : `-PT${minutes}M`;
}

function latestForecast<F extends { at: string; seq: number }>(forecasts: readonly F[]): { f: F; at: number } | null {
  let best: { f: F; at: number } | null = null;
  for (const f of forecasts) {
    const at = parseInstant(f.at);
    if (at === null) continue;
    if (!best || at > best.at || (at === best.at && f.seq > best.f.seq)) best = { f, at };
  }
  return best;
}



function localTime(ms: number, zone: string): string {
  return `${toLocalInputValue(ms, zone).replace('T', ' ')} (${zone})`;
}

/** The standing forecast of a question of any type, as the description's line says it (null when none). */
function lastForecastLine(q: Question, zone: string): string | null {
  if (q.type === 'binary') {
    const last = latestForecast(q.forecasts);
    return last && `Last probability: ${percentText(last.f.p)} (set ${localTime(last.at, zone)})`;
  }
  if (q.type === 'choice') {
    const last = latestForecast(q.forecasts);
    return last && `Last forecast: ${choiceForecastText(q.options, last.f.probs)} (set ${localTime(last.at, zone)})`;
  }
  const last = latestForecast(q.forecasts);
  return last && `Last forecast: ${numericForecastText(q.levels, last.f.quantiles, q.unit)} (set ${localTime(last.at, zone)})`;
}

function description(q: Question, close: number, zone: string): string {
  const lines = [`Resolution rule: ${q.rule}`, `Closes: ${localTime(close, zone)}`];
  lines.push(lastForecastLine(q, zone) ?? (q.type === 'binary' ? 'Last probability: none yet' : 'Last forecast: none yet'));
  if (q.type === 'binary' && q.base_rate !== null) {
    lines.push(`Base rate: ${percentText(q.base_rate)}${q.base_rate_note ? ` (${q.base_rate_note})` : ''}`);
  }
  if (q.type === 'choice' && q.option_base_rates) {
    lines.push(`Base rates: ${choiceForecastText(q.options, q.option_base_rates)}${q.base_rate_note ? ` (${q.base_rate_note})` : ''}`);
  }
  return lines.join('\n');
}

function eventLines(q: Question, close: number, dtstamp: string, alarmHours: number): string[] {
  const zone = isValidTimeZone(q.time_zone) ? q.time_zone : 'UTC';
  const lines = [
    'BEGIN:VEVENT',
    `UID:${escapeText(`${q.id}@forelog.local`)}`,
    `DTSTAMP:${dtstamp}`,
  ];
  const updated = parseInstant(q.updated_at);
  if (updated !== null) lines.push(`LAST-MODIFIED:${icalUtc(updated)}`);
  lines.push(
    `DTSTART:${icalUtc(close)}`,
    `DURATION:PT${EVENT_MINUTES}M`,
    `SUMMARY:${escapeText(`Closes: ${q.title}`)}`,
    `DESCRIPTION:${escapeText(description(q, close, zone))}`,
  );
  const tags = q.tags.filter((t) => t.length > 0);
  if (tags.length > 0) lines.push(`CATEGORIES:${tags.map(escapeText).join(',')}`);
  lines.push(
    // A deadline is a marker, not a meeting: it must not show the user as busy.
    'TRANSP:TRANSPARENT',
    'BEGIN:VALARM',
    'ACTION:DISPLAY',
    `TRIGGER:${triggerBefore(alarmHours)}`,
    `DESCRIPTION:${escapeText(`Forelog: ${q.title} closes soon`)}`,
    'END:VALARM',
    'END:VEVENT',
  );
  return lines;
}

/**
 * An RFC 5545 VCALENDAR with one VEVENT per unresolved question, at its close, ordered by
 * close then title. Resolved and void questions, and any whose close cannot be read, are
 * left out. Returns the file's full text (CRLF line ends, folded, ending in CRLF).
 */
export function toICalendar(questions: readonly Question[], options: CalendarOptions): string {
  const dtstamp = icalUtc(options.now);
  const open = questions
    .filter((q) => !q.resolution)
    .map((q) => ({ q, close: parseInstant(q.closes_at) }))
    .filter((e): e is { q: Question; close: number } => e.close !== null)
    .sort((a, b) => a.close - b.close || a.q.title.localeCompare(b.q.title, 'en') || (a.q.id < b.q.id ? -1 : a.q.id > b.q.id ? 1 : 0));
  const lines = [
    'BEGIN:VCALENDAR',
    'VERSION:2.0',
    `PRODID:${escapeText(options.prodId ?? DEFAULT_PRODID)}`,
    'CALSCALE:GREGORIAN',
    'METHOD:PUBLISH',
    ...open.flatMap(({ q, close }) => eventLines(q, close, dtstamp, options.alarmHours ?? 24)),
    'END:VCALENDAR',
  ];
  return lines.map(foldLine).join('\r\n') + '\r\n';
}
