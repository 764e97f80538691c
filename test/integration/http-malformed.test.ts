/**
 * No request, however malformed, ends `forelog serve`: the server runs in a process of its
 * own and each test sends raw bytes over a socket (malformed request lines and paths, bad
 * and oversized headers, bodies cut off or too large), expects a 4xx, and then checks that
 * the process is alive and still answers.
 */
import assert from 'node:assert/strict';
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { after, before, test } from 'node:test';
import { tempDir } from '../support/temp-diary';

const ROOT = path.resolve(import.meta.dirname, '..', '..');

let child: ChildProcess;
let port = 0;
let token = '';
let stderr = '';

// Made here rather than in before(): a cleanup registered inside a hook runs when the hook ends.
const dir = tempDir();

before(async () => {
  const rendererDir = path.join(dir, 'renderer');
  fs.mkdirSync(rendererDir);
  fs.writeFileSync(path.join(rendererDir, 'index.html'), '<!doctype html><title>Forelog</title>');
  child = spawn(
    process.execPath,
    ['--import', 'tsx', path.join(ROOT, 'test', 'support', 'http-server-process.ts'), path.join(dir, 'diary.sqlite'), rendererDir],
    { cwd: ROOT, stdio: ['ignore', 'pipe', 'pipe'] },
  );
  child.stderr!.on('data', (c: Buffer) => (stderr += c.toString()));
  const line = await new Promise<string>((resolve, reject) => {
    let out = '';
    child.stdout!.on('data', (c: Buffer) => {
      out += c.toString();
      if (out.includes('\n')) resolve(out.split('\n')[0]!);
    });
    child.once('exit', (code) => reject(new Error(`the server exited (${code}) before listening:\n${stderr}`)));
  });
  [port, token] = [Number(line.split(' ')[0]), line.split(' ')[1]!];
});

after(() => {
  child.kill('SIGTERM');
});

interface RawAnswer {
  /** The status code of the first answer, or 0 when the server closed without one. */
  status: number;
  text: string;
}

/**
 * Writes `parts` to a fresh connection (pausing between them when there are several),
 * optionally half-closes or resets it, and collects what comes back until the server
 * closes the connection or `waitMs` passes.
 */
function raw(parts: (string | Buffer)[], options: { end?: 'half-close' | 'reset'; waitMs?: number } = {}): Promise<RawAnswer> {
  return new Promise((resolve) => {
    const socket = net.connect(port, '127.0.0.1');
    const chunks: Buffer[] = [];
    let done = false;
    const finish = () => {
      if (done) return;
      done = true;
      clearTimeout(timer);
      socket.destroy();
      const text = Buffer.concat(chunks).toString('latin1');
      const m = /^HTTP\/1\.[01] (\d{3})/.exec(text);
      resolve({ status: m ? Number(m[1]) : 0, text });
    };
    const timer = setTimeout(finish, options.waitMs ?? 2000);
    socket.on('data', (c: Buffer) => chunks.push(c));
    socket.on('close', finish);
    socket.on('error', finish);
    socket.on('connect', async () => {
      for (const part of parts) {
        if (socket.destroyed) break;
        socket.write(part);
        if (parts.length > 1) await new Promise((r) => setTimeout(r, 20));
      }
      if (options.end === 'half-close') socket.end();
      if (options.end === 'reset') socket.resetAndDestroy();
    });
  });
}

const host = () => `127.0.0.1:${port}`;
const get = (target: string, method = 'GET') => `${method} ${target} HTTP/1.1\r\nHost: ${host()}\r\nConnection: close\r\n\r\n`;
const post = (operation: string, headers: string, body = '') =>
  `POST /api/${operation} HTTP/1.1\r\nHost: ${host()}\r\nAuthorization: Bearer ${token}\r\nConnection: close\r\n${headers}\r\n${body}`;

/** The process is running and answers a well-formed API call. */
async function assertStillServing(): Promise<void> {
  assert.equal(child.exitCode, null, `the server process ended:\n${stderr}`);
  const ok = await raw([post('diaryInfo', 'Content-Length: 2\r\n', '{}')]);
  assert.equal(ok.status, 200, ok.text);
}

