/**
 * The handler behind the app's own scheme (main/shell/app-protocol.ts), on a real folder
 * laid out like a Vite build, with a file beside it that must never be served. Sources:
 * Electron's protocol docs (protocol.handle takes web Request/Response; the handler must
 * itself refuse paths that escape its folder), WHATWG URL Standard (dot segments and
 * percent-encoding), RFC 9110 (status codes, Allow), W3C CSP Level 3 (the header).
 */
import { before, test } from 'node:test';
import assert from 'node:assert/strict';
import { mkdir, mkdtemp, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { contentTypeFor, rendererFileFor, rendererProtocolHandler } from '../../main/shell/app-protocol';
import { CONTENT_SECURITY_POLICY } from '../../main/shell/csp';

let appDir = '';
let rendererDir = '';
let serve: (request: Request) => Promise<Response>;
const INDEX = '<!doctype html><title>Forelog</title><script type="module" src="./assets/index.js"></script>';

before(async () => {
  appDir = await mkdtemp(path.join(tmpdir(), 'forelog-protocol-'));
  rendererDir = path.join(appDir, 'dist', 'renderer');
  await mkdir(path.join(rendererDir, 'assets'), { recursive: true });
  await writeFile(path.join(rendererDir, 'index.html'), INDEX);
  await writeFile(path.join(rendererDir, 'assets', 'index.js'), 'console.log("forelog");');
  await writeFile(path.join(rendererDir, 'assets', 'index.css'), 'body{}');
  await writeFile(path.join(rendererDir, 'favicon.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');
  await writeFile(path.join(rendererDir, 'notes.bin'), 'x');
  // Inside the folder although it starts with two dots: the neighbour of the "..\/" edge.
  await writeFile(path.join(rendererDir, '..inside.txt'), 'inside');
  // Outside the folder: beside it, and in a sibling whose name starts with the folder's.
  await writeFile(path.join(appDir, 'secret.txt'), 'secret');
  await mkdir(path.join(appDir, 'dist', 'renderer-old'), { recursive: true });
  await writeFile(path.join(appDir, 'dist', 'renderer-old', 'index.html'), 'old');
  serve = rendererProtocolHandler(rendererDir);
});

const get = (url: string, method = 'GET') => serve(new Request(url, { method }));

test('serves the page and its assets with their content types and our policy', async () => {
  const page = await get('forelog-app://app/index.html');
  assert.equal(page.status, 200);
  assert.equal(page.headers.get('content-type'), 'text/html; charset=utf-8');
  assert.equal(page.headers.get('content-security-policy'), CONTENT_SECURITY_POLICY);
  assert.equal(page.headers.get('x-content-type-options'), 'nosniff');
  assert.equal(await page.text(), INDEX);

  const root = await get('forelog-app://app/');
  assert.equal(await root.text(), INDEX, 'the bare origin is the page');
  assert.equal((await get('forelog-app://app/index.html#/questions?new=1')).status, 200);

  const script = await get('forelog-app://app/assets/index.js');
  assert.equal(script.headers.get('content-type'), 'text/javascript; charset=utf-8', 'module scripts need a JavaScript type');
  assert.equal(await script.text(), 'console.log("forelog");');
  assert.equal((await get('forelog-app://app/assets/index.css')).headers.get('content-type'), 'text/css; charset=utf-8');
  assert.equal((await get('forelog-app://app/favicon.svg')).headers.get('content-type'), 'image/svg+xml');
  assert.equal((await get('forelog-app://app/notes.bin')).headers.get('content-type'), 'application/octet-stream');
  assert.equal(await (await get('forelog-app://app/..inside.txt')).text(), 'inside');

  const head = await get('forelog-app://app/index.html', 'HEAD');
  assert.equal(head.status, 200);
  assert.equal(await head.text(), '');
});

test('a path that leaves the folder is refused with 403, however it is spelled', async () => {
  for (const url of [
    'forelog-app://app/..%2fsecret.txt',
    'forelog-app://app/..%2F..%2Fdist%2Frenderer-old%2Findex.html',
    'forelog-app://app/assets/..%2f..%2fsecret.txt',
    'forelog-app://app/%2e%2e%2fsecret.txt',
    'forelog-app://app/..%5csecret.txt',
    'forelog-app://app/%2Fetc%2Fpasswd',
    'forelog-app://app/%2F' + encodeURIComponent(path.join(appDir, 'secret.txt').slice(1)),
  ]) {
    const answer = await get(url);
    assert.equal(answer.status, 403, url);
    assert.equal(answer.headers.get('content-security-policy'), CONTENT_SECURITY_POLICY, url);
    assert.doesNotMatch(await answer.text(), /secret|old/, url);
  }
});

test('unescaped dot segments never get past URL parsing, and land inside the folder', async () => {
  // The URL parser removes "..", "%2e%2e" and ".%2E" segments before the handler runs,
  // so these ask for files inside the folder, which do not exist.
  for (const url of ['forelog-app://app/../secret.txt', 'forelog-app://app/%2e%2e/%2E%2E/secret.txt', 'forelog-app://app/assets/.%2E/.%2e/secret.txt']) {
    const answer = await get(url);
    assert.equal(answer.status, 404, url);
    assert.doesNotMatch(await answer.text(), /^secret$/, url);
  }
});

test('rendererFileFor refuses escapes on raw paths too, and keeps neighbours that stay inside', () => {
  const refused = (pathname: string) => {
    const lookup = rendererFileFor(rendererDir, pathname);
    return lookup.ok ? 'served' : lookup.status;
  };
  assert.equal(refused('/../secret.txt'), 403);
  assert.equal(refused('/assets/../../secret.txt'), 403);
  assert.equal(refused('/../renderer-old/index.html'), 403, 'a sibling whose name starts like ours is outside');
  assert.equal(refused('/..'), 403);
  assert.equal(refused('//etc/passwd'), 403);
  assert.equal(refused('/a\\b'), 403);
  assert.equal(refused('/index.html%00.js'), 400);
  assert.equal(refused('/%E0%A4%A'), 400);
  assert.equal(refused('/assets/../index.html'), 'served');
  assert.equal(refused('/..inside.txt'), 'served');
  assert.equal(refused('/.../x'), 'served', 'three dots is a name, not a step up');
  assert.deepEqual(rendererFileFor(rendererDir, '/'), { ok: true, file: path.join(rendererDir, 'index.html') });
});

test('unknown files, folders and other hosts get 404; other methods 405; all with our policy', async () => {
  const answers = [
    ['forelog-app://app/missing.js', 404],
    ['forelog-app://app/assets/', 404],
    ['forelog-app://app/assets', 404],
    ['forelog-app://other/index.html', 404],
    ['forelog-app://app:1/index.html', 404],
    ['forelog-app://app/%E0%A4%A', 400],
  ] as const;
  for (const [url, status] of answers) {
    const answer = await get(url);
    assert.equal(answer.status, status, url);
    assert.equal(answer.headers.get('content-security-policy'), CONTENT_SECURITY_POLICY, url);
    assert.equal(answer.headers.get('content-type'), 'text/plain; charset=utf-8', url);
  }
  const missing = await get('forelog-app://app/missing.js');
  assert.match(await missing.text(), /no file at \/missing\.js[\s\S]*npm run build/);

  const post = await get('forelog-app://app/index.html', 'POST');
  assert.equal(post.status, 405);
  assert.equal(post.headers.get('allow'), 'GET, HEAD');
  assert.equal(post.headers.get('content-security-policy'), CONTENT_SECURITY_POLICY);
});

test('contentTypeFor: by extension, case-insensitive, octet-stream otherwise', () => {
  assert.equal(contentTypeFor('/x/INDEX.HTML'), 'text/html; charset=utf-8');
  assert.equal(contentTypeFor('/x/a.js.map'), 'application/json; charset=utf-8');
  assert.equal(contentTypeFor('/x/a.woff2'), 'font/woff2');
  assert.equal(contentTypeFor('/x/a.jsx'), 'application/octet-stream');
  assert.equal(contentTypeFor('/x/js'), 'application/octet-stream');
});
