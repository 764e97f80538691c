/** Diary settings as key → JSON value rows; missing keys fall back to the defaults. */
import { defaultSettings, type Settings } from '../../shared/domain';
import type { Db } from './open';

export function readSettings(db: Db, systemTimeZone: string): Settings {
  const settings = defaultSettings(systemTimeZone) as unknown as Record<string, unknown>;
  for (const row of db.prepare('SELECT key, value FROM settings').all() as { key: string; value: string }[]) {
    if (row.key in settings) settings[row.key] = JSON.parse(row.value);
  }
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
