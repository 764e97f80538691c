/**
 * Browser mode's transport: the token, the Host/Origin checks against DNS rebinding,
 * static files, and the same validated API as the desktop app.
 */
import assert from 'node:assert/strict';
import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { after, test } from 'node:test';
import { startHttpServer } from '../../main/transport/http';
import { openTestDiary, tempDir } from '../support/temp-diary';

async function setup() {
  const d = openTestDiary();
  const dir = tempDir();
  fs.writeFileSync(path.join(dir, 'index.html'), '<!doctype html><title>Forelog</title>');
  const server = await startHttpServer({ dispatch: d.service.dispatch, rendererDir: dir, port: 0 });
  after(() => server.close());
  return { d, server, dir };
}

/** A raw request, so the test controls the Host and Origin headers exactly. */
function request(
  port: number,
  options: { path: string; method?: string; headers?: Record<string, string>; body?: string; latin1?: boolean },
): Promise<{ status: number; body: string; headers: http.IncomingHttpHeaders }> {
  return new Promise((resolve, reject) => {
    const req = http.request(
      { host: '127.0.0.1', port, path: options.path, method: options.method ?? 'GET', headers: options.headers, setHost: false },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, body: Buffer.concat(chunks).toString('utf8'), headers: res.headers }));
      },
    );
    req.on('error', reject);
    if (options.body) req.write(options.body, options.latin1 ? 'latin1' : 'utf8');
    req.end();
  });
}

test('prints a loopback URL carrying the token', async () => {
  const { server } = await setup();
  assert.match(server.url, /^http:\/\/127\.0\.0\.1:\d+\/\?token=[A-Za-z0-9_-]{32}$/);
  assert.ok(server.url.endsWith(server.token));
});

test('API calls need the token (401) and the loopback Host (403)', async () => {
  const { server } = await setup();
  const host = `127.0.0.1:${server.port}`;
  const noToken = await request(server.port, { path: '/api/listQuestions', method: 'POST', headers: { Host: host }, body: '{}' });
  assert.equal(noToken.status, 401);
  const wrongToken = await request(server.port, {
    path: '/api/listQuestions',
    method: 'POST',
    headers: { Host: host, Authorization: 'Bearer nope' },
    body: '{}',
  });
  assert.equal(wrongToken.status, 401);
  // The scheme's name is case-insensitive: a script writing it in lower case is let in.
  for (const scheme of ['bearer', 'BEARER', 'Bearer  ']) {
    const answer = await request(server.port, {
      path: '/api/listQuestions',
      method: 'POST',
      headers: { Host: host, Authorization: `${scheme} ${server.token}`, 'Content-Type': 'application/json' },
      body: '{}',
    });
    assert.equal(answer.status, 200, `Authorization: ${scheme} <token>`);
  }
  const rebound = await request(server.port, {
    path: '/api/listQuestions',
    method: 'POST',
    headers: { Host: `evil.example:${server.port}`, Authorization: `Bearer ${server.token}` },
    body: '{}',
  });
  assert.equal(rebound.status, 403);
  const otherPort = await request(server.port, { path: '/', headers: { Host: '127.0.0.1:1' } });
  assert.equal(otherPort.status, 403);
  const foreignOrigin = await request(server.port, {
    path: '/api/listQuestions',
    method: 'POST',
    headers: { Host: host, Origin: 'http://evil.example', Authorization: `Bearer ${server.token}` },
    body: '{}',
  });
  assert.equal(foreignOrigin.status, 403);
  const ok = await request(server.port, {
    path: '/api/listQuestions',
    method: 'POST',
    headers: { Host: host, Origin: `http://127.0.0.1:${server.port}`, Authorization: `Bearer ${server.token}` },
    body: '{}',
  });
  assert.equal(ok.status, 200);
  assert.deepEqual(JSON.parse(ok.body), { ok: true, value: { questions: [], tags: [], total: 0, matched: 0, offset: 0, sort: 'attention', direction: 'asc' } });
});

test('the same validation as every transport: 400 with the field, nothing written', async () => {
  const { server, d } = await setup();
  const res = await request(server.port, {
    path: '/api/createQuestion',
    method: 'POST',
    headers: { Host: `127.0.0.1:${server.port}`, Authorization: `Bearer ${server.token}`, 'Content-Type': 'application/json' },
    body: JSON.stringify({ title: 'x', closes_at: '2030-01-01T00:00:00Z', first_forecast: { p: 2 } }),
  });
  assert.equal(res.status, 400);
  const body = JSON.parse(res.body);
  assert.equal(body.ok, false);
  assert.deepEqual(body.error.fields, ['first_forecast.p: must be a probability between 0 and 1']);
  assert.equal((await d.call('listQuestions', {})).total, 0);
  const notJson = await request(server.port, {
    path: '/api/createQuestion',
    method: 'POST',
    headers: { Host: `127.0.0.1:${server.port}`, Authorization: `Bearer ${server.token}` },
    body: '{oops',
  });
  assert.equal(notJson.status, 400);
  assert.match(JSON.parse(notJson.body).error.message, /not valid JSON/);
});

