/**
 * Undoing a change made of several steps (a Desk snooze covers each kind due, one request
 * each): the diary undoes a step only while the question is as that step left it, so the
 * steps go back newest first (docs/api.md, "Undo").
 */
import type { UndoResult } from '../../../shared/contract';

/** Undoes the steps of one change, newest first; resolves the last answer (the question as it is again). */
export async function undoSteps(tokens: readonly string[], undo: (token: string) => Promise<UndoResult>): Promise<UndoResult> {
  let result: UndoResult | undefined;
  for (const token of [...tokens].reverse()) result = await undo(token);
  if (!result) throw new Error('There was nothing to undo: the change answered without an undo token. Reload the window to see the question as it is.');
  return result;
}

/** What the toast says once a change is undone. */
export function undoneMessage(result: UndoResult, title: string): string {
  if (result.question === null) return `Undone: “${title}” is no longer in the diary.`;
  return `Undone: “${result.question.title}” is back as it was.`;
}
