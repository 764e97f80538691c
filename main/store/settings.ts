/** Diary settings as key → JSON value rows; missing keys fall back to the defaults. */
import { defaultSettings, type Settings } from '../../shared/domain';
import type { Db } from './open';

/**
 * The diary's settings. `systemTimeZone` is asked only when the diary has no zone of its
 * own: finding the system's zone loads ICU's locale data (~12 ms of a command's start).
 */
export function readSettings(db: Db, systemTimeZone: () => string): Settings {
  const settings = defaultSettings('') as unknown as Record<string, unknown>;
  for (const row of db.prepare('SELECT key, value FROM settings').all() as { key: string; value: string }[]) {
    if (row.key in settings) settings[row.key] = JSON.parse(row.value);
  }
  if (settings.time_zone === '') settings.time_zone = systemTimeZone();
  return settings as unknown as Settings;
}

export function writeSettings(db: Db, patch: Partial<Settings>): void {
  const upsert = db.prepare(
    'INSERT INTO settings (key, value) VALUES (?, ?) ON CONFLICT (key) DO UPDATE SET value = excluded.value',
  );
  for (const [key, value] of Object.entries(patch)) {
    if (value !== undefined) upsert.run(key, JSON.stringify(value));
  }
}