test('malformed paths and request targets get 400, and serve keeps running', async () => {
  for (const [target, method] of [
    ['/%', 'GET'],
    ['/%E0%A4%A', 'GET'],
    ['/%ff', 'HEAD'],
    ['/assets/%C0%AF', 'GET'],
    ['http://[', 'GET'],
    ['http://%', 'GET'],
    ['*', 'GET'],
    ['ftp://127.0.0.1/x', 'GET'],
  ] as const) {
    const answer = await raw([get(target, method)]);
    assert.equal(answer.status, 400, `${method} ${target}: ${answer.text}`);
  }
  await assertStillServing();
});

test('an absolute-form target naming another host is refused like a foreign Host header', async () => {
  assert.equal((await raw([get(`http://evil.example:${port}/`)])).status, 403);
  assert.equal((await raw([get(`http://${host()}/`)])).status, 200);
  await assertStillServing();
});

test('a NUL in a path is a missing file, not a crash', async () => {
  assert.equal((await raw([get('/%00')])).status, 404);
  assert.equal((await raw([get('/index.html%00.png')])).status, 404);
  await assertStillServing();
});

test('a body in a transfer coding serve does not unpack (gzip, chunked) gets 501; plain chunks are read', async () => {
  const chunked = (coding: string, body: string) => post('diaryInfo', `Content-Type: application/json\r\nTransfer-Encoding: ${coding}\r\n`, `${body.length.toString(16)}\r\n${body}\r\n0\r\n\r\n`);
  for (const coding of ['gzip, chunked', 'deflate, chunked']) {
    const answer = await raw([chunked(coding, '{}')]);
    assert.equal(answer.status, 501, `${coding}: ${answer.text}`);
    assert.match(answer.text, /declared as Transfer-Encoding: .*; send it without compression\. Nothing was changed\./);
  }
  assert.equal((await raw([chunked('chunked', '{}')])).status, 200);
  await assertStillServing();
});

test('malformed request lines, bad headers and oversized headers get 4xx', async () => {
  const cases: [string, string, number][] = [
    ['garbage line', 'NOT HTTP AT ALL\r\n\r\n', 400],
    ['unknown method', `BREW / HTTP/1.1\r\nHost: ${host()}\r\n\r\n`, 400],
    ['space in header name', `GET / HTTP/1.1\r\nHost: ${host()}\r\nBad Header: x\r\n\r\n`, 400],
    ['control byte in header value', `GET / HTTP/1.1\r\nHost: ${host()}\r\nX-A: a\u0001b\r\n\r\n`, 400],
    ['bad content length', `POST /api/diaryInfo HTTP/1.1\r\nHost: ${host()}\r\nContent-Length: -1\r\n\r\n`, 400],
    ['two content lengths', `POST /api/diaryInfo HTTP/1.1\r\nHost: ${host()}\r\nContent-Length: 2\r\nContent-Length: 3\r\n\r\n{}`, 400],
    ['bad chunk size', `POST /api/diaryInfo HTTP/1.1\r\nHost: ${host()}\r\nAuthorization: Bearer ${token}\r\nTransfer-Encoding: chunked\r\n\r\nzz\r\n`, 400],
    ['huge header', `GET / HTTP/1.1\r\nHost: ${host()}\r\nX-Big: ${'a'.repeat(100_000)}\r\n\r\n`, 431],
    ['many headers', `GET / HTTP/1.1\r\nHost: ${host()}\r\n${'X-A: b\r\n'.repeat(5000)}\r\n`, 431],
  ];
  for (const [name, text, status] of cases) {
    const answer = await raw([text]);
    assert.equal(answer.status, status, `${name}: ${answer.text.slice(0, 200)}`);
  }
  await assertStillServing();
});

