/**
 * The Settings form keeps what the user typed as text; on save it becomes a settings patch.
 * The form checks only what it alone can know (a box left empty, text that is not a
 * number); ranges and formats are the diary's to judge, and its reasons come back per field.
 */
import type { Request } from '../../../../shared/contract';
import type { Settings } from '../../../../shared/domain';

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

export function draftFrom(settings: Settings): SettingsDraft {
  return {
    checkinDays: String(settings.default_checkin_days),
    closingSoonHours: String(settings.closing_soon_hours),
    overdueAfterDays: String(settings.overdue_after_days),
    quietOn: settings.quiet_hours !== null,
    quietStart: settings.quiet_hours?.start ?? DEFAULT_QUIET.start,
    quietEnd: settings.quiet_hours?.end ?? DEFAULT_QUIET.end,
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
  if (text.trim() === '') return null;
  const n = Number(text);
  return Number.isFinite(n) ? n : null;
}

export type PatchResult = { ok: true; patch: Request<'updateSettings'> } | { ok: false; errors: Record<string, string> };

/** Field names are the request's paths, so the diary's `field: reason` lines land on the same fields. */
export function patchFrom(draft: SettingsDraft): PatchResult {
  const errors: Record<string, string> = {};
  const need = (field: string, text: string, what: string): number => {
    const n = numberIn(text);
    if (n === null) errors[field] = text.trim() === '' ? `enter ${what}` : `must be a number (${what})`;
    return n ?? 0;
  };
  const default_checkin_days = need('default_checkin_days', draft.checkinDays, 'a number of days, or 0 for no check-ins');
  const closing_soon_hours = need('closing_soon_hours', draft.closingSoonHours, 'a number of hours');
  const overdue_after_days = need('overdue_after_days', draft.overdueAfterDays, 'a number of days');
  const default_false_alarm_cost = need('default_false_alarm_cost', draft.falseAlarmCost, 'a cost greater than 0');
  const default_miss_cost = need('default_miss_cost', draft.missCost, 'a cost greater than 0');
  if (draft.quietOn) {
    if (draft.quietStart.trim() === '') errors['quiet_hours.start'] = 'enter when quiet hours start (HH:MM)';
    if (draft.quietEnd.trim() === '') errors['quiet_hours.end'] = 'enter when quiet hours end (HH:MM)';
  }
  if (draft.timeZone.trim() === '') errors.time_zone = 'enter a time zone name such as Europe/London';
  if (Object.keys(errors).length > 0) return { ok: false, errors };
  return {
    ok: true,
    patch: {
      default_checkin_days,
      closing_soon_hours,
      overdue_after_days,
      default_false_alarm_cost,
      default_miss_cost,
      time_zone: draft.timeZone.trim(),
      quiet_hours: draft.quietOn ? { start: draft.quietStart.trim(), end: draft.quietEnd.trim() } : null,
    },
  };
}
