/**
 * The application menu and the tray menu, as plain templates for Menu.buildFromTemplate.
 * The items call back into the shell; nothing here touches Electron, so tests can read
 * labels, accelerators and wiring directly.
 */

/** The renderer's routes (hash paths of dist/renderer/index.html) the menu opens. */
export const ROUTES = {
  desk: '/',
  questions: '/questions',
  newQuestion: '/questions?new=1',
  scorecard: '/scorecard',
  hindsight: '/hindsight',
  settings: '/settings',
} as const;

export type Route = (typeof ROUTES)[keyof typeof ROUTES];

/** The Electron menu roles used here (a subset of MenuItemConstructorOptions['role']). */
type MenuRole =
  | 'appMenu'
  | 'editMenu'
  | 'windowMenu'
  | 'quit'
  | 'reload'
  | 'forceReload'
  | 'toggleDevTools'
  | 'resetZoom'
  | 'zoomIn'
  | 'zoomOut'
  | 'togglefullscreen';

export interface MenuItemSpec {
  label?: string;
  role?: MenuRole;
  type?: 'separator';
  accelerator?: string;
  click?: () => void;
  submenu?: MenuItemSpec[];
}

export interface MenuActions {
  go(route: Route): void;
  exportDiary(): void;
  importDiary(): void;
  backUp(): void;
  about(): void;
  quit(): void;
}

export interface MenuPlatform {
  isMac: boolean;
  /** Reload and developer tools only in a development build. */
  isPackaged: boolean;
}

const separator: MenuItemSpec = { type: 'separator' };

export function applicationMenuTemplate(actions: MenuActions, platform: MenuPlatform): MenuItemSpec[] {
  const file: MenuItemSpec[] = [
    { label: 'New question…', accelerator: 'CmdOrCtrl+N', click: () => actions.go(ROUTES.newQuestion) },
    separator,
    { label: 'Export diary…', accelerator: 'CmdOrCtrl+Shift+E', click: () => actions.exportDiary() },
    { label: 'Import diary…', click: () => actions.importDiary() },
    { label: 'Back up…', click: () => actions.backUp() },
  ];
  // On macOS Quit lives in the app menu (appMenu role); elsewhere it ends the File menu.
  if (!platform.isMac) file.push(separator, { label: 'Quit', accelerator: 'CmdOrCtrl+Q', click: () => actions.quit() });

  const view: MenuItemSpec[] = [
    { label: 'Desk', accelerator: 'CmdOrCtrl+1', click: () => actions.go(ROUTES.desk) },
    { label: 'Questions', accelerator: 'CmdOrCtrl+2', click: () => actions.go(ROUTES.questions) },
    { label: 'Scorecard', accelerator: 'CmdOrCtrl+3', click: () => actions.go(ROUTES.scorecard) },
    { label: 'Hindsight', accelerator: 'CmdOrCtrl+4', click: () => actions.go(ROUTES.hindsight) },
    { label: 'Settings', accelerator: 'CmdOrCtrl+,', click: () => actions.go(ROUTES.settings) },
    separator,
    { role: 'resetZoom' },
    { role: 'zoomIn' },
    { role: 'zoomOut' },
    separator,
    { role: 'togglefullscreen' },
  ];
  if (!platform.isPackaged) view.push(separator, { role: 'reload' }, { role: 'forceReload' }, { role: 'toggleDevTools' });

  const template: MenuItemSpec[] = [];
  if (platform.isMac) template.push({ role: 'appMenu' });
  template.push(
    { label: 'File', submenu: file },
    // The Edit menu's roles are what make copy, paste and undo work in text fields on macOS.
    { role: 'editMenu' },
    { label: 'View', submenu: view },
  );
  if (platform.isMac) template.push({ role: 'windowMenu' });
  template.push({ label: 'Help', submenu: [{ label: 'About Forelog', click: () => actions.about() }] });
  return template;
}

export function trayMenuTemplate(actions: { open(): void; quit(): void }): MenuItemSpec[] {
  return [
    { label: 'Open Forelog', click: () => actions.open() },
    separator,
    { label: 'Quit Forelog', click: () => actions.quit() },
  ];
}

/** The tray tooltip: how many nudges are due, or just the name before the first count. */
export function trayTooltip(dueCount: number | null): string {
  if (dueCount === null) return 'Forelog';
  if (dueCount === 0) return 'Forelog — nothing due';
  return `Forelog — ${dueCount} due`;
}
