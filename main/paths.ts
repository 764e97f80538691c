/**
 * Where the desktop app keeps its diary, computed the way Electron's
 * `app.getPath('userData')` does for an app named "Forelog", so the command line and the
 * app open the same file by default.
 */
import os from 'node:os';
import path from 'node:path';

export const APP_NAME = 'Forelog';
export const DIARY_FILE_NAME = 'forelog.sqlite';

export function userDataDir(platform: NodeJS.Platform = process.platform, env: NodeJS.ProcessEnv = process.env): string {
  const home = os.homedir();
  if (platform === 'win32') return path.join(env.APPDATA ?? path.join(home, 'AppData', 'Roaming'), APP_NAME);
  if (platform === 'darwin') return path.join(home, 'Library', 'Application Support', APP_NAME);
  return path.join(env.XDG_CONFIG_HOME ?? path.join(home, '.config'), APP_NAME);
}

export function defaultDiaryPath(): string {
  return path.join(userDataDir(), DIARY_FILE_NAME);
}
