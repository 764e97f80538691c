/**
 * `forelog <command>`: the diary from the command line (INTERFACES.md §2). Every command
 * takes `--db PATH` and, on failure, exits non-zero with a one-line message on stderr.
 */
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { isCheckout } from '../scripts/freshness.mjs';
import { ApiError, parseRequest, type DueList, type ImportResult, type TagCount } from '../shared/contract';
import { NUDGE_KIND_NAMES } from '../shared/domain';
import { BARE_DATE_FORM, formatLocal, LOCAL_DATE_TIME_FORM, parseInstant, parseLocalInZone, parseRangeBound, toIso } from '../shared/time';
import { version as VERSION } from '../package.json';
import { clearLeftovers, FileWriteError, syncFolder, writeToDescriptor, type Chunk } from './files/atomic-write';
import { fileNameProblem } from './files/file-name';
import { defaultDiaryPath } from './paths';
import { freshRenderer } from './renderer-build';
import { formatScoreTable } from './score-table';
import { inspectBackup, restoreFrom } from './service/backup';
import { callOrThrow, storeFailure } from './service/dispatch';
import { openDiary, type DiaryService } from './service/index';
import { startHttpServer } from './transport/http';

const USAGE = `Usage: forelog <command> [--db PATH]

Commands:
  serve [--port N]            the full app in a browser, on 127.0.0.1 only
  import FILE [--format json|csv] [--merge]
                              add a diary file (JSON v1, or CSV as in docs/csv-format.md;
                              chosen by --format or the .csv extension); --merge skips
                              questions already in the diary unchanged
  score [--tag T] [--from D] [--to D] [--json]
                              the scorecard (JSON as documented with --json)
  export [FILE] [--format json|csv|ics]
                              write the diary file (to stdout without FILE; without
                              --format, FILE ending .csv or .ics picks that); csv: one
                              row per revision; ics: every open question's close as an event
  due [--at TIME] [--json]    the nudges due at that instant (default now), in the
                              diary's time zone; --json keeps UTC instants
  demo                        fill an empty diary with the invented example
  backup FILE                 online copy of the diary database
  restore FILE                put a backup copy in place of the diary

Times for --from, --to and --at:
  2026-03-31                  a bare date: that whole day in UTC (--from and --to only)
  2026-03-31T17:00            a date and time without offset: on the diary's clock
                              (its time zone setting)
  2026-03-31T17:00+01:00      a date and time with an offset or Z: that instant

Options:
  --db PATH                   the diary file (default: the desktop app's own diary)
  --help                      this text
  --version                   the version of Forelog`;

/** The options each command takes, besides --db and --help; any other is refused. */
const COMMAND_OPTIONS: Record<string, readonly string[]> = {
  serve: ['port'],
  import: ['format', 'merge'],
  export: ['format'],
  score: ['tag', 'from', 'to', 'json'],
  due: ['at', 'json'],
  demo: [],
  backup: [],
  restore: [],
};

class UsageError extends Error {}

/** Every option the command line knows (each command takes some of them: COMMAND_OPTIONS). */
const OPTIONS = {
  db: { type: 'string' },
  port: { type: 'string' },
  format: { type: 'string' },
  tag: { type: 'string' },
  from: { type: 'string' },
  to: { type: 'string' },
  at: { type: 'string' },
  json: { type: 'boolean' },
  merge: { type: 'boolean' },
  help: { type: 'boolean', short: 'h' },
  version: { type: 'boolean', short: 'V' },
} as const;

/**
 * The one of `names` a mistyped `word` most likely meant — a letter added, dropped, changed or
 * swapped with its neighbour (case ignored) for every three letters of the name, at most two —
 * for a "did you mean" hint; none when two names are as close.
 */
