/**
 * The Undo in a change's toast. Every change to a question answers with an undo token
 * (docs/api.md, "Undo"); the toast's Undo hands it back to the diary's own `undo`
 * operation, which puts the question back exactly as it was, then every screen reloads.
 * A change made of several steps (a Desk snooze covers each kind due) is undone newest
 * first, the only order the diary accepts.
 */
import { useCallback } from 'react';
import type { UndoResult } from '../../../shared/contract';
import { api } from '../api/client';
import { diaryChanged } from '../api/changes';
import { describeError } from '../api/errors';
import { useToast } from '../components/Toast';
import { hrefTo, parseRoute, questionPath } from '../routing';
import { undoneMessage, undoSteps } from './undoSteps';

export interface UndoableChange {
  /** What was done, e.g. "Resolved “Northgate signs phase 2”: Yes." */
  message: string;
  /** The token(s) the change answered with, in the order the steps were made. */
  undo: string | readonly string[];
  /** What the question was called, for the message after undoing. */
  title: string;
  /** What the message after undoing says, when one question's title would not tell it (a change to many questions). */
  undoneMessage?: string;
  /** Runs after a successful undo, e.g. to go back to a question that was deleted. */
  afterUndo?: (result: UndoResult) => void;
}


/**
 * `show(change)`: a toast saying what was done, with an Undo button (reachable with F6 and
 * announced with the toast). Undo reports its own outcome in a second toast; a refusal (the
 * question changed since, or the change is too old) says why and that nothing changed.
 */
export function useUndoToast(): (change: UndoableChange) => void {
  const toast = useToast();
  return useCallback(
    (change: UndoableChange) => {
      const tokens = typeof change.undo === 'string' ? [change.undo] : [...change.undo];
      async function undo() {
        try {
          const result = await undoSteps(tokens, (token) => api.undo({ token }));
          change.afterUndo?.(result);
          // A link to the question, unless its page is the one open (undone from the page itself).
          const path = result.question && change.undoneMessage === undefined ? questionPath(result.question.id) : null;
          const elsewhere = path !== null && parseRoute(window.location.hash).path !== path;
          toast.show({
            message: change.undoneMessage ?? undoneMessage(result, change.title),
            ...(path !== null && elsewhere ? { action: { label: 'Open question', href: hrefTo(path) } } : {}),
          });
        } catch (error) {
          toast.show({ tone: 'error', message: `Could not undo: ${describeError(error)}` });
        } finally {
          // Also after a partial undo of several steps: the screen shows what the diary holds.
          diaryChanged();
        }
      }
      toast.show({ message: change.message, action: { label: 'Undo', onClick: () => void undo() } });
    },
    [toast],
  );
}
