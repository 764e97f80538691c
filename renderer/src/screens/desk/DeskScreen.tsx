/**
 * Desk, the home screen: everything due now, grouped by what it asks of the user — closed
 * questions to resolve, windows closing soon, check-ins — each answerable in one click.
 * After an action the diary changes, the list reloads, the item leaves (or moves group) and
 * focus goes to the item that took its place, so a keyboard user can work down the list.
 */
import { useCallback, useEffect, useMemo, useRef } from 'react';
import { systemTimeZone } from '../../../../shared/time';
import { diaryChanged } from '../../api/changes';
import { describeError } from '../../api/errors';
import { Button } from '../../components/Button';
import { EmptyState } from '../../components/EmptyState';
import { ErrorBanner } from '../../components/ErrorBanner';
import { useToast } from '../../components/Toast';
import { useDiaryInfo } from '../../diaryInfo';
import { useUndoToast } from '../../forgiving/undo';
import { useDocumentTitle } from '../../hooks';
import { hrefTo } from '../../routing';
import { QUICK_ADD_ARIA_SHORTCUTS, QUICK_ADD_SHORTCUT_TEXT, useQuickAdd } from '../questions/quickAdd';
import { DeskGroupList } from './DeskGroupList';
import { DeskItemCard, type Done, type TypedOnCard } from './DeskItemCard';
import { GROUPS, deskItems, summary, type DeskItem } from './items';
import { SnoozedSection } from './SnoozedSection';
import { useDue } from './useDueCount';
import { formatCount } from '../../dates';
import './desk.css';

export function DeskScreen() {
  // The window title is "Forelog", with the due count in front (App adds it).
  useDocumentTitle(null);
  const toast = useToast();
  const undoToast = useUndoToast();
  const info = useDiaryInfo();
  const due = useDue();
  const items = useMemo(() => (due.data ? deskItems(due.data.nudges) : []), [due.data]);
  const now = due.data ? Date.parse(due.data.at) : Date.now();
  const diaryTimeZone = info.data?.time_zone ?? systemTimeZone();
  const headingRef = useRef<HTMLHeadingElement>(null);
  /** Where focus goes once the list reloads after an action: the item itself if it is still listed, else `next`. */
  const focusPlan = useRef<{ id: string; next: string | null } | null>(null);

  useEffect(() => {
    const plan = focusPlan.current;
    if (!plan || !due.data) return;
    focusPlan.current = null;
    const target = [plan.id, plan.next].find((id) => id !== null && items.some((i) => i.id === id));
    const link = target ? document.querySelector<HTMLElement>(`[data-desk-item="${CSS.escape(target)}"] h3 a`) : null;
    (link ?? headingRef.current)?.focus();
  }, [due.data, items]);

  // What a card held when its action was undone, by question id, until the card is drawn again with it.
  const restoring = useRef(new Map<string, TypedOnCard>());
  const onRestored = useCallback((id: string) => restoring.current.delete(id), []);
  // A question the undo did not bring back to the Desk keeps nothing for a later visit.
  useEffect(() => {
    for (const id of restoring.current.keys()) if (!items.some((i) => i.id === id)) restoring.current.delete(id);
  }, [items]);

  const onDone = useCallback(
    (item: DeskItem, done: Done, typed: TypedOnCard) => {
      const index = items.findIndex((i) => i.id === item.id);
      const next = items[index + 1] ?? items[index - 1] ?? null;
      focusPlan.current = { id: item.id, next: next?.id ?? null };
      undoToast({ message: done.message, undo: done.undo, title: item.title, afterUndo: () => restoring.current.set(item.id, typed) });
      diaryChanged();
    },
    [items, undoToast],
  );
  const onFailed = useCallback((message: string) => toast.show({ tone: 'error', message }), [toast]);

  return (
    <div className="screen desk" aria-busy={due.loading || undefined}>
      <header className="screen__header">
        <div className="desk__heading">
          <h1 ref={headingRef} tabIndex={-1}>
            Desk
          </h1>
          {items.length > 0 ? (
            <p className="desk__summary" data-testid="desk-summary">
              {summary(items)}
            </p>
          ) : null}
        </div>
      </header>
      {due.error ? <ErrorBanner message={describeError(due.error)} onRetry={due.reload} /> : null}
      {due.data ? (
        items.length === 0 ? (
          <NothingDue questionCount={info.data?.question_count ?? null} />
        ) : (
          GROUPS.map(({ group, heading, intro }) => {
            const listed = items.filter((i) => i.group === group);
            if (listed.length === 0) return null;
            const headingId = `desk-${group}`;
            return (
              <section key={group} className={`desk-group desk-group--${group}`} aria-labelledby={headingId} data-testid={`desk-group-${group}`}>
                <div className="desk-group__head">
                  <h2 id={headingId}>
                    {heading} <span className="desk-group__count">{formatCount(listed.length)}</span>
                  </h2>
                  <p className="desk-group__intro">{intro}</p>
                </div>
                <DeskGroupList
                  items={listed}
                  render={(item) => (
                    <DeskItemCard
                      key={item.id}
                      item={item}
                      now={now}
                      diaryTimeZone={diaryTimeZone}
                      onDone={onDone}
                      onFailed={onFailed}
                      restored={restoring.current.get(item.id)}
                      onRestored={onRestored}
                    />
                  )}
                />
              </section>
            );
          })
        )
      ) : null}
      {due.data ? <SnoozedSection snoozed={due.data.snoozed} now={now} diaryTimeZone={diaryTimeZone} /> : null}
    </div>
  );
}

function NothingDue({ questionCount }: { questionCount: number | null }) {
  const quickAdd = useQuickAdd();
  const newButton = (
    <Button variant="primary" onClick={quickAdd.open} title={`New question (${QUICK_ADD_SHORTCUT_TEXT})`} aria-keyshortcuts={QUICK_ADD_ARIA_SHORTCUTS}>
      Write a new question
    </Button>
  );
  if (questionCount === 0) {
    return (
      <EmptyState title="Your diary is empty" actions={<>{newButton}<a href={hrefTo('questions')}>Or load the example diary on Questions</a></>}>
        <p>Once you write down a call, this is where its check-ins, closing window and resolution come up.</p>
      </EmptyState>
    );
  }
  return (
    <EmptyState title="Nothing is due right now" actions={<>{newButton}<a href={hrefTo('questions')}>See all questions</a></>}>
      <p>Check-ins, windows about to close and closed questions waiting for their outcome will show up here as they come due.</p>
    </EmptyState>
  );
}
