/**
 * The Questions table, drawn only where it is on screen: the page scrolls over the full
 * height of every matching row, but only the rows in view (and a few either side) exist in
 * the document, so 100,000 questions cost what 30 do. Screen readers still hear the whole
 * table: `aria-rowcount` gives the number of rows, each drawn row its `aria-rowindex`.
 * Spacer rows above and below keep the scroll height; they are hidden from assistive tech.
 *
 * Column headers are buttons that sort (again: reverse), with `aria-sort` on the sorted one.
 */
import { useEffect, useLayoutEffect, useRef, useState, type MouseEvent } from 'react';
import { useWindowVirtualizer, type VirtualItem } from '@tanstack/react-virtual';
import type { ListSort } from '../../../../shared/contract';
import { StatusPill } from '../../components/StatusPill';
import { formatInstant } from '../../dates';
import { formatPercent } from '../../percent';
import { lastForecastText, resolvedText } from '../../questionTypes/summaries';
import { hrefTo, navigate, questionPath } from '../../routing';
import { countCaption, type ListQuery } from './listQuery';
import type { QuestionPages } from './useQuestionPages';

/** A row's height before it is measured (one line of title and one of tags). */
const ESTIMATED_ROW_PX = 66;

/**
 * The row heights measured when the table last went away, for the list it showed: coming back
 * to the same list draws every row at the height it had, so the remembered scroll offset
 * lands on the same rows.
 */
let measured: { key: string; cache: VirtualItem[] } | null = null;

const COLUMNS: readonly { sort: ListSort; label: string; className?: string }[] = [
  { sort: 'title', label: 'Question' },
  { sort: 'status', label: 'Status' },
  { sort: 'closes', label: 'Closes' },
  { sort: 'last_p', label: 'Last forecast', className: 'num' },
  { sort: 'base_rate', label: 'Base rate', className: 'num' },
];

export interface QuestionTableProps {
  pages: QuestionPages;
  query: ListQuery;
  busy: boolean;
  onSort: (sort: ListSort) => void;
}

export function QuestionTable({ pages, query, busy, onSort }: QuestionTableProps) {
  const bodyRef = useRef<HTMLTableSectionElement>(null);
  const [margin, setMargin] = useState(0);
  useLayoutEffect(() => {
    const body = bodyRef.current;
    if (body) setMargin(body.getBoundingClientRect().top + window.scrollY);
  });
  const [initial] = useState(() => (measured?.key === pages.key ? measured.cache : undefined));
  const virtualizer = useWindowVirtualizer({
    count: pages.matched,
    initialMeasurementsCache: initial,
    estimateSize: () => ESTIMATED_ROW_PX,
    overscan: 8,
    scrollMargin: margin,
    getItemKey: (index) => pages.rowAt(index)?.id ?? `row-${index}`,
  });
  const keyRef = useRef(pages.key);
  keyRef.current = pages.key;
  useEffect(() => () => {
    if (keyRef.current !== null) measured = { key: keyRef.current, cache: virtualizer.measurementsCache };
  }, [virtualizer]);
  const items = virtualizer.getVirtualItems();
  const first = items[0]?.index ?? 0;
  const last = items[items.length - 1]?.index ?? 0;
  useLayoutEffect(() => {
    if (items.length) pages.want(first, last);
  }, [first, last, items.length, pages]);

  const before = items.length ? items[0]!.start - margin : 0;
  const after = items.length ? virtualizer.getTotalSize() - (items[items.length - 1]!.end - margin) : 0;
  const caption = countCaption(pages.matched, pages.total);

  return (
    <div className="table-card" aria-busy={busy || undefined}>
      <table className="question-table" data-testid="question-table" aria-rowcount={pages.matched + 1}>
        <caption className="table-card__caption">
          {caption}
          {query.sort === 'attention' ? <span className="question-table__order"> · most in need of attention first</span> : null}
        </caption>
        <colgroup>
          <col />
          <col className="question-table__status" />
          <col className="question-table__closes" />
          <col className="question-table__last" />
          <col className="question-table__num" />
        </colgroup>
        <thead>
          <tr aria-rowindex={1}>
            {COLUMNS.map((c) => {
              const sorted = query.sort === c.sort;
              return (
                <th key={c.sort} scope="col" className={c.className} aria-sort={sorted ? (query.direction === 'asc' ? 'ascending' : 'descending') : undefined}>
                  <button type="button" className="sort-button" onClick={() => onSort(c.sort)}>
                    {c.label}
                    <span className="sort-button__mark" aria-hidden="true">
                      {sorted ? (query.direction === 'asc' ? '▲' : '▼') : '↕'}
                    </span>
                  </button>
                </th>
              );
            })}
          </tr>
        </thead>
        <tbody ref={bodyRef}>
          {before > 0 ? (
            <tr aria-hidden="true" className="question-table__spacer">
              <td colSpan={COLUMNS.length} style={{ height: before }} />
            </tr>
          ) : null}
          {items.map((item) => {
            const q = pages.rowAt(item.index);
            if (!q) {
              return (
                <tr key={item.key} data-index={item.index} ref={virtualizer.measureElement} aria-rowindex={item.index + 2} className="question-row--loading">
                  <td colSpan={COLUMNS.length}>
                    <span className="muted">Loading…</span>
                  </td>
                </tr>
              );
            }
            return (
              <tr
                key={item.key}
                data-index={item.index}
                ref={virtualizer.measureElement}
                aria-rowindex={item.index + 2}
                className="question-row"
                onClick={(event) => openRow(event, q.id)}
              >
                <td>
                  <a href={hrefTo(questionPath(q.id))} className="question-row__title">
                    {q.title}
                  </a>
                  {q.tags.length > 0 ? (
                    <span className="question-row__tags">
                      <span className="visually-hidden">Tags: </span>
                      {q.tags.join(' · ')}
                    </span>
                  ) : null}
                </td>
                <td>
                  <StatusPill status={q.status} outcome={q.outcome} resolved={resolvedText(q)} />
                </td>
                <td>
                  <time dateTime={q.closes_at}>{formatInstant(q.closes_at, q.time_zone)}</time>
                </td>
                <td className="num">{lastForecastText(q)}</td>
                <td className="num">{formatPercent(q.base_rate)}</td>
              </tr>
            );
          })}
          {after > 0 ? (
            <tr aria-hidden="true" className="question-table__spacer">
              <td colSpan={COLUMNS.length} style={{ height: after }} />
            </tr>
          ) : null}
        </tbody>
      </table>
    </div>
  );
}

/** A click anywhere on a row opens the question; the title link is the keyboard route. */
function openRow(event: MouseEvent, id: string) {
  if ((event.target as HTMLElement).closest('a, button')) return;
  navigate(questionPath(id));
}
