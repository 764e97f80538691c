/**
 * One Desk group's items, a page at a time: a diary with thousands of questions due would
 * otherwise draw thousands of cards before the first could be used. The first page is what
 * a morning's work looks like; "Show more" adds the next, and focus moves to the first card
 * it added, so a keyboard user carries on where the list ended.
 */
import { useRef, type ReactNode } from 'react';
import { ShowMore, usePages } from '../../components/ShowMore';
import type { DeskItem } from './items';

/** Cards drawn at first in each group, and added by each "Show more". */
export const DESK_PAGE = 30;

export interface DeskGroupListProps {
  items: readonly DeskItem[];
  render: (item: DeskItem) => ReactNode;
}

export function DeskGroupList({ items, render }: DeskGroupListProps) {
  const listRef = useRef<HTMLUListElement>(null);
  const { shown, more } = usePages(DESK_PAGE, (index) => listRef.current?.children[index]?.querySelector<HTMLElement>('h3 a'));
  return (
    <>
      <ul className="desk-group__list" ref={listRef}>
        {items.slice(0, shown).map(render)}
      </ul>
      <ShowMore shown={Math.min(shown, items.length)} total={items.length} page={DESK_PAGE} onMore={more} />
    </>
  );
}
