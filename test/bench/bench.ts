/**
 * `npm run bench`: how long the things a user waits for take on this machine, on synthetic
 * diaries of 1,000 and 10,000 questions (`npm run bench -- --large` adds 100,000;
 * `-- --no-browser` leaves out browser mode and the `serve` calls), 20
 * revisions each, from a seeded PRNG (test/bench/make-diary.ts). For each size it prints:
 *   - import, export (JSON, CSV), `score --json` and `due`, each as a whole process of the
 *     built command line (dist/main/cli.cjs), the way a user or a script runs them;
 *   - `score --json` against a yardstick: test/bench/score_peer.py, the same core figures
 *     (Brier, log score, calibration bins) computed with numpy from the exported file by
 *     Debian's /usr/bin/python3, timed as a whole process in the same run; it must agree;
 *     and the reading floor (test/bench/reading-floor.cjs): Node and SQLite alone passing
 *     the same revisions to JavaScript, the least any scorer over this storage could take;
 *   - reading the diary for scoring and the engine's own compute, in process, and the
 *     reading ahead a running app does while idle (total, steps, longest step);
 *   - `due`, `dueCount` and a page of `listQuestions` per call to a running `forelog serve`;
 *   - in browser mode (`forelog serve` in Chromium): time from the in-app navigation until
 *     Questions, the Desk, Hindsight and the Scorecard show their content, one search
 *     keystroke until the list shows its answer, a Scorecard tag change, and the DOM node
 *     count of each screen. Targets (issue 11): each screen ≤ 300 ms and a keystroke
 *     ≤ 100 ms at 10,000 questions; every screen within 1 s at 100,000.
 * Then a mixed diary of 10,000 questions (yes/no, choice and numeric; make-diary.ts
 * buildMixedDiaryFile): import, export, `score --json`, and the engine's time for all three
 * types' reports in process (issue 9's target: within 150 ms), and the browser figures
 * (medians of 3); `npm run bench -- --mixed` measures only that diary.
 * Whole-process figures are medians of 5 (3 at 100,000), in-process and per-call ones of 5,
 * browser ones of 5 (1 at 100,000); the load average before and after is printed because
 * other work on the machine inflates them.
 * `-- --screens FILE` measures only the per-call and browser figures on an existing diary.
 * Figures are printed, never asserted: timings do not belong in pass/fail tests.
 */
import { spawn, spawnSync } from 'node:child_process';
import type { Page } from '@playwright/test';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import readline from 'node:readline';
import { loadScoringInput, loadScoringQuestions } from '../../main/service/scoring-source';
import { openDiary } from '../../main/service/index';
import { computeChoiceReport, computeNumericReport, computeScoreReport, type ScoreReport } from '../../shared/scoring';
import { BENCH_TAGS, buildDiaryFile, buildMixedDiaryFile } from './make-diary';

// The little of the DOM the functions run inside the page use (this file is type-checked without the DOM library).
declare const document: { querySelector(selector: string): { textContent: string | null } | null; querySelectorAll(selector: string): { length: number } };
declare const location: { hash: string };

const ROOT = path.resolve(import.meta.dirname, '..', '..');
const CLI = path.join(ROOT, 'dist', 'main', 'cli.cjs');
const PEER = path.join(ROOT, 'test', 'bench', 'score_peer.py');
const FLOOR = path.join(ROOT, 'test', 'bench', 'reading-floor.cjs');
const PYTHON = '/usr/bin/python3';
const CHROMIUM = '/usr/bin/chromium';
const REVISIONS_PER_QUESTION = 20;

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const ms = (x: number) => (x >= 10_000 ? `${(x / 1000).toFixed(1)} s` : `${x.toFixed(0)} ms`);

interface Timed {
  ms: number;
  stdout: string;
}

