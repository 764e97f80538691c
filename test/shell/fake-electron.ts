/**
 * A small stand-in for the `electron` module, for tests under plain Node (the Electron
 * runtime cannot be installed here). It implements just what the shell calls and records
 * it in `fake`, so tests can assert on options, registrations and messages, and trigger
 * events (app, window, web contents, notification, tray, power) themselves.
 * register-fake-electron.mjs maps the bare specifier 'electron' to this file.
 *
 * Where Electron has an ordering rule, the fake enforces it the same way (Electron's API
 * docs): app.enableSandbox and protocol.registerSchemesAsPrivileged throw once the app is
 * ready, protocol.handle throws before; every new window's web contents is announced with
 * app 'web-contents-created'. `fake.timeline` records the order these happened in.
 */
import { EventEmitter } from 'node:events';

type Handler = (...args: any[]) => unknown;

/** An Electron-style event: preventDefault() is recorded in defaultPrevented. */
export function fakeEvent<T extends object>(fields: T): T & { defaultPrevented: boolean; preventDefault(): void } {
  const event = {
    ...fields,
    defaultPrevented: false,
    preventDefault() {
      event.defaultPrevented = true;
    },
  };
  return event;
}

export class FakeWebContents extends EventEmitter {
  readonly sent: { channel: string; args: unknown[] }[] = [];
  windowOpenHandler: ((details: { url: string }) => { action: string }) | null = null;
  reloads = 0;
  /** Every window uses the default session, as in the app. */
  readonly session = session.defaultSession;
  printToPDF(options: Record<string, unknown>): Promise<Buffer> {
    fake.printedToPdf.push(options);
    return Promise.resolve(Buffer.from('%PDF-1.7 fake'));
  }
  send(channel: string, ...args: unknown[]): void {
    this.sent.push({ channel, args });
  }
  setWindowOpenHandler(handler: (details: { url: string }) => { action: string }): void {
    this.windowOpenHandler = handler;
  }
  reload(): void {
    this.reloads += 1;
  }
}

export class FakeBrowserWindow extends EventEmitter {
  readonly webContents = new FakeWebContents();
  readonly loads: string[] = [];
  readonly calls: string[] = [];
  visible = false;
  minimized = false;
  destroyed = false;
  constructor(readonly options: Record<string, any>) {
    super();
    fake.windows.push(this);
    app.emit('web-contents-created', fakeEvent({}), this.webContents);
  }
  loadURL(url: string): Promise<void> {
    this.loads.push(url);
    return fake.loadError === null ? Promise.resolve() : Promise.reject(fake.loadError);
  }
  isDestroyed(): boolean {
    return this.destroyed;
  }
  destroy(): void {
    this.destroyed = true;
  }
  isMinimized(): boolean {
    return this.minimized;
  }
  restore(): void {
    this.calls.push('restore');
    this.minimized = false;
  }
  show(): void {
    this.calls.push('show');
    this.visible = true;
  }
  hide(): void {
    this.calls.push('hide');
    this.visible = false;
  }
  focus(): void {
    this.calls.push('focus');
  }
}

export class FakeNotification extends EventEmitter {
  shown = false;
  constructor(readonly options: { title: string; body: string }) {
    super();
    fake.notifications.push(this);
  }
  static isSupported(): boolean {
    return fake.notificationsSupported;
  }
  show(): void {
    this.shown = true;
  }
}

export class FakeTray extends EventEmitter {
  tooltip: string | null = null;
  contextMenu: FakeMenu | null = null;
  destroyed = false;
  constructor(readonly image: { path: string }) {
    super();
    fake.trays.push(this);
  }
  setToolTip(text: string): void {
    this.tooltip = text;
  }
  setContextMenu(menu: FakeMenu): void {
    this.contextMenu = menu;
  }
  destroy(): void {
    this.destroyed = true;
  }
}

export interface FakeMenu {
  template: FakeMenuItem[];
}

export interface FakeMenuItem {
  label?: string;
  role?: string;
  type?: string;
  accelerator?: string;
  click?: () => void;
  submenu?: FakeMenuItem[];
}

