/**
 * What the Hindsight screen is asked to show, and the `hindsight` request it becomes. The
 * threshold is typed in percent (50–99); dates are whole days on the diary's clocks (the user
 * thinks "windows that ended in March", not "in March UTC"), so each bound is sent as the
 * instant that day starts or ends in the diary's time zone.
 */
import type { Request } from '../../../../shared/contract';
import { dayRange } from '../../dates';
import { readDecimal } from '../../../../shared/numeric-value';

export interface HindsightSelection {
  /** '' means every tag. */
  tag: string;
  /** "Confident at", in percent as typed. */
  threshold: string;
  /** "YYYY-MM-DD" or ''. */
  from: string;
  /** "YYYY-MM-DD" or ''. */
  to: string;
  includeHits: boolean;
}

/** 80 %: INTERFACES.md's confident-miss rule, the one the scorecard's own list uses. */
export const DEFAULT_THRESHOLD_PERCENT = 80;
export const MIN_THRESHOLD_PERCENT = 50;
export const MAX_THRESHOLD_PERCENT = 99;

export const INITIAL_SELECTION: HindsightSelection = {
  tag: '',
  threshold: String(DEFAULT_THRESHOLD_PERCENT),
  from: '',
  to: '',
  includeHits: false,
};

export interface SelectionProblems {
  threshold?: string;
  from?: string;
  to?: string;
}

export interface BuiltSelection {
  /** null while any field is unusable; the screen keeps showing the last good answer. */
  request: Request<'hindsight'> | null;
  problems: SelectionProblems;
}

/** Percent text → threshold as a probability, or the reason it cannot be one. */
export function parseThreshold(text: string): { value: number } | { problem: string } {
  const trimmed = text.trim();
  const n = readDecimal(trimmed);
  if (n === null) return { problem: `must be a percentage from ${MIN_THRESHOLD_PERCENT} to ${MAX_THRESHOLD_PERCENT}` };
  if (n < MIN_THRESHOLD_PERCENT || n > MAX_THRESHOLD_PERCENT) {
    return { problem: `must be from ${MIN_THRESHOLD_PERCENT}% to ${MAX_THRESHOLD_PERCENT}%` };
  }
  // 85 / 100 is 0.85 exactly as typed; rounding removes binary noise such as 0.5700000000000001.
  return { value: Number((n / 100).toPrecision(12)) };
}

export function buildSelection(selection: HindsightSelection, timeZone: string): BuiltSelection {
  const { from, to, problems: rangeProblems } = dayRange(selection.from, selection.to, timeZone);
  const problems: SelectionProblems = { ...rangeProblems };
  const threshold = parseThreshold(selection.threshold);
  if ('problem' in threshold) problems.threshold = threshold.problem;
  if (Object.keys(problems).length > 0 || 'problem' in threshold) return { request: null, problems };
  return {
    request: {
      ...(selection.tag ? { tag: selection.tag } : {}),
      ...(from !== undefined ? { from } : {}),
      ...(to !== undefined ? { to } : {}),
      threshold: threshold.value,
      include_hits: selection.includeHits,
    },
    problems,
  };
}

/** A file name that is safe on every desktop system: "client:northgate" → "client-northgate". */
export function briefingFileName(tag: string): string {
  const slug = tag
    .normalize('NFKD')
    .replace(/[^A-Za-z0-9._-]+/g, '-')
    .replace(/^[-.]+|[-.]+$/g, '');
  return `forelog-briefing-${slug || 'whole-diary'}.html`;
}

/**
 * The selection as kept in the address (`#/hindsight?tag=…&confident=…&from=…&to=…&hits=1`),
 * so Back, Forward and a reload keep it; what is left out is the initial choice.
 */
export function decodeSelection(query: URLSearchParams): HindsightSelection {
  return {
    tag: query.get('tag') ?? INITIAL_SELECTION.tag,
    threshold: query.get('confident') ?? INITIAL_SELECTION.threshold,
    from: query.get('from') ?? INITIAL_SELECTION.from,
    to: query.get('to') ?? INITIAL_SELECTION.to,
    includeHits: query.get('hits') === '1',
  };
}

export function encodeSelection(selection: HindsightSelection): Record<string, string> {
  return {
    tag: selection.tag,
    confident: selection.threshold === INITIAL_SELECTION.threshold ? '' : selection.threshold,
    from: selection.from,
    to: selection.to,
    hits: selection.includeHits ? '1' : '',
  };
}
