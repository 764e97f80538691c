/**
 * The diary file, JSON version 1 (INTERFACES.md §1): its schema for import and its shape
 * for export. Import is all-or-nothing, so `parseDiaryFile` either returns every record
 * or throws naming the first bad record's index, the field and the reason.
 */
import { z } from 'zod';
import { OUTCOMES, type Question, type Settings } from './domain';
import * as v from './validation';

export const DIARY_FORMAT = 'forelog-diary';
export const DIARY_VERSION = 1;

const fileForecast = z.object({
  at: v.instant,
  p: v.probability,
  note: v.note.optional(),
  lenses: v.lenses.optional(),
});

const fileReference = z.object({
  at: v.instant,
  p: v.probability,
  source: v.source,
});

const fileResolution = z.object({
  outcome: z.enum(OUTCOMES as [string, ...string[]], { error: 'must be yes, no or void' }),
  at: v.instant,
  note: v.note.optional(),
});

export const fileQuestion = z
  .object({
    id: v.id().optional(),
    ...v.questionFields,
    forecasts: z.array(fileForecast, { error: 'must be a list of forecasts' }),
    references: z.array(fileReference, { error: 'must be a list of reference forecasts' }).optional(),
    resolution: fileResolution.nullable().optional(),
  })
  .refine(...v.closesAfterOpens);

export type FileQuestion = z.output<typeof fileQuestion>;

const fileSettings = z
  .object({
    default_false_alarm_cost: v.positiveCost.optional(),
    default_miss_cost: v.positiveCost.optional(),
    default_checkin_days: v.checkinDays.optional(),
    closing_soon_hours: z.number().int().min(1).max(24 * 14).optional(),
    overdue_after_days: z.number().int().min(0).max(90).optional(),
    time_zone: v.timeZone.optional(),
    quiet_hours: z.object({ start: v.hhmm, end: v.hhmm }).nullable().optional(),
  })
  .passthrough();

export type FileSettings = z.output<typeof fileSettings>;

export interface ParsedDiary {
  settings: FileSettings | null;
  questions: FileQuestion[];
}

export class DiaryFileError extends Error {
  constructor(
    message: string,
    readonly record: number | null,
    readonly field: string | null,
  ) {
    super(message);
    this.name = 'DiaryFileError';
  }
}

/** Validates a whole diary file (already JSON-parsed). Throws DiaryFileError on the first bad record. */
export function parseDiaryFile(raw: unknown): ParsedDiary {
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) {
    throw new DiaryFileError('This is not a Forelog diary file: expected a JSON object with "format": "forelog-diary".', null, null);
  }
  const top = raw as Record<string, unknown>;
  if (top.format !== DIARY_FORMAT) {
    throw new DiaryFileError(`This is not a Forelog diary file: "format" must be "${DIARY_FORMAT}".`, null, 'format');
  }
  if (top.version !== DIARY_VERSION) {
    throw new DiaryFileError(
      `This diary file is version ${JSON.stringify(top.version)}; this Forelog reads version ${DIARY_VERSION}. Update Forelog to import it.`,
      null,
      'version',
    );
  }
  let settings: FileSettings | null = null;
  if (top.settings !== undefined && top.settings !== null) {
    const s = fileSettings.safeParse(top.settings);
    if (!s.success) {
      const line = v.describeIssues(s.error, 'settings')[0]!;
      throw new DiaryFileError(`The settings are not valid: ${line}. Nothing was imported.`, null, line.split(':')[0]!);
    }
    settings = s.data;
  }
  if (!Array.isArray(top.questions)) {
    throw new DiaryFileError('"questions" must be a list (it may be empty).', null, 'questions');
  }
  const questions: FileQuestion[] = [];
  const ids = new Set<string>();
  top.questions.forEach((item, index) => {
    const r = fileQuestion.safeParse(item);
    if (!r.success) {
      const issue = r.error.issues[0]!;
      const field = v.formatPath(issue.path) || '(record)';
      throw new DiaryFileError(
        `Question record ${index} is not valid: field ${field}: ${issue.message}. Nothing was imported.`,
        index,
        field,
      );
    }
    if (r.data.id !== undefined) {
      if (ids.has(r.data.id)) {
        throw new DiaryFileError(
          `Question record ${index} is not valid: field id: "${r.data.id}" is used by an earlier record. Nothing was imported.`,
          index,
          'id',
        );
      }
      ids.add(r.data.id);
    }
    questions.push(r.data);
  });
  return { settings, questions };
}

/** The export shape of one question; optional fields are written only when set. */
export function toFileQuestion(q: Question): Record<string, unknown> {
  const out: Record<string, unknown> = {
    id: q.id,
    title: q.title,
    rule: q.rule,
    kind: q.kind,
    tags: q.tags,
    opened_at: q.opened_at,
    closes_at: q.closes_at,
    time_zone: q.time_zone,
  };
  if (q.base_rate !== null) out.base_rate = q.base_rate;
  if (q.base_rate_note) out.base_rate_note = q.base_rate_note;
  if (q.costs) out.costs = { false_alarm: q.costs.false_alarm, miss: q.costs.miss };
  if (q.checkin_days !== null) out.checkin_days = q.checkin_days;
  out.forecasts = q.forecasts.map((f) => {
    const item: Record<string, unknown> = { at: f.at, p: f.p, note: f.note };
    if (f.lenses.length) item.lenses = f.lenses.map((l) => ({ name: l.name, p: l.p, weight: l.weight }));
    return item;
  });
  out.references = q.references.map((r) => ({ at: r.at, p: r.p, source: r.source }));
  out.resolution = q.resolution ? { outcome: q.resolution.outcome, at: q.resolution.at, note: q.resolution.note } : null;
  return out;
}

export function toDiaryFile(settings: Settings, questions: Question[]): Record<string, unknown> {
  return {
    format: DIARY_FORMAT,
    version: DIARY_VERSION,
    settings: { ...settings },
    questions: questions.map(toFileQuestion),
  };
}