function closestName(word: string, names: readonly string[]): string | undefined {
  const typed = word.toLowerCase();
  let best: string | undefined;
  let bestDistance = Infinity;
  let tie = false;
  for (const name of names) {
    const d = editDistance(typed, name.toLowerCase());
    if (d > Math.min(2, Math.floor(name.length / 3))) continue;
    if (d < bestDistance) [best, bestDistance, tie] = [name, d, false];
    else if (d === bestDistance) tie = true;
  }
  return tie ? undefined : best;
}

/** Optimal string alignment distance: insertions, deletions, substitutions and swaps of neighbours. */
function editDistance(a: string, b: string): number {
  const rows: number[][] = Array.from({ length: a.length + 1 }, (_, i) => [i, ...Array<number>(b.length).fill(0)]);
  for (let j = 1; j <= b.length; j++) rows[0]![j] = j;
  for (let i = 1; i <= a.length; i++) {
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let d = Math.min(rows[i - 1]![j]! + 1, rows[i]![j - 1]! + 1, rows[i - 1]![j - 1]! + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) d = Math.min(d, rows[i - 2]![j - 2]! + 1);
      rows[i]![j] = d;
    }
  }
  return rows[a.length]![b.length]!;
}

/** " (did you mean X?)" when `word` is close to exactly one of `names`, else "". */
function didYouMean(word: string, names: readonly string[], shown: (name: string) => string): string {
  const name = closestName(word, names);
  return name === undefined ? '' : ` (did you mean ${shown(name)}?)`;
}

/** Set when stdout's reader went away (`forelog export | head`): the rest is not wanted. */
class StdoutClosed extends Error {}

/** Standard output refused the result (a full disk behind `> file`): about the output, never the diary. */
class OutputError extends Error {}

const OUTPUT_FIXES: Record<string, string> = {
  ENOSPC: 'the disk is full; free some space or send the output to another disk',
  EDQUOT: 'your disk quota is used up; free some space or send the output to another disk',
  EFBIG: 'the output is larger than this system allows files to be; send it to another disk',
  EIO: 'the disk reported an error; check it and try again',
};

function writeStdout(text: Chunk): void {
  try {
    writeToDescriptor(1, text);
  } catch (err) {
    const { code, syscall } = err as NodeJS.ErrnoException;
    if (code === 'EPIPE') throw new StdoutClosed();
    if (typeof syscall === 'string') {
      throw new OutputError(`Could not write to standard output: ${OUTPUT_FIXES[code ?? ''] ?? (err as Error).message} (${code ?? 'error'}); the diary is unchanged`);
    }
    throw err;
  }
}

/** Unexpected failures keep their stack on stderr when FORELOG_DEBUG is set. */
function reportInternal(err: unknown): void {
  if (process.env.FORELOG_DEBUG) process.stderr.write(`${err instanceof Error ? (err.stack ?? err.message) : String(err)}\n`);
}

interface Parsed {
  command: string | undefined;
  positionals: string[];
  values: {
    db?: string;
    port?: string;
    format?: string;
    tag?: string;
    from?: string;
    to?: string;
    at?: string;
    json?: boolean;
    merge?: boolean;
    help?: boolean;
    version?: boolean;
  };
}

