/**
 * Construction options for the app's windows. The webPreferences follow Electron's security
 * checklist (electronjs.org/docs/latest/tutorial/security): the page gets no Node.js, runs in
 * Chromium's sandbox, and sees the preload's API only through an isolated world. Every window
 * starts from LOCKED_DOWN; the shell also calls app.enableSandbox(), so a window that forgot
 * `sandbox: true` would still be sandboxed.
 */
export const LOCKED_DOWN = {
  contextIsolation: true,
  sandbox: true,
  nodeIntegration: false,
  nodeIntegrationInWorker: false,
  nodeIntegrationInSubFrames: false,
  webSecurity: true,
  allowRunningInsecureContent: false,
  webviewTag: false,
  // Dropping a file on the window must not replace the app with that file.
  navigateOnDragDrop: false,
  safeDialogs: true,
} as const;

export interface MainWindowSettings {
  preload: string;
  icon: string;
  /** False in the packaged app: nobody should be walked into pasting code into a console. */
  devTools: boolean;
}

export function mainWindowOptions(settings: MainWindowSettings) {
  return {
    title: 'Forelog',
    width: 1200,
    height: 820,
    minWidth: 720,
    minHeight: 520,
    // Shown on 'ready-to-show', so the window never flashes an empty frame.
    show: false,
    icon: settings.icon,
    webPreferences: { ...LOCKED_DOWN, preload: settings.preload, devTools: settings.devTools },
  };
}

/**
 * The hidden window that lays the briefing out and prints it to PDF: no preload, no scripts,
 * no developer tools, so the page, whatever a note in it says, can reach nothing.
 */
export function printWindowOptions() {
  return {
    show: false,
    webPreferences: { ...LOCKED_DOWN, javascript: false, devTools: false },
  };
}
