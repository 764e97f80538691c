/**
 * Starts diary-child.ts as a separate Node process holding a diary open, and talks to it.
 * The process is killed after the test if the test did not close it.
 */
import { spawn, spawnSync, type ChildProcessWithoutNullStreams } from 'node:child_process';
import path from 'node:path';
import readline from 'node:readline';
import { after } from 'node:test';
import type { Envelope } from '../../shared/bridge';

export const ROOT = path.resolve(import.meta.dirname, '..', '..');

export interface DiaryProcess {
  child: ChildProcessWithoutNullStreams;
  /** Sends one request and waits for the next reply line. */
  send(message: unknown): Promise<any>;
  /** One operation through the process's own dispatch. */
  call(operation: string, request?: unknown): Promise<Envelope>;
  /** Closes the diary in that process and waits for it to exit. */
  close(): Promise<void>;
}

export async function startDiaryProcess(dbPath: string, options: { busyTimeoutMs?: number } = {}): Promise<DiaryProcess> {
  const args = ['--import', 'tsx', path.join(ROOT, 'test', 'support', 'diary-child.ts'), dbPath];
  if (options.busyTimeoutMs !== undefined) args.push(String(options.busyTimeoutMs));
  const child = spawn(process.execPath, args, { cwd: ROOT, env: { ...process.env, TZ: 'UTC' } });
  let stderr = '';
  child.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  after(() => {
    if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
  });

  const waiting: ((value: unknown) => void)[] = [];
  const early: unknown[] = [];
  readline.createInterface({ input: child.stdout }).on('line', (line) => {
    const value = JSON.parse(line) as unknown;
    const next = waiting.shift();
    if (next) next(value);
    else early.push(value);
  });
  const nextLine = () =>
    new Promise<any>((resolve, reject) => {
      if (early.length) return resolve(early.shift());
      waiting.push(resolve);
      void exited.then(() => reject(new Error(`the diary process exited: ${stderr}`)));
    });

  const ready = await nextLine();
  if (!ready?.ready) throw new Error(`the diary process did not start: ${stderr}`);
  const send = (message: unknown) => {
    child.stdin.write(`${JSON.stringify(message)}\n`);
    return nextLine();
  };
  return {
    child,
    send,
    call: async (operation, request = {}) => (await send({ call: operation, request })).envelope as Envelope,
    close: async () => {
      await send({ close: true });
      await exited;
    },
  };
}

/** Runs the `forelog` command line as a user does, to completion. */
export function forelog(...args: string[]): { status: number; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, ['--import', 'tsx', path.join(ROOT, 'main', 'cli.ts'), ...args], {
    cwd: ROOT,
    encoding: 'utf8',
    env: { ...process.env, TZ: 'UTC' },
  });
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

/** The same, without blocking this process: for commands that run beside a diary process. */
export function forelogAsync(...args: string[]): Promise<{ status: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, ['--import', 'tsx', path.join(ROOT, 'main', 'cli.ts'), ...args], {
      cwd: ROOT,
      env: { ...process.env, TZ: 'UTC' },
    });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (c: Buffer) => (stdout += c.toString()));
    child.stderr.on('data', (c: Buffer) => (stderr += c.toString()));
    child.on('close', (code) => resolve({ status: code ?? -1, stdout, stderr }));
  });
}
