/**
 * The Desk's snoozed section lists questions, not nudges, like the due list (items.ts): one
 * entry per question, back when the first of its snoozes runs out, soonest first.
 */
import type { SnoozedNudge } from '../../../../shared/domain';
import { extent } from '../../../../shared/extent';

export interface SnoozedItem {
  id: string;
  title: string;
  /** When the first of its snoozes runs out (epoch ms). */
  back: number;
}

export function snoozedItems(snoozed: readonly SnoozedNudge[]): SnoozedItem[] {
  const byId = new Map<string, { title: string; untils: number[] }>();
  for (const n of snoozed) {
    const known = byId.get(n.id) ?? { title: n.title, untils: [] };
    known.untils.push(Date.parse(n.until));
    byId.set(n.id, known);
  }
  return [...byId]
    .map(([id, { title, untils }]) => ({ id, title, back: extent(untils).min }))
    .sort((x, y) => x.back - y.back);
}
