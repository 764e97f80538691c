/**
 * Opens a diary file and assembles everything the transports need around it.
 */
import { systemTimeZone } from '../../shared/time';
import { openStore, type StoreHandles } from '../store/open';
import { backupTo } from './backup';
import { buildDemoDiary } from './demo';
import { createDiary, type Diary } from './diary';
import { createDispatch, type Dispatch } from './dispatch';

export interface OpenOptions {
  dbPath: string;
  now?: () => number;
  timeZone?: string;
  onInternalError?: (err: unknown) => void;
}

export interface DiaryService {
  dispatch: Dispatch;
  diary: Diary;
  store: StoreHandles;
  location: string;
  now: () => number;
  exportDiaryJson(): string;
  backupTo(file: string, onProgress?: (percent: number) => void): Promise<void>;
  close(): void;
}

export function openDiary(options: OpenOptions): DiaryService {
  const now = options.now ?? Date.now;
  const store = openStore(options.dbPath);
  const diary = createDiary({ store, now, systemTimeZone: options.timeZone ?? systemTimeZone(), demo: buildDemoDiary });
  const dispatch = createDispatch(diary.handlers, options.onInternalError);
  return {
    dispatch,
    diary,
    store,
    location: store.path,
    now,
    exportDiaryJson: () => `${JSON.stringify(diary.exportDiary(), null, 2)}\n`,
    backupTo: (file, onProgress) => backupTo(store, file, onProgress),
    close: () => store.close(),
  };
}
