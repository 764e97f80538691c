/**
 * Property-based fuzzing of browser mode's HTTP API. The real server (startHttpServer) runs
 * over the real service on a temp SQLite diary holding the example diary, and receives, for
 * every operation in shared/contract.ts, random JSON and mutations of a valid request
 * (wrong types, out-of-range and non-finite numbers, NaN-like strings, huge strings, deep
 * nesting, control characters, unknown fields, boundary dates), raw bodies that are not
 * JSON, and malformed paths, methods and headers over a raw socket. It asserts what a user
 * relies on: never a 5xx, the server keeps answering, and a refused request (non-2xx)
 * leaves the diary exactly as it was (byte-identical export, no commit at all).
 *
 * Seeded and bounded: FUZZ_SEED and FUZZ_RUNS (runs per field of an operation's request)
 * override the defaults;
 * a failure prints the seed and the shrunk counterexample to replay it.
 */
import assert from 'node:assert/strict';
import fs from 'node:fs';
import http from 'node:http';
import net from 'node:net';
import path from 'node:path';
import { after, test } from 'node:test';
import fc from 'fast-check';
import { startHttpServer, type RunningServer } from '../../main/transport/http';
import { operations, type OperationName, type Request } from '../../shared/contract';
import { exportJson, openTestDiary, tempDir, type TestDiary } from '../support/temp-diary';

const SEED = Number(process.env.FUZZ_SEED ?? 20_260_801);
/** Mutated requests per field of an operation's valid request; the other properties scale with it. */
const RUNS_PER_FIELD = Number(process.env.FUZZ_RUNS ?? 10);
/**
 * A safety net on a loaded machine: once a property has run its share of time, its
 * remaining runs send nothing, so the file stays within about 50 s. (fast-check's own
 * time limit would abandon a request mid-flight, whose commit would then land during the
 * next check.)
 */
const MUTATION_TIME_MS = 28_000;

// Set up at the top level: node:test runs a cleanup registered inside a hook when the hook ends.
const d: TestDiary = openTestDiary();
await d.call('loadDemo', {});
const rendererDir = tempDir();
fs.writeFileSync(path.join(rendererDir, 'index.html'), '<!doctype html><title>Forelog</title>');
const server: RunningServer = await startHttpServer({ dispatch: d.service.dispatch, rendererDir, port: 0 });
const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
const ids = await (async () => {
  const questions = await Promise.all(
    (JSON.parse(exportJson(d.service)) as { questions: { id: string }[] }).questions.map((q) => d.call('getQuestion', { id: q.id })),
  );
  return {
    questions: questions.map((q) => q.id as string),
    forecasts: questions.flatMap((q) => q.forecasts.map((f: { id: string }) => f.id)),
    references: questions.flatMap((q) => q.references.map((r: { id: string }) => r.id)),
  };
})();
// A real undo token and a running snooze, so `undo` and `unsnooze` have something to act on.
const open = (await d.call('due', { at: '2026-06-01T12:00:00Z' })).nudges[0] as { id: string; kind: 'checkin' } | undefined;
const undoToken: string = open ? (await d.call('snooze', { question_id: open.id, kind: open.kind, preset: 'next_week' })).undo : 'no-undo';

after(async () => {
  agent.destroy();
  await server.close();
});

// ---- what a request may hold -----------------------------------------------------------

const nest = (depth: number): unknown => {
  let v: unknown = 1;
  for (let i = 0; i < depth; i++) v = i % 2 ? [v] : { a: v };
  return v;
};

/**
 * Stands for a value nested `depth` levels deep, written out only when the body is
 * serialised: JSON.stringify, structuredClone and fast-check's reporting all recurse and
 * would overflow on the real thing. A string, so a mutation that edits it just leaves a
 * string.
 */
const DEEP = '\u0000fuzz-deep:';
const deepMarker = (depth: number) => `${DEEP}${depth}`;
const deepText = (depth: number) => '{"a":['.repeat(depth / 2) + '1' + ']}'.repeat(depth / 2);

/** JSON text of `value`, with each deep marker replaced by the nesting it stands for. */
function toJson(value: unknown): string {
  return (JSON.stringify(value) ?? '').replace(/"\\u0000fuzz-deep:(\d{1,6})"/g, (_m, depth: string) => deepText(Number(depth) & ~1));
}