export interface FileDialogOptions {
  title?: string;
  defaultPath?: string;
  filters?: { name: string; extensions: string[] }[];
}

export interface FakeCustomScheme {
  scheme: string;
  privileges?: Record<string, boolean>;
}

type ProtocolHandler = (request: Request) => Response | Promise<Response>;

interface FakeState {
  ready: boolean;
  /** 'enableSandbox', 'registerSchemesAsPrivileged', 'ready', 'protocol.handle <scheme>' in the order they happened. */
  timeline: string[];
  privilegedSchemes: FakeCustomScheme[] | null;
  protocolHandlers: Map<string, ProtocolHandler>;
  singleInstanceLock: boolean;
  isPackaged: boolean;
  appPath: string;
  paths: Record<string, string>;
  quitCalls: number;
  exitCodes: number[];
  appUserModelIds: string[];
  badgeCounts: number[];
  windows: FakeBrowserWindow[];
  /** What the next loadURL rejects with, or null for success. */
  loadError: (Error & { code?: string }) | null;
  printedToPdf: Record<string, unknown>[];
  handlers: Map<string, Handler>;
  applicationMenu: FakeMenu | null;
  trays: FakeTray[];
  notifications: FakeNotification[];
  notificationsSupported: boolean;
  exposed: { key: string; api: any }[];
  invocations: { channel: string; args: unknown[] }[];
  invokeResult: unknown;
  openedExternally: string[];
  errorBoxes: { title: string; content: string }[];
  messageBoxes: { message: string; detail?: string }[];
  fileDialogs: FileDialogOptions[];
  /** What the next save/open dialog answers: a path, or null for Cancel. */
  savePath: string | null;
  openPath: string | null;
  headersListener: Handler | null;
  permissionRequestHandler: Handler | null;
  permissionCheckHandler: Handler | null;
  reset(): void;
}

function initialState(): Omit<FakeState, 'reset'> {
  return {
    ready: false,
    timeline: [],
    privilegedSchemes: null,
    protocolHandlers: new Map(),
    singleInstanceLock: true,
    isPackaged: false,
    appPath: '/opt/forelog-test/app',
    paths: { appData: '/home/tester/.config', documents: '/home/tester/Documents' },
    quitCalls: 0,
    exitCodes: [],
    appUserModelIds: [],
    badgeCounts: [],
    windows: [],
    loadError: null,
    printedToPdf: [],
    handlers: new Map(),
    applicationMenu: null,
    trays: [],
    notifications: [],
    notificationsSupported: true,
    exposed: [],
    invocations: [],
    invokeResult: { ok: true, value: null },
    openedExternally: [],
    errorBoxes: [],
    messageBoxes: [],
    fileDialogs: [],
    savePath: null,
    openPath: null,
    headersListener: null,
    permissionRequestHandler: null,
    permissionCheckHandler: null,
  };
}

export const fake: FakeState = {
  ...initialState(),
  reset() {
    Object.assign(fake, initialState());
    app.removeAllListeners();
    powerMonitor.removeAllListeners();
    ipcRenderer.removeAllListeners();
  },
};

class FakeApp extends EventEmitter {
  get isPackaged(): boolean {
    return fake.isPackaged;
  }
  getPath(name: string): string {
    const value = fake.paths[name];
    if (value === undefined) throw new Error(`fake electron: no path named ${name}`);
    return value;
  }
  setPath(name: string, value: string): void {
    fake.paths[name] = value;
  }
  getAppPath(): string {
    return fake.appPath;
  }
  getVersion(): string {
    return '0.1.0';
  }
  setAppUserModelId(id: string): void {
    fake.appUserModelIds.push(id);
  }
  requestSingleInstanceLock(): boolean {
    return fake.singleInstanceLock;
  }
  whenReady(): Promise<void> {
    return Promise.resolve().then(() => {
      if (fake.ready) return;
      fake.ready = true;
      fake.timeline.push('ready');
    });
  }
  enableSandbox(): void {
    if (fake.ready) throw new Error('app.enableSandbox() can only be called before app is ready');
    fake.timeline.push('enableSandbox');
  }
  quit(): void {
    fake.quitCalls += 1;
  }
  exit(code: number): void {
    fake.exitCodes.push(code);
  }
  setBadgeCount(count: number): boolean {
    fake.badgeCounts.push(count);
    return true;
  }
}

