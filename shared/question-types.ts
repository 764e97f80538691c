/**
 * What a question's type allows (INTERFACES.md "Question types"; SCORING.md): which fields
 * a question of each type carries, and what its forecasts, references and resolution
 * give. One home for these rules, read by the API contract (shared/contract.ts), the
 * diary file (shared/diary-file.ts) and the service (which alone knows a stored
 * question's type when a request names it by id).
 *
 * Each check returns issues `{ path, message }`; the message reads after the field's name
 * ("probs: must give one probability per option (3), not 2").
 */
import { optionIndexProblem } from './choice-vector';
import type { AnyOutcome, QuestionType, ValueKind } from './domain';
import { numericValueProblem } from './numeric-value';
import { DEFAULT_QUANTILE_LEVELS, quantilesProblem } from './quantile-levels';

export interface TypeIssue {
  path: (string | number)[];
  message: string;
}

/** The type fields of a question as a request or a file record gives them (absent = default). */
export interface TypeFields {
  type?: string;
  base_rate?: number | null;
  costs?: unknown;
  options?: string[];
  ordered?: boolean;
  option_base_rates?: number[] | null;
  unit?: string;
  value_kind?: string;
  levels?: number[];
}

/** What a question's type makes of its forecasts, references and resolution. */
export type TypeShape =
  | { type: 'binary' }
  | { type: 'choice'; option_count: number }
  | { type: 'numeric'; levels: readonly number[]; value_kind: ValueKind };

const TYPE_NAME: Record<QuestionType, string> = { binary: 'a yes/no question', choice: 'a choice question', numeric: 'a numeric question' };

/** Which fields belong to which type only (the others apply to every type). */
const ONLY: Record<string, { type: QuestionType; nullAllowed: boolean }> = {
  base_rate: { type: 'binary', nullAllowed: true },
  costs: { type: 'binary', nullAllowed: true },
  options: { type: 'choice', nullAllowed: false },
  ordered: { type: 'choice', nullAllowed: false },
  option_base_rates: { type: 'choice', nullAllowed: true },
  unit: { type: 'numeric', nullAllowed: false },
  value_kind: { type: 'numeric', nullAllowed: false },
  levels: { type: 'numeric', nullAllowed: false },
};

/** The question's type, `binary` when it does not say. */
export function typeOf(q: { type?: string }): QuestionType {
  return (q.type ?? 'binary') as QuestionType;
}

/**
 * Fields of another type on a question record, and a choice question's options and
 * option base rates that do not agree. Assumes each field already passed its own rule
 * (shared/validation.ts).
 */
export function questionTypeIssues(q: TypeFields): TypeIssue[] {
  const type = typeOf(q);
  const issues: TypeIssue[] = [];
  for (const [field, only] of Object.entries(ONLY)) {
    const value = (q as Record<string, unknown>)[field];
    if (value === undefined || (value === null && only.nullAllowed) || only.type === type) continue;
    issues.push({ path: [field], message: `applies to ${TYPE_NAME[only.type].slice(2)}s only; this is ${TYPE_NAME[type]}` });
  }
  if (type === 'choice') {
    if (q.options === undefined) issues.push({ path: ['options'], message: 'are required for a choice question: 2 to 12 labels' });
    else if (q.option_base_rates && q.option_base_rates.length !== q.options.length) {
      issues.push({ path: ['option_base_rates'], message: `must give one base rate per option (${q.options.length}), not ${q.option_base_rates.length}` });
    }
  }
  return issues;
}

/** The shape of a question whose fields passed `questionTypeIssues`, with the defaults filled in. */
export function shapeOf(q: TypeFields): TypeShape {
  const type = typeOf(q);
  if (type === 'choice') return { type, option_count: q.options?.length ?? 0 };
  if (type === 'numeric') return { type, levels: q.levels ?? DEFAULT_QUANTILE_LEVELS, value_kind: (q.value_kind ?? 'number') as ValueKind };
  return { type };
}

/** A forecast or a reference as given: the probability, the vector or the quantiles, and (forecasts) lenses. */
export interface EntryFields {
  p?: number;
  probs?: number[];
  quantiles?: (number | string)[];
  lenses?: unknown[];
}

const VALUE_FIELD: Record<QuestionType, 'p' | 'probs' | 'quantiles'> = { binary: 'p', choice: 'probs', numeric: 'quantiles' };
const VALUE_DESCRIPTION: Record<QuestionType, string> = {
  binary: 'a probability p between 0 and 1',
  choice: 'probs, one probability per option',
  numeric: 'quantiles, one value per level',
};

/**
 * Whether a forecast or reference fits the question: it gives its type's value field (and
 * no other type's), the right number of entries, values of the question's kind; lenses
 * only on yes/no forecasts. `required` is false when editing (the value may be left as it is).
 */
