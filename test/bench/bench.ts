/**
 * `npm run bench`: builds a 10,000-question / 200,000-revision diary from a seeded PRNG
 * and prints how long the things a user waits for take on this machine:
 *   - importing it with `forelog import` (whole process),
 *   - `forelog score --json` (whole process: start-up, reading the diary, scoring, printing),
 *   - the scoring engine's own compute time (median of 5, in process),
 *   - the Scorecard's update after a filter change in browser mode (median of 5), when
 *     Chromium is installed.
 * Figures are printed, never asserted: timings do not belong in pass/fail tests.
 */
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import readline from 'node:readline';
import { openDiary } from '../../main/service/index';
import { loadScoringQuestions } from '../../main/service/scoring-source';
import { computeScoreReport } from '../../shared/scoring';
import { BENCH_TAGS, buildDiaryFile } from './make-diary';

const ROOT = path.resolve(import.meta.dirname, '..', '..');
const QUESTIONS = 10_000;
const REVISIONS = 200_000;
const TAGS = BENCH_TAGS;

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const ms = (x: number) => `${x.toFixed(0)} ms`;

function cli(args: string[]): number {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, [path.join(ROOT, 'dist', 'main', 'cli.cjs'), ...args], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  const elapsed = performance.now() - t0;
  if (r.status !== 0) throw new Error(`forelog ${args[0]} failed: ${r.stderr}`);
  return elapsed;
}

async function scorecardFilterTiming(dbPath: string): Promise<string> {
  if (!fs.existsSync('/usr/bin/chromium')) return 'skipped (no /usr/bin/chromium)';
  const server = spawn(process.execPath, [path.join(ROOT, 'dist', 'main', 'cli.cjs'), 'serve', '--db', dbPath, '--port', '0'], { stdio: ['ignore', 'pipe', 'inherit'] });
  try {
    const url = await new Promise<string>((resolve, reject) => {
      readline.createInterface({ input: server.stdout! }).once('line', resolve);
      server.once('exit', () => reject(new Error('serve exited')));
    });
    const { chromium } = await import('@playwright/test');
    const browser = await chromium.launch({
      executablePath: '/usr/bin/chromium',
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    });
    try {
      const page = await browser.newPage();
      await page.goto(`${url}#/scorecard`);
      const tagFilter = page.getByLabel('Tag', { exact: true });
      await tagFilter.waitFor({ timeout: 20_000 });
      await page.locator('[data-scorecard-ready="true"]').waitFor({ timeout: 20_000 });
      const times: number[] = [];
      for (const tag of [TAGS[0]!, TAGS[2]!, '', TAGS[4]!, TAGS[1]!]) {
        const t0 = performance.now();
        await tagFilter.selectOption(tag);
        await page.locator(`[data-scorecard-ready="true"][data-scorecard-tag="${tag}"]`).waitFor({ timeout: 20_000 });
        times.push(performance.now() - t0);
      }
      return `${ms(median(times))} (median of 5 tag changes; from the click to every figure redrawn)`;
    } finally {
      await browser.close();
    }
  } finally {
    server.kill();
  }
}

async function main(): Promise<void> {
  if (!fs.existsSync(path.join(ROOT, 'dist', 'main', 'cli.cjs'))) {
    process.stderr.write('Building first (npm run build)…\n');
    spawnSync('npm', ['run', 'build'], { cwd: ROOT, stdio: 'inherit' });
  }
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'forelog-bench-'));
  try {
    process.stderr.write(`Generating ${QUESTIONS.toLocaleString('en')} questions with ${REVISIONS.toLocaleString('en')} revisions…\n`);
    const file = path.join(dir, 'bench.json');
    fs.writeFileSync(file, JSON.stringify(buildDiaryFile(QUESTIONS, REVISIONS / QUESTIONS)));
    const dbPath = path.join(dir, 'bench.sqlite');
    process.stderr.write('Importing…\n');
    const importMs = cli(['import', file, '--db', dbPath]);
    process.stderr.write('Scoring (5 whole-process runs)…\n');
    const scoreRuns = Array.from({ length: 5 }, () => cli(['score', '--json', '--db', dbPath]));

    const service = openDiary({ dbPath });
    const loadRuns: number[] = [];
    const engineRuns: number[] = [];
    try {
      for (let i = 0; i < 5; i++) {
        const t0 = performance.now();
        const questions = loadScoringQuestions(service.store.read);
        const t1 = performance.now();
        computeScoreReport(questions, { default_costs: { false_alarm: 1, miss: 1 } });
        const t2 = performance.now();
        loadRuns.push(t1 - t0);
        engineRuns.push(t2 - t1);
      }
    } finally {
      service.close();
    }
    process.stderr.write('Timing the Scorecard in browser mode…\n');
    const browser = await scorecardFilterTiming(dbPath).catch((err: unknown) => `not measured: ${err instanceof Error ? err.message.split('\n')[0] : String(err)}`);

    const cpus = os.cpus();
    process.stdout.write(
      [
        `Forelog benchmark — ${QUESTIONS.toLocaleString('en')} questions, ${REVISIONS.toLocaleString('en')} revisions`,
        `machine: ${cpus.length} × ${cpus[0]?.model ?? 'cpu'}, Node ${process.version}`,
        `  import (whole process)            ${ms(importMs)}`,
        `  score --json (whole process)      ${ms(median(scoreRuns))}  median of 5 (min ${ms(Math.min(...scoreRuns))})`,
        `  reading the diary for scoring     ${ms(median(loadRuns))}  median of 5`,
        `  scoring engine compute            ${ms(median(engineRuns))}  median of 5 (targets: engine ≤ 150 ms, score ≤ 1.5 s)`,
        `  Scorecard filter change (browser) ${browser}  (target ≤ 250 ms)`,
      ].join('\n') + '\n',
    );
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((err: unknown) => {
  process.stderr.write(`bench failed: ${err instanceof Error ? err.message : String(err)}\n`);
  process.exitCode = 1;
});
