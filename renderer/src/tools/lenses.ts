/**
 * Lenses as the revise form holds them (text, as typed) and what they mean: the rows ready
 * to pool while the user types, and the checked list sent with the revision.
 */
import type { Lens } from '../../../shared/domain';
import { poolLenses } from '../../../shared/scoring';
import { percentToProbability } from '../percent';
import { numberOrNull } from './format';

export interface LensDraft {
  /** Stable identity for React keys and focus; not sent. */
  key: number;
  name: string;
  /** Percent text, as typed. */
  p: string;
  weight: string;
}

/** Names offered for new lenses, in the order they are usually worked through. */
/** Plain apostrophe, as the example diary spells it, so one lens keeps one name across revisions. */
export const SUGGESTED_LENS_NAMES = ['outside view', 'inside view', "devil's advocate"] as const;

/** The diary keeps at most this many lenses per revision (shared/validation). */
export const MAX_LENSES = 20;

export const EXTREMIZE_MIN = 1;
export const EXTREMIZE_MAX = 3;

let nextKey = 1;

/** A new row named after the first suggestion not yet used. */
export function newLens(existing: readonly LensDraft[]): LensDraft {
  const used = new Set(existing.map((l) => l.name.trim().toLowerCase()));
  const name = SUGGESTED_LENS_NAMES.find((s) => !used.has(s)) ?? '';
  return { key: nextKey++, name, p: '', weight: '1' };
}

/** Field keys the form uses for a row's errors. */
export const lensField = (key: number, part: 'name' | 'p' | 'weight') => `lens-${key}-${part}`;

function probabilityOf(draft: LensDraft): number | null {
  const parsed = percentToProbability(draft.p);
  return parsed.ok ? parsed.value : null;
}

function weightOf(draft: LensDraft): number | null {
  const w = numberOrNull(draft.weight);
  return w !== null && w >= 0 ? w : null;
}

export interface Pooled {
  /** null when nothing can be pooled yet; `why` says what is missing. */
  p: number | null;
  /** How many rows went into the pool. */
  used: number;
  why: string;
}

/**
 * The live suggestion: rows with a valid probability and weight, pooled by weighted log-odds
 * averaging with the extremizing factor `a` (shared/scoring `poolLenses`). Rows still being
 * typed are left out and counted, so the user sees what the number rests on.
 */
export function pooledSuggestion(drafts: readonly LensDraft[], a: number | null): Pooled {
  const ready = drafts.flatMap((d) => {
    const p = probabilityOf(d);
    const weight = weightOf(d);
    return p !== null && weight !== null ? [{ p, weight }] : [];
  });
  if (ready.length === 0) return { p: null, used: 0, why: 'Give a lens a probability to see the pooled suggestion.' };
  if (!ready.some((l) => l.weight > 0)) return { p: null, used: ready.length, why: 'Give at least one lens a weight above 0.' };
  if (a === null || a < EXTREMIZE_MIN || a > EXTREMIZE_MAX) {
    return { p: null, used: ready.length, why: `Set the extremizing factor between ${EXTREMIZE_MIN} and ${EXTREMIZE_MAX}.` };
  }
  return { p: poolLenses(ready, a), used: ready.length, why: '' };
}

/**
 * The lenses to send, or the reasons beside each field. A row left completely empty (no
 * name, no probability) is dropped rather than refused: it is an "Add lens" click undone.
 */
export function checkLenses(drafts: readonly LensDraft[]): { lenses: Lens[]; errors: Record<string, string> } {
  const lenses: Lens[] = [];
  const errors: Record<string, string> = {};
  for (const d of drafts) {
    if (d.name.trim() === '' && d.p.trim() === '') continue;
    const parsed = percentToProbability(d.p);
    const weight = numberOrNull(d.weight);
    if (d.name.trim() === '') errors[lensField(d.key, 'name')] = 'name this lens, e.g. outside view';
    if (!parsed.ok) errors[lensField(d.key, 'p')] = parsed.error;
    else if (parsed.value === null) errors[lensField(d.key, 'p')] = 'enter this lens’s probability, or remove the lens';
    if (weight === null || weight < 0) errors[lensField(d.key, 'weight')] = 'must be a weight of 0 or more, e.g. 1';
    if (parsed.ok && parsed.value !== null && weight !== null && weight >= 0 && d.name.trim() !== '') {
      lenses.push({ name: d.name.trim(), p: parsed.value, weight });
    }
  }
  if (lenses.length > 0 && Object.keys(errors).length === 0 && !lenses.some((l) => l.weight > 0)) {
    const first = drafts.find((d) => d.name.trim() !== '' || d.p.trim() !== '');
    if (first) errors[lensField(first.key, 'weight')] = 'at least one lens needs a weight above 0';
  }
  return { lenses, errors };
}
