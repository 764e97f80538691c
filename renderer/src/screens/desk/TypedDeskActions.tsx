/**
 * The Desk's answers for a choice or numeric question: buttons that open the question's own
 * dialogs — Revise (a percentage per option, or a value per level) and Resolve (pick the
 * option, or enter the value) — and its last forecast in a few words, shown with the card's
 * other facts. The question is read when the card appears (`useTypedQuestion`), since a due
 * nudge carries only a yes/no probability.
 */
import { useState } from 'react';
import { api } from '../../api/client';
import { toStoredValue } from '../../../../shared/numeric-value';
import { useLoad } from '../../api/useLoad';
import { Button } from '../../components/Button';
import { choiceSummary, numericSummary } from '../../questionTypes/summaries';
import { TypedEntryDialog, type TypedQuestion } from '../question/TypedEntryDialog';
import { TypedResolveDialog } from '../question/TypedResolveDialog';
import type { TypedInDialog } from '../question/questionForms';
import { latestEntry } from '../question/typedFacts';
import type { Done } from './DeskItemCard';
import type { DeskItem } from './items';

/** A choice or numeric item's question once read; undefined for a yes/no item, or until it arrives. */
export function useTypedQuestion(item: DeskItem): TypedQuestion | undefined {
  const loaded = useLoad(() => (item.type === 'binary' ? Promise.resolve(undefined) : api.getQuestion({ id: item.id })), [item.id, item.type]);
  return loaded.data && loaded.data.type !== 'binary' ? loaded.data : undefined;
}

/** The last forecast in a few words ("Ambledene 60%", "13 weeks (9 – 20)") and when it was made; null with none. */
export function typedLast(q: TypedQuestion): { text: string; at: string } | null {
  if (q.type === 'choice') {
    const last = latestEntry(q.forecasts);
    return last ? { text: choiceSummary(q.options, last.probs), at: last.at } : null;
  }
  const last = latestEntry(q.forecasts);
  return last ? { text: numericSummary(q.levels, last.quantiles.map((v) => toStoredValue(v, q.value_kind)), q.value_kind, q.unit), at: last.at } : null;
}

export function TypedDeskActions({
  item,
  q,
  toResolve,
  disabled,
  onDone,
  restored,
}: {
  item: DeskItem;
  q: TypedQuestion | undefined;
  toResolve: boolean;
  disabled: boolean;
  /** `typed`: what the dialog held, to give back if the change is undone. */
  onDone: (done: Done, typed?: TypedInDialog) => void;
  /** What a dialog held when its change was undone: that dialog opens again with it, once the question is read. */
  restored?: TypedInDialog | undefined;
}) {
  // Given back once: a dialog closed after it (saved, or its changes discarded) opens afresh.
  const [kept, setKept] = useState(restored);
  const [dialog, setDialog] = useState<'revise' | 'resolve' | null>(restored ? (restored.form === 'typed-resolve' ? 'resolve' : 'revise') : null);
  const close = () => {
    setDialog(null);
    setKept(undefined);
  };
  const saved = (message: string, undo: string, typed?: TypedInDialog) => {
    close();
    onDone({ message: `“${item.title}”: ${message}`, undo: [undo] }, typed);
  };
  return (
    <>
      <Button size="sm" variant="primary" disabled={disabled || q === undefined} onClick={() => setDialog(toResolve ? 'resolve' : 'revise')}>
        {toResolve ? 'Resolve…' : 'Revise…'}
      </Button>
      {q ? (
        <>
          <TypedEntryDialog question={q} mode="forecast" open={dialog === 'revise'} onClose={close} onSaved={saved} restored={kept} />
          <TypedResolveDialog question={q} open={dialog === 'resolve'} onClose={close} onSaved={saved} restored={kept} />
        </>
      ) : null}
    </>
  );
}
