/**
 * The Electron shell: one window, the application menu, the tray, nudges as desktop
 * notifications, a single running instance. It wires things together and decides
 * nothing the service could decide; the pieces it uses live in main/shell/ (pure, no
 * Electron import) and main/transport/ipc.ts.
 *
 * How it starts: inside Electron (process.versions.electron is set) this module loads
 * the service and calls startShell. Under plain Node nothing starts by itself, so tests
 * import startShell with a fake 'electron' module (test/shell/register-fake-electron.mjs)
 * and pass their own openDiary.
 */
import fs from 'node:fs';
import path from 'node:path';
import {
  app,
  BrowserWindow,
  dialog,
  ipcMain,
  Menu,
  nativeImage,
  Notification,
  powerMonitor,
  protocol,
  session,
  shell,
  Tray,
  type MessageBoxOptions,
  type OpenDialogOptions,
  type SaveDialogOptions,
  type WebContents,
} from 'electron';
import { IPC_OPEN_QUESTION_CHANNEL } from '../shared/bridge';
import { APP_SCHEME, APP_SCHEME_PRIVILEGES, appPageUrl, isAppDocument } from './shell/app-origin';
import { rendererProtocolHandler } from './shell/app-protocol';
import { withContentSecurityPolicy } from './shell/csp';
import { diaryFileActions, type FileDialogs } from './shell/diary-files';
import { APP_NAME, DIARY_FILE_NAME } from './paths';
import { APP_ID, dbPathFromArgs, shellLocations } from './shell/locations';
import { applicationMenuTemplate, ROUTES, trayMenuTemplate, trayTooltip, type Route } from './shell/menu';
import { briefingPdfSaver } from './shell/briefing-pdf';
import { createNotifier } from './shell/notifier';
import type { DiaryService, OpenDiary } from './shell/service-port';
import { webContentsGuard, type WebContentsGuard } from './shell/web-contents-guard';
import { mainWindowOptions, printWindowOptions } from './shell/window-options';
import { registerIpc } from './transport/ipc';

/** How often the running app checks whether today's automatic backup exists. */
const BACKUP_CHECK_MS = 3 * 3_600_000;

export interface ShellDeps {
  openDiary: OpenDiary;
  /** The process arguments; `--db PATH` picks another diary file. */
  argv: readonly string[];
  cwd: string;
  platform: NodeJS.Platform;
}

