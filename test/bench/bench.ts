/**
 * `npm run bench`: how long the things a user waits for take on this machine, on synthetic
 * diaries of 1,000 and 10,000 questions (`npm run bench -- --large` adds 100,000), 20
 * revisions each, from a seeded PRNG (test/bench/make-diary.ts). For each size it prints:
 *   - import, export (JSON, CSV), `score --json` and `due`, each as a whole process of the
 *     built command line (dist/main/cli.cjs), the way a user or a script runs them;
 *   - `score --json` against a yardstick: test/bench/score_peer.py, the same core figures
 *     (Brier, log score, calibration bins) computed with numpy from the exported file by
 *     Debian's /usr/bin/python3, timed as a whole process in the same run; it must agree;
 *   - reading the diary for scoring and the engine's own compute, in process;
 *   - in browser mode (`forelog serve` in Chromium): opening Questions, one search keystroke
 *     (includes the search box's 250 ms pause), opening the Desk and Hindsight, a Scorecard
 *     tag change, and the DOM node count of each screen.
 * Whole-process figures are medians of 5 (3 at 100,000), in-process ones of 5; the load
 * average before and after is printed because other work on the machine inflates them.
 * Figures are printed, never asserted: timings do not belong in pass/fail tests.
 */
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import readline from 'node:readline';
import { loadScoringQuestions } from '../../main/service/scoring-source';
import { openDiary } from '../../main/service/index';
import { computeScoreReport, type ScoreReport } from '../../shared/scoring';
import { BENCH_TAGS, buildDiaryFile } from './make-diary';

// The little of the DOM the functions run inside the page use (this file is type-checked without the DOM library).
declare const document: { querySelector(selector: string): { textContent: string | null } | null; querySelectorAll(selector: string): { length: number } };
declare const location: { hash: string };

const ROOT = path.resolve(import.meta.dirname, '..', '..');
const CLI = path.join(ROOT, 'dist', 'main', 'cli.cjs');
const PEER = path.join(ROOT, 'test', 'bench', 'score_peer.py');
const PYTHON = '/usr/bin/python3';
const CHROMIUM = '/usr/bin/chromium';
const REVISIONS_PER_QUESTION = 20;
/** The largest file one import takes today is 64 MB; bigger diaries are written in parts of this many questions. */
const PART = 10_000;

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

interface BrowserFigures {
  questionsOpen: number;
  questionsNodes: number;
  searchKeystroke: number;
  deskOpen: number;
  deskNodes: number;
  hindsightOpen: number;
  hindsightNodes: number;
  scorecardOpen: number;
  scorecardNodes: number;
  scorecardFilter: number;
}

