/**
 * The File menu's export, import and back-up: ask for a file, call the diary, and tell
 * the user what happened. The dialogs come in as functions so this runs without Electron.
 */
import { readFile, rename, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
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

/**
 * Writes through a temporary file and a rename, so an export that fails half way never
 * leaves a truncated file where an older good one was.
 */
async function writeWhole(file: string, text: string): Promise<void> {
  const temporary = path.join(path.dirname(file), `.${path.basename(file)}.${process.pid}.partial`);
  try {
    await writeFile(temporary, text, 'utf8');
    await rename(temporary, file);
  } catch (error) {
    await rm(temporary, { force: true });
    throw error;
  }
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
        await writeWhole(file, diary.exportDiaryJson());
        dialogs.showInfo('Diary exported.', `Saved to ${file}.`);
      } catch (error) {
        dialogs.showError('Export failed', `${reason(error)}\nNothing was written. Choose a folder you can write to and try again.`);
      }
    },

    async importDiary() {
      const file = await dialogs.chooseOpenPath({ title: 'Import diary', extension: 'json', kind: 'Forelog diary' });
      if (file === null) return false;
      let text: string;
      try {
        text = await readFile(file, 'utf8');
      } catch (error) {
        dialogs.showError('Import failed', `${reason(error)}\nThe diary was not changed. Check the file exists and can be read.`);
        return false;
      }
      try {
        const { added } = diary.importDiaryJson(text);
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
