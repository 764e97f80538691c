/**
 * Where the shell finds its files and the diary. Paths inside the app are resolved from
 * Electron's app path (the folder or app.asar holding package.json), never from the
 * module's own location, because the same code runs bundled (dist/main/app.cjs) and from
 * source under tsx in tests.
 */
import path from 'node:path';

/**
 * The application id: Windows needs it (setAppUserModelId) for notifications to show and
 * to be matched to the installed shortcut; electron-builder.yml's appId must be the same.
 */
export const APP_ID = 'app.forelog.desktop';

export interface ShellLocations {
  /** The built renderer, served to the window by app-protocol.ts and nothing beyond it. */
  rendererDir: string;
  indexHtml: string;
  preload: string;
  windowIcon: string;
  trayIcon: string;
  /** SQLite's native module built for Electron by scripts/electron-native.mjs (absent in packaged apps). */
  nativeSqlite: string;
}

/** scripts/build-main.mjs writes dist/main/*.cjs and copies the icons to dist/main/assets. */
export function shellLocations(appPath: string): ShellLocations {
  const rendererDir = path.join(appPath, 'dist', 'renderer');
  return {
    rendererDir,
    indexHtml: path.join(rendererDir, 'index.html'),
    preload: path.join(appPath, 'dist', 'main', 'preload.cjs'),
    windowIcon: path.join(appPath, 'dist', 'main', 'assets', 'icon.png'),
    trayIcon: path.join(appPath, 'dist', 'main', 'assets', 'tray.png'),
    nativeSqlite: path.join(appPath, 'dist', 'native', 'better_sqlite3.node'),
  };
}

/**
 * The diary file named by `--db PATH` or `--db=PATH` (resolved against `cwd`), or null
 * when the option is absent. Throws when the option has no path after it.
 */
export function dbPathFromArgs(argv: readonly string[], cwd: string): string | null {
  for (let i = 0; i < argv.length; i += 1) {
    const arg = argv[i] as string;
    let value: string | undefined;
    if (arg === '--db') value = argv[i + 1];
    else if (arg.startsWith('--db=')) value = arg.slice('--db='.length);
    else continue;
    if (value === undefined || value === '' || value.startsWith('--')) {
      throw new Error('The --db option needs the path of a diary file after it, for example --db ~/forelog.sqlite.');
    }
    return path.resolve(cwd, value);
  }
  return null;
}
