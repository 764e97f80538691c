/**
 * The File menu's export, import and back-up: ask for a file, call the diary, and tell
 * the user what happened. The dialogs come in as functions so this runs without Electron.
 */
import { FileWriteError } from '../files/atomic-write';
import type { DiaryService } from './service-port';

export interface FileDialogs {
  /** Resolves to the chosen path, or null when the user cancelled. */
  chooseSavePath(options: { title: string; defaultName: string; extension: string; kind: string }): Promise<string | null>;
  chooseOpenPath(options: { title: string; extension: string; kind: string }): Promise<string | null>;
  showInfo(message: string, detail: string): void;
  showError(title: string, message: string): void;
}

export interface DiaryFileActions {
  exportDiary(): Promise<void>;
  /** Resolves true when questions were added, so the caller can refresh the screens. */
  importDiary(): Promise<boolean>;
  backUp(): Promise<void>;
}

/** YYYY-MM-DD in the user's local time, for default file names. */
export function localDateStamp(at: Date): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${at.getFullYear()}-${pad(at.getMonth() + 1)}-${pad(at.getDate())}`;
}

function reason(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

export function diaryFileActions(diary: DiaryService, dialogs: FileDialogs, today: () => Date): DiaryFileActions {
  return {
    async exportDiary() {
      const file = await dialogs.chooseSavePath({
        title: 'Export diary',
        defaultName: `forelog-diary-${localDateStamp(today())}.json`,
        extension: 'json',
        kind: 'Forelog diary',
      });
      if (file === null) return;
      try {
        // Streamed from the diary through a temporary file renamed over the target, so a
        // failure half way never leaves a truncated file where an older good one was.
        diary.exportDiaryFile(file, 'json');
        dialogs.showInfo('Diary exported.', `Saved to ${file}.`);
      } catch (error) {
        // A file system failure says what to do and that the old file is unchanged; anything else happened before a byte was written.
        dialogs.showError('Export failed', error instanceof FileWriteError ? error.message : `${reason(error)}\nNothing was written.`);
      }
    },

    async importDiary() {
      const file = await dialogs.chooseOpenPath({ title: 'Import diary', extension: 'json', kind: 'Forelog diary' });
      if (file === null) return false;
      try {
        // Read as it streams, so a file of any size imports; all or nothing.
        const { added } = diary.importDiaryFile(file, 'json');
        dialogs.showInfo('Diary imported.', `Added ${added} question${added === 1 ? '' : 's'} from ${file}.`);
        return added > 0;
      } catch (error) {
        // The service's message names the record and field; import is all or nothing.
        dialogs.showError('Import failed', `${reason(error)}\nThe diary was not changed.`);
        return false;
      }
    },

    async backUp() {
      const file = await dialogs.chooseSavePath({
        title: 'Back up diary',
        defaultName: `forelog-backup-${localDateStamp(today())}.sqlite`,
        extension: 'sqlite',
        kind: 'Forelog database',
      });
      if (file === null) return;
      try {
        await diary.backupTo(file);
        dialogs.showInfo('Backup written.', `A full copy of the diary is at ${file}.`);
      } catch (error) {
        dialogs.showError('Backup failed', `${reason(error)}\nNo backup was made. Choose a folder you can write to and try again.`);
      }
    },
  };
}