test('a number too large to hold (1e400) is refused as too large, not as "not a number", and nothing is written', async () => {
  const { server, d } = await setup();
  const post = (op: string, body: string) =>
    request(server.port, {
      path: `/api/${op}`,
      method: 'POST',
      headers: { Host: `127.0.0.1:${server.port}`, Authorization: `Bearer ${server.token}`, 'Content-Type': 'application/json' },
      body,
    });
  const TOO_LARGE = ': the one given is beyond about ±1.8e308, too large to hold';
  const p = await post('createQuestion', '{"title":"x","closes_at":"2030-01-01T00:00:00Z","first_forecast":{"p":1e400}}');
  assert.deepEqual(JSON.parse(p.body).error.fields, [`first_forecast.p: must be a number between 0 and 1${TOO_LARGE}`]);
  const costs = await post('createQuestion', '{"title":"x","closes_at":"2030-01-01T00:00:00Z","costs":{"false_alarm":1e400,"miss":1}}');
  assert.equal(costs.status, 400);
  assert.deepEqual(JSON.parse(costs.body).error.fields, [`costs.false_alarm: must be a number${TOO_LARGE}`]);
  const numeric = await post('createQuestion', '{"type":"numeric","title":"x","closes_at":"2030-01-01T00:00:00Z","first_forecast":{"quantiles":[-1e400,0,1]}}');
  assert.equal(numeric.status, 400);
  assert.deepEqual(JSON.parse(numeric.body).error.fields, [`first_forecast.quantiles[0]: must be a number, or a date YYYY-MM-DD for a question about a date${TOO_LARGE}`]);
  // The largest number that does fit is taken as given.
  const fits = await post('createQuestion', '{"type":"numeric","title":"x","closes_at":"2030-01-01T00:00:00Z","first_forecast":{"quantiles":[-1.7976931348623157e308,0,1.7976931348623157e308]}}');
  assert.equal(fits.status, 200);
  assert.deepEqual(JSON.parse(fits.body).value.forecasts[0].quantiles, [-Number.MAX_VALUE, 0, Number.MAX_VALUE]);
  assert.equal((await d.call('listQuestions', {})).total, 1);
});

test('a body naming a member twice in one object is refused, at any depth, and nothing is written', async () => {
  // JSON.parse would keep the last one: {"p": 2, "p": 0.3} would land as 0.3 while the
  // person (or another reader) sees 2.
  const { server, d } = await setup();
  const headers = { Host: `127.0.0.1:${server.port}`, Authorization: `Bearer ${server.token}`, 'Content-Type': 'application/json' };
  const bodies = [
    '{"title":"x","title":"y","closes_at":"2030-01-01T00:00:00Z"}',
    '{"title":"x","closes_at":"2030-01-01T00:00:00Z","first_forecast":{"p":2,"p":0.3}}',
    '{"title":"x","closes_at":"2030-01-01T00:00:00Z","first_forecast":{"p":0.3,"lenses":[{"name":"a","p":0.1,"\\u0070":0.2}]}}',
  ];
  for (const body of bodies) {
    const res = await request(server.port, { path: '/api/createQuestion', method: 'POST', headers, body });
    assert.equal(res.status, 400, body);
    assert.match(JSON.parse(res.body).error.message, /names the member "(title|p)" twice in one object .*keep one of them\. Nothing was changed\./, body);
  }
  assert.equal((await d.call('listQuestions', {})).total, 0);
  // The same names in different objects, or inside text, are no duplicates.
  const fine = await request(server.port, {
    path: '/api/createQuestion',
    method: 'POST',
    headers,
    body: '{"title":"x \\"title\\":1","closes_at":"2030-01-01T00:00:00Z","first_forecast":{"p":0.3,"note":"p","lenses":[{"name":"a","p":0.1},{"name":"b","p":0.2}]}}',
  });
  assert.equal(fine.status, 200, fine.body);
});