export const app = new FakeApp();
export const powerMonitor = new EventEmitter();
export const BrowserWindow = FakeBrowserWindow;
export const Notification = FakeNotification;
export const Tray = FakeTray;

export const ipcMain = {
  handle(channel: string, handler: Handler): void {
    if (fake.handlers.has(channel)) throw new Error(`fake electron: a handler for ${channel} is already registered`);
    fake.handlers.set(channel, handler);
  },
};

export const Menu = {
  buildFromTemplate(template: FakeMenuItem[]): FakeMenu {
    return { template };
  },
  setApplicationMenu(menu: FakeMenu | null): void {
    fake.applicationMenu = menu;
  },
};

export const nativeImage = {
  createFromPath(path: string): { path: string } {
    return { path };
  },
};

export const protocol = {
  registerSchemesAsPrivileged(schemes: FakeCustomScheme[]): void {
    if (fake.ready) throw new Error('protocol.registerSchemesAsPrivileged should be called before app is ready');
    if (fake.privilegedSchemes !== null) throw new Error('fake electron: registerSchemesAsPrivileged can be called only once');
    fake.privilegedSchemes = schemes;
    fake.timeline.push('registerSchemesAsPrivileged');
  },
  handle(scheme: string, handler: ProtocolHandler): void {
    if (!fake.ready) throw new Error('fake electron: protocol.handle can only be used after the app is ready');
    if (fake.protocolHandlers.has(scheme)) throw new Error(`fake electron: the scheme ${scheme} is already handled`);
    fake.protocolHandlers.set(scheme, handler);
    fake.timeline.push(`protocol.handle ${scheme}`);
  },
};

export const session = {
  defaultSession: {
    webRequest: {
      onHeadersReceived(listener: Handler): void {
        fake.headersListener = listener;
      },
    },
    setPermissionRequestHandler(handler: Handler): void {
      fake.permissionRequestHandler = handler;
    },
    setPermissionCheckHandler(handler: Handler): void {
      fake.permissionCheckHandler = handler;
    },
  },
};

export const shell = {
  openExternal(url: string): Promise<void> {
    fake.openedExternally.push(url);
    return Promise.resolve();
  },
};

/** Dialog calls take an optional parent window first, as Electron's do. */
function dialogOptions<T>(args: unknown[]): T {
  return args[args.length - 1] as T;
}

export const dialog = {
  showSaveDialog(...args: unknown[]): Promise<{ canceled: boolean; filePath: string }> {
    fake.fileDialogs.push(dialogOptions<FileDialogOptions>(args));
    return Promise.resolve(fake.savePath === null ? { canceled: true, filePath: '' } : { canceled: false, filePath: fake.savePath });
  },
  showOpenDialog(...args: unknown[]): Promise<{ canceled: boolean; filePaths: string[] }> {
    fake.fileDialogs.push(dialogOptions<FileDialogOptions>(args));
    return Promise.resolve(fake.openPath === null ? { canceled: true, filePaths: [] } : { canceled: false, filePaths: [fake.openPath] });
  },
  showMessageBox(...args: unknown[]): Promise<{ response: number }> {
    const options = dialogOptions<{ message: string; detail?: string }>(args);
    fake.messageBoxes.push({ message: options.message, detail: options.detail });
    return Promise.resolve({ response: 0 });
  },
  showErrorBox(title: string, content: string): void {
    fake.errorBoxes.push({ title, content });
  },
};

export const contextBridge = {
  exposeInMainWorld(key: string, api: unknown): void {
    fake.exposed.push({ key, api });
  },
};

class FakeIpcRenderer extends EventEmitter {
  invoke(channel: string, ...args: unknown[]): Promise<unknown> {
    fake.invocations.push({ channel, args });
    return Promise.resolve(fake.invokeResult);
  }
}

export const ipcRenderer = new FakeIpcRenderer();