const EDGE_NUMBERS = [
  0, -0, 1, -1, 0.5, 1.0000000000000002, 0.9999999999999999, 4.9e-324, -4.9e-324, 1e-300, 1e21, 1e308, -1e308,
  Number.MAX_SAFE_INTEGER, Number.MAX_SAFE_INTEGER + 2, 0.49999999999999994, 0.5000000000000001, 24, 336, 337, 365, 366, 90, 91,
];

const EDGE_STRINGS = [
  '', ' ', '\t', '\n', '\u0000', 'a\u0000b', '\u007f', '\u00a0', '\u2028', '\ufeff', '\ud800', 'NaN', 'Infinity', '-Infinity',
  '1e999', 'null', 'true', '0x10', '__proto__', 'constructor', 'x'.repeat(300), 'x'.repeat(301), ' '.repeat(400),
  'Europe/London', 'UTC', 'Etc/GMT+14', 'Not/A_Zone', 'yes', 'no', 'void', 'json', 'csv', 'ics', 'hour', 'checkin',
  'client:northgate', 'UPPER', 'a'.repeat(65), '22:00', '24:00', '23:60', '%', '%E0%A4%A', '../../etc/passwd',
];

/** Instants at and around the accepted range's ends, odd offsets and calendar errors. */
const EDGE_DATES = [
  '1900-01-01T00:00:00.000Z', '1899-12-31T23:59:59.999Z', '1899-12-31T10:00:00.000-14:00', '1900-01-01T13:59:59.999+14:00',
  '2199-12-31T23:59:59.999Z', '2200-01-01T00:00:00.000Z', '2200-01-01T13:59:59.999+14:00', '2199-12-31T10:00:00.000-14:00',
  '9999-12-31T23:59:59.999-14:00', '0000-01-01T00:00:00Z', '+010000-01-01T00:00:00.000Z', '2026-02-29T00:00:00Z',
  '2028-02-29T00:00:00Z', '2026-13-01T00:00:00Z', '2026-06-01T23:59:60Z', '2026-06-01T12:00:00+23:59', '2026-06-01T12:00:00+24:00',
  '2026-06-01T12:00:00', '2026-06-01', '1900-01-01', '1899-12-31', '2199-12-31', '2200-01-01', '2026-06-01T12:00:00.123456789Z',
  '2026-03-29T01:30:00+00:00', '2026-06-01T12:00:00Z',
];

const FAR_DATES = [
  '9999-12-31T23:59:59.999-14:00', '0000-01-01T00:00:00Z', '0001-01-01T00:00:00+14:00', '0099-06-01T00:00:00Z',
  '1000-01-01T00:00:00Z', '3000-01-01T00:00:00Z', '2500-02-29T00:00:00Z', '9999-12-31',
];

const nasty: fc.Arbitrary<unknown> = fc.oneof(
  fc.jsonValue({ maxDepth: 3 }),
  fc.constantFrom(...EDGE_NUMBERS),
  fc.constantFrom(...EDGE_STRINGS),
  fc.constantFrom(...EDGE_DATES, ...FAR_DATES),
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.constantFrom(20_000, 20_001, 200_000).map((n) => 'y'.repeat(n)),
  fc.constantFrom(63, 64, 65).map(nest),
  fc.constantFrom(20_000, 200_000).map(deepMarker),
  fc.array(fc.constantFrom(...EDGE_STRINGS), { maxLength: 40 }),
  fc.constantFrom({}, [], null, true, false, { false_alarm: 1e308, miss: 4.9e-324 }, { start: '22:00', end: '22:00' }),
);

// ---- a valid request for every operation ------------------------------------------------

const pick = <T>(list: T[], n: number): T => list[n % list.length]!;