function parse(argv: string[]): Parsed {
  try {
    const { values, positionals, tokens } = parseArgs({
      args: argv,
      allowPositionals: true,
      strict: true,
      tokens: true,
      options: OPTIONS,
    });
    // node:util keeps only the last of a repeated option; which one was meant is not ours to guess.
    const seen = new Set<string>();
    for (const token of tokens) {
      if (token.kind !== 'option') continue;
      if (seen.has(token.name)) throw new UsageError(`--${token.name} is given twice; give it once`);
      seen.add(token.name);
      // An empty value (--db "$UNSET") would be read as the current folder, or as no filter.
      if (token.value === '') throw new UsageError(`--${token.name} is given an empty value; write --${token.name} VALUE`);
    }
    // An empty FILE ("$UNSET") would be read as the current folder, or its name as no format.
    if (positionals.includes('')) throw new UsageError('an argument is empty (""); give the path of a file');
    return { command: positionals[0], positionals: positionals.slice(1), values };
  } catch (err) {
    if (err instanceof UsageError) throw err;
    // node:util's own wording is written for programmers ("place it at the end … after '--'").
    const code = (err as NodeJS.ErrnoException).code;
    const message = (err as Error).message;
    const option = /'(-[^' ]+)/.exec(message)?.[1];
    if (code === 'ERR_PARSE_ARGS_UNKNOWN_OPTION') {
      const hint = option?.startsWith('--') ? didYouMean(option.slice(2).split('=')[0]!, Object.keys(OPTIONS), (name) => `--${name}`) : '';
      throw new UsageError(`there is no option ${option ?? ''}`.trimEnd() + hint);
    }
    if (code === 'ERR_PARSE_ARGS_INVALID_OPTION_VALUE') {
      const name = option ?? 'the option';
      if (/does not take an argument/.test(message)) throw new UsageError(`${name} takes no value; write ${name} alone`);
      throw new UsageError(`${name} needs a value: write ${name} VALUE (or ${name}=VALUE for one that starts with a dash)`);
    }
    throw err;
  }
}

/** Refuses an option the command does not use, rather than ignoring it. */
function checkOptions(command: string, values: Parsed['values']): void {
  const allowed = COMMAND_OPTIONS[command];
  if (!allowed) return;
  for (const [name, value] of Object.entries(values)) {
    if (value === undefined || name === 'db' || name === 'help' || allowed.includes(name)) continue;
    const takes = allowed.length ? `it takes ${allowed.map((o) => `--${o}`).join(', ')}` : 'it takes no options besides --db';
    throw new UsageError(`${command} does not use --${name}; ${takes}`);
  }
}

/**
 * A --from, --to or --at value as the API reads it: a date and time without offset is
 * read on the diary's clock (`timeZone`) and becomes that instant; a bare date or a time
 * with an offset passes as written (the contract reads a bare date as its UTC day).
 */
function onDiaryClock(option: string, text: string | undefined, timeZone: string, bareDate: boolean): string | undefined {
  if (text === undefined) return undefined;
  const local = parseLocalInZone(text, timeZone);
  if (local !== null) return toIso(local);
  if (!bareDate && BARE_DATE_FORM.test(text.trim())) {
    throw new UsageError(`--${option} takes a time, not a bare date: write ${text.trim()}T09:00 (on the diary's clock, ${timeZone}) or ${text.trim()}T09:00Z`);
  }
  // The shape of a local time that names no real moment.
  if (LOCAL_DATE_TIME_FORM.test(text.trim())) {
    throw new UsageError(
      `--${option} ${text} is not a date and time that exists; write it as ${bareDate ? '2026-03-31 (a UTC day), ' : ''}2026-03-31T17:00 (on the diary's clock, ${timeZone}) or 2026-03-31T17:00+01:00`,
    );
  }
  // Anything else goes to the service as written: a time with an offset or Z (or, for --from
  // and --to, a bare date), whose range the service checks. A form it could not read is said
  // here in the command line's own terms — the service's message names only the forms a
  // request may carry, not the diary's clock.
  const readable = bareDate ? parseRangeBound(text, option === 'to' ? 'to' : 'from') !== null : parseInstant(text) !== null;
  if (!readable) {
    throw new UsageError(
      `--${option} ${text} is not a ${bareDate ? 'date or time' : 'time'} Forelog can read; write ${bareDate ? '2026-03-31 (a UTC day), ' : ''}2026-03-31T17:00 (on the diary's clock, ${timeZone}) or 2026-03-31T17:00+01:00 (year first, 24-hour clock)`,
    );
  }
  return text;
}

/**
 * An empty scorecard for a tag no question has is most often a typo (tags match exactly):
 * says so on stderr, with the tags the diary has, and leaves the answer on stdout as it is.
 */
