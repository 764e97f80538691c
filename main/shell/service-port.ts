/**
 * What the shell needs from the diary service (main/service). Declared here, as a port, so
 * the shell and its tests depend on this shape only; app.ts checks the real `openDiary`
 * against it when it hands it to `startShell`.
 */
import type { Envelope } from '../../shared/bridge';

/** One notification the scheduler wants shown; `question_id` null means a summary (open the Desk). */
export interface NudgeNotice {
  title: string;
  body: string;
  question_id: string | null;
}

export interface NudgeNotifier {
  notify(notice: NudgeNotice): void;
}

export interface NudgeScheduler {
  runOnce(reason: 'tick' | 'start' | 'resume'): unknown;
  /** Starts the minute tick and runs once straight away (reason 'start'). */
  start(): void;
  stop(): void;
}

export interface DiaryService {
  /** Validates `request` against the contract and runs the operation; never throws. */
  dispatch(operation: string, request: unknown): Promise<Envelope>;
  createScheduler(notifier: NudgeNotifier, onDueCountChanged?: (count: number) => void): NudgeScheduler;
  /** Writes the diary to `file`, whole or not at all; throws an error saying what went wrong. */
  exportDiaryFile(file: string, format: 'json'): void;
  /** Adds a diary file from disk, read as it streams (all or nothing); throws an error saying what was wrong. */
  importDiaryFile(file: string, format: 'json'): { added: number };
  backupTo(file: string): Promise<void>;
  /** Today's automatic copy into `dir` if there is none yet; keeps the newest seven. */
  rollingBackup(dir: string): Promise<unknown>;
  close(): void;
  /** Where the diary file lives, for the about box. */
  location: string;
}

/** `warmScores`: read the scoring input ahead of need while idle (see main/service/index.ts). */
export type OpenDiary = (options: { dbPath: string; now?: () => number; nativeBinding?: string; warmScores?: boolean }) => DiaryService;
