/**
 * `npx tsx test/bench/files-bench.ts [--questions N] [--revisions R] [--keep DIR]`:
 * the diary files at scale. Writes a synthetic diary file (default 100,000 questions with
 * 20 revisions each, from make-diary.ts's seeded PRNG) a record at a time, then runs the
 * built `forelog` command as a user would and prints, for each step, the wall time, the CPU
 * time (user + system; on a shared machine it grows less with other work than the wall
 * time does) and the process's peak resident memory (from /usr/bin/time):
 *   - import of the JSON file into an empty diary,
 *   - export as JSON and as CSV to files,
 *   - the round trips: import each export into a fresh diary, export again, and compare
 *     the bytes with the first export (they must be identical),
 *   - merging each export back into the diary it came from (every question skipped).
 * Figures are printed, never asserted: timings do not belong in pass/fail tests.
 */
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { diaryQuestions } from './make-diary';

const ROOT = path.resolve(import.meta.dirname, '..', '..');
const CLI = path.join(ROOT, 'dist', 'main', 'cli.cjs');

const { values } = parseArgs({ options: { questions: { type: 'string' }, revisions: { type: 'string' }, keep: { type: 'string' } } });
const QUESTIONS = Number(values.questions ?? 100_000);
const REVISIONS = Number(values.revisions ?? 20);

/** Writes the synthetic diary file (JSON v1, one record per line) without holding it in memory. */
function writeDiary(file: string): void {
  const fd = fs.openSync(file, 'w');
  try {
    fs.writeSync(fd, '{"format":"forelog-diary","version":1,"questions":[\n');
    let first = true;
    let pending = '';
    for (const q of diaryQuestions(QUESTIONS, REVISIONS)) {
      pending += `${first ? '' : ',\n'}${JSON.stringify(q)}`;
      first = false;
      if (pending.length > 1 << 20) {
        fs.writeSync(fd, pending);
        pending = '';
      }
    }
    fs.writeSync(fd, `${pending}\n]}\n`);
  } finally {
    fs.closeSync(fd);
  }
}

interface Step {
  what: string;
  seconds: number;
  cpuSeconds: number;
  peakMb: number;
}

const steps: Step[] = [];

/** Runs `forelog …args`, recording wall time, CPU time and peak RSS as /usr/bin/time reports them. */
function forelog(what: string, ...args: string[]): void {
  const r = spawnSync('/usr/bin/time', ['-f', '%e %M %U %S', process.execPath, CLI, ...args], { encoding: 'utf8', stdio: ['ignore', 'ignore', 'pipe'] });
  const last = r.stderr.trim().split('\n').pop() ?? '';
  if (r.status !== 0) throw new Error(`forelog ${args.join(' ')} failed:\n${r.stderr}`);
  const [seconds, kb, user, system] = last.split(' ').map(Number);
  const step = { what, seconds: seconds!, cpuSeconds: user! + system!, peakMb: kb! / 1024 };
  steps.push(step);
  process.stderr.write(`${what}: ${step.seconds.toFixed(1)} s (CPU ${step.cpuSeconds.toFixed(1)} s), peak ${step.peakMb.toFixed(0)} MB\n`);
}

function sha256(file: string): string {
  const hash = createHash('sha256');
  const fd = fs.openSync(file, 'r');
  const buffer = Buffer.allocUnsafe(1 << 20);
  for (let n; (n = fs.readSync(fd, buffer, 0, buffer.length, null)) > 0; ) hash.update(buffer.subarray(0, n));
  fs.closeSync(fd);
  return hash.digest('hex');
}

const mb = (file: string) => `${(fs.statSync(file).size / 1_048_576).toFixed(0)} MB`;

function main(): void {
  process.stderr.write('Building the command line (dist/main/cli.cjs)…\n');
  const built = spawnSync(process.execPath, [path.join(ROOT, 'scripts', 'build-main.mjs'), 'cli'], { cwd: ROOT, stdio: 'inherit' });
  if (built.status !== 0) throw new Error('the build failed');
  const dir = values.keep ?? fs.mkdtempSync(path.join(os.tmpdir(), 'forelog-files-bench-'));
  fs.mkdirSync(dir, { recursive: true });
  const at = (name: string) => path.join(dir, name);
  try {
    process.stderr.write(`Writing ${QUESTIONS.toLocaleString('en')} questions with ${REVISIONS} revisions each…\n`);
    writeDiary(at('source.json'));
    process.stderr.write(`source.json: ${mb(at('source.json'))}\n`);

    forelog('import source.json (JSON)', 'import', at('source.json'), '--db', at('a.sqlite'));
    forelog('export JSON to a file', 'export', at('a.json'), '--db', at('a.sqlite'));
    forelog('export CSV to a file', 'export', at('a.csv'), '--format', 'csv', '--db', at('a.sqlite'));
    forelog('import the JSON export', 'import', at('a.json'), '--db', at('b.sqlite'));
    forelog('export it again (JSON)', 'export', at('b.json'), '--db', at('b.sqlite'));
    forelog('import the CSV export', 'import', at('a.csv'), '--db', at('c.sqlite'));
    forelog('export it again (CSV)', 'export', at('c.csv'), '--format', 'csv', '--db', at('c.sqlite'));
    // A merge compares every question of the file with the diary's: the heaviest import there is.
    forelog('merge the JSON export back (all skipped)', 'import', '--merge', at('a.json'), '--db', at('b.sqlite'));
    forelog('merge the CSV export back (all skipped)', 'import', '--merge', at('a.csv'), '--db', at('c.sqlite'));

    const jsonSame = sha256(at('a.json')) === sha256(at('b.json'));
    const csvSame = sha256(at('a.csv')) === sha256(at('c.csv'));
    const lines = [
      `${QUESTIONS.toLocaleString('en')} questions × ${REVISIONS} revisions on ${os.cpus().length} cores (load ${os.loadavg()[0]!.toFixed(1)}); JSON export ${mb(at('a.json'))}, CSV export ${mb(at('a.csv'))}`,
      '',
      '| step | wall time | CPU time | peak RSS |',
      '| --- | --- | --- | --- |',
      ...steps.map((s) => `| ${s.what} | ${s.seconds.toFixed(1)} s | ${s.cpuSeconds.toFixed(1)} s | ${s.peakMb.toFixed(0)} MB |`),
      '',
      `export → import → export, JSON: ${jsonSame ? 'identical bytes' : 'DIFFERENT'}`,
      `export → import → export, CSV: ${csvSame ? 'identical bytes' : 'DIFFERENT'}`,
    ];
    process.stdout.write(`${lines.join('\n')}\n`);
    if (!jsonSame || !csvSame) process.exitCode = 1;
  } finally {
    if (!values.keep) fs.rmSync(dir, { recursive: true, force: true });
  }
}

main();