const smallDiary = () => ({
  format: 'forelog-diary',
  version: 1,
  settings: { default_false_alarm_cost: 1, default_miss_cost: 4, time_zone: 'Europe/London' },
  questions: [
    {
      title: 'Fuzzed import',
      rule: 'Yes if it happens.',
      kind: 'state_at_deadline',
      tags: ['fuzz'],
      opened_at: '2026-01-01T00:00:00Z',
      closes_at: '2026-09-01T00:00:00Z',
      base_rate: 0.2,
      costs: { false_alarm: 1, miss: 2 },
      checkin_days: 0,
      forecasts: [{ at: '2026-01-02T00:00:00Z', p: 0.3, note: 'first', lenses: [{ name: 'outside view', p: 0.2, weight: 2 }] }],
      references: [{ at: '2026-01-03T00:00:00Z', p: 0.4, source: 'desk' }],
      resolution: { outcome: 'no', at: '2026-09-01T00:00:00Z', note: 'did not' },
    },
  ],
});

/** One valid request per operation; TypeScript refuses to compile when an operation is missing. */
const VALID: { [K in OperationName]: (n: number) => Request<K> } = {
  diaryInfo: () => ({}),
  listQuestions: () => ({ status: 'open', tag: 'fuzz', text: 'sign' }),
  getQuestion: (n) => ({ id: pick(ids.questions, n) }),
  listTags: () => ({}),
  createQuestion: () => ({
    title: 'Fuzzed question',
    rule: 'Yes if signed.',
    kind: 'event_by_deadline',
    tags: ['fuzz'],
    opened_at: '2026-05-01T00:00:00Z',
    closes_at: '2026-12-31T17:00:00+01:00',
    time_zone: 'Europe/London',
    base_rate: 0.3,
    base_rate_note: 'a guess',
    costs: { false_alarm: 1, miss: 4 },
    checkin_days: 7,
    first_forecast: { p: 0.4, note: 'start', at: '2026-05-02T00:00:00Z', lenses: [{ name: 'inside view', p: 0.5, weight: 1 }] },
  }),
  updateQuestion: (n) => ({
    id: pick(ids.questions, n),
    changes: { title: 'Renamed', closes_at: '2027-06-01T00:00:00Z', tags: ['fuzz'], checkin_days: 14, costs: null, base_rate: 0.5 },
  }),
  deleteQuestion: (n) => ({ id: pick(ids.questions, n) }),
  addForecast: (n) => ({ question_id: pick(ids.questions, n), p: 0.6, note: 'revised', at: '2026-05-20T00:00:00Z', lenses: [] }),
  updateForecast: (n) => ({ id: pick(ids.forecasts, n), p: 0.55, note: 'edited', at: '2026-05-21T00:00:00Z' }),
  deleteForecast: (n) => ({ id: pick(ids.forecasts, n) }),
  addReference: (n) => ({ question_id: pick(ids.questions, n), p: 0.45, source: 'the client', at: '2026-05-22T00:00:00Z' }),
  deleteReference: (n) => ({ id: pick(ids.references, n) }),
  resolveQuestion: (n) => ({ id: pick(ids.questions, n), outcome: 'yes', at: '2026-05-30T00:00:00Z', note: 'signed' }),
  reopenQuestion: (n) => ({ id: pick(ids.questions, n) }),
  getSettings: () => ({}),
  updateSettings: () => ({
    default_false_alarm_cost: 1,
    default_miss_cost: 3,
    default_checkin_days: 7,
    closing_soon_hours: 24,
    overdue_after_days: 3,
    time_zone: 'Europe/London',
    quiet_hours: { start: '22:00', end: '07:00' },
  }),
  importDiary: () => ({ diary: smallDiary() }),
  exportDiary: () => ({}),
  // `text` stays an object here so mutations reach inside the file; it is serialised before sending.
  importText: () => ({ format: 'json', text: smallDiary() as unknown as string }),
  exportText: (n) => ({ format: pick(['json', 'csv', 'ics'] as const, n) }),
  loadDemo: () => ({}),
  removeDemo: () => ({}),
  score: () => ({ tag: 'fuzz', from: '2026-01-01', to: '2026-12-31T23:59:59Z', costs: { false_alarm: 1, miss: 2 } }),
  due: () => ({ at: '2026-06-01T12:00:00Z' }),

  dueCount: () => ({ at: '2026-06-01T12:00:00Z' }),
  snooze: (n) => ({ question_id: pick(ids.questions, n), kind: 'checkin', preset: pick(['hour', 'tomorrow_morning', 'next_week'] as const, n) }),
  unsnooze: (n) => (n % 2 && open ? { question_id: open.id, kind: open.kind } : { question_id: pick(ids.questions, n) }),
  undo: () => ({ token: undoToken }),
  hindsight: () => ({ tag: 'fuzz', from: '2026-01-01', to: '2026-12-31', threshold: 0.8, include_hits: true }),
  briefing: () => ({ tag: 'fuzz', threshold: 0.7 }),
};

