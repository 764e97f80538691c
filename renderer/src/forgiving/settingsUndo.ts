/**
 * The Undo of a settings save. Settings are not in the diary's undo log (docs/api.md,
 * "Undo"): a save is a patch of named values, so undoing it saves the values it replaced,
 * read from the diary just before the save. Every screen then reloads.
 */
import { useCallback } from 'react';
import type { Settings } from '../../../shared/domain';
import { api } from '../api/client';
import { diaryChanged } from '../api/changes';
import { describeError } from '../api/errors';
import { useToast } from '../components/Toast';

/** The values `patch` replaces, as `before` held them. */
export function replacedValues<K extends keyof Settings>(before: Settings, patch: Partial<Pick<Settings, K>>): Partial<Settings> {
  const out: Partial<Settings> = {};
  for (const key of Object.keys(patch) as K[]) (out as Record<K, Settings[K]>)[key] = before[key];
  return out;
}

/**
 * `show(message, restore, onRestored?)`: a toast whose Undo saves `restore` (the values the
 * save replaced) and hands the diary's settings to `onRestored`.
 */
export function useSettingsUndoToast(): (message: string, restore: Partial<Settings>, onRestored?: (settings: Settings) => void) => void {
  const toast = useToast();
  return useCallback(
    (message, restore, onRestored) => {
      async function undo() {
        try {
          const back = await api.updateSettings(restore);
          onRestored?.(back);
          toast.show({ message: 'Undone: the settings are as they were before that save.' });
        } catch (error) {
          toast.show({ tone: 'error', message: `Could not undo: ${describeError(error)}` });
        } finally {
          diaryChanged();
        }
      }
      toast.show({ message, action: { label: 'Undo', onClick: () => void undo() } });
    },
    [toast],
  );
}
