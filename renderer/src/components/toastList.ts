/**
 * Which toasts are on screen after one more is shown (the pure part of `Toast.tsx`).
 *
 * A toast that says exactly what one already showing says — same message, same tone, no
 * action or the same link — does not pile up beside it: pressing Undo three times in a row
 * gave three identical "Undone: …" messages, which read as three different things having
 * happened. The one already showing is shown again instead (`shown` counts the showings; the
 * toast restarts its time and its message is read out again). A toast with a button (Undo)
 * is always new: its button belongs to one change, and two such toasts undo different things.
 */
export type ToastAction = { label: string; href: string } | { label: string; onClick: () => void };

export interface ToastInput {
  message: string;
  tone?: 'success' | 'error' | 'info';
  action?: ToastAction;
}

export interface ToastItem extends ToastInput {
  id: number;
  /** How many times this toast was shown; a repeat of it counts here rather than adding a toast. */
  shown: number;
}

/** How many toasts stay on screen at once; the oldest goes first. */
export const MOST_TOASTS = 4;

function sameAction(a: ToastAction | undefined, b: ToastAction | undefined): boolean {
  if (a === undefined || b === undefined) return a === b;
  return 'href' in a && 'href' in b && a.href === b.href && a.label === b.label;
}

/** True when `shown` would tell the user nothing `next` does not already say. */
export function repeatsToast(shown: ToastInput, next: ToastInput): boolean {
  return shown.message === next.message && (shown.tone ?? 'success') === (next.tone ?? 'success') && sameAction(shown.action, next.action);
}

/** The list after showing `next` (with `id` if it is new). */
export function withToast(list: readonly ToastItem[], next: ToastInput, id: number): ToastItem[] {
  const index = list.findIndex((item) => repeatsToast(item, next));
  if (index >= 0) return list.map((item, i) => (i === index ? { ...item, shown: item.shown + 1 } : item));
  return [...list.slice(-(MOST_TOASTS - 1)), { ...next, id, shown: 1 }];
}
