/** Real diary files in temp folders, removed after each test. */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { after } from 'node:test';
import { callOrThrow } from '../../main/service/dispatch';
import { openDiary, type DiaryService } from '../../main/service/index';
import type { OperationName, Request } from '../../shared/contract';

export function tempDir(prefix = 'forelog-test-'): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), prefix));
  after(() => fs.rmSync(dir, { recursive: true, force: true }));
  return dir;
}

export interface TestDiary {
  service: DiaryService;
  dbPath: string;
  clock: { now: number };
  call<K extends OperationName>(op: K, request: Request<K>): Promise<any>;
}

/** Opens a fresh diary on a fixed, movable clock (UTC time zone unless given). */
export function openTestDiary(options: { now?: string; timeZone?: string; dbPath?: string } = {}): TestDiary {
  const dbPath = options.dbPath ?? path.join(tempDir(), 'diary.sqlite');
  const clock = { now: Date.parse(options.now ?? '2026-06-01T12:00:00Z') };
  const service = openDiary({ dbPath, now: () => clock.now, timeZone: options.timeZone ?? 'UTC' });
  after(() => service.close());
  return {
    service,
    dbPath,
    clock,
    call: (op, request) => callOrThrow(service.dispatch, op, request) as Promise<any>,
  };
}

/** The diary's JSON export as one text, from the same writer the command line uses. */
export function exportJson(service: DiaryService): string {
  const pieces: Uint8Array[] = [];
  service.diary.exportTo('json', (piece) => pieces.push(Buffer.from(piece)));
  return Buffer.concat(pieces).toString('utf8');
}
