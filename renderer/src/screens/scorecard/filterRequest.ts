/**
 * What the Scorecard is filtered by, and the `score` request it becomes. Dates are whole days
 * on the diary's clocks (the user thinks "from 1 March", not "from 1 March UTC"), so each
 * bound is sent as the exact instant that day starts or ends in the diary's time zone.
 */
import type { Request } from '../../../../shared/contract';
import { dayRange } from '../../dates';
import { readDecimal } from '../../../../shared/numeric-value';

export interface ScorecardFilter {
  /** '' means every tag. */
  tag: string;
  /** "YYYY-MM-DD" or ''. */
  from: string;
  /** "YYYY-MM-DD" or ''. */
  to: string;
  /** What-if costs as typed ('' when not in use). */
  whatIfFalseAlarm: string;
  whatIfMiss: string;
}


export interface FilterProblems {
  from?: string;
  to?: string;
  whatIfFalseAlarm?: string;
  whatIfMiss?: string;
}

export interface BuiltRequest {
  /** null while any field is unusable; the screen keeps showing the last good answer. */
  request: Request<'score'> | null;
  problems: FilterProblems;
  /** The what-if costs in force, or null when each question's own costs apply. */
  whatIf: { false_alarm: number; miss: number } | null;
}

function parseCost(text: string): { value: number | null; problem?: string } {
  const trimmed = text.trim();
  if (trimmed === '') return { value: null };
  const n = readDecimal(trimmed);
  if (n === null || n <= 0) return { value: null, problem: 'must be a cost greater than 0' };
  return { value: n };
}

export function buildRequest(filter: ScorecardFilter, timeZone: string): BuiltRequest {
  const { from, to, problems: rangeProblems } = dayRange(filter.from, filter.to, timeZone);
  const problems: FilterProblems = { ...rangeProblems };

  const fa = parseCost(filter.whatIfFalseAlarm);
  const miss = parseCost(filter.whatIfMiss);
  if (fa.problem) problems.whatIfFalseAlarm = fa.problem;
  if (miss.problem) problems.whatIfMiss = miss.problem;
  // One cost without the other says nothing about their ratio.
  if (fa.value !== null && miss.value === null && !miss.problem) problems.whatIfMiss = 'give both costs, or clear both';
  if (miss.value !== null && fa.value === null && !fa.problem) problems.whatIfFalseAlarm = 'give both costs, or clear both';
  const whatIf = fa.value !== null && miss.value !== null ? { false_alarm: fa.value, miss: miss.value } : null;

  if (Object.keys(problems).length > 0) return { request: null, problems, whatIf: null };
  return {
    request: {
      ...(filter.tag ? { tag: filter.tag } : {}),
      ...(from !== undefined ? { from } : {}),
      ...(to !== undefined ? { to } : {}),
      ...(whatIf ? { costs: whatIf } : {}),
    },
    problems,
    whatIf,
  };
}

/**
 * The filter as kept in the address (`#/scorecard?tag=…&from=…&to=…&false_alarm=…&miss=…`),
 * so Back, Forward and a reload keep it; what is left out is empty.
 */
export function decodeFilter(query: URLSearchParams): ScorecardFilter {
  return {
    tag: query.get('tag') ?? '',
    from: query.get('from') ?? '',
    to: query.get('to') ?? '',
    whatIfFalseAlarm: query.get('false_alarm') ?? '',
    whatIfMiss: query.get('miss') ?? '',
  };
}

export function encodeFilter(filter: ScorecardFilter): Record<string, string> {
  return { tag: filter.tag, from: filter.from, to: filter.to, false_alarm: filter.whatIfFalseAlarm, miss: filter.whatIfMiss };
}