function run(command: string, args: string[]): Timed {
  const t0 = performance.now();
  const r = spawnSync(command, args, { encoding: 'utf8', maxBuffer: 1024 * 1024 * 1024 });
  const elapsed = performance.now() - t0;
  if (r.status !== 0) throw new Error(`${path.basename(command)} ${args.slice(0, 2).join(' ')} failed: ${(r.stderr || r.error?.message || '').trim()}`);
  return { ms: elapsed, stdout: r.stdout };
}

const forelog = (...args: string[]) => run(process.execPath, [CLI, ...args]);

function repeat(times: number, fn: () => Timed): { median: number; last: Timed } {
  const runs: Timed[] = [];
  for (let i = 0; i < times; i++) runs.push(fn());
  return { median: median(runs.map((r) => r.ms)), last: runs[runs.length - 1]! };
}

/** A row of the table: label → figure per size. */
type Row = Map<number, string>;

/** The peer must compute the same figures, or the comparison means nothing. */
function peerAgrees(peer: { scored: number; brier: number; log_score: number; bins: { index: number; n: number; mean_p: number; observed: number }[] }, ours: ScoreReport): string {
  const close = (a: number | null, b: number | null) => a !== null && b !== null && Math.abs(a - b) <= 1e-12 * Math.max(1, Math.abs(b));
  const ok =
    peer.scored === ours.scored &&
    close(peer.brier, ours.brier) &&
    close(peer.log_score, ours.log_score) &&
    peer.bins.length === ours.bins.length &&
    peer.bins.every((b, i) => b.index === ours.bins[i]!.index && b.n === ours.bins[i]!.n && close(b.mean_p, ours.bins[i]!.mean_p) && close(b.observed, ours.bins[i]!.observed));
  return ok ? 'agrees' : 'DISAGREES (check the counting rules of score_peer.py)';
}

/**
 * Screens in browser mode, each measured on its own so one that cannot finish (a screen that
 * draws every row of a very large diary) does not hide the others: in-app navigation from
 * Settings to the screen, timed until its content is drawn, then the page's DOM node count.
 * Calls `put(label, figure)` for each; a figure is "not measured: …" when a step timed out.
 */
