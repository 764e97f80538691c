/**
 * What a snooze hides from the Desk, so nothing vanishes: a collapsed section under the due
 * groups with each snoozed question, when it comes back, and Unsnooze, which ends its
 * snoozes now (it rejoins the list above if still due). Like the due list, one entry per
 * question; it comes back when its first snooze runs out.
 */
import { useState } from 'react';
import type { SnoozedNudge } from '../../../../shared/domain';
import { api } from '../../api/client';
import { diaryChanged } from '../../api/changes';
import { describeError } from '../../api/errors';
import { Button } from '../../components/Button';
import { useToast } from '../../components/Toast';
import { useUndoToast } from '../../forgiving/undo';
import { hrefTo, questionPath } from '../../routing';
import { snoozedItems, type SnoozedItem } from './snoozed';
import { clockTime, dayWord } from './wording';
import { formatCount } from '../../dates';
import '../../forgiving/forgiving.css';

interface Props {
  snoozed: readonly SnoozedNudge[];
  /** The instant the due list was computed for (epoch ms). */
  now: number;
  /** Snoozes run out on the diary's clock. */
  diaryTimeZone: string;
}

export function SnoozedSection({ snoozed, now, diaryTimeZone }: Props) {
  const items = snoozedItems(snoozed);
  if (items.length === 0) return null;
  return (
    <details className="desk-snoozed" data-testid="desk-snoozed">
      <summary>
        Snoozed <span className="desk-group__count">{formatCount(items.length)}</span>
      </summary>
      <p className="desk-snoozed__intro">Due, but hidden until the time shown. Unsnooze brings one back now.</p>
      <ul className="desk-snoozed__list">
        {items.map((item) => (
          <SnoozedRow key={item.id} item={item} now={now} diaryTimeZone={diaryTimeZone} />
        ))}
      </ul>
    </details>
  );
}

function SnoozedRow({ item, now, diaryTimeZone }: { item: SnoozedItem; now: number; diaryTimeZone: string }) {
  const toast = useToast();
  const undoToast = useUndoToast();
  const [busy, setBusy] = useState(false);
  const when = `${dayWord(item.back, now, diaryTimeZone)} ${clockTime(item.back, diaryTimeZone)}`;

  async function unsnooze() {
    setBusy(true);
    try {
      const { undo } = await api.unsnooze({ question_id: item.id });
      undoToast({ message: `Unsnoozed “${item.title}”.`, undo, title: item.title });
      diaryChanged();
    } catch (error) {
      setBusy(false);
      toast.show({ tone: 'error', message: describeError(error) });
    }
  }

  return (
    <li className="desk-snoozed__item" data-testid="desk-snoozed-item">
      <div>
        <a className="desk-snoozed__title" href={hrefTo(questionPath(item.id))}>
          {item.title}
        </a>
        <p className="desk-snoozed__when">
          Back <time dateTime={new Date(item.back).toISOString()}>{when}</time>
        </p>
      </div>
      <Button size="sm" onClick={() => void unsnooze()} busy={busy} aria-label={`Unsnooze “${item.title}”`}>
        Unsnooze
      </Button>
    </li>
  );
}
