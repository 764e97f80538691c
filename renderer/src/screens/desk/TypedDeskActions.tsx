/**
 * The Desk's answers for a choice or numeric question: its last forecast in a few words, and
 * buttons that open the question's own dialogs — Revise (a percentage per option, or a value
 * per level) and Resolve (pick the option, or enter the value). The question is read when
 * the card appears, since a due nudge carries only a yes/no probability.
 */
import { useState } from 'react';
import { api } from '../../api/client';
import { toStoredValue } from '../../../../shared/numeric-value';
import { useLoad } from '../../api/useLoad';
import { Button } from '../../components/Button';
import { choiceSummary, numericSummary } from '../../questionTypes/summaries';
import { TypedEntryDialog, type TypedQuestion } from '../question/TypedEntryDialog';
import { TypedResolveDialog } from '../question/TypedResolveDialog';
import { latestEntry } from '../question/typedFacts';
import type { Done } from './DeskItemCard';
import type { DeskItem } from './items';

function lastText(q: TypedQuestion): string | null {
  if (q.type === 'choice') {
    const last = latestEntry(q.forecasts);
    return last ? choiceSummary(q.options, last.probs) : null;
  }
  const last = latestEntry(q.forecasts);
  return last ? numericSummary(q.levels, last.quantiles.map((v) => toStoredValue(v, q.value_kind)), q.value_kind, q.unit) : null;
}

export function TypedDeskActions({ item, toResolve, disabled, onDone }: { item: DeskItem; toResolve: boolean; disabled: boolean; onDone: (done: Done) => void }) {
  const loaded = useLoad(() => api.getQuestion({ id: item.id }), [item.id]);
  const [dialog, setDialog] = useState<'revise' | 'resolve' | null>(null);
  const q = loaded.data && loaded.data.type !== 'binary' ? loaded.data : undefined;
  const last = q ? lastText(q) : null;
  const saved = (message: string, undo: string) => {
    setDialog(null);
    onDone({ message: `“${item.title}”: ${message}`, undo: [undo] });
  };
  return (
    <>
      <p className="desk-item__last desk-item__last--typed" data-testid="desk-typed-last">
        {q === undefined ? '…' : last === null ? 'No forecast yet' : <>Last forecast <strong className="desk-item__p">{last}</strong></>}
      </p>
      <Button size="sm" variant="primary" disabled={disabled || q === undefined} onClick={() => setDialog(toResolve ? 'resolve' : 'revise')}>
        {toResolve ? 'Resolve…' : 'Revise…'}
      </Button>
      {q ? (
        <>
          <TypedEntryDialog question={q} mode="forecast" open={dialog === 'revise'} onClose={() => setDialog(null)} onSaved={saved} />
          <TypedResolveDialog question={q} open={dialog === 'resolve'} onClose={() => setDialog(null)} onSaved={saved} />
        </>
      ) : null}
    </>
  );
}
