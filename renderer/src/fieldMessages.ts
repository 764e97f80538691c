/**
 * The diary's reasons in the user's words. The diary (shared/contract) answers a refused
 * request with `field.path: reason` lines; a form shows each reason beside the field it
 * names, as a sentence, without the request's internal names ("opened_at"): those become
 * the field's label, or plain words. Forms also run the same contract schema themselves
 * before sending (`schemaReasons`), so everything wrong is reported at once.
 */
import type { ZodType } from 'zod';
import { describeIssues } from '../../shared/validation';
import { fieldReasons } from './api/errors';
import { clockTimesAsShown, userLocale } from './dates';

export interface FieldPlacement {
  /** Field names the form shows (request paths, e.g. "closes_at", "first_forecast.p"). */
  fields: readonly string[];
  /** The label each field shows, for naming it in plain words. */
  labels?: Readonly<Record<string, string>>;
  /** Request-path prefix to drop before matching, e.g. "changes" for updateQuestion. */
  prefix?: string;
  /** Request paths shown by another field, e.g. { opened_at: 'closes_at' }. */
  aliases?: Readonly<Record<string, string>>;
}

const SNAKE = /\b[a-z]+(?:_[a-z]+)+\b/g;

/** "opened_at" → "opened at" when no label is known. */
function words(name: string): string {
  return name.replaceAll('_', ' ').replaceAll('.', ' ');
}

/** A field path's name for people: its label, else its words ("default_miss_cost" → "default miss cost"). */
export function fieldName(path: string, labels: Readonly<Record<string, string>> = {}): string {
  return labels[path] ?? words(path);
}

/**
 * A reason as a sentence in plain words: internal names in brackets go ("must be after the
 * opening time (opened_at)" → "Must be after the opening time"), others become labels or
 * words, and a reason that starts with a verb gets a subject ("is not a valid tag…" →
 * "This is not a valid tag…"); the diary's times ("2026-09-24 08:48 Europe/London") are
 * written as the window writes dates.
 */
export function plainReason(reason: string, labels: Readonly<Record<string, string>> = {}, locale = userLocale()): string {
  // Times first, so a zone name's underscore ("America/New_York") is not read as an internal name.
  let text = clockTimesAsShown(reason, locale).replace(/\s*\(([a-z]+(?:_[a-z]+)+)\)/g, '');
  text = text.replace(SNAKE, (name) => (labels[name] ? `“${labels[name]}”` : words(name))).trim();
  if (/^(is|lists|has|was)\b/.test(text)) text = `This ${text}`;
  return text.charAt(0).toUpperCase() + text.slice(1);
}

export interface Placed {
  /** Field → message, for the fields the form shows. */
  shown: Map<string, string>;
  /** "Label: message" lines for anything else. */
  elsewhere: string[];
}

/** Puts each `field: reason` line beside its field, in plain words. */
export function placeReasons(lines: readonly string[], placement: FieldPlacement): Placed {
  const shown = new Map<string, string>();
  const elsewhere: string[] = [];
  const labels = placement.labels ?? {};
  for (const [field, reason] of fieldReasons(lines, placement.prefix)) {
    const target = placement.aliases?.[field] ?? field;
    const message = plainReason(reason, labels);
    if (placement.fields.includes(target)) {
      const before = shown.get(target);
      shown.set(target, before ? `${before}; ${message.charAt(0).toLowerCase()}${message.slice(1)}` : message);
    } else {
      elsewhere.push(field ? `${fieldName(field, labels)}: ${message}` : message);
    }
  }
  return { shown, elsewhere };
}

/** The contract's own `field: reason` lines for a request, as the diary would answer them; none when it passes. */
export function schemaReasons(schema: ZodType, request: unknown): string[] {
  const result = schema.safeParse(request);
  return result.success ? [] : describeIssues(result.error);
}