// ---- mutations -----------------------------------------------------------------------------

type Path = (string | number)[];

/** Every path into `value` (objects and lists), the root first; leaves are the paths to non-containers. */
function pathsOf(value: unknown, prefix: Path = []): { containers: Path[]; leaves: Path[] } {
  const out = { containers: [] as Path[], leaves: [] as Path[] };
  const walk = (v: unknown, at: Path) => {
    if (v && typeof v === 'object') {
      out.containers.push(at);
      for (const [k, child] of Object.entries(v)) walk(child, [...at, Array.isArray(v) ? Number(k) : k]);
    } else out.leaves.push(at);
  };
  walk(value, prefix);
  return out;
}

/** Edits that keep a text's look while breaking a rule: a control character inside, a length past a limit, an edge date. */
const stringEdit = fc.oneof(
  {
    weight: 4,
    arbitrary: fc
      .tuple(fc.constantFrom('\u0000', '\u0000', '\u0001', '\t', '\n', '\r', '\u001b', '\u007f', '\u2028', '\ud800'), fc.nat())
      .map(([c, at]) => (t: string) => t.slice(0, at % (t.length + 1)) + c + t.slice(at % (t.length + 1))),
  },
  { weight: 2, arbitrary: fc.constantFrom(...EDGE_DATES).map((d) => () => d) },
  // Far outside the accepted range: what the store, the export and date arithmetic must never see.
  { weight: 1, arbitrary: fc.constantFrom(...FAR_DATES).map((d) => () => d) },
  { weight: 2, arbitrary: fc.constantFrom(80, 81, 200, 201, 300, 301, 20_000, 20_001).map((n) => (t: string) => t.padEnd(n, 'x')) },
  {
    weight: 1,
    arbitrary: fc.constantFrom(
      (t: string) => ` ${t} `,
      (t: string) => t.toUpperCase(),
      (t: string) => t.replace(/\d/, '9'),
      (t: string) => t.replace(/Z$|[+-]\d\d:\d\d$/, '+14:00'),
    ),
  },
  { weight: 2, arbitrary: fc.constantFrom(...EDGE_STRINGS).map((v) => () => v) },
);

/** Edits of a number: the edges of every numeric rule, and the next double either side. */
const numberEdit = fc.oneof(
  fc.constantFrom(...EDGE_NUMBERS).map((v) => () => v),
  fc.constantFrom(
    (n: number) => n + Number.EPSILON * Math.max(1, Math.abs(n)),
    (n: number) => n - Number.EPSILON * Math.max(1, Math.abs(n)),
    (n: number) => -n,
    (n: number) => n * 1e308,
    (n: number) => n + 0.5,
    (n: number) => Math.round(n) + 1,
  ),
);

type Mutation =
  | { kind: 'edit'; at: number; text: (t: string) => string; number: (n: number) => number; other: unknown }
  | { kind: 'set'; at: number; value: unknown }
  | { kind: 'delete'; at: number }
  | { kind: 'add'; at: number; key: string; value: unknown };

const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  {
    weight: 6,
    arbitrary: fc.record({ kind: fc.constant('edit' as const), at: fc.nat(), text: stringEdit, number: numberEdit, other: nasty }),
  },
  { weight: 3, arbitrary: fc.record({ kind: fc.constant('set' as const), at: fc.nat(), value: nasty }) },
  { weight: 1, arbitrary: fc.record({ kind: fc.constant('delete' as const), at: fc.nat() }) },
  {
    weight: 1,
    arbitrary: fc.record({
      kind: fc.constant('add' as const),
      at: fc.nat(),
      key: fc.oneof(fc.string({ maxLength: 8 }), fc.constantFrom('__proto__', 'constructor', 'id', 'p', 'type', 'probs')),
      value: nasty,
    }),
  },
);

