/**
 * The shell's pure helpers (main/shell/*). Sources beside each group: W3C CSP Level 3
 * (header syntax, directive names), Electron docs (Notification 'click'/'close'/'failed').
 * The app's origin, its protocol and the web-contents guard have their own test files.
 */
import { BRIEFING_STYLE_HASH } from '../../main/service/briefing-style';
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { mkdtemp, readdir, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { writeFileAtomic } from '../../main/files/atomic-write';
import { readTextFile } from '../../main/files/read-text';
import { CONTENT_SECURITY_POLICY, withContentSecurityPolicy } from '../../main/shell/csp';
import { diaryFileActions, localDateStamp, type FileDialogs } from '../../main/shell/diary-files';
import { dbPathFromArgs, shellLocations } from '../../main/shell/locations';
import { createNotifier, type NotificationLike } from '../../main/shell/notifier';
import type { DiaryService } from '../../main/shell/service-port';

/** Directive name → source list, per CSP3 §2.2 (serialized-policy: ';'-separated, first token is the name). */
function directives(policy: string): Map<string, string[]> {
  return new Map(
    policy.split(';').map((part) => {
      const [name, ...sources] = part.trim().split(/\s+/);
      return [name!, sources];
    }),
  );
}

test('CSP: scripts and styles only from our files, nothing inline, no eval, no plugins, no framing, no forms', () => {
  const d = directives(CONTENT_SECURITY_POLICY);
  assert.deepEqual(d.get('default-src'), ["'self'"]);
  assert.deepEqual(d.get('script-src'), ["'self'"]);
  // Styles: our files, plus the printable briefing's one <style> admitted by its hash.
  assert.deepEqual(d.get('style-src'), ["'self'", BRIEFING_STYLE_HASH]);
  assert.match(BRIEFING_STYLE_HASH, /^'sha256-[A-Za-z0-9+/]{43}='$/);
  assert.deepEqual(d.get('img-src'), ["'self'", 'data:']);
  assert.deepEqual(d.get('connect-src'), ["'self'"]);
  assert.deepEqual(d.get('object-src'), ["'none'"]);
  assert.deepEqual(d.get('base-uri'), ["'none'"]);
  assert.deepEqual(d.get('frame-ancestors'), ["'none'"]);
  assert.deepEqual(d.get('form-action'), ["'none'"]);
  assert.ok(!CONTENT_SECURITY_POLICY.includes('unsafe'), 'no unsafe-inline or unsafe-eval anywhere');
});

test('CSP header: replaces any spelling of an existing policy header and keeps the others', () => {
  // Header field names are case-insensitive (RFC 9110 §5.1).
  const out = withContentSecurityPolicy({ 'Content-Type': ['text/html'], 'CONTENT-SECURITY-POLICY': ['default-src *'] });
  assert.deepEqual(out, { 'Content-Type': ['text/html'], 'Content-Security-Policy': [CONTENT_SECURITY_POLICY] });
  assert.deepEqual(withContentSecurityPolicy(undefined), { 'Content-Security-Policy': [CONTENT_SECURITY_POLICY] });
});

test('shellLocations: everything the window needs sits under the app path', () => {
  const at = shellLocations('/opt/Forelog/resources/app.asar');
  assert.equal(at.rendererDir, '/opt/Forelog/resources/app.asar/dist/renderer');
  assert.equal(at.indexHtml, '/opt/Forelog/resources/app.asar/dist/renderer/index.html');
  assert.equal(at.preload, '/opt/Forelog/resources/app.asar/dist/main/preload.cjs');
  assert.equal(at.trayIcon, '/opt/Forelog/resources/app.asar/dist/main/assets/tray.png');
});

test('dbPathFromArgs: --db PATH and --db=PATH, resolved against the working folder', () => {
  assert.equal(dbPathFromArgs(['electron', '.'], '/home/u'), null);
  assert.equal(dbPathFromArgs(['electron', '.', '--db', 'd.sqlite'], '/home/u'), '/home/u/d.sqlite');
  assert.equal(dbPathFromArgs(['forelog', '--db=/srv/d.sqlite'], '/home/u'), '/srv/d.sqlite');
  assert.throws(() => dbPathFromArgs(['forelog', '--db'], '/home/u'), /needs the path/);
  assert.throws(() => dbPathFromArgs(['forelog', '--db', '--inspect'], '/home/u'), /needs the path/);
  assert.throws(() => dbPathFromArgs(['forelog', '--db='], '/home/u'), /needs the path/);
});

class RecordingNotification implements NotificationLike {
  static supported = true;
  static made: RecordingNotification[] = [];
  readonly listeners = new Map<string, () => void>();
  shown = false;
  constructor(readonly options: { title: string; body: string }) {
    RecordingNotification.made.push(this);
  }
  static isSupported() {
    return RecordingNotification.supported;
  }
  on(event: 'click' | 'close' | 'failed', listener: () => void) {
    this.listeners.set(event, listener);
    return this;
  }
  show() {
    this.shown = true;
  }
}

test('notifier: shows title and body, a click reports the question, and nothing is made when unsupported', () => {
  const opened: (string | null)[] = [];
  const notifier = createNotifier(RecordingNotification, (id) => opened.push(id));
  notifier.notify({ title: 'Check-in due', body: 'Check-in due: Pilot reaches 500 weekly users', question_id: 'q9' });
  notifier.notify({ title: '2 nudges', body: '2 nudges due', question_id: null });
  assert.deepEqual(
    RecordingNotification.made.map((n) => [n.options, n.shown]),
    [
      [{ title: 'Check-in due', body: 'Check-in due: Pilot reaches 500 weekly users' }, true],
      [{ title: '2 nudges', body: '2 nudges due' }, true],
    ],
  );
  RecordingNotification.made[1]!.listeners.get('click')!();
  RecordingNotification.made[0]!.listeners.get('click')!();
  assert.deepEqual(opened, [null, 'q9']);

  RecordingNotification.supported = false;
  notifier.notify({ title: 'x', body: 'y', question_id: 'q1' });
  assert.equal(RecordingNotification.made.length, 2);
  RecordingNotification.supported = true;
});

test('localDateStamp: the local calendar date, zero-padded', () => {
  assert.equal(localDateStamp(new Date(2026, 2, 9, 23, 59)), '2026-03-09');
  assert.equal(localDateStamp(new Date(2026, 11, 31, 0, 0)), '2026-12-31');
});

function quietDialogs(answer: string | null) {
  const shown: { kind: 'info' | 'error'; title: string; text: string }[] = [];
  const dialogs: FileDialogs = {
    chooseSavePath: async () => answer,
    chooseOpenPath: async () => answer,
    showInfo: (title, text) => shown.push({ kind: 'info', title, text }),
    showError: (title, text) => shown.push({ kind: 'error', title, text }),
  };
  return { dialogs, shown };
}

const unusedDiary = (overrides: Partial<DiaryService>): DiaryService => ({
  dispatch: async () => ({ ok: true, value: null }),
  createScheduler: () => ({ runOnce: () => null, start: () => undefined, stop: () => undefined }),
  // The service's own file writer and reader, over an empty diary's text.
  exportDiaryFile: (file) => writeFileAtomic(file, '{}'),
  importDiaryFile: (file) => {
    for (const chunk of readTextFile(file)) void chunk;
    return { added: 0 };
  },
  backupTo: async () => undefined,
  rollingBackup: async () => undefined,
  close: () => undefined,
  location: ':memory:',
  ...overrides,
});

test('export into a folder that does not exist reports the error and leaves nothing behind', async () => {
  const dir = await mkdtemp(path.join(tmpdir(), 'forelog-files-'));
  const { dialogs, shown } = quietDialogs(path.join(dir, 'missing', 'diary.json'));
  await diaryFileActions(unusedDiary({}), dialogs, () => new Date()).exportDiary();
  assert.equal(shown.length, 1);
  assert.equal(shown[0]!.kind, 'error');
  assert.equal(
    shown[0]!.text,
    `Could not write ${path.join(dir, 'missing', 'diary.json')}: the folder ${path.join(dir, 'missing')} does not exist; create it or choose another (ENOENT). No file was written.`,
  );
  assert.deepEqual(await readdir(dir), []);
});

test('import: an unreadable file and a rejected file both say the diary was not changed', async () => {
  const dir = await mkdtemp(path.join(tmpdir(), 'forelog-files-'));
  const missing = quietDialogs(path.join(dir, 'nope.json'));
  assert.equal(await diaryFileActions(unusedDiary({}), missing.dialogs, () => new Date()).importDiary(), false);
  assert.match(missing.shown[0]!.text, /^there is no file at .*nope\.json; check the path\nThe diary was not changed\.$/);

  const file = path.join(dir, 'bad.json');
  await writeFile(file, '{"format":"something-else"}');
  const rejected = quietDialogs(file);
  const diary = unusedDiary({
    importDiaryFile: () => {
      throw new Error('Record 0: format must be "forelog-diary".');
    },
  });
  assert.equal(await diaryFileActions(diary, rejected.dialogs, () => new Date()).importDiary(), false);
  assert.equal(rejected.shown[0]!.kind, 'error');
  assert.match(rejected.shown[0]!.text, /Record 0: format[\s\S]*not changed/);
});

test('cancelling a dialog does nothing at all', async () => {
  let touched = false;
  const diary = unusedDiary({
    exportDiaryFile: () => {
      touched = true;
    },
    importDiaryFile: () => {
      touched = true;
      return { added: 0 };
    },
    backupTo: async () => {
      touched = true;
    },
  });
  const { dialogs, shown } = quietDialogs(null);
  const actions = diaryFileActions(diary, dialogs, () => new Date());
  await actions.exportDiary();
  await actions.backUp();
  assert.equal(await actions.importDiary(), false);
  assert.equal(touched, false);
  assert.deepEqual(shown, []);
});