async function browserFigures(dbPath: string, times: number, timeoutMs: number, put: (label: string, value: string) => void): Promise<void> {
  const server = spawn(process.execPath, [CLI, 'serve', '--db', dbPath, '--port', '0'], { stdio: ['ignore', 'pipe', 'ignore'] });
  try {
    const url = await new Promise<string>((resolve, reject) => {
      readline.createInterface({ input: server.stdout! }).once('line', resolve);
      server.once('exit', () => reject(new Error('forelog serve exited before printing its address')));
    });
    // The due list and the top bar's count as the running app asks for them, after one warm-up call.
    const address = new URL(url);
    // …and a page of the Questions list as the screen asks for it: the first, and a search.
    const calls: [string, string, object][] = [
      ['due', 'due', {}],
      ['dueCount', 'dueCount', {}],
      ['listQuestions (first page of 100)', 'listQuestions', { limit: 100 }],
      ['listQuestions (search, first page)', 'listQuestions', { text: 'question 1', limit: 100 }],
    ];
    for (const [label, op, body] of calls) {
      const call = async () => {
        const t0 = performance.now();
        const response = await fetch(`${address.origin}/api/${op}`, {
          method: 'POST',
          headers: { 'Content-Type': 'application/json', Authorization: `Bearer ${address.searchParams.get('token')}` },
          body: JSON.stringify(body),
        });
        await response.text();
        return performance.now() - t0;
      };
      await call();
      const spans: number[] = [];
      for (let i = 0; i < 5; i++) spans.push(await call());
      put(`${label} per call in serve`, ms(median(spans)));
    }

    const { chromium } = await import('@playwright/test');
    const browser = await chromium.launch({
      executablePath: CHROMIUM,
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    });
    const wait = { timeout: timeoutMs };
    try {
      /** A fresh tab on Settings for each figure, so a screen that hangs leaves nothing behind. */
      async function onPage(label: string, fn: (page: Page) => Promise<string>): Promise<void> {
        const page = await browser.newPage({ viewport: { width: 1280, height: 860 } });
        try {
          await page.goto(`${url}#/settings`);
          await page.getByRole('heading', { level: 1, name: 'Settings' }).waitFor(wait);
          put(label, await fn(page));
        } catch (err) {
          put(label, `not measured: ${(err as Error).message.split('\n')[0]!.slice(0, 60)}`);
        } finally {
          await page.close().catch(() => undefined);
        }
      }
      const nodes = async (page: Page) => `${(await page.evaluate(() => document.querySelectorAll('*').length)).toLocaleString('en')} nodes`;

      /** Median time from the navigation to `ready`, and the node count then. */
      async function open(page: Page, hash: string, ready: () => Promise<unknown>): Promise<string> {
        const spans: number[] = [];
        for (let i = 0; i < times; i++) {
          await page.evaluate(() => (location.hash = '#/settings'));
          await page.getByRole('heading', { level: 1, name: 'Settings' }).waitFor(wait);
          const t0 = performance.now();
          await page.evaluate((h) => (location.hash = h), hash);
          await ready();
          spans.push(performance.now() - t0);
        }
        return `${ms(median(spans))}, ${await nodes(page)}`;
      }
      const questionsReady = (page: Page) => async () => {
        await page.getByTestId('question-table').locator('caption').waitFor(wait);
        await page.locator('.table-card:not([aria-busy])').waitFor(wait);
      };

      await onPage('Questions open (browser)', (page) => open(page, '#/questions', questionsReady(page)));

      await onPage('search keystroke until the list shows (browser)', async (page) => {
        await page.evaluate(() => (location.hash = '#/questions'));
        await questionsReady(page)();
        // One digit typed after "question 1": always fewer matches, so the caption changes. The
        // caption groups digits as the locale does ("of 100,000 questions").
        const search = page.getByRole('searchbox', { name: 'Search' });
        await search.fill('question 1');
        await page.waitForFunction(() => /of \d{1,3}([,.\u00a0\u202f]\d{3})* questions/.test(document.querySelector('[data-testid="question-table"] caption')?.textContent ?? ''), null, wait);
        const before = await page.evaluate(() => document.querySelector('[data-testid="question-table"] caption')?.textContent ?? '');
        const keystrokes: number[] = [];
        for (let i = 0; i < times; i++) {
          await search.fill('question 1');
          await page.waitForFunction((was) => document.querySelector('[data-testid="question-table"] caption')?.textContent === was, before, wait);
          await page.locator('.table-card:not([aria-busy])').waitFor(wait);
          const t0 = performance.now();
          await search.press(String((i % 9) + 1));
          await page.waitForFunction(
            (was) => document.querySelector('[data-testid="question-table"] caption')?.textContent !== was && document.querySelector('.table-card[aria-busy]') === null,
            before,
            wait,
          );
          keystrokes.push(performance.now() - t0);
        }
        return ms(median(keystrokes));
      });

      await onPage('Desk open (browser)', (page) => open(page, '#/', () => page.locator('.screen.desk:not([aria-busy])').waitFor(wait)));
      await onPage('Hindsight open (browser)', (page) => open(page, '#/hindsight', () => page.locator('[data-hindsight-ready="true"]').waitFor(wait)));
      await onPage('Scorecard open (browser)', (page) => open(page, '#/scorecard', () => page.locator('[data-scorecard-ready="true"]').waitFor(wait)));
      await onPage('Scorecard tag change (browser)', async (page) => {
        await page.evaluate(() => (location.hash = '#/scorecard'));
        await page.locator('[data-scorecard-ready="true"]').waitFor(wait);
        const tagFilter = page.getByLabel('Tag', { exact: true });
        const changes: number[] = [];
        for (const tag of [BENCH_TAGS[0]!, BENCH_TAGS[2]!, '', BENCH_TAGS[4]!, BENCH_TAGS[1]!].slice(0, Math.max(times, 3))) {
          const t0 = performance.now();
          await tagFilter.selectOption(tag);
          await page.locator(`[data-scorecard-ready="true"][data-scorecard-tag="${tag}"]`).waitFor(wait);
          changes.push(performance.now() - t0);
        }
        return ms(median(changes));
      });
    } finally {
      await browser.close();
    }
  } finally {
    server.kill();
  }
}