/**
 * Applies one mutation to a copy: `edit` changes a leaf by its type (most requests are
 * refused by one field, so this is where the store's own rules get reached); `set`,
 * `delete` and `add` work on any field or list, the whole request included.
 */
function mutate(value: unknown, m: Mutation): unknown {
  const copy = structuredClone(value) as unknown;
  const { containers, leaves } = pathsOf(copy);
  const targets = m.kind === 'edit' ? leaves : m.kind === 'add' ? containers : [...containers, ...leaves];
  if (targets.length === 0) return copy;
  const target = targets[m.at % targets.length]!;
  if (target.length === 0) return m.kind === 'set' ? m.value : m.kind === 'add' ? { ...(copy as object), [m.key]: m.value } : copy;
  const parent = target.slice(0, -1).reduce<any>((node, key) => node[key], copy);
  const key = target[target.length - 1]!;
  const old = parent[key] as unknown;
  if (m.kind === 'edit') parent[key] = typeof old === 'string' ? m.text(old) : typeof old === 'number' ? m.number(old) : m.other;
  else if (m.kind === 'set') parent[key] = m.value;
  else if (m.kind === 'delete') {
    if (Array.isArray(parent)) parent.splice(key as number, 1);
    else delete parent[key];
  } else if (old && typeof old === 'object' && !Array.isArray(old)) {
    Object.defineProperty(old, m.key, { value: m.value, enumerable: true, writable: true, configurable: true });
  }
  return copy;
}

/** The body as sent: the (mutated) request as JSON, `importText`'s file serialised first. */
function bodyOf(operation: OperationName, request: unknown): string {
  if (operation === 'importText' && request && typeof request === 'object' && !Array.isArray(request)) {
    const r = request as { text?: unknown };
    if (r.text !== undefined && typeof r.text !== 'string') return toJson({ ...r, text: toJson(r.text) });
  }
  return toJson(request);
}

/** A body that is not (quite) JSON: cut short, odd literals, a BOM, bytes that are not UTF-8. */
const rawBodyEdit = fc.constantFrom<(text: string) => Buffer>(
  (t) => Buffer.from(t.slice(0, Math.floor(t.length / 2))),
  (t) => Buffer.from(t.replace(/(-?\d+(\.\d+)?)/, '1e999')),
  (t) => Buffer.from(t.replace(/(-?\d+(\.\d+)?)/, '-1e999')),
  (t) => Buffer.from(t.replace(/(-?\d+(\.\d+)?)/, 'NaN')),
  (t) => Buffer.from(`\ufeff${t}`),
  (t) => Buffer.from(`${t}garbage`),
  (t) => Buffer.from(`${t}${t}`),
  (t) => Buffer.concat([Buffer.from(t.slice(0, 5)), Buffer.from([0xc3, 0x28, 0xff, 0xfe]), Buffer.from(t.slice(5))]),
  () => Buffer.from(''),
  () => Buffer.from('   '),
  () => Buffer.from('[]'),
  () => Buffer.from('"text"'),
);

// ---- talking to the server ---------------------------------------------------------------------

interface Answer {
  status: number;
  body: string;
}

