/**
 * Opens a diary file and assembles everything the transports need around it.
 */
import type { ImportResult } from '../../shared/contract';
import { systemTimeZone } from '../../shared/time';
import { openStore, type StoreHandles } from '../store/open';
import { backupTo, rollingBackup } from './backup';
import { buildDemoDiary } from './demo';
import { createDiary, type Diary } from './diary';
import { createDispatch, type Dispatch } from './dispatch';
import { createDiaryScheduler, type Notifier } from './nudges';
import type { Scheduler } from '../nudges/scheduler';

export interface OpenOptions {
  dbPath: string;
  now?: () => number;
  timeZone?: string;
  onInternalError?: (err: unknown) => void;
  /** Path of better-sqlite3's native module when it is not the default (Electron's own build). */
  nativeBinding?: string;
  /** false: a missing diary file is an error and nothing is created (commands that only read). */
  create?: boolean;
  /** Whether this process may write the file; injected by tests (see openStore). */
  canWrite?: (file: string) => boolean;
  /** How long a write waits for another window's or command's write, in ms (default 5 s). */
  busyTimeoutMs?: number;
  /** Told before an existing diary is brought up to this version's format (see openStore). */
  onMigrating?: (from: number, to: number) => void;
  /**
   * Read the scoring input ahead of need while idle (long-running apps: the desktop app and
   * `forelog serve`), so the Scorecard and Hindsight open without reading a large diary first.
   */
  warmScores?: boolean;
}

/** How often a long-running app looks whether the scoring input must be read again, in ms. */
const WARM_CHECK_MS = 2_000;

/**
 * Reads the scoring input in steps of a few thousand questions, one step per turn of the
 * event loop, whenever the diary has changed since it was last read; requests are served
 * between the steps. Returns the function that stops it.
 */
function warmScoresWhileIdle(diary: Diary, onError: (err: unknown) => void): () => void {
  let running = false;
  let stopped = false;
  const step = () => {
    if (stopped) return;
    let current: boolean;
    try {
      current = diary.warmScoringInput();
    } catch (err) {
      // A busy or failing file: the request that needs the input will say so; try again later.
      onError(err);
      current = true;
    }
    if (current) running = false;
    else setImmediate(step);
  };
  const timer = setInterval(() => {
    if (running || stopped) return;
    running = true;
    step();
  }, WARM_CHECK_MS);
  timer.unref();
  return () => {
    stopped = true;
    clearInterval(timer);
  };
}

export interface DiaryService {
  dispatch: Dispatch;
  diary: Diary;
  store: StoreHandles;
  location: string;
  now: () => number;
  /** Writes the diary to `file` (JSON v1, CSV or iCalendar), streamed, whole or not at all. */
  exportDiaryFile(file: string, format: 'json' | 'csv' | 'ics', onProgress?: (questions: number, total: number) => void): void;
  /** Adds a diary file (JSON v1 or CSV) from disk, streamed, all or nothing; `merge` skips questions already here unchanged. */
  importDiaryFile(file: string, format: 'json' | 'csv', options?: { merge?: boolean; onRead?: (bytes: number, total: number) => void }): ImportResult;
  /** The nudge scheduler over this diary, delivering through `notifier`. */
  createScheduler(notifier: Notifier, onDueCountChanged?: (count: number) => void): Scheduler;
  backupTo(file: string, onProgress?: (percent: number) => void): Promise<void>;
  /** Today's automatic copy into `dir` if there is none yet; keeps the newest seven. */
  rollingBackup(dir: string): Promise<{ created: string | null; removed: string[] }>;
  close(): void;
}

export function openDiary(options: OpenOptions): DiaryService {
  const now = options.now ?? Date.now;
  const store = openStore(options.dbPath, {
    nativeBinding: options.nativeBinding,
    create: options.create,
    canWrite: options.canWrite,
    busyTimeoutMs: options.busyTimeoutMs,
    onMigrating: options.onMigrating,
  });
  let zone = options.timeZone;
  const diary = createDiary({ store, now, systemTimeZone: () => (zone ??= systemTimeZone()), demo: buildDemoDiary });
  const dispatch = createDispatch(diary.handlers, options.onInternalError ?? (() => {}), store.path);
  const stopWarming = options.warmScores ? warmScoresWhileIdle(diary, options.onInternalError ?? (() => {})) : () => {};
  return {
    dispatch,
    diary,
    store,
    location: store.path,
    now,
    exportDiaryFile: (file, format, onProgress) => diary.exportFile(file, format, onProgress),
    importDiaryFile: (file, format, options) => diary.importFile(file, format, options),
    createScheduler: (notifier, onDueCountChanged) => createDiaryScheduler(store, now, diary.settings, notifier, onDueCountChanged),
    backupTo: (file, onProgress) => backupTo(store, file, onProgress),
    rollingBackup: (dir) => rollingBackup(store, dir, now()),
    close: () => {
      stopWarming();
      store.close();
    },
  };
}