function unknownTagNote(tag: string, tags: readonly TagCount[]): void {
  if (tags.some((t) => t.tag === tag)) return;
  const SHOWN = 12;
  const known = tags.length === 0 ? 'it has no tags yet' : `its tags: ${tags.slice(0, SHOWN).map((t) => t.tag).join(', ')}${tags.length > SHOWN ? `, and ${tags.length - SHOWN} more` : ''}`;
  process.stderr.write(`forelog: no question in this diary has the tag "${tag}" (tags match exactly); ${known}.\n`);
}

/** The diary path the arguments name, for messages about the file after a failure. */
function dbPathOf(argv: string[]): string {
  try {
    return parse(argv).values.db ?? defaultDiaryPath();
  } catch {
    return defaultDiaryPath();
  }
}

function one(positionals: string[], what: string): string {
  if (positionals.length !== 1) throw new UsageError(`expects exactly one ${what}`);
  return positionals[0]!;
}

/**
 * A progress line for a long task, on stderr and only at a terminal (a script's output stays
 * exactly the result): "Importing FILE… 37 %", rewritten in place as the percentage moves,
 * then `after` once the work measured is done (the commit that follows takes a moment too).
 */
function progressLine(what: string, after: string): { update: (done: number, total: number) => void; end: () => void } {
  const shown = process.stderr.isTTY === true;
  let last = -1;
  return {
    update(done, total) {
      const percent = total > 0 ? Math.floor((done / total) * 100) : 0;
      if (!shown || percent === last) return;
      last = percent;
      process.stderr.write(`\r${what}… ${percent} %${percent === 100 ? ` — ${after}` : ''}`);
    },
    end() {
      if (shown && last >= 0) process.stderr.write('\r\x1b[K');
    },
  };
}

function noteMigrating(dbPath: string): (from: number, to: number) => void {
  return (from, to) =>
    process.stderr.write(`Updating the diary at ${path.resolve(dbPath)} to this version's format (${from} → ${to}); a one-time step that takes up to a minute for a very large diary…\n`);
}

/** Says so on stderr when a command made a new diary (a mistyped --db shows up at once). */
function noteCreated(created: boolean, location: string): void {
  if (created) process.stderr.write(`Created a new diary at ${location}.\n`);
}

/**
 * Opens the diary for one command. Commands that only read (`create: false`) refuse a
 * missing file, naming the path, and create nothing; commands that add data may start a
 * new diary (`newDiary`), and say so.
 */
async function withDiary<T>(dbPath: string, mode: { create: boolean }, fn: (service: DiaryService) => Promise<T>): Promise<T> {
  if (mode.create) {
    const made = await newDiary(dbPath, fn);
    if (made) return made.result;
  }
  const service = openDiary({ dbPath, create: mode.create, onInternalError: reportInternal, onMigrating: noteMigrating(dbPath) });
  const { created } = service.store;
  try {
    const result = await fn(service);
    noteCreated(created, service.location);
    return result;
  } finally {
    service.close();
  }
}

/** `.forelog-new-<pid>-<8 hex>.sqlite` and SQLite's files beside it; the first group is the maker's process id. */
const STAGING = /^\.forelog-new-(\d+)-[0-9a-f]{8}\.sqlite(?:-wal|-shm|-journal)?$/;

/**
 * Runs `fn` on a new diary when there is none at `dbPath`: the diary is made under a
 * temporary name in the same folder and appears under its own, whole, only once `fn` has
 * succeeded (a hard link, which never replaces a file). A refused command therefore leaves
 * nothing behind and never removes a path another process may have opened meanwhile (before,
 * a refused import deleted the empty diary it had made, even when another command had just
 * started writing to it). Null when the diary is to be opened in place instead: one exists,
 * another process made one meanwhile, the temporary one could not be made or linked (a file
 * system without hard links) — the caller then runs `fn` on the path itself, whose open
 * gives the right message if it cannot be made.
 */