function post(operation: string, body: Buffer | string, headers: Record<string, string> = {}): Promise<Answer> {
  return new Promise((resolve, reject) => {
    const req = http.request(
      {
        host: '127.0.0.1',
        port: server.port,
        path: `/api/${operation}`,
        method: 'POST',
        agent,
        headers: { Host: `127.0.0.1:${server.port}`, Authorization: `Bearer ${server.token}`, 'Content-Type': 'application/json', ...headers },
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
}

/** Writes raw bytes on a fresh connection; every status line that comes back, until close or timeout. */
function rawExchange(bytes: Buffer): Promise<number[]> {
  return new Promise((resolve) => {
    const socket = net.connect(server.port, '127.0.0.1');
    const chunks: Buffer[] = [];
    const done = () => {
      clearTimeout(timer);
      socket.destroy();
      resolve([...Buffer.concat(chunks).toString('latin1').matchAll(/HTTP\/1\.[01] (\d{3})/g)].map((m) => Number(m[1])));
    };
    const timer = setTimeout(done, 1500);
    socket.on('data', (c: Buffer) => chunks.push(c));
    socket.on('close', done);
    socket.on('error', done);
    socket.on('connect', () => socket.end(bytes));
  });
}

/** The diary as the user would get it, and SQLite's own count of commits by others. */
function snapshot(): { export: string; version: number } {
  return { export: exportJson(d.service), version: d.service.store.read.pragma('data_version', { simple: true }) as number };
}

function assertUnchanged(before: { export: string; version: number }, what: string): void {
  const now = snapshot();
  assert.equal(now.version, before.version, `${what}: a refused request committed a change`);
  assert.ok(now.export === before.export, `${what}: a refused request changed the diary export`);
}

async function assertStillAnswers(): Promise<void> {
  const r = await post('diaryInfo', '{}');
  assert.equal(r.status, 200, `the server stopped answering: ${r.body}`);
}

/** Sends one API request and checks the three promises. */
async function check(operation: string, body: Buffer | string, headers?: Record<string, string>): Promise<void> {
  const before = snapshot();
  const answer = await post(operation, body, headers);
  const what = `${operation} ${String(body).slice(0, 300)} → ${answer.status} ${answer.body.slice(0, 300)}`;
  assert.ok(answer.status >= 200 && answer.status < 500, what);
  if (answer.status >= 300) assertUnchanged(before, what);
  await assertStillAnswers();
}

async function runProperty<T>(
  name: string,
  arbitrary: fc.Arbitrary<T>,
  predicate: (value: T) => Promise<void>,
  options: { numRuns: number; seed?: number; timeLimitMs: number },
): Promise<void> {
  const seed = options.seed ?? SEED;
  const deadline = Date.now() + options.timeLimitMs;
  const property = fc.asyncProperty(arbitrary, async (value) => {
    if (Date.now() < deadline) await predicate(value);
  });
  try {
    await fc.assert(property, { seed, numRuns: options.numRuns });
  } catch (err) {
    const cause = err instanceof Error && err.cause instanceof Error ? `\n${err.cause.message}` : '';
    const message = `${err instanceof Error ? err.message : String(err)}${cause}`;
    throw new Error(`HTTP fuzz "${name}" failed with seed ${seed}; replay with FUZZ_SEED=${SEED} FUZZ_RUNS=${RUNS_PER_FIELD}.\n${message}`);
  }
}

const OPERATIONS = Object.keys(operations) as OperationName[];

// ---- the properties --------------------------------------------------------------------------

/** Fields (leaves) in an operation's valid request: its runs grow with them, so rich requests get more. */
const leafCount = (operation: OperationName): number => pathsOf(VALID[operation](0)).leaves.length;

test('mutated valid requests for every operation: never a 5xx, refusals change nothing', async () => {
  // One property per operation, so none is starved by chance.
  const runs = OPERATIONS.map((operation) => RUNS_PER_FIELD * Math.max(2, leafCount(operation)));
  const total = runs.reduce((a, b) => a + b, 0);
  for (const [index, operation] of OPERATIONS.entries()) {
    await runProperty(
      `mutated ${operation}`,
      fc.tuple(fc.nat(), fc.array(mutation, { minLength: 1, maxLength: 2 })),
      async ([n, mutations]) => {
        const request = mutations.reduce<unknown>((r, m) => mutate(r, m), VALID[operation](n));
        await check(operation, bodyOf(operation, request));
      },
      { numRuns: runs[index]!, seed: SEED + index, timeLimitMs: (MUTATION_TIME_MS * runs[index]!) / total },
    );
  }
});

test('random JSON bodies for every operation: never a 5xx, refusals change nothing', async () => {
  await runProperty(
    'random bodies',
    fc.tuple(fc.constantFrom(...OPERATIONS), fc.oneof(nasty, fc.dictionary(fc.string({ maxLength: 12 }), nasty, { maxKeys: 6 }))),
    async ([operation, body]) => {
      await check(operation, toJson(body));
    },
    { numRuns: 300, timeLimitMs: 5_000 },
  );
});

test('bodies that are not quite JSON: never a 5xx, refusals change nothing', async () => {
  await runProperty(
    'raw bodies',
    fc.tuple(fc.constantFrom(...OPERATIONS), fc.nat(), rawBodyEdit),
    async ([operation, n, edit]) => {
      await check(operation, edit(bodyOf(operation, VALID[operation](n))));
    },
    { numRuns: 120, timeLimitMs: 4_000 },
  );
});

/** Request lines, paths, methods and headers as a browser would never send them. */
const rawRequest = fc.record({
  method: fc.constantFrom('GET', 'HEAD', 'POST', 'PUT', 'DELETE', 'OPTIONS', 'PATCH', 'CONNECT', 'TRACE', 'post', 'BREW', ''),
  target: fc.oneof(
    fc.constantFrom('/', '/index.html', '/api/', '/api/diaryInfo', '/api/nope', '/api/__proto__', '/api/constructor', '*', '%', '/%', '/%E0%A4%A',
      '/%ff', '/%00', '/..%2f..%2fetc%2fpasswd', '//evil', 'http://[', 'http://127.0.0.1:1/', '/api/diaryInfo?x=%', '/a b', '/\u00e9'),
    fc.string({ unit: 'binary-ascii', maxLength: 30 }).map((s) => `/${s}`),
    fc.array(fc.constantFrom('%', '%2', '%25', '%C3', '%A9', '%E0%A4', '%F0%9F%98', '..', '/', 'a', '?', '#', ';'), { maxLength: 8 }).map((p) => `/${p.join('')}`),
  ),
  version: fc.constantFrom('HTTP/1.1', 'HTTP/1.0', 'HTTP/2.0', 'HTTP/1.1 extra', ''),
  host: fc.constantFrom('ours', 'localhost', 'none', 'evil.example', '', 'ours, ours'),
  token: fc.constantFrom('right', 'wrong', 'none', 'Bearer', 'Basic abc'),
  extra: fc.array(
    fc.constantFrom(
      'Origin: http://evil.example', 'Origin: null', 'Content-Type: text/plain', 'Transfer-Encoding: chunked', 'Transfer-Encoding: gzip',
      'Content-Length: abc', 'Content-Length: -1', 'Content-Length: 0', 'Expect: 100-continue', 'X-Bad\u0001: 1', 'X-Bad: a\u0000b',
      'Bad Header: 1', ': empty name', 'Connection: upgrade', 'Upgrade: websocket', `X-Long: ${'z'.repeat(20_000)}`,
    ),
    { maxLength: 3 },
  ),
  body: fc.oneof(fc.constant(''), fc.constant('{}'), fc.string({ maxLength: 50 }), fc.constantFrom('0\r\n\r\n', 'zz\r\n', '5\r\n{}\r\n0\r\n\r\n')),
});

test('malformed paths, methods and headers over a raw socket: never a 5xx, the server keeps answering', async () => {
  await runProperty(
    'raw requests',
    rawRequest,
    async (r) => {
      const hostHeader = { ours: `Host: 127.0.0.1:${server.port}`, localhost: `Host: localhost:${server.port}`, none: '', 'evil.example': 'Host: evil.example', '': 'Host: ', 'ours, ours': `Host: 127.0.0.1:${server.port}\r\nHost: 127.0.0.1:${server.port}` }[r.host];
      const tokenHeader = { right: `Authorization: Bearer ${server.token}`, wrong: 'Authorization: Bearer nope', none: '', Bearer: 'Authorization: Bearer', 'Basic abc': 'Authorization: Basic abc' }[r.token];
      const declaresLength = r.extra.some((h) => /^(Content-Length|Transfer-Encoding):/.test(h));
      const headers = [hostHeader, tokenHeader, ...r.extra, declaresLength ? '' : `Content-Length: ${Buffer.byteLength(r.body)}`, 'Connection: close'].filter(Boolean);
      const before = snapshot();
      const statuses = await rawExchange(Buffer.from(`${r.method} ${r.target} ${r.version}`.trim() + `\r\n${headers.join('\r\n')}\r\n\r\n${r.body}`));
      for (const status of statuses) assert.ok(status < 500, `${JSON.stringify(r).slice(0, 400)} → ${status}`);
      if (!statuses.some((s) => s >= 200 && s < 300)) assertUnchanged(before, JSON.stringify(r).slice(0, 400));
      await assertStillAnswers();
    },
    { numRuns: 200, timeLimitMs: 5_000 },
  );
});