test('a body cut off before its end, or a connection reset mid-body, leaves serve running and the diary untouched', async () => {
  const start = post('createQuestion', 'Content-Type: application/json\r\nContent-Length: 1000\r\n', '{"title":"cut off","closes_at":');
  const halfClosed = await raw([start], { end: 'half-close' });
  assert.ok(halfClosed.status === 0 || halfClosed.status === 400, halfClosed.text);
  await raw([start], { end: 'reset', waitMs: 200 });
  const chunked = post('createQuestion', 'Transfer-Encoding: chunked\r\n', '10\r\n{"title":"cut o');
  await raw([chunked], { end: 'reset', waitMs: 200 });
  await assertStillServing();
  const list = await raw([post('listQuestions', 'Content-Length: 2\r\n', '{}')]);
  assert.match(list.text, /"total":0/);
});

test('a body larger than the limit gets 413 at once, whether declared or streamed', async () => {
  const declared = await raw([post('importText', 'Content-Length: 200000000\r\n', '{"format":"json","text":"')]);
  assert.equal(declared.status, 413, declared.text);
  assert.match(declared.text, /larger than 64 MB/);
  // Streamed without a length: the refusal comes once the limit is passed, not at the end.
  const chunk = `100000\r\n${'a'.repeat(0x100000)}\r\n`;
  const streamed = await raw([post('importText', 'Transfer-Encoding: chunked\r\n'), ...Array.from({ length: 70 }, () => chunk)], { waitMs: 10_000 });
  assert.equal(streamed.status, 413, streamed.text.slice(0, 200));
  await assertStillServing();
});

test('a body that is not UTF-8 or not JSON gets 400 naming the problem', async () => {
  const latin1 = Buffer.concat([Buffer.from(post('listQuestions', 'Content-Length: 12\r\n')), Buffer.from('{"text":"\xe9"}', 'latin1')]);
  const notUtf8 = await raw([latin1]);
  assert.equal(notUtf8.status, 400);
  assert.match(notUtf8.text, /not UTF-8/);
  const notJson = await raw([post('listQuestions', 'Content-Length: 5\r\n', '{oops')]);
  assert.equal(notJson.status, 400);
  assert.match(notJson.text, /not valid JSON/);
  await assertStillServing();
});

test('garbage pipelined behind a request still being answered: that request gets its whole answer, then a 400, then the connection closes', async () => {
  const pipelined = await raw([
    `${post('exportText', 'Content-Type: application/json\r\nContent-Length: 17\r\n', '{"format":"json"}').replace('Connection: close\r\n', '')}GARBAGE LINE\r\n\r\n`,
  ]);
  assert.equal(pipelined.status, 200, pipelined.text.slice(0, 200));
  const answers = pipelined.text.split(/(?=HTTP\/1\.1 \d{3} )/);
  assert.equal(answers.length, 2, pipelined.text.slice(0, 400));
  const [head, body] = answers[0]!.split('\r\n\r\n');
  assert.equal(Buffer.byteLength(body!, 'latin1'), Number(/content-length: (\d+)/i.exec(head!)![1]), 'the first answer is whole');
  assert.ok(JSON.parse(Buffer.from(body!, 'latin1').toString('utf8')).ok);
  assert.match(answers[1]!, /^HTTP\/1\.1 400 /);
  await assertStillServing();
});

test('a write followed by garbage on the same connection is answered: the caller learns it was done', async () => {
  const before = await raw([post('diaryInfo', 'Content-Length: 2\r\n', '{}')]);
  const count = (text: string) => (JSON.parse(text.slice(text.indexOf('\r\n\r\n') + 4).split(/HTTP\/1\.1 /)[0]!) as { value: { question_count: number } }).value.question_count;
  const body = JSON.stringify({ title: 'Pipelined with garbage', closes_at: '2030-01-01T00:00:00Z' });
  const answer = await raw([`${post('createQuestion', `Content-Type: application/json\r\nContent-Length: ${Buffer.byteLength(body)}\r\n`, body).replace('Connection: close\r\n', '')}\x00\x01 nonsense\r\n\r\n`]);
  assert.equal(answer.status, 200, answer.text.slice(0, 300));
  assert.match(answer.text, /"title":"Pipelined with garbage"/);
  const after = await raw([post('diaryInfo', 'Content-Length: 2\r\n', '{}')]);
  assert.equal(count(after.text), count(before.text) + 1);
});