export function entryIssues(shape: TypeShape, entry: EntryFields, required = true): TypeIssue[] {
  const issues: TypeIssue[] = [];
  const own = VALUE_FIELD[shape.type];
  for (const field of ['p', 'probs', 'quantiles'] as const) {
    if (field === own || entry[field] === undefined) continue;
    issues.push({ path: [field], message: `does not apply: ${TYPE_NAME[shape.type]} takes ${VALUE_DESCRIPTION[shape.type]}` });
  }
  if (entry.lenses !== undefined && shape.type !== 'binary') {
    issues.push({ path: ['lenses'], message: `apply to yes/no questions only; this is ${TYPE_NAME[shape.type]}` });
  }
  if (entry[own] === undefined) {
    if (required) issues.push({ path: [own], message: `is required: ${TYPE_NAME[shape.type]} takes ${VALUE_DESCRIPTION[shape.type]}` });
    return issues;
  }
  if (shape.type === 'choice') {
    // The count against the question; each entry and the sum are the field's own rule (shared/validation.ts probs).
    if (entry.probs!.length !== shape.option_count) {
      issues.push({ path: ['probs'], message: `must give one probability per option (${shape.option_count}), not ${entry.probs!.length}` });
    }
  } else if (shape.type === 'numeric') {
    issues.push(...quantileIssues(shape, entry.quantiles!));
  }
  return issues;
}

function quantileIssues(shape: Extract<TypeShape, { type: 'numeric' }>, values: (number | string)[]): TypeIssue[] {
  if (values.length !== shape.levels.length) {
    return [{ path: ['quantiles'], message: quantilesProblem(values.map(() => 0), shape.levels.length)! }];
  }
  const issues: TypeIssue[] = [];
  values.forEach((value, i) => {
    const problem = kindProblem(value, shape.value_kind);
    if (problem) issues.push({ path: ['quantiles', i], message: problem });
  });
  return issues;
}

/**
 * Whether a value is of the question's kind: a number for `number`, a `YYYY-MM-DD` text for
 * `date`. That the number is finite and the date real is the field's own rule
 * (shared/validation.ts numericValue), checked before this.
 */
function kindProblem(value: unknown, kind: ValueKind): string | null {
  const want = kind === 'date' ? 'string' : 'number';
  return typeof value === want ? null : numericValueProblem(value, kind);
}

/** A resolution as given: the outcome and, for its type, the option or the value. */
export interface ResolutionFields {
  outcome: string;
  option?: number | null;
  value?: number | string | null;
}

const OUTCOMES_OF: Record<QuestionType, readonly AnyOutcome[]> = {
  binary: ['yes', 'no', 'void'],
  choice: ['option', 'void'],
  numeric: ['value', 'void'],
};

/**
 * Whether a resolution fits the question: an outcome of its type (yes/no/void; option or
 * void with `option`; value or void with `value`), the option one of its options, the
 * value of its kind.
 */
export function resolutionIssues(shape: TypeShape, r: ResolutionFields): TypeIssue[] {
  const allowed = OUTCOMES_OF[shape.type];
  if (!allowed.includes(r.outcome as AnyOutcome)) {
    return [{ path: ['outcome'], message: `must be ${allowed.join(' or ')} for ${TYPE_NAME[shape.type]} (got ${r.outcome})` }];
  }
  const issues = resolutionPairingIssues(r);
  if (issues.length > 0) return issues;
  if (shape.type === 'choice' && r.outcome === 'option') {
    const problem = optionIndexProblem(r.option!, shape.option_count);
    if (problem) issues.push({ path: ['option'], message: problem });
  }
  if (shape.type === 'numeric' && r.outcome === 'value') {
    const problem = kindProblem(r.value, shape.value_kind);
    if (problem) issues.push({ path: ['value'], message: problem });
  }
  return issues;
}

/** Whatever the question: `option` comes with outcome option and only then, `value` with outcome value and only then. */
export function resolutionPairingIssues(r: ResolutionFields): TypeIssue[] {
  const issues: TypeIssue[] = [];
  const option = r.option ?? undefined;
  const value = r.value ?? undefined;
  if (r.outcome === 'option' && option === undefined) {
    issues.push({ path: ['option'], message: 'is required with outcome option: the 0-based index of the option that came true' });
  }
  if (r.outcome !== 'option' && option !== undefined) issues.push({ path: ['option'], message: 'goes only with outcome option' });
  if (r.outcome === 'value' && value === undefined) {
    issues.push({ path: ['value'], message: 'is required with outcome value: the value the question took' });
  }
  if (r.outcome !== 'value' && value !== undefined) issues.push({ path: ['value'], message: 'goes only with outcome value' });
  return issues;
}