test('a body declared as anything but JSON gets 415 naming the header to send, and nothing is written', async () => {
  const { server, d } = await setup();
  const body = JSON.stringify({ title: 'x', closes_at: '2030-01-01T00:00:00Z' });
  for (const type of ['text/plain', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=x', 'application/jsonp']) {
    const res = await request(server.port, {
      path: '/api/createQuestion',
      method: 'POST',
      headers: { Host: `127.0.0.1:${server.port}`, Authorization: `Bearer ${server.token}`, 'Content-Type': type },
      body,
    });
    assert.equal(res.status, 415, type);
    assert.match(JSON.parse(res.body).error.message, /send it with Content-Type: application\/json\. Nothing was changed\.$/, type);
  }
  // JSON declared in another character set would be read as UTF-8 and stored garbled (the
  // Latin-1 bytes of "Ã©" are the UTF-8 of "é"): refused, naming the charset to send.
  for (const type of ['application/json; charset=latin1', 'application/json; charset="ISO-8859-1"', 'application/json;charset=utf-16']) {
    const res = await request(server.port, {
      path: '/api/createQuestion',
      method: 'POST',
      headers: { Host: `127.0.0.1:${server.port}`, Authorization: `Bearer ${server.token}`, 'Content-Type': type },
      body: JSON.stringify({ title: 'Ã©', closes_at: '2030-01-01T00:00:00Z' }),
    });
    assert.equal(res.status, 415, type);
    assert.match(JSON.parse(res.body).error.message, /send it as UTF-8 \(Content-Type: application\/json; charset=utf-8, or no charset\)\. Nothing was changed\.$/, type);
  }
  // A compressed body is not unpacked: refused whether it is compressed (gzip was called
  // "not UTF-8") or, declared so, sent plain (it was carried out).
  for (const [coding, sent] of [['gzip', gzipSync(body).toString('latin1')], ['br', body], ['identity, gzip', body]] as const) {
    const res = await request(server.port, {
      path: '/api/createQuestion',
      method: 'POST',
      headers: { Host: `127.0.0.1:${server.port}`, Authorization: `Bearer ${server.token}`, 'Content-Type': 'application/json', 'Content-Encoding': coding },
      body: sent,
      latin1: true,
    });
    assert.equal(res.status, 415, coding);
    assert.match(JSON.parse(res.body).error.message, /declared as Content-Encoding: .*; send it without compression\. Nothing was changed\.$/, coding);
    assert.equal(res.headers['accept-encoding'], 'identity');
  }
  assert.equal((await d.call('listQuestions', {})).total, 0);
  // JSON with a charset, in any letter case, or with no Content-Type at all, or declared
  // uncompressed (identity), is read.
  for (const headers of [{ 'Content-Type': 'Application/JSON; charset=utf-8' }, { 'Content-Type': 'application/json; Charset="UTF-8"' }, {}, { 'Content-Encoding': 'identity' }] as Record<string, string>[]) {
    const res = await request(server.port, {
      path: '/api/createQuestion',
      method: 'POST',
      headers: { Host: `127.0.0.1:${server.port}`, Authorization: `Bearer ${server.token}`, ...headers },
      body,
    });
    assert.equal(res.status, 200, res.body);
  }
});

test('serves the renderer with a strict CSP and never files outside it', async () => {
  const { server } = await setup();
  const host = `localhost:${server.port}`;
  const page = await request(server.port, { path: '/', headers: { Host: host } });
  assert.equal(page.status, 200);
  assert.match(page.body, /<title>Forelog<\/title>/);
  assert.match(String(page.headers['content-security-policy']), /script-src 'self'/);
  const escape = await request(server.port, { path: '/..%2f..%2fetc%2fpasswd', headers: { Host: host } });
  assert.equal(escape.status, 404);
});

test('a dispatch that throws or rejects gets a 500 answer, and the server keeps answering', async () => {
  const dir = tempDir();
  fs.writeFileSync(path.join(dir, 'index.html'), '<!doctype html><title>Forelog</title>');
  let calls = 0;
  const server = await startHttpServer({
    dispatch: (operation) => {
      calls += 1;
      if (operation === 'throws') throw new Error('boom');
      if (operation === 'rejects') return Promise.reject(new Error('bang'));
      return Promise.resolve({ ok: true, value: calls });
    },
    rendererDir: dir,
    port: 0,
  });
  after(() => server.close());
  const headers = { Host: `127.0.0.1:${server.port}`, Authorization: `Bearer ${server.token}` };
  for (const operation of ['throws', 'rejects']) {
    const res = await request(server.port, { path: `/api/${operation}`, method: 'POST', headers, body: '{}' });
    assert.equal(res.status, 500);
    assert.match(JSON.parse(res.body).error.message, /Forelog could not answer: (boom|bang)\. Nothing was changed/);
  }
  const ok = await request(server.port, { path: '/api/fine', method: 'POST', headers, body: '{}' });
  assert.deepEqual(JSON.parse(ok.body), { ok: true, value: 3 });
});

test('a POST outside /api/ (wrong case, no slash) is refused with the JSON error shape, naming the path to use, and nothing is written', async () => {
  const { d, server } = await setup();
  const host = `127.0.0.1:${server.port}`;
  const body = JSON.stringify({ title: 'Northgate signs', closes_at: '2099-01-01T00:00:00Z' });
  for (const target of ['/API/createQuestion', '/Api/createQuestion', '/api', '/createQuestion']) {
    const answer = await request(server.port, {
      path: target,
      method: 'POST',
      headers: { Host: host, Authorization: `Bearer ${server.token}`, 'Content-Type': 'application/json' },
      body,
    });
    assert.equal(answer.status, 405, target);
    assert.equal(answer.headers.allow, 'GET, HEAD', target);
    assert.match(answer.headers['content-type'] ?? '', /^application\/json/, target);
    const envelope = JSON.parse(answer.body) as { ok: boolean; error: { code: string; message: string; fields: string[] } };
    assert.equal(envelope.ok, false, target);
    assert.equal(envelope.error.code, 'invalid', target);
    assert.match(envelope.error.message, /POST \/api\/<operation>/, target);
    assert.match(envelope.error.message, /Nothing was changed/, target);
  }
  const list = await d.service.dispatch('listQuestions', {});
  assert.ok(list.ok);
  assert.equal((list.value as { total: number }).total, 0);
});
