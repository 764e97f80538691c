/**
 * The error the renderer throws when the diary refuses or cannot answer a call. It keeps the
 * service's code and its `field: reason` lines so a form can put each reason beside its field,
 * and a merging import's list of conflicting questions.
 */
import type { ApiErrorCode, ImportConflict } from '../../../shared/contract';
import { clockTimesAsShown } from '../dates';

export type RequestErrorCode = ApiErrorCode | 'unreachable' | 'unauthorized';

export class RequestError extends Error {
  constructor(
    readonly code: RequestErrorCode,
    message: string,
    readonly fields: string[] = [],
    readonly operation = '',
    readonly conflicts: readonly ImportConflict[] = [],
  ) {
    super(message);
    this.name = 'RequestError';
  }
}

/**
 * Splits `field: reason` lines into a map keyed by field path, with list indexes dropped
 * (`tags[2]` → `tags`) and an optional prefix removed (`changes.title` → `title`), so a form
 * can look a reason up by the name of its own field. Lines without a field go under ''.
 */
export function fieldReasons(fields: readonly string[], stripPrefix = ''): Map<string, string> {
  const out = new Map<string, string>();
  for (const line of fields) {
    const colon = line.indexOf(': ');
    let key = colon > 0 ? line.slice(0, colon) : '';
    const reason = colon > 0 ? line.slice(colon + 2) : line;
    if (stripPrefix && key.startsWith(`${stripPrefix}.`)) key = key.slice(stripPrefix.length + 1);
    key = key.replace(/\[\d+\]/g, '');
    const before = out.get(key);
    out.set(key, before ? `${before}; ${reason}` : reason);
  }
  return out;
}

/** A sentence for a toast or banner, whatever was thrown. */
export function describeError(error: unknown): string {
  // The diary's neutral times ("2026-11-02 09:30 Europe/London") read as the window writes dates.
  if (error instanceof Error) return clockTimesAsShown(error.message);
  return `Something unexpected went wrong (${String(error)}). Reload the window and try again.`;
}