async function measure(questions: number, rows: Map<string, Row>): Promise<void> {
  const put = (label: string, value: string) => {
    if (!rows.has(label)) rows.set(label, new Map());
    rows.get(label)!.set(questions, value);
  };
  const large = questions > 10_000;
  const times = large ? 3 : 5;
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'forelog-bench-'));
  const say = (what: string) => process.stderr.write(`[${questions.toLocaleString('en')}] ${what}…\n`);
  try {
    const dbPath = path.join(dir, 'bench.sqlite');
    say('generating the diary');
    const whole = path.join(dir, 'diary.json');
    fs.writeFileSync(whole, JSON.stringify(buildDiaryFile(questions, REVISIONS_PER_QUESTION)));
    say('importing');
    put('import JSON (whole process)', ms(forelog('import', whole, '--db', dbPath).ms));
    fs.rmSync(whole, { force: true });

    say('exporting');
    const exported = path.join(dir, 'export.json');
    put('export JSON (whole process)', ms(forelog('export', exported, '--db', dbPath).ms));
    put('export CSV (whole process)', ms(forelog('export', path.join(dir, 'export.csv'), '--format', 'csv', '--db', dbPath).ms));
    fs.rmSync(path.join(dir, 'export.csv'), { force: true });

    say('scoring, and the numpy peer');
    const score = repeat(times, () => forelog('score', '--json', '--db', dbPath));
    const peer = repeat(times, () => run(PYTHON, [PEER, exported]));
    const report = JSON.parse(score.last.stdout) as ScoreReport;
    put('score --json (whole process)', ms(score.median));
    put('numpy peer (whole process)', `${ms(peer.median)} (${peerAgrees(JSON.parse(peer.last.stdout), report)})`);
    put('score ÷ peer', `${(score.median / peer.median).toFixed(2)}`);
    const floor = repeat(times, () => run(process.execPath, [FLOOR, dbPath]));
    put('reading floor (Node + SQLite alone, whole process)', `${ms(floor.median)} (÷ peer ${(floor.median / peer.median).toFixed(2)})`);
    fs.rmSync(exported, { force: true });

    const service = openDiary({ dbPath });
    const reading: number[] = [];
    const engine: number[] = [];
    try {
      for (let i = 0; i < 5; i++) {
        const t0 = performance.now();
        const input = loadScoringQuestions(service.store.read);
        const t1 = performance.now();
        computeScoreReport(input, { default_costs: { false_alarm: 1, miss: 1 } });
        reading.push(t1 - t0);
        engine.push(performance.now() - t1);
      }
    } finally {
      service.close();
    }
    put('reading the diary for scoring (in process)', ms(median(reading)));
    put('scoring engine (in process)', ms(median(engine)));
    readingAhead(dbPath, put);

    say('due');
    const due = repeat(times, () => forelog('due', '--json', '--db', dbPath));
    put('due --json (whole process)', `${ms(due.median)} (${(JSON.parse(due.last.stdout) as { nudges: unknown[] }).nudges.length.toLocaleString('en')} due)`);

    if (process.argv.includes('--no-browser')) return;
    if (!fs.existsSync(CHROMIUM)) {
      put('browser mode', `not measured (no ${CHROMIUM})`);
      return;
    }
    say('browser mode');
    await browserFigures(dbPath, large ? 1 : 5, large ? 300_000 : 60_000, put).catch((err: unknown) => put('browser mode', `not measured: ${(err as Error).message.split('\n')[0]}`));
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

/**
 * `npm run bench -- --screens FILE`: only the per-call and browser figures, on a diary file
 * already made (e.g. a 100,000-question one imported once, which takes minutes), one run each.
 */
async function measureScreens(dbPath: string, rows: Map<string, Row>): Promise<number> {
  const service = openDiary({ dbPath });
  const questions = service.diary.handlers.diaryInfo({}) as { question_count: number };
  service.close();
  const size = questions.question_count;
  const put = (label: string, value: string) => {
    if (!rows.has(label)) rows.set(label, new Map());
    rows.get(label)!.set(size, value);
  };
  readingAhead(dbPath, put);
  await browserFigures(dbPath, 1, 300_000, put);
  return size;
}

/**
 * What the app and `forelog serve` do while idle after opening a diary or after a change
 * (main/service/index.ts): read the scoring input in steps and score it with no filter.
 * The total says how soon a first Scorecard or Hindsight visit finds it done; the longest
 * step is the most a request can wait behind it.
 */
function readingAhead(dbPath: string, put: (label: string, value: string) => void): void {
  const service = openDiary({ dbPath });
  try {
    const t0 = performance.now();
    let steps = 0;
    let longest = 0;
    for (;;) {
      const s0 = performance.now();
      const done = service.diary.warmScoringInput();
      longest = Math.max(longest, performance.now() - s0);
      if (done) break;
      steps++;
    }
    put('reading ahead while idle (in process)', `${ms(performance.now() - t0)} in ${steps} steps, longest ${ms(longest)}`);
  } finally {
    service.close();
  }
}

/** The mixed diary's size: the engine must stay within 150 ms on it (issue 9). */
const MIXED = 10_000;

/**
 * A mixed diary of 10,000 questions (a third each yes/no, choice and numeric; 20 revisions
 * each): import, export, `score --json` as whole processes, and the scoring engine in
 * process, all three types' reports (what `score --json` computes) on the same input.
 */
async function measureMixed(put: (label: string, value: string) => void): Promise<void> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'forelog-bench-mixed-'));
  const say = (what: string) => process.stderr.write(`[mixed ${MIXED.toLocaleString('en')}] ${what}…\n`);
  try {
    const dbPath = path.join(dir, 'mixed.sqlite');
    const file = path.join(dir, 'mixed.json');
    say('generating and importing');
    fs.writeFileSync(file, JSON.stringify(buildMixedDiaryFile(MIXED, REVISIONS_PER_QUESTION)));
    put('import JSON (whole process)', ms(forelog('import', file, '--db', dbPath).ms));
    say('exporting');
    put('export JSON (whole process)', ms(forelog('export', path.join(dir, 'export.json'), '--db', dbPath).ms));
    put('export CSV (whole process)', ms(forelog('export', path.join(dir, 'export.csv'), '--format', 'csv', '--db', dbPath).ms));
    say('scoring');
    put('score --json (whole process)', ms(repeat(5, () => forelog('score', '--json', '--db', dbPath)).median));

    const service = openDiary({ dbPath });
    try {
      const t0 = performance.now();
      const { binary, choice, numeric } = loadScoringInput(service.store.read);
      put('reading the diary for scoring, all three types (in process)', ms(performance.now() - t0));
      const costs = { default_costs: { false_alarm: 1, miss: 1 } };
      const spans: number[] = [];
      const cpu: number[] = [];
      const parts = { binary: [] as number[], choice: [] as number[], numeric: [] as number[] };
      for (let i = 0; i < 5; i++) {
        const c0 = process.cpuUsage();
        const t0 = performance.now();
        computeScoreReport(binary, costs);
        const t1 = performance.now();
        computeChoiceReport(choice, {});
        const t2 = performance.now();
        computeNumericReport(numeric, {});
        const t3 = performance.now();
        const used = process.cpuUsage(c0);
        cpu.push((used.user + used.system) / 1000);
        spans.push(t3 - t0);
        parts.binary.push(t1 - t0);
        parts.choice.push(t2 - t1);
        parts.numeric.push(t3 - t2);
      }
      put(
        `scoring engine, all three reports (in process; target ≤ 150 ms)`,
        `${ms(median(spans))}, CPU ${ms(median(cpu))} (yes/no ${ms(median(parts.binary))}, choice ${ms(median(parts.choice))}, numeric ${ms(median(parts.numeric))}; ${binary.length.toLocaleString('en')} + ${choice.length.toLocaleString('en')} + ${numeric.length.toLocaleString('en')} questions)`,
      );
    } finally {
      service.close();
    }
    // The screens too: a third of the calls on Hindsight and the Scorecard are choice and numeric ones.
    if (!process.argv.includes('--no-browser') && fs.existsSync(CHROMIUM)) {
      say('browser mode');
      await browserFigures(dbPath, 3, 60_000, put).catch((err: unknown) => put('browser mode', `not measured: ${(err as Error).message.split('\n')[0]}`));
    }
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

async function main(): Promise<void> {
  // `--mixed` measures the mixed diary alone (a quick check of the engine on every type);
  // `--screens FILE` only the screens on an existing diary.
  const mixedOnly = process.argv.includes('--mixed');
  const screensAt = process.argv.indexOf('--screens');
  const sizes = mixedOnly ? [] : process.argv.includes('--large') ? [1_000, 10_000, 100_000] : [1_000, 10_000];
  process.stderr.write('Building the command line and the screens (npm run build)…\n');
  const built = spawnSync('npm', ['run', '--silent', 'build'], { cwd: ROOT, stdio: ['ignore', 'ignore', 'inherit'] });
  if (built.status !== 0) throw new Error('npm run build failed (messages above)');
  const loadBefore = os.loadavg()[0]!;
  const rows = new Map<string, Row>();
  if (screensAt >= 0) {
    const file = process.argv[screensAt + 1];
    if (!file || !fs.existsSync(file)) throw new Error('--screens needs the path of an existing diary file');
    sizes.splice(0, sizes.length, await measureScreens(path.resolve(file), rows));
  } else {
    for (const size of sizes) await measure(size, rows);
  }

  const mixed = new Map<string, string>();
  if (screensAt < 0) await measureMixed((label, value) => mixed.set(label, value));

  const cpus = os.cpus();
  const header = ['', ...sizes.map((s) => `${s.toLocaleString('en')} questions`)];
  const body = [...rows].map(([label, values]) => [label, ...sizes.map((s) => values.get(s) ?? '—')]);
  const widths = header.map((_, i) => Math.max(...[header, ...body].map((r) => r[i]!.length)));
  const line = (cells: string[]) => `| ${cells.map((c, i) => c.padEnd(widths[i]!)).join(' | ')} |`;
  process.stdout.write(
    [
      `Forelog benchmark, ${REVISIONS_PER_QUESTION} revisions per question`,
      `machine: ${cpus.length} × ${cpus[0]?.model ?? 'cpu'}, ${(os.totalmem() / 2 ** 30).toFixed(0)} GB, Node ${process.version}; load average ${loadBefore.toFixed(1)} before, ${os.loadavg()[0]!.toFixed(1)} after`,
      '',
      ...(sizes.length ? [line(header), line(widths.map((w) => '-'.repeat(w))), ...body.map(line), ''] : []),
      ...(mixed.size
        ? [
            `Mixed diary: ${MIXED.toLocaleString('en')} questions, a third each yes/no, choice (2–12 options) and numeric (3, 5 or 7 levels), ${REVISIONS_PER_QUESTION} revisions each`,
            '',
            ...[...mixed].map(([label, value]) => `- ${label}: ${value}`),
          ]
        : []),
    ].join('\n') + '\n',
  );
}

main().catch((err: unknown) => {
  process.stderr.write(`bench failed: ${err instanceof Error ? err.message : String(err)}\n`);
  process.exitCode = 1;
});
