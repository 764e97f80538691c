/**
 * The app's origin (main/shell/app-origin.ts) and the rules every web contents gets
 * (main/shell/web-contents-guard.ts), without Electron. Sources: WHATWG URL Standard (host
 * parsing, userinfo, ports, percent-encoding); Electron security checklist
 * (electronjs.org/docs/latest/tutorial/security), items "Disable or limit navigation",
 * "Disable or limit creation of new windows", "Verify WebView options before creation",
 * "Handle session permission requests from remote content"; Electron's WebContents docs
 * ('will-navigate', 'will-redirect', setWindowOpenHandler, 'will-attach-webview').
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { APP_INDEX_URL, appPageUrl, isAppDocument, isAppOrigin } from '../../main/shell/app-origin';
import { externalLinkTarget, webContentsGuard } from '../../main/shell/web-contents-guard';

test('isAppOrigin: our scheme and host only; the nearest neighbours of each are not ours', () => {
  for (const url of ['forelog-app://app/', 'forelog-app://app/index.html#/q', 'forelog-app://app/assets/x.js', 'forelog-app://APP/index.html']) {
    assert.equal(isAppOrigin(url), true, url);
  }
  for (const url of [
    'forelog-apq://app/', // scheme one letter off
    'forelog-ap://app/',
    'forelog-appx://app/',
    'forelog-app://ap/', // host one letter short, long, or extended
    'forelog-app://appx/',
    'forelog-app://app.example.org/',
    'forelog-app://app:1/', // a port makes another origin
    'forelog-app://app@example.org/', // userinfo: the host is example.org
    'forelog-app:app/index.html', // no host at all
    'file:///opt/Forelog/resources/app.asar/dist/renderer/index.html',
    'https://app/',
    'not a url',
  ]) {
    assert.equal(isAppOrigin(url), false, url);
  }
});

test('isAppDocument: index.html with any hash or query, nothing that merely starts like it', () => {
  assert.equal(isAppDocument(APP_INDEX_URL), true);
  assert.equal(isAppDocument(`${APP_INDEX_URL}#/questions?new=1`), true);
  assert.equal(isAppDocument(`${APP_INDEX_URL}?token=x`), true);
  // Chromium and Node may percent-encode differently; comparing decoded paths matches both.
  assert.equal(isAppDocument('forelog-app://app/%69ndex.html'), true);
  assert.equal(isAppDocument(`${APP_INDEX_URL}.evil`), false);
  assert.equal(isAppDocument('forelog-app://app/index.htm'), false);
  assert.equal(isAppDocument('forelog-app://app/'), false, 'the window always loads index.html by name');
  assert.equal(isAppDocument('forelog-app://app/assets/index.html'), false);
  assert.equal(isAppDocument('forelog-app://app:1/index.html'), false);
  assert.equal(isAppDocument('file:///opt/Forelog/dist/renderer/index.html'), false);
  assert.equal(isAppDocument('forelog-app://app/%E0%A4%A.html'), false);
  assert.equal(isAppDocument('not a url'), false);
});

test('appPageUrl: the index, or the index at a hash route', () => {
  assert.equal(appPageUrl(), 'forelog-app://app/index.html');
  assert.equal(appPageUrl('/questions?new=1'), 'forelog-app://app/index.html#/questions?new=1');
});

test('externalLinkTarget: https only', () => {
  assert.equal(externalLinkTarget('https://example.org/a?b=c'), 'https://example.org/a?b=c');
  for (const url of ['http://example.org/', 'file:///etc/passwd', 'javascript:alert(1)', 'mailto:a@b.c', 'smb://host/share', 'forelog-app://app/', '::']) {
    assert.equal(externalLinkTarget(url), null, url);
  }
});

function navigation(url: string, isSameDocument = false) {
  const event = {
    url,
    isSameDocument,
    prevented: false,
    preventDefault() {
      event.prevented = true;
    },
  };
  return event;
}

test('will-navigate: allowed inside our origin; anything else is prevented, and only https goes to the browser', () => {
  const opened: string[] = [];
  const guard = webContentsGuard((url) => opened.push(url));
  const outcome = (url: string, sameDocument = false) => {
    const event = navigation(url, sameDocument);
    guard.willNavigate(event);
    return event.prevented;
  };
  assert.equal(outcome(`${APP_INDEX_URL}#/scorecard`), false);
  assert.equal(outcome('forelog-app://app/other.html'), false, 'our origin serves only our build');
  assert.equal(outcome('https://example.org/#x', true), false, 'same-document navigations are not ours to stop');
  assert.equal(outcome('https://example.org/report'), true);
  assert.equal(outcome('http://example.org/'), true);
  assert.equal(outcome('file:///etc/passwd'), true);
  assert.equal(outcome('forelog-app://app.example.org/'), true);
  assert.equal(outcome('data:text/html,<p>x</p>'), true);
  assert.deepEqual(opened, ['https://example.org/report']);
});

test('will-redirect: a redirect may stay in our origin but never leave it, and opens nothing', () => {
  const opened: string[] = [];
  const guard = webContentsGuard((url) => opened.push(url));
  const stay = navigation(`${APP_INDEX_URL}#/`);
  guard.willRedirect(stay);
  assert.equal(stay.prevented, false);
  const leave = navigation('https://example.org/');
  guard.willRedirect(leave);
  assert.equal(leave.prevented, true);
  assert.deepEqual(opened, []);
});

test('window.open is always denied, webviews never attach, permissions are always refused', () => {
  const opened: string[] = [];
  const guard = webContentsGuard((url) => opened.push(url));
  assert.deepEqual(guard.windowOpen({ url: 'https://example.org/a' }), { action: 'deny' });
  assert.deepEqual(guard.windowOpen({ url: APP_INDEX_URL }), { action: 'deny' }, 'not even a second window of our own');
  assert.deepEqual(guard.windowOpen({ url: 'http://example.org/b' }), { action: 'deny' });
  assert.deepEqual(opened, ['https://example.org/a']);

  const webview = navigation('https://example.org/');
  guard.willAttachWebview(webview);
  assert.equal(webview.prevented, true);

  const answers: boolean[] = [];
  for (const permission of ['notifications', 'media', 'geolocation', 'clipboard-read', 'fullscreen']) {
    guard.permissionRequest({}, permission, (granted) => answers.push(granted));
  }
  assert.deepEqual(answers, [false, false, false, false, false]);
  assert.equal(guard.permissionCheck(), false);
});
