/**
 * Field rules shared by the API contract and the diary file: one home for what a valid
 * probability, instant, tag, time zone and title are, each with the message a user sees.
 */
import { z } from 'zod';
import { isValidTimeZone, parseInstant } from './time';

export const TAG_PATTERN = /^[a-z0-9][a-z0-9_\-:./]{0,63}$/;
export const TAG_RULE =
  'a tag is 1–64 lower-case letters, digits or - _ : . / starting with a letter or digit (e.g. client:northgate)';

export const probability = z
  .number({ error: 'must be a number between 0 and 1' })
  .refine((v) => Number.isFinite(v) && v >= 0 && v <= 1, { message: 'must be a probability between 0 and 1' });

const INSTANT_TYPE = 'must be an ISO 8601 date-time text';

/** The instant rule, once: epoch ms of a valid instant text, or the reason it is not one. */
function readInstant(text: string): number | string {
  const ms = parseInstant(text);
  return ms === null ? 'must be an ISO 8601 date-time with an offset or Z, e.g. 2026-03-31T17:00:00+01:00' : ms;
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

export const tag = z.string({ error: 'must be text' }).refine((v) => TAG_PATTERN.test(v), { message: `is not a valid tag: ${TAG_RULE}` });

export const tags = z
  .array(tag, { error: 'must be a list of tags' })
  .max(32, { message: 'at most 32 tags per question' })
  .refine((list) => new Set(list).size === list.length, { message: 'lists the same tag twice' });

export const timeZone = z
  .string({ error: 'must be an IANA time zone name' })
  .refine(isValidTimeZone, { message: 'is not a time zone this system knows (use an IANA name such as Europe/London)' });

export const title = z
  .string({ error: 'must be text' })
  .trim()
  .min(1, { message: 'must not be empty' })
  .max(300, { message: 'must be at most 300 characters' });

export const note = z.string({ error: 'must be text' }).max(20_000, { message: 'must be at most 20,000 characters' });

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
  name: z.string({ error: 'must be text' }).trim().min(1, { message: 'must not be empty' }).max(80),
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

export const hhmm = z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, { message: 'must be a time of day HH:MM (24-hour)' });

/** Turns a zod error into one line per problem: `field.path: reason`. */
export function describeIssues(error: z.ZodError, prefix = ''): string[] {
  return error.issues.map((issue) => {
    const path = formatPath(issue.path);
    const field = prefix && path ? `${prefix}.${path}` : prefix || path;
    return field ? `${field}: ${issue.message}` : issue.message;
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