async function newDiary<T>(dbPath: string, fn: (service: DiaryService) => Promise<T>): Promise<{ result: T } | null> {
  const target = path.resolve(dbPath);
  if (fs.existsSync(target) || fileNameProblem(target)) return null;
  const folder = path.dirname(target);
  clearLeftovers(folder, STAGING);
  const staging = path.join(folder, `.forelog-new-${process.pid}-${randomBytes(4).toString('hex')}.sqlite`);
  const remove = () => {
    for (const suffix of ['', '-wal', '-shm', '-journal']) fs.rmSync(`${staging}${suffix}`, { force: true });
  };
  let service: DiaryService;
  try {
    service = openDiary({ dbPath: staging, onInternalError: reportInternal });
  } catch {
    remove();
    return null;
  }
  let result: T;
  try {
    result = await fn(service);
  } catch (err) {
    service.close();
    remove();
    throw err;
  }
  service.close();
  try {
    fs.linkSync(staging, target);
  } catch {
    remove();
    return null;
  }
  remove();
  syncFolder(folder);
  noteCreated(true, target);
  return { result };
}

/**
 * Finds the built renderer next to this program. In a source checkout it is built first
 * when missing or older than the sources, so `forelog serve` always shows the screens as
 * the code stands (safely beside other servers of the same checkout: main/renderer-build.ts).
 */
async function rendererDir(): Promise<string> {
  // This file is main/cli.ts (run from source) or dist/main/cli.cjs (built); an installed
  // copy has dist/renderer beside dist/main. Node has already followed any symlinked install.
  const here = path.dirname(fileURLToPath(import.meta.url));
  const root = [path.join(here, '..'), path.join(here, '..', '..')].find(isCheckout);
  if (!root) {
    const installed = path.join(here, '..', 'renderer');
    if (fs.existsSync(path.join(installed, 'index.html'))) return installed;
    throw new Error('The app screens are missing from this installation; reinstall Forelog.');
  }
  return freshRenderer(
    root,
    async (outDir) => {
      const vite = await import('vite');
      await vite.build({ root: path.join(root, 'renderer'), configFile: path.join(root, 'vite.config.ts'), logLevel: 'warn', build: { outDir, emptyOutDir: true } });
    },
    (reason) => process.stderr.write(`Building the app screens (${reason})…\n`),
  );
}

/** `forelog due` for a person: each time on the diary's clock (`zone`), snoozed nudges after the due ones. */
function dueText(list: DueList, zone: string): string {
  const local = (iso: string) => formatLocal(Date.parse(iso), zone);
  const line = (kind: keyof typeof NUDGE_KIND_NAMES, word: string, iso: string, title: string) =>
    `${NUDGE_KIND_NAMES[kind].padEnd(13)} ${word} ${local(iso)}  ${title}\n`;
  let out = list.nudges.length ? `Due at ${local(list.at)} (${zone}):\n` : `Nothing due at ${local(list.at)} (${zone}).\n`;
  for (const n of list.nudges) out += line(n.kind, 'since', n.due_at, n.title);
  if (list.snoozed.length) {
    out += 'Snoozed:\n';
    for (const n of list.snoozed) out += line(n.kind, 'until', n.until, n.title);
  }
  return out;
}