/** Screens in browser mode: in-app navigation from Settings to each screen, timed until its content is drawn. */
async function browserFigures(dbPath: string, times: number): Promise<BrowserFigures> {
  const server = spawn(process.execPath, [CLI, 'serve', '--db', dbPath, '--port', '0'], { stdio: ['ignore', 'pipe', 'inherit'] });
  try {
    const url = await new Promise<string>((resolve, reject) => {
      readline.createInterface({ input: server.stdout! }).once('line', resolve);
      server.once('exit', () => reject(new Error('forelog serve exited before printing its address')));
    });
    const { chromium } = await import('@playwright/test');
    const browser = await chromium.launch({
      executablePath: CHROMIUM,
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    });
    try {
      const page = await browser.newPage({ viewport: { width: 1280, height: 860 } });
      const wait = { timeout: 120_000 };
      const nodes = () => page.evaluate(() => document.querySelectorAll('*').length);
      await page.goto(`${url}#/settings`);
      await page.getByRole('heading', { level: 1, name: 'Settings' }).waitFor(wait);

      /** Median time from the navigation to `ready` (in the page), and the node count then. */
      async function open(hash: string, ready: () => Promise<unknown>): Promise<[number, number]> {
        const spans: number[] = [];
        for (let i = 0; i < times; i++) {
          await page.evaluate(() => (location.hash = '#/settings'));
          await page.getByRole('heading', { level: 1, name: 'Settings' }).waitFor(wait);
          const t0 = performance.now();
          await page.evaluate((h) => (location.hash = h), hash);
          await ready();
          spans.push(performance.now() - t0);
        }
        return [median(spans), await nodes()];
      }

      const questionsReady = async () => {
        await page.getByTestId('question-table').locator('caption').waitFor(wait);
        await page.locator('.table-card:not([aria-busy])').waitFor(wait);
      };
      const [questionsOpen, questionsNodes] = await open('#/questions', questionsReady);

      // One keystroke added to "question 1" (a digit: always fewer matches, so the caption changes).
      const search = page.getByRole('searchbox', { name: 'Search' });
      const caption = () => page.evaluate(() => document.querySelector('[data-testid="question-table"] caption')?.textContent ?? '');
      await search.fill('question 1');
      await page.waitForFunction(() => /of \d+ questions/.test(document.querySelector('[data-testid="question-table"] caption')?.textContent ?? ''), null, wait);
      const before = await caption();
      const keystrokes: number[] = [];
      for (let i = 0; i < times; i++) {
        await search.fill('question 1');
        await page.waitForFunction((was) => document.querySelector('[data-testid="question-table"] caption')?.textContent === was, before, wait);
        await page.locator('.table-card:not([aria-busy])').waitFor(wait);
        const t0 = performance.now();
        await search.press(String((i % 9) + 1));
        await page.waitForFunction((was) => {
          const caption = document.querySelector('[data-testid="question-table"] caption')?.textContent;
          return caption !== was && document.querySelector('.table-card[aria-busy]') === null;
        }, before, wait);
        keystrokes.push(performance.now() - t0);
      }
      await search.fill('');

      const [deskOpen, deskNodes] = await open('#/', () => page.locator('.screen.desk:not([aria-busy])').waitFor(wait));
      const [hindsightOpen, hindsightNodes] = await open('#/hindsight', () => page.locator('[data-hindsight-ready="true"]').waitFor(wait));
      const [scorecardOpen, scorecardNodes] = await open('#/scorecard', () => page.locator('[data-scorecard-ready="true"]').waitFor(wait));

      const tagFilter = page.getByLabel('Tag', { exact: true });
      const changes: number[] = [];
      for (const tag of [BENCH_TAGS[0]!, BENCH_TAGS[2]!, '', BENCH_TAGS[4]!, BENCH_TAGS[1]!].slice(0, Math.max(times, 3))) {
        const t0 = performance.now();
        await tagFilter.selectOption(tag);
        await page.locator(`[data-scorecard-ready="true"][data-scorecard-tag="${tag}"]`).waitFor(wait);
        changes.push(performance.now() - t0);
      }
      return {
        questionsOpen,
        questionsNodes,
        searchKeystroke: median(keystrokes),
        deskOpen,
        deskNodes,
        hindsightOpen,
        hindsightNodes,
        scorecardOpen,
        scorecardNodes,
        scorecardFilter: median(changes),
      };
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
  const large = questions > PART;
  const times = large ? 3 : 5;
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'forelog-bench-'));
  const say = (what: string) => process.stderr.write(`[${questions.toLocaleString('en')}] ${what}…\n`);
  try {
    const dbPath = path.join(dir, 'bench.sqlite');
    say('generating the diary');
    const whole = path.join(dir, 'diary.json');
    fs.writeFileSync(whole, JSON.stringify(buildDiaryFile(questions, REVISIONS_PER_QUESTION)));
    say('importing');
    try {
      put('import JSON (whole process)', ms(forelog('import', whole, '--db', dbPath).ms));
    } catch (err) {
      // Today one import takes at most 64 MB; a larger diary goes in as several files.
      put('import JSON (whole process)', `refused (${(err as Error).message.replace(/^.*?: forelog: /, '').slice(0, 60)}…)`);
      fs.rmSync(dbPath, { force: true });
      let total = 0;
      for (let first = 0; first < questions; first += PART) {
        const part = path.join(dir, 'part.json');
        fs.writeFileSync(part, JSON.stringify(buildDiaryFile(Math.min(PART, questions - first), REVISIONS_PER_QUESTION, first)));
        total += forelog('import', part, '--db', dbPath).ms;
      }
      put(`import in files of ${PART.toLocaleString('en')} (sum)`, ms(total));
    }
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

    say('due');
    const due = repeat(times, () => forelog('due', '--json', '--db', dbPath));
    put('due --json (whole process)', `${ms(due.median)} (${(JSON.parse(due.last.stdout) as { nudges: unknown[] }).nudges.length.toLocaleString('en')} due)`);

    if (!fs.existsSync(CHROMIUM)) {
      put('browser mode', `not measured (no ${CHROMIUM})`);
      return;
    }
    say('browser mode');
    try {
      const b = await browserFigures(dbPath, large ? 3 : 5);
      put('Questions open (browser)', `${ms(b.questionsOpen)}, ${b.questionsNodes.toLocaleString('en')} nodes`);
      put('search keystroke (browser, incl. 250 ms pause)', ms(b.searchKeystroke));
      put('Desk open (browser)', `${ms(b.deskOpen)}, ${b.deskNodes.toLocaleString('en')} nodes`);
      put('Hindsight open (browser)', `${ms(b.hindsightOpen)}, ${b.hindsightNodes.toLocaleString('en')} nodes`);
      put('Scorecard open (browser)', `${ms(b.scorecardOpen)}, ${b.scorecardNodes.toLocaleString('en')} nodes`);
      put('Scorecard tag change (browser)', ms(b.scorecardFilter));
    } catch (err) {
      put('browser mode', `not measured: ${(err as Error).message.split('\n')[0]}`);
    }
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

async function main(): Promise<void> {
  const sizes = process.argv.includes('--large') ? [1_000, 10_000, 100_000] : [1_000, 10_000];
  process.stderr.write('Building the command line and the screens (npm run build)…\n');
  const built = spawnSync('npm', ['run', '--silent', 'build'], { cwd: ROOT, stdio: ['ignore', 'ignore', 'inherit'] });
  if (built.status !== 0) throw new Error('npm run build failed (messages above)');
  const loadBefore = os.loadavg()[0]!;
  const rows = new Map<string, Row>();
  for (const size of sizes) await measure(size, rows);

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
      line(header),
      line(widths.map((w) => '-'.repeat(w))),
      ...body.map(line),
    ].join('\n') + '\n',
  );
}

main().catch((err: unknown) => {
  process.stderr.write(`bench failed: ${err instanceof Error ? err.message : String(err)}\n`);
  process.exitCode = 1;
});
