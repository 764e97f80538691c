/**
 * Requests and diary files nested deeper than MAX_NESTING are refused up front with a 400
 * that says so, instead of overflowing the stack in a reader further in (a diary file's
 * "version" nested 20,000 deep used to end in an "internal" error).
 */
import assert from 'node:assert/strict';
import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { after, test } from 'node:test';
import fc from 'fast-check';
import { startHttpServer } from '../../main/transport/http';
import { jsonTextNestedDeeperThan, MAX_NESTING, nestedDeeperThan } from '../../shared/validation';
import { openTestDiary, tempDir } from '../support/temp-diary';

/** `[[…[]…]]` with `depth` levels of lists. */
const lists = (depth: number) => '['.repeat(depth) + ']'.repeat(depth);
/** `{"a":{"a":…1…}}` with `depth` levels of objects. */
const objects = (depth: number) => '{"a":'.repeat(depth) + '1' + '}'.repeat(depth);

test('the limit is exact: MAX_NESTING levels pass, one more is refused, for values and for text', () => {
  assert.equal(MAX_NESTING, 64);
  for (const make of [lists, objects]) {
    assert.equal(nestedDeeperThan(JSON.parse(make(MAX_NESTING))), false);
    assert.equal(nestedDeeperThan(JSON.parse(make(MAX_NESTING + 1))), true);
    assert.equal(jsonTextNestedDeeperThan(make(MAX_NESTING)), false);
    assert.equal(jsonTextNestedDeeperThan(make(MAX_NESTING + 1)), true);
  }
  assert.equal(nestedDeeperThan('just text'), false);
  assert.equal(jsonTextNestedDeeperThan(`"${'['.repeat(500)}\\"${'{'.repeat(500)}"`), false, 'brackets inside strings do not count');
  const cycle: Record<string, unknown> = {};
  cycle.self = cycle;
  assert.equal(nestedDeeperThan(cycle), true, 'a cyclic value (possible over IPC) is refused, not walked forever');
});

test('the text check and the value check agree on any JSON', () => {
  fc.assert(
    fc.property(fc.jsonValue({ maxDepth: 8 }), fc.integer({ min: 1, max: 8 }), (value, limit) => {
      const text = JSON.stringify(value);
      assert.equal(jsonTextNestedDeeperThan(text, limit), nestedDeeperThan(JSON.parse(text), limit), text);
    }),
    { seed: 20_000, numRuns: 1000 },
  );
});

test('a request nested 20,000 deep is refused as invalid saying so, wherever the depth is', async () => {
  const d = openTestDiary();
  const deep = JSON.parse(objects(20_000));
  const requests: [string, unknown][] = [
    ['importDiary', { diary: { format: 'forelog-diary', version: deep, questions: [] } }],
    ['importDiary', { diary: JSON.parse(lists(20_000)) }],
    ['createQuestion', { title: 'x', closes_at: '2030-01-01T00:00:00Z', extra: deep }],
    ['updateSettings', deep],
  ];
  for (const [op, request] of requests) {
    const answer = await d.service.dispatch(op, request);
    assert.equal(answer.ok, false, op);
    if (answer.ok) continue;
    assert.equal(answer.error.code, 'invalid', `${op}: ${answer.error.message}`);
    assert.match(answer.error.message, /nested too deeply: lists and objects may nest at most 64 levels deep/);
  }
  assert.equal((await d.call('listQuestions', {})).total, 0);
});

test('a diary file nested 20,000 deep is refused as invalid, and nothing is imported', async () => {
  const d = openTestDiary();
  const text = `{"format":"forelog-diary","version":1,"questions":[{"title":"x","closes_at":"2030-01-01T00:00:00Z","forecasts":[],"x":${objects(20_000)}}]}`;
  const answer = await d.service.dispatch('importText', { format: 'json', text });
  assert.equal(answer.ok, false);
  if (!answer.ok) {
    assert.equal(answer.error.code, 'invalid');
    assert.match(answer.error.message, /line 1, column \d+: the data is nested more than 64 levels deep here/);
  }
  assert.equal((await d.call('listQuestions', {})).total, 0);
});

test('over HTTP, a deeply nested body gets 400 before it is parsed', async () => {
  const d = openTestDiary();
  const dir = tempDir();
  fs.writeFileSync(path.join(dir, 'index.html'), '<!doctype html>');
  const server = await startHttpServer({ dispatch: d.service.dispatch, rendererDir: dir, port: 0 });
  after(() => server.close());
  for (const body of [objects(20_000), lists(1_000_000), `{"diary":${lists(MAX_NESTING)}}`]) {
    const answer = await new Promise<{ status: number; body: string }>((resolve, reject) => {
      const req = http.request(
        {
          host: '127.0.0.1',
          port: server.port,
          path: '/api/importDiary',
          method: 'POST',
          headers: { Host: `127.0.0.1:${server.port}`, Authorization: `Bearer ${server.token}` },
        },
        (res) => {
          const chunks: Buffer[] = [];
          res.on('data', (c: Buffer) => chunks.push(c));
          res.on('end', () => resolve({ status: res.statusCode ?? 0, body: Buffer.concat(chunks).toString('utf8') }));
        },
      );
      req.on('error', reject);
      req.end(body);
    });
    assert.equal(answer.status, 400);
    assert.match(JSON.parse(answer.body).error.message, /nested too deeply/);
  }
});