async function serve(dbPath: string, portText: string | undefined): Promise<void> {
  // Digits only: Number() would also take "1e3", "0x50", " 80" and "" (as 0).
  const port = portText === undefined ? 0 : /^[0-9]{1,5}$/.test(portText) ? Number(portText) : NaN;
  if (!Number.isInteger(port) || port < 0 || port > 65535) throw new UsageError('--port must be a whole number from 0 to 65535');
  const dir = await rendererDir();
  const service = openDiary({ dbPath, onInternalError: reportInternal, onMigrating: noteMigrating(dbPath), warmScores: true });
  noteCreated(service.store.created, service.location);
  let server;
  try {
    server = await startHttpServer({ dispatch: service.dispatch, rendererDir: dir, port });
  } catch (err) {
    service.close();
    if ((err as NodeJS.ErrnoException).code === 'EADDRINUSE') throw new Error(`port ${port} is already in use; choose another with --port or use --port 0`);
    throw err;
  }
  // The first line is the address with the token: scripts and tests read it.
  process.stdout.write(`${server.url}\n`);
  process.stderr.write(`Forelog is serving ${service.location} on 127.0.0.1 only. Open the address above; press Ctrl+C to stop.\n`);
  const stop = () => {
    void server.close().then(() => {
      service.close();
      process.exit(0);
    });
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

async function run(argv: string[]): Promise<void> {
  const { command, positionals, values } = parse(argv);
  if (values.version && !values.help) {
    if (command !== undefined) throw new UsageError('--version takes no command');
    process.stdout.write(`forelog ${VERSION}\n`);
    return;
  }
  if (values.help || command === undefined || command === 'help') {
    process.stdout.write(`${USAGE}\n`);
    return;
  }
  checkOptions(command, values);
  const dbPath = values.db ?? defaultDiaryPath();
  switch (command) {
    case 'serve':
      return serve(dbPath, values.port);
    case 'import': {
      const file = one(positionals, 'FILE to import');
      const format = values.format ?? (/\.csv$/i.test(file) ? 'csv' : 'json');
      if (format !== 'json' && format !== 'csv') throw new UsageError(`--format must be json or csv for import (got "${format}")`);
      const tooLong = fileNameProblem(file);
      if (tooLong) throw new Error(`${tooLong} Nothing was imported.`);
      if (!fs.existsSync(file)) throw new Error(`There is no file at ${file}. Check the path; nothing was imported.`);
      // Streamed from the file: no size limit, all or nothing.
      const progress = progressLine(`Importing ${file}`, 'saving');
      let result: ImportResult;
      try {
        result = await withDiary(dbPath, { create: true }, async (s) => s.importDiaryFile(file, format, { merge: values.merge, onRead: progress.update }));
      } finally {
        progress.end();
      }
      const plural = (n: number) => `${n} question${n === 1 ? '' : 's'}`;
      const skipped = values.merge ? `; skipped ${plural(result.skipped)} already in it unchanged` : '';
      process.stdout.write(`Imported ${plural(result.added)} into ${path.resolve(dbPath)}${skipped}.\n`);
      return;
    }
    case 'export': {
      if (positionals.length > 1) throw new UsageError('expects at most one FILE');
      const file = positionals[0];
      // Without --format, the file's name decides as it does for import: diary.csv is CSV.
      const format = values.format ?? (file && /\.(csv|ics)$/i.exec(file)?.[1]?.toLowerCase()) ?? 'json';
      if (format !== 'json' && format !== 'csv' && format !== 'ics') throw new UsageError(`--format must be json, csv or ics (got "${format}")`);
      // Progress only for a file: an export to stdout may be going to this same terminal.
      const progress = progressLine(`Exporting to ${file}`, 'saving');
      try {
        await withDiary(dbPath, { create: false }, async (s) => {
          // Streamed from the diary a batch at a time: to a file whole or not at all, or to stdout.
          if (file) s.exportDiaryFile(file, format, progress.update);
          else s.diary.exportTo(format, writeStdout);
        });
      } finally {
        progress.end();
      }
      if (file) process.stderr.write(`Wrote ${file}.\n`);
      return;
    }
    case 'score': {
      if (positionals.length) throw new UsageError('takes no FILE; filter with --tag, --from and --to');
      const text = await withDiary(dbPath, { create: false }, async (s) => {
        const zone = s.diary.settings().time_zone;
        const request = parseRequest('score', { tag: values.tag, from: onDiaryClock('from', values.from, zone, true), to: onDiaryClock('to', values.to, zone, true) });
        if (values.tag !== undefined) unknownTagNote(values.tag, (await s.diary.handlers.listTags({})).tags);
        if (values.json) return `${JSON.stringify(s.diary.scoreReport(request), null, 2)}\n`;
        // The readable form also prints the headline scores' intervals, which are the Scorecard's, not part of the JSON.
        const { report, detail } = await s.diary.handlers.score(request);
        const note = [values.tag && `tag ${values.tag}`, values.from && `from ${values.from}`, values.to && `to ${values.to}`].filter(Boolean).join(', ');
        return formatScoreTable(report, note, { brier: detail.brier_interval, log: detail.log_interval });
      });
      writeStdout(text);
      return;
    }
    case 'due': {
      if (positionals.length) throw new UsageError('takes no FILE; give the instant with --at');
      const { list, zone } = await withDiary(dbPath, { create: false }, async (s) => {
        const zone = s.diary.settings().time_zone;
        const at = onDiaryClock('at', values.at, zone, false);
        return { list: (await callOrThrow(s.dispatch, 'due', at === undefined ? {} : { at })) as DueList, zone };
      });
      if (values.json) {
        // Exactly the documented object (docs/command-line.md): instants in UTC.
        const out = { at: list.at, nudges: list.nudges.map((n) => ({ id: n.id, title: n.title, kind: n.kind, due_at: n.due_at })) };
        writeStdout(`${JSON.stringify(out, null, 2)}\n`);
      } else writeStdout(dueText(list, zone));
      return;
    }
    case 'demo': {
      const result = (await withDiary(dbPath, { create: true }, (s) => callOrThrow(s.dispatch, 'loadDemo', {}))) as { added: number };
      process.stdout.write(`Added the example diary: ${result.added} invented questions in ${path.resolve(dbPath)}.\n`);
      return;
    }
    case 'backup': {
      const file = one(positionals, 'FILE to write the backup to');
      await withDiary(dbPath, { create: false }, (s) =>
        s.backupTo(file, (percent) => {
          if (process.stderr.isTTY) process.stderr.write(`\rBacking up… ${percent}%`);
        }),
      );
      if (process.stderr.isTTY) process.stderr.write('\n');
      process.stdout.write(`Backed up ${path.resolve(dbPath)} to ${path.resolve(file)} (${inspectBackup(file).questions} questions).\n`);
      return;
    }
    case 'restore': {
      const file = one(positionals, 'backup FILE to restore');
      const result = await restoreFrom(file, dbPath, Date.now());
      noteCreated(result.created, path.resolve(dbPath));
      process.stdout.write(
        `Restored ${result.questions} questions from ${path.resolve(file)} into ${path.resolve(dbPath)}.` +
          (result.safetyCopy ? ` The diary as it was is kept at ${result.safetyCopy}.` : '') +
          '\n',
      );
      return;
    }
    default:
      throw new UsageError(`unknown command "${command}"${didYouMean(command ?? '', Object.keys(COMMAND_OPTIONS), (name) => `"${name}"`)}`);
  }
}

const argv = process.argv.slice(2);
run(argv).catch((err: unknown) => {
  // A failure of the diary file itself (busy, read-only, disk full, damaged) reads as the app says it.
  // A file being written (an export, a copy) that fails says so itself, naming that file.
  const aboutOutput = err instanceof FileWriteError || err instanceof OutputError;
  const failure = err instanceof UsageError || err instanceof ApiError || aboutOutput ? null : storeFailure(err, path.resolve(dbPathOf(argv)));
  if (err instanceof StdoutClosed) return;
  const message =
    err instanceof UsageError
      ? `forelog: ${err.message}. See forelog --help.`
      : err instanceof ApiError
        ? `forelog: ${err.message}`
        : failure
          ? `forelog: ${failure.message}`
          : `forelog: ${err instanceof Error ? err.message : String(err)}`;
  process.stderr.write(`${message.replace(/\s*\n\s*/g, ' ')}\n`);
  process.exitCode = 1;
});