function reason(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

/** The file dialogs of diary-files.ts, as Electron dialogs attached to the window. */
function electronDialogs(window: () => BrowserWindow | null): FileDialogs {
  const documents = () => app.getPath('documents');
  return {
    async chooseSavePath({ title, defaultName, extension, kind }) {
      const options: SaveDialogOptions = {
        title,
        defaultPath: path.join(documents(), defaultName),
        filters: [{ name: kind, extensions: [extension] }],
      };
      const parent = window();
      const result = parent ? await dialog.showSaveDialog(parent, options) : await dialog.showSaveDialog(options);
      return result.canceled || !result.filePath ? null : result.filePath;
    },
    async chooseOpenPath({ title, extension, kind }) {
      const options: OpenDialogOptions = {
        title,
        defaultPath: documents(),
        filters: [{ name: kind, extensions: [extension] }],
        properties: ['openFile'],
      };
      const parent = window();
      const result = parent ? await dialog.showOpenDialog(parent, options) : await dialog.showOpenDialog(options);
      return result.canceled ? null : (result.filePaths[0] ?? null);
    },
    showInfo(message, detail) {
      const options: MessageBoxOptions = { type: 'info', title: 'Forelog', message, detail };
      const parent = window();
      void (parent ? dialog.showMessageBox(parent, options) : dialog.showMessageBox(options));
    },
    showError(title, message) {
      dialog.showErrorBox(title, message);
    },
  };
}

/**
 * Prints a self-contained HTML page (the briefing) to an A4 PDF in a hidden window that
 * runs no scripts and has no preload, so the page can reach nothing.
 */
async function renderHtmlToPdf(html: string): Promise<Uint8Array> {
  const printer = new BrowserWindow(printWindowOptions());
  try {
    await printer.loadURL(`data:text/html;charset=utf-8,${encodeURIComponent(html)}`);
    return await printer.webContents.printToPDF({ pageSize: 'A4', printBackground: true });
  } finally {
    printer.destroy();
  }
}

/** Puts the app-wide rules (web-contents-guard.ts) on one web contents. */
function guardWebContents(contents: WebContents, guard: WebContentsGuard): void {
  contents.on('will-navigate', (event) => guard.willNavigate(event));
  contents.on('will-redirect', (event) => guard.willRedirect(event));
  contents.on('will-attach-webview', (event) => guard.willAttachWebview(event));
  contents.setWindowOpenHandler((details) => guard.windowOpen(details));
  // All of today's windows share the default session, where setting the same handlers again
  // changes nothing; a window given its own session later is covered as well.
  contents.session.setPermissionRequestHandler((source, permission, callback) => guard.permissionRequest(source, permission, callback));
  contents.session.setPermissionCheckHandler(() => guard.permissionCheck());
}

/**
 * Starts the desktop app. Resolves true once the window, menu, tray and nudges are up;
 * false when another Forelog already runs (it is focused instead) or the diary could not
 * be opened (the user is told why, and the app quits).
 */
export async function startShell(deps: ShellDeps): Promise<boolean> {
  // These three must happen before the app is ready (Electron refuses them afterwards):
  // every renderer in Chromium's sandbox, whatever a window's options say; our scheme's
  // privileges; and the guard, in place before the first web contents exists.
  app.enableSandbox();
  protocol.registerSchemesAsPrivileged([{ scheme: APP_SCHEME, privileges: APP_SCHEME_PRIVILEGES }]);
  const guard = webContentsGuard((url) => {
    shell.openExternal(url).catch((error: unknown) => {
      dialog.showErrorBox('Could not open the link', `${reason(error)}\nCopy the address into your browser instead: ${url}`);
    });
  });
  app.on('web-contents-created', (_event, contents) => guardWebContents(contents, guard));

  // A fixed folder name, so the packaged app, `electron .` and the command line (paths.ts)
  // share one diary; set before the lock, which lives in this folder.
  app.setPath('userData', path.join(app.getPath('appData'), APP_NAME));
  if (deps.platform === 'win32') app.setAppUserModelId(APP_ID);
  if (!app.requestSingleInstanceLock()) {
    app.quit();
    return false;
  }

  let win: BrowserWindow | null = null;
  let tray: Tray | null = null;
  let quitting = false;

  const reveal = () => {
    if (win === null || win.isDestroyed()) return;
    if (win.isMinimized()) win.restore();
    win.show();
    win.focus();
  };
  app.on('second-instance', reveal);
  app.on('activate', reveal);
  app.on('before-quit', () => {
    quitting = true;
  });

  await app.whenReady();

  const locations = shellLocations(app.getAppPath());
  protocol.handle(APP_SCHEME, rendererProtocolHandler(locations.rendererDir));
  let diary: DiaryService;
  try {
    const dbPath = dbPathFromArgs(deps.argv, deps.cwd) ?? path.join(app.getPath('userData'), DIARY_FILE_NAME);
    // From a checkout, `npm start` builds SQLite for Electron beside the Node build (scripts/electron-native.mjs);
    // a packaged app has it rebuilt in place by electron-builder.
    diary = deps.openDiary({ dbPath, nativeBinding: fs.existsSync(locations.nativeSqlite) ? locations.nativeSqlite : undefined, warmScores: true });
  } catch (error) {
    dialog.showErrorBox(
      'Forelog could not open its diary',
      `${reason(error)}\n\nForelog will close now. To use another diary file, start it with --db PATH; to go back to a backup, use "forelog restore FILE".`,
    );
    app.quit();
    return false;
  }

  // Our scheme's answers carry the policy already; this puts it on any other response a page
  // of this session might receive, so no response arrives without it.
  session.defaultSession.webRequest.onHeadersReceived((details, callback) => {
    callback({ responseHeaders: withContentSecurityPolicy(details.responseHeaders) });
  });

  registerIpc(
    ipcMain,
    (operation, request) => diary.dispatch(operation, request),
    (frameUrl) => isAppDocument(frameUrl),
    briefingPdfSaver({
      dispatch: (operation, request) => diary.dispatch(operation, request),
      chooseSavePath: (defaultName) =>
        electronDialogs(() => win).chooseSavePath({ title: 'Save briefing as PDF', defaultName, extension: 'pdf', kind: 'PDF document' }),
      renderPdf: (html) => renderHtmlToPdf(html),
      today: () => new Date(),
    }),
  );

  const window = new BrowserWindow(
    mainWindowOptions({ preload: locations.preload, icon: locations.windowIcon, devTools: !app.isPackaged }),
  );
  win = window;
  window.on('close', (event) => {
    // Closing the window keeps Forelog running (tray, dock) so nudges still arrive; Quit ends it.
    if (quitting) return;
    event.preventDefault();
    window.hide();
  });
  window.once('ready-to-show', () => window.show());

  const show = (route?: Route) => {
    const cannotShow = (detail: string) =>
      dialog.showErrorBox(
        'Forelog could not show its screens',
        `${detail}\nThe file ${locations.indexHtml} is missing or unreadable. Reinstall Forelog, or run "npm run build" in a checkout.`,
      );
    // Our scheme would answer a missing page with a 404 text, which is no load failure;
    // checking first keeps the message that says what to do.
    if (!fs.existsSync(locations.indexHtml)) {
      cannotShow("Forelog's screens are not where they should be.");
      return;
    }
    window.loadURL(appPageUrl(route)).catch((error: unknown) => {
      // A load cut short by the next one (two menu clicks in a row) is not a failure.
      if ((error as { code?: unknown }).code === 'ERR_ABORTED') return;
      cannotShow(reason(error));
    });
  };
  const go = (route: Route) => {
    reveal();
    show(route);
  };
  show();

  const files = diaryFileActions(diary, electronDialogs(() => win), () => new Date());
  const showAbout = () => {
    const options: MessageBoxOptions = {
      type: 'info',
      title: 'About Forelog',
      message: `Forelog ${app.getVersion()}`,
      detail: `A private diary for probability forecasts.\n\nYour diary: ${diary.location}\nNothing leaves this computer.`,
    };
    void dialog.showMessageBox(window, options);
  };
  Menu.setApplicationMenu(
    Menu.buildFromTemplate(
      applicationMenuTemplate(
        {
          go,
          exportDiary: () => void files.exportDiary(),
          importDiary: () =>
            void files.importDiary().then((added) => {
              if (added) show();
            }),
          backUp: () => void files.backUp(),
          about: showAbout,
          quit: () => app.quit(),
        },
        { isMac: deps.platform === 'darwin', isPackaged: app.isPackaged },
      ),
    ),
  );

  tray = new Tray(nativeImage.createFromPath(locations.trayIcon));
  tray.setToolTip(trayTooltip(null));
  tray.setContextMenu(Menu.buildFromTemplate(trayMenuTemplate({ open: reveal, quit: () => app.quit() })));
  tray.on('click', reveal);

  const notifier = createNotifier(Notification, (questionId) => {
    reveal();
    if (questionId === null) show(ROUTES.desk);
    else window.webContents.send(IPC_OPEN_QUESTION_CHANNEL, questionId);
  });
  const scheduler = diary.createScheduler(notifier, (count) => {
    tray?.setToolTip(trayTooltip(count));
    // Also the dock badge on macOS; on Linux only where the launcher supports counts.
    app.setBadgeCount(count);
  });
  // start() runs once straight away (reason 'start'), which catches up what fell due while closed.
  scheduler.start();

  // Automatic rolling backups: one a day while the app runs, the newest seven kept.
  const backupsDir = path.join(app.getPath('userData'), 'backups');
  const backUp = () => {
    diary.rollingBackup(backupsDir).catch((error: unknown) => console.error(`Forelog: the daily backup failed: ${reason(error)}`));
  };
  backUp();
  const backupTimer = setInterval(backUp, BACKUP_CHECK_MS);
  backupTimer.unref();
  powerMonitor.on('resume', () => {
    scheduler.runOnce('resume');
  });

  let shutDown = false;
  app.on('will-quit', () => {
    if (shutDown) return;
    shutDown = true;
    scheduler.stop();
    clearInterval(backupTimer);
    tray?.destroy();
    tray = null;
    diary.close();
  });
  return true;
}

if (process.versions.electron !== undefined) {
  import('./service')
    .then(({ openDiary }) => startShell({ openDiary, argv: process.argv, cwd: process.cwd(), platform: process.platform }))
    .catch((error: unknown) => {
      dialog.showErrorBox('Forelog could not start', `${reason(error)}\nReinstall Forelog; if it keeps happening, start it from a terminal to see more.`);
      app.exit(1);
    });
}
