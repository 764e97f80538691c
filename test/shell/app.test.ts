/**
 * The Electron shell's wiring, driven through the fake electron module. What is expected
 * comes from the Electron security checklist (electronjs.org/docs/latest/tutorial/security:
 * context isolation, sandbox for every renderer, no Node integration, CSP, a custom protocol
 * instead of file://, navigation limits on every web contents, window.open denied,
 * permission requests denied, IPC sender validation), Electron's API docs (app.enableSandbox
 * and protocol.registerSchemesAsPrivileged before ready, protocol.handle after;
 * app 'web-contents-created'; app.requestSingleInstanceLock / 'second-instance',
 * Notification 'click', Tray.setToolTip, app.setBadgeCount) and the product brief (menu
 * routes, tray wording).
 */
import { beforeEach, test } from 'node:test';
import assert from 'node:assert/strict';
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { mkdtemp, readFile, readdir, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { app, BrowserWindow, fake, fakeEvent, powerMonitor, type FakeBrowserWindow, type FakeMenuItem } from './fake-electron';
import { startShell } from '../../main/app';
import type { DiaryService, NudgeNotifier } from '../../main/shell/service-port';
import { APP_ID } from '../../main/shell/locations';
import { CONTENT_SECURITY_POLICY } from '../../main/shell/csp';
import { APP_INDEX_URL } from '../../main/shell/app-origin';
import { IPC_BRIEFING_PDF_CHANNEL, IPC_CALL_CHANNEL, IPC_OPEN_QUESTION_CHANNEL, type Envelope } from '../../shared/bridge';

/** An installed app's folder: the built page and one asset, and a file beside them that must stay private. */
const APP_PATH = mkdtempSync(path.join(tmpdir(), 'forelog-app-'));
const RENDERER_DIR = path.join(APP_PATH, 'dist', 'renderer');
const INDEX_HTML = path.join(RENDERER_DIR, 'index.html');
mkdirSync(path.join(RENDERER_DIR, 'assets'), { recursive: true });
writeFileSync(INDEX_HTML, '<!doctype html><title>Forelog</title>');
writeFileSync(path.join(RENDERER_DIR, 'assets', 'index.js'), 'void 0;');
writeFileSync(path.join(APP_PATH, 'package.json'), '{"name":"forelog"}');

function fakeDiary() {
  const record = {
    dispatched: [] as { operation: string; request: unknown }[],
    runs: [] as string[],
    starts: 0,
    stops: 0,
    closes: 0,
    exported: [] as { file: string; format: string }[],
    imported: [] as { file: string; format: string }[],
    backups: [] as string[],
    rollingBackups: [] as string[],
    notifier: null as NudgeNotifier | null,
    onDueCountChanged: undefined as ((count: number) => void) | undefined,
  };
  const service: DiaryService = {
    async dispatch(operation, request) {
      record.dispatched.push({ operation, request });
      return { ok: true, value: { operation } };
    },
    createScheduler(notifier, onDueCountChanged) {
      record.notifier = notifier;
      record.onDueCountChanged = onDueCountChanged;
      return {
        runOnce: (reason) => record.runs.push(reason),
        start: () => {
          record.starts += 1;
        },
        stop: () => {
          record.stops += 1;
        },
      };
    },
    exportDiaryFile(file, format) {
      record.exported.push({ file, format });
      writeFileSync(file, '{"format":"forelog-diary","version":1,"questions":[]}\n');
    },
    importDiaryFile(file, format) {
      record.imported.push({ file, format });
      return { added: 2 };
    },
    async backupTo(file) {
      record.backups.push(file);
    },
    async rollingBackup(dir) {
      record.rollingBackups.push(dir);
    },
    close() {
      record.closes += 1;
    },
    location: '/home/tester/.config/Forelog/forelog.sqlite',
  };
  return { service, record };
}

interface StartOptions {
  argv?: string[];
  platform?: NodeJS.Platform;
  openDiary?: () => DiaryService;
}

async function start(options: StartOptions = {}) {
  const diary = fakeDiary();
  const opened: string[] = [];
  const started = await startShell({
    openDiary: ({ dbPath }) => {
      opened.push(dbPath);
      return options.openDiary ? options.openDiary() : diary.service;
    },
    argv: options.argv ?? ['/usr/bin/electron', '.'],
    cwd: '/home/tester/work',
    platform: options.platform ?? 'linux',
  });
  return { started, opened, record: diary.record, win: fake.windows[0] };
}

function menuItem(template: FakeMenuItem[], ...labels: string[]): FakeMenuItem {
  let items = template;
  let found: FakeMenuItem | undefined;
  for (const label of labels) {
    found = items.find((item) => item.label === label);
    assert.ok(found, `menu item ${labels.join(' > ')} exists`);
    items = found.submenu ?? [];
  }
  return found!;
}

/** Waits for the async work a click starts (dialogs, file writes) to finish. */
async function until(done: () => boolean): Promise<void> {
  for (let i = 0; i < 200 && !done(); i += 1) await new Promise((resolve) => setTimeout(resolve, 5));
  assert.ok(done(), 'the expected effect happened');
}

beforeEach(() => {
  fake.reset();
  fake.appPath = APP_PATH;
});

/** The web-preferences every window must have (Electron security checklist items 2–4 and 6). */
function assertLockedDown(window: FakeBrowserWindow, label: string): void {
  const prefs = window.options.webPreferences;
  assert.equal(prefs.sandbox, true, `${label}: sandbox`);
  assert.equal(prefs.contextIsolation, true, `${label}: contextIsolation`);
  assert.equal(prefs.nodeIntegration, false, `${label}: nodeIntegration`);
  assert.equal(prefs.webSecurity, true, `${label}: webSecurity`);
  assert.equal(prefs.webviewTag, false, `${label}: webviewTag`);
  assert.equal(prefs.allowRunningInsecureContent, false, `${label}: allowRunningInsecureContent`);
}

/** Emits a navigation event on a web contents as Electron does; true when the handler prevented it. */
function navigate(window: FakeBrowserWindow, event: 'will-navigate' | 'will-redirect', url: string): boolean {
  const details = fakeEvent({ url, isSameDocument: false, isMainFrame: true });
  window.webContents.emit(event, details, url);
  return details.defaultPrevented;
}

test('the window gets the security webPreferences and our preload, and loads the page from our scheme', async () => {
  const { started, win } = await start();
  assert.equal(started, true);
  assert.equal(fake.windows.length, 1);
  assertLockedDown(win!, 'main window');
  const prefs = win!.options.webPreferences;
  assert.equal(prefs.preload, path.join(APP_PATH, 'dist', 'main', 'preload.cjs'));
  assert.equal(prefs.devTools, true, 'a development run keeps the developer tools');
  assert.deepEqual(win!.loads, ['forelog-app://app/index.html']);
  // Shown only when ready, so no blank frame flashes first.
  assert.equal(win!.visible, false);
  win!.emit('ready-to-show');
  assert.equal(win!.visible, true);
});

test('the diary lives in <appData>/Forelog/forelog.sqlite unless --db names another file', async () => {
  const first = await start();
  assert.equal(fake.paths.userData, '/home/tester/.config/Forelog');
  assert.deepEqual(first.opened, ['/home/tester/.config/Forelog/forelog.sqlite']);
  fake.reset();
  const second = await start({ argv: ['/usr/bin/electron', '.', '--db', 'diaries/work.sqlite'] });
  assert.deepEqual(second.opened, ['/home/tester/work/diaries/work.sqlite']);
});

test('a --db without a path, or a diary that fails to open, is reported and the app quits', async () => {
  const missing = await start({ argv: ['/usr/bin/electron', '.', '--db'] });
  assert.equal(missing.started, false);
  assert.deepEqual(missing.opened, []);
  assert.match(fake.errorBoxes[0]!.content, /--db option needs the path/);
  assert.equal(fake.quitCalls, 1);
  assert.equal(fake.windows.length, 0);

  fake.reset();
  const broken = await start({
    openDiary: () => {
      throw new Error('The diary file was written by a newer Forelog (schema 9).');
    },
  });
  assert.equal(broken.started, false);
  assert.equal(fake.errorBoxes[0]!.title, 'Forelog could not open its diary');
  assert.match(fake.errorBoxes[0]!.content, /newer Forelog[\s\S]*--db PATH/);
  assert.equal(fake.quitCalls, 1);
  assert.equal(fake.windows.length, 0);
});

test('a packaged build has no developer tools in the window or the menu', async () => {
  fake.isPackaged = true;
  const { win } = await start();
  assert.equal(win!.options.webPreferences.devTools, false);
  const roles = menuItem(fake.applicationMenu!.template, 'View').submenu!.map((item) => item.role);
  assert.ok(!roles.includes('toggleDevTools') && !roles.includes('reload'));
});

test('the sandbox, our scheme and the guard are set up before the app is ready; the scheme is served after', async () => {
  await start();
  assert.deepEqual(fake.timeline, ['enableSandbox', 'registerSchemesAsPrivileged', 'ready', 'protocol.handle forelog-app']);
  assert.deepEqual(fake.privilegedSchemes, [{ scheme: 'forelog-app', privileges: { standard: true, secure: true } }]);
  assert.equal(app.listenerCount('web-contents-created'), 1);
});

test('a second instance also enables the sandbox before it quits', async () => {
  fake.singleInstanceLock = false;
  await start();
  assert.deepEqual(fake.timeline, ['enableSandbox', 'registerSchemesAsPrivileged']);
});

test('our scheme serves the built page with the policy, and nothing outside dist/renderer', async () => {
  await start();
  const serve = fake.protocolHandlers.get('forelog-app')!;
  const page = await serve(new Request(APP_INDEX_URL));
  assert.equal(page.status, 200);
  assert.equal(await page.text(), '<!doctype html><title>Forelog</title>');
  assert.equal(page.headers.get('content-security-policy'), CONTENT_SECURITY_POLICY);
  assert.equal((await serve(new Request('forelog-app://app/assets/index.js'))).headers.get('content-type'), 'text/javascript; charset=utf-8');
  for (const url of ['forelog-app://app/..%2f..%2fpackage.json', 'forelog-app://app/%2F' + encodeURIComponent(path.join(APP_PATH, 'package.json').slice(1))]) {
    const refused = await serve(new Request(url));
    assert.equal(refused.status, 403, url);
    assert.equal(refused.headers.get('content-security-policy'), CONTENT_SECURITY_POLICY, url);
  }
  assert.equal((await serve(new Request('forelog-app://app/nothing-here.js'))).status, 404);
});

test('every response gets our Content-Security-Policy header, replacing any other', async () => {
  await start();
  assert.ok(fake.headersListener, 'a header hook is installed');
  let answer: { responseHeaders?: Record<string, string[] | string> } | undefined;
  fake.headersListener!(
    { url: 'https://example.org/any-other-response', responseHeaders: { 'content-type': ['text/html'], 'content-security-policy': ["default-src *"] } },
    (response: typeof answer) => {
      answer = response;
    },
  );
  assert.deepEqual(answer, {
    responseHeaders: { 'content-type': ['text/html'], 'Content-Security-Policy': [CONTENT_SECURITY_POLICY] },
  });
});

test('permission requests are denied and permission checks answer no', async () => {
  await start();
  const answers: boolean[] = [];
  fake.permissionRequestHandler!({}, 'media', (granted: boolean) => answers.push(granted), {});
  fake.permissionRequestHandler!({}, 'notifications', (granted: boolean) => answers.push(granted), {});
  assert.deepEqual(answers, [false, false]);
  assert.equal(fake.permissionCheckHandler!({}, 'geolocation', 'forelog-app://app', {}), false);
});

test('navigation away from our origin is prevented; only https links go to the system browser', async () => {
  const { win } = await start();
  assert.equal(navigate(win!, 'will-navigate', 'https://example.org/report'), true);
  assert.equal(navigate(win!, 'will-navigate', 'http://example.org/'), true);
  assert.equal(navigate(win!, 'will-navigate', 'file:///etc/passwd'), true);
  assert.equal(navigate(win!, 'will-navigate', `file://${INDEX_HTML}`), true, 'not even our own files over file://');
  assert.equal(navigate(win!, 'will-navigate', 'javascript:alert(1)'), true);
  assert.equal(navigate(win!, 'will-navigate', `${APP_INDEX_URL}#/scorecard`), false, 'our own page may reload');
  assert.equal(navigate(win!, 'will-redirect', 'https://example.org/elsewhere'), true);
  assert.deepEqual(fake.openedExternally, ['https://example.org/report']);
});

test('a web contents created after start (the hidden PDF window, any later one) gets the same guard', async () => {
  const dir = await mkdtemp(path.join(tmpdir(), 'forelog-shell-'));
  await start();
  fake.savePath = path.join(dir, 'briefing.pdf');
  const savePdf = fake.handlers.get(IPC_BRIEFING_PDF_CHANNEL)! as (e: unknown, req: unknown) => Promise<Envelope>;
  const saved = await savePdf({ senderFrame: { url: APP_INDEX_URL } }, { tag: 'renewals' });
  assert.deepEqual(saved, { ok: true, value: { file: fake.savePath } });
  assert.equal(fake.windows.length, 2);
  const printer = fake.windows[1]!;
  assertLockedDown(printer, 'PDF window');
  assert.equal(printer.options.webPreferences.javascript, false);
  assert.equal(printer.options.webPreferences.preload, undefined);
  assert.match(printer.loads[0]!, /^data:text\/html/);
  assert.equal(printer.isDestroyed(), true);

  const later = new BrowserWindow({ webPreferences: {} });
  for (const contents of [printer, later]) {
    assert.equal(navigate(contents, 'will-navigate', 'https://example.org/phish'), true);
    assert.equal(navigate(contents, 'will-redirect', 'http://example.org/'), true);
    assert.deepEqual(contents.webContents.windowOpenHandler!({ url: 'https://example.org/popup' }), { action: 'deny' });
    const webview = fakeEvent({});
    contents.webContents.emit('will-attach-webview', webview, {}, { src: 'https://example.org/' });
    assert.equal(webview.defaultPrevented, true);
  }
  assert.deepEqual(fake.openedExternally, ['https://example.org/phish', 'https://example.org/popup', 'https://example.org/phish', 'https://example.org/popup']);
});

test('window.open is always denied; an https target opens in the system browser instead', async () => {
  const { win } = await start();
  assert.deepEqual(win!.webContents.windowOpenHandler!({ url: APP_INDEX_URL }), { action: 'deny' });
  const handler = win!.webContents.windowOpenHandler!;
  assert.deepEqual(handler({ url: 'https://example.org/a' }), { action: 'deny' });
  assert.deepEqual(handler({ url: 'file:///tmp/x.html' }), { action: 'deny' });
  assert.deepEqual(handler({ url: 'http://example.org/b' }), { action: 'deny' });
  assert.deepEqual(fake.openedExternally, ['https://example.org/a']);
});

test('IPC: one handler, our page reaches dispatch, other senders and unknown operations are refused', async () => {
  const { record } = await start();
  assert.deepEqual([...fake.handlers.keys()].sort(), [IPC_BRIEFING_PDF_CHANNEL, IPC_CALL_CHANNEL]);
  const handler = fake.handlers.get(IPC_CALL_CHANNEL)! as (e: unknown, op: unknown, req: unknown) => Promise<Envelope>;

  const ok = await handler({ senderFrame: { url: `${APP_INDEX_URL}#/questions` } }, 'listQuestions', { tag: 'renewals' });
  assert.deepEqual(ok, { ok: true, value: { operation: 'listQuestions' } });

  for (const url of [`${APP_INDEX_URL}.evil/index.html`, `file://${INDEX_HTML}`, 'about:srcdoc']) {
    const stranger = await handler({ senderFrame: { url } }, 'deleteQuestion', { id: 'q1' });
    assert.ok(!stranger.ok && /did not come from Forelog's own window/.test(stranger.error.message), url);
  }

  const unknown = await handler({ senderFrame: { url: APP_INDEX_URL } }, 'formatDisk', {});
  assert.ok(!unknown.ok && unknown.error.code === 'invalid');

  assert.deepEqual(record.dispatched, [{ operation: 'listQuestions', request: { tag: 'renewals' } }]);

  // The PDF channel checks the sender the same way before anything runs.
  const pdf = fake.handlers.get(IPC_BRIEFING_PDF_CHANNEL)! as (e: unknown, req: unknown) => Promise<Envelope>;
  const refused = await pdf({ senderFrame: { url: 'https://example.invalid/' } }, { tag: 'renewals' });
  assert.ok(!refused.ok && /did not come from Forelog's own window/.test(refused.error.message));
  assert.equal(record.dispatched.length, 1);
});

test('single instance: without the lock the app quits at once; with it, a second launch focuses the window', async () => {
  fake.singleInstanceLock = false;
  const refused = await start();
  assert.equal(refused.started, false);
  assert.equal(fake.quitCalls, 1);
  assert.deepEqual(refused.opened, [], 'the diary is not opened by a second instance');
  assert.equal(fake.windows.length, 0);

  fake.reset();
  const { win } = await start();
  win!.minimized = true;
  win!.calls.length = 0;
  app.emit('second-instance', fakeEvent({}), ['/usr/bin/forelog'], '/home/tester');
  assert.deepEqual(win!.calls, ['restore', 'show', 'focus']);
});

test('menu: accelerators for new question, the four screens and quit, and the routes they open', async () => {
  const { win } = await start();
  const template = fake.applicationMenu!.template;
  assert.equal(menuItem(template, 'File', 'New question…').accelerator, 'CmdOrCtrl+N');
  assert.equal(menuItem(template, 'File', 'Quit').accelerator, 'CmdOrCtrl+Q');
  const screens: [string, string, string][] = [
    ['Desk', 'CmdOrCtrl+1', '/'],
    ['Questions', 'CmdOrCtrl+2', '/questions'],
    ['Scorecard', 'CmdOrCtrl+3', '/scorecard'],
    ['Hindsight', 'CmdOrCtrl+4', '/hindsight'],
  ];
  for (const [label, accelerator, hash] of screens) {
    const item = menuItem(template, 'View', label);
    assert.equal(item.accelerator, accelerator);
    item.click!();
    assert.equal(win!.loads.at(-1), `forelog-app://app/index.html#${hash}`);
  }
  win!.calls.length = 0;
  menuItem(template, 'File', 'New question…').click!();
  assert.equal(win!.loads.at(-1), 'forelog-app://app/index.html#/questions?new=1');
  assert.deepEqual(win!.calls, ['show', 'focus'], 'the window comes forward for the new question');
  assert.ok(template.some((item) => item.role === 'editMenu'), 'Edit roles make copy/paste work');
  menuItem(template, 'File', 'Quit').click!();
  assert.equal(fake.quitCalls, 1);
});

test('menu on macOS: the app menu comes first and Quit is not repeated under File', async () => {
  await start({ platform: 'darwin' });
  const template = fake.applicationMenu!.template;
  assert.equal(template[0]!.role, 'appMenu');
  assert.ok(!menuItem(template, 'File').submenu!.some((item) => item.label === 'Quit'));
  assert.deepEqual(fake.appUserModelIds, [], 'the AppUserModelID is a Windows setting');
});

test('on Windows the AppUserModelID is set to the appId electron-builder installs under', async () => {
  await start({ platform: 'win32' });
  assert.deepEqual(fake.appUserModelIds, [APP_ID]);
  const config = await readFile(new URL('../../electron-builder.yml', import.meta.url), 'utf8');
  assert.match(config, new RegExp(`^appId: ${APP_ID.replace(/\./g, '\\.')}$`, 'm'));
});

test('a nudge becomes a notification; clicking it shows the window and sends the question id', async () => {
  const { win, record } = await start();
  record.notifier!.notify({ title: 'Window closed', body: 'Window closed: Northgate phase 2 — how did it resolve?', question_id: 'q-42' });
  assert.equal(fake.notifications.length, 1);
  const notification = fake.notifications[0]!;
  assert.deepEqual(notification.options, { title: 'Window closed', body: 'Window closed: Northgate phase 2 — how did it resolve?' });
  assert.equal(notification.shown, true);
  win!.calls.length = 0;
  notification.emit('click', fakeEvent({}));
  assert.deepEqual(win!.calls, ['show', 'focus']);
  assert.deepEqual(win!.webContents.sent, [{ channel: IPC_OPEN_QUESTION_CHANNEL, args: ['q-42'] }]);
});

test('clicking a summary notification (no question) opens the Desk', async () => {
  const { win, record } = await start();
  record.notifier!.notify({ title: '3 nudges', body: '3 nudges while you were away', question_id: null });
  fake.notifications[0]!.emit('click', fakeEvent({}));
  assert.deepEqual(win!.webContents.sent, []);
  assert.equal(win!.loads.at(-1), 'forelog-app://app/index.html#/');
});

test('the due count shows in the tray tooltip and the app badge', async () => {
  const { record } = await start();
  const tray = fake.trays[0]!;
  assert.equal(tray.image.path, path.join(APP_PATH, 'dist', 'main', 'assets', 'tray.png'));
  assert.equal(tray.tooltip, 'Forelog');
  record.onDueCountChanged!(3);
  assert.equal(tray.tooltip, 'Forelog — 3 due');
  record.onDueCountChanged!(0);
  assert.equal(tray.tooltip, 'Forelog — nothing due');
  assert.deepEqual(fake.badgeCounts, [3, 0]);
  assert.deepEqual(
    tray.contextMenu!.template.filter((item) => item.label).map((item) => item.label),
    ['Open Forelog', 'Quit Forelog'],
  );
});

test('nudges start with the app, and a system resume runs them again', async () => {
  const { record } = await start();
  assert.equal(record.starts, 1);
  powerMonitor.emit('resume');
  assert.deepEqual(record.runs, ['resume']);
});

test('the app makes its automatic daily backup into the user-data folder at start', async () => {
  const { record } = await start();
  assert.equal(record.rollingBackups.length, 1);
  assert.match(record.rollingBackups[0]!, /[\\/]backups$/);
});

test('closing the window hides it; quitting stops nudges and closes the diary once', async () => {
  const { win, record } = await start();
  const close = fakeEvent({});
  win!.emit('close', close);
  assert.equal(close.defaultPrevented, true);
  assert.equal(win!.visible, false);

  app.emit('before-quit', fakeEvent({}));
  const closeOnQuit = fakeEvent({});
  win!.emit('close', closeOnQuit);
  assert.equal(closeOnQuit.defaultPrevented, false);
  app.emit('will-quit', fakeEvent({}));
  app.emit('will-quit', fakeEvent({}));
  assert.equal(record.stops, 1);
  assert.equal(record.closes, 1);
  assert.equal(fake.trays[0]!.destroyed, true);
});

test('File > Export writes the diary file where the user chose, with a dated default name', async () => {
  const dir = await mkdtemp(path.join(tmpdir(), 'forelog-shell-'));
  const { record } = await start();
  fake.savePath = path.join(dir, 'mine.json');
  menuItem(fake.applicationMenu!.template, 'File', 'Export diary…').click!();
  await until(() => fake.messageBoxes.length > 0);
  assert.deepEqual(record.exported, [{ file: fake.savePath, format: 'json' }], 'the service writes the chosen file');
  assert.equal(await readFile(fake.savePath, 'utf8'), '{"format":"forelog-diary","version":1,"questions":[]}\n');
  assert.deepEqual(await readdir(dir), ['mine.json'], 'no partial file is left behind');
  assert.match(fake.fileDialogs[0]!.defaultPath!, /forelog-diary-\d{4}-\d{2}-\d{2}\.json$/);
  assert.deepEqual(fake.errorBoxes, []);
});

test('File > Import hands the file to the service, reports the count and reloads the screens', async () => {
  const dir = await mkdtemp(path.join(tmpdir(), 'forelog-shell-'));
  const { win, record } = await start();
  fake.openPath = path.join(dir, 'theirs.json');
  await writeFile(fake.openPath, '{"format":"forelog-diary","version":1,"questions":[{"title":"x"}]}');
  const loadsBefore = win!.loads.length;
  menuItem(fake.applicationMenu!.template, 'File', 'Import diary…').click!();
  await until(() => win!.loads.length > loadsBefore);
  assert.deepEqual(record.imported, [{ file: fake.openPath, format: 'json' }], 'the service reads the chosen file itself (streaming)');
  assert.match(fake.messageBoxes[0]!.detail!, /Added 2 questions/);
});

test('File > Back up asks for a file and has the service write the copy; Cancel does nothing', async () => {
  const { record } = await start();
  const backUp = menuItem(fake.applicationMenu!.template, 'File', 'Back up…');
  backUp.click!();
  await until(() => fake.fileDialogs.length === 1);
  await new Promise((resolve) => setTimeout(resolve, 10));
  assert.deepEqual(record.backups, []);
  fake.savePath = '/home/tester/Documents/copy.sqlite';
  backUp.click!();
  await until(() => record.backups.length === 1);
  assert.deepEqual(record.backups, ['/home/tester/Documents/copy.sqlite']);
  assert.match(fake.fileDialogs[1]!.defaultPath!, /forelog-backup-\d{4}-\d{2}-\d{2}\.sqlite$/);
});

test('missing screens are reported with what to do, and nothing is loaded', async () => {
  fake.appPath = await mkdtemp(path.join(tmpdir(), 'forelog-empty-app-'));
  const { win } = await start();
  assert.equal(fake.errorBoxes[0]!.title, 'Forelog could not show its screens');
  assert.match(fake.errorBoxes[0]!.content, /dist[\\/]renderer[\\/]index\.html[\s\S]*npm run build/);
  assert.deepEqual(win!.loads, []);
});

test('a failed page load is reported with what to do, but a load cut short by the next is not', async () => {
  fake.loadError = Object.assign(new Error('ERR_FAILED (-2) loading forelog-app://app/index.html'), { code: 'ERR_FAILED' });
  await start();
  await until(() => fake.errorBoxes.length === 1);
  assert.match(fake.errorBoxes[0]!.content, /npm run build/);

  fake.reset();
  fake.appPath = APP_PATH;
  fake.loadError = Object.assign(new Error('ERR_ABORTED (-3) loading forelog-app://app/index.html'), { code: 'ERR_ABORTED' });
  await start();
  await new Promise((resolve) => setTimeout(resolve, 20));
  assert.deepEqual(fake.errorBoxes, []);
});
