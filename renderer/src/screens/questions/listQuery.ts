/**
 * What the Questions list shows — search text, status, tag and order — as it is kept in the
 * address (`#/questions?q=…&status=…&tag=…&sort=…&dir=…`), so Back, Forward and a reload
 * keep it. The last one used, with how far the list was scrolled, is also remembered for the
 * session, so coming back to Questions from the navigation bar finds the list as it was left.
 */
import { LIST_SORTS, type ListSort, type SortDirection } from '../../../../shared/contract';
import { QUESTION_STATUSES, type QuestionStatus } from '../../../../shared/domain';
import { formatCount } from '../../dates';
import { plural } from '../../tools/format';

export type StatusFilter = QuestionStatus | 'all';

export interface ListQuery {
  text: string;
  status: StatusFilter;
  tag: string;
  sort: ListSort;
  direction: SortDirection;
}

export const DEFAULT_QUERY: ListQuery = { text: '', status: 'all', tag: '', sort: 'attention', direction: 'asc' };

export function decodeListQuery(query: URLSearchParams): ListQuery {
  const status = query.get('status') ?? '';
  const sort = query.get('sort') ?? '';
  return {
    text: query.get('q') ?? '',
    status: (QUESTION_STATUSES as readonly string[]).includes(status) ? (status as QuestionStatus) : 'all',
    tag: query.get('tag') ?? '',
    sort: (LIST_SORTS as readonly string[]).includes(sort) ? (sort as ListSort) : 'attention',
    direction: query.get('dir') === 'desc' ? 'desc' : 'asc',
  };
}

export function encodeListQuery(q: ListQuery): Record<string, string> {
  return {
    q: q.text,
    status: q.status === 'all' ? '' : q.status,
    tag: q.tag,
    sort: q.sort === 'attention' ? '' : q.sort,
    dir: q.direction === 'asc' ? '' : 'desc',
  };
}

export function isFiltered(q: ListQuery): boolean {
  return q.text.trim() !== '' || q.status !== 'all' || q.tag !== '';
}

/** The order a column header asks for when it is not yet the sort: text and dates A→Z / soonest first. */
export function nextSort(current: ListQuery, sort: ListSort): Pick<ListQuery, 'sort' | 'direction'> {
  if (current.sort === sort) return { sort, direction: current.direction === 'asc' ? 'desc' : 'asc' };
  return { sort, direction: 'asc' };
}

/** The last list state of this window's session: the address query and the scroll offset. */
let remembered: { search: string; scrollY: number } | null = null;

export function rememberList(search: string, scrollY: number): void {
  remembered = { search, scrollY };
}

export function rememberedList(): { search: string; scrollY: number } | null {
  return remembered;
}

/** The list's count line: "1 question", "45 questions", or "3 of 45 questions" while filtered. */
export function countCaption(matched: number, total: number, locale?: string): string {
  if (matched === total) return plural(total, 'question', 'questions', locale);
  return `${formatCount(matched, locale)} of ${plural(total, 'question', 'questions', locale)}`;
}
