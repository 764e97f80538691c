/**
 * The Settings form keeps what the user typed as text; on save it becomes a settings patch.
 * This module checks only what the form alone can know (a box left empty, text that is not a
 * number); ranges and formats are the diary's rules, which the form runs before sending.
 */
import type { Request } from '../../../../shared/contract';
import type { Settings } from '../../../../shared/domain';
import { readDecimal } from '../../../../shared/numeric-value';
import { formatTimeText, parseTimeText, userLocale } from '../../dates';

export interface SettingsDraft {
  checkinDays: string;
  closingSoonHours: string;
  overdueAfterDays: string;
  quietOn: boolean;
  quietStart: string;
  quietEnd: string;
  timeZone: string;
  falseAlarmCost: string;
  missCost: string;
}

/** Quiet hours offered when the user first turns them on: the night. */
const DEFAULT_QUIET = { start: '22:00', end: '07:00' };

/**
 * A quiet-hours time as the time boxes elsewhere show it: "22:00", or "10:00 PM" where the
 * locale uses a 12-hour clock. The diary stores 24-hour "HH:MM" (`quietTimeValue` reads it back).
 */
export function quietTimeText(stored: string, locale = userLocale()): string {
  const m = /^(\d{2}):(\d{2})$/.exec(stored);
  return m ? formatTimeText({ hour: Number(m[1]), minute: Number(m[2]) }, locale) : stored;
}

/**
 * A typed quiet-hours time as the diary stores it (24-hour "HH:MM"), read like every other
 * time box (`parseTimeText`: "22:00", "22.00", "2200", "10 pm", "10:00 PM", spaces around
 * ignored); or why it is not a time.
 */
export function quietTimeValue(text: string, locale = userLocale()): { ok: true; value: string } | { ok: false; error: string } {
  const read = parseTimeText(text, locale);
  if (!read.ok) return read;
  const pad = (n: number) => String(n).padStart(2, '0');
  return { ok: true, value: `${pad(read.value.hour)}:${pad(read.value.minute)}` };
}

export function draftFrom(settings: Settings, locale = userLocale()): SettingsDraft {
  return {
    checkinDays: String(settings.default_checkin_days),
    closingSoonHours: String(settings.closing_soon_hours),
    overdueAfterDays: String(settings.overdue_after_days),
    quietOn: settings.quiet_hours !== null,
    quietStart: quietTimeText(settings.quiet_hours?.start ?? DEFAULT_QUIET.start, locale),
    quietEnd: quietTimeText(settings.quiet_hours?.end ?? DEFAULT_QUIET.end, locale),
    timeZone: settings.time_zone,
    falseAlarmCost: String(settings.default_false_alarm_cost),
    missCost: String(settings.default_miss_cost),
  };
}

export function sameDraft(a: SettingsDraft, b: SettingsDraft): boolean {
  return (Object.keys(a) as (keyof SettingsDraft)[]).every((k) => a[k] === b[k]);
}

/** A typed number, or null when the box is empty or does not hold a number. */
export function numberIn(text: string): number | null {
  return readDecimal(text);
}

export interface PatchResult {
  /** What can be sent: every field the form could read (the others are left out). */
  patch: Request<'updateSettings'>;
  /** Field (request path) → what is wrong with it, for boxes the form could not read. */
  errors: Record<string, string>;
}

/**
 * Field names are the request's paths, so the diary's `field: reason` lines land on the same
 * fields. The form runs the diary's own rules (the contract schema) on `patch` before
 * sending, so every problem is shown at once.
 */
export function patchFrom(draft: SettingsDraft, locale = userLocale()): PatchResult {
  const errors: Record<string, string> = {};
  const patch: Request<'updateSettings'> = {};
  const need = (field: string, text: string, what: string): number | undefined => {
    const n = numberIn(text);
    if (n === null) errors[field] = text.trim() === '' ? `enter ${what}` : `must be a number (${what})`;
    return n ?? undefined;
  };
  const put = <K extends keyof Request<'updateSettings'>>(key: K, value: Request<'updateSettings'>[K] | undefined) => {
    if (value !== undefined) patch[key] = value;
  };
  put('default_checkin_days', need('default_checkin_days', draft.checkinDays, 'a number of days, or 0 for no check-ins'));
  put('closing_soon_hours', need('closing_soon_hours', draft.closingSoonHours, 'a number of hours'));
  put('overdue_after_days', need('overdue_after_days', draft.overdueAfterDays, 'a number of days'));
  put('default_false_alarm_cost', need('default_false_alarm_cost', draft.falseAlarmCost, 'a cost greater than 0'));
  put('default_miss_cost', need('default_miss_cost', draft.missCost, 'a cost greater than 0'));
  if (draft.quietOn) {
    // Read as every time box reads a time, in the user's own clock; sent as the diary's HH:MM.
    const time = (field: string, text: string, what: string): string | undefined => {
      if (text.trim() === '') {
        errors[field] = `enter when quiet hours ${what}`;
        return undefined;
      }
      const read = quietTimeValue(text, locale);
      if (!read.ok) errors[field] = read.error;
      return read.ok ? read.value : undefined;
    };
    const start = time('quiet_hours.start', draft.quietStart, 'start');
    const end = time('quiet_hours.end', draft.quietEnd, 'end');
    // The diary reads equal times as no quiet hours at all (docs/diary-file.md); with the box
    // ticked the user meant some, so the form says so rather than save a setting that holds nothing.
    if (start !== undefined && start === end) {
      errors['quiet_hours.end'] = 'must differ from Quiet from: the same start and end would hold nothing; choose another time, or untick quiet hours';
    }
    if (start !== undefined && end !== undefined) patch.quiet_hours = { start, end };
  } else {
    patch.quiet_hours = null;
  }
  if (draft.timeZone.trim() === '') errors.time_zone = 'enter a time zone name such as Europe/London';
  else patch.time_zone = draft.timeZone.trim();
  return { patch, errors };
}
