/**
 * One `forelog serve` per test file, on a fresh diary in a temporary folder. The server's
 * first stdout line is the address with the launch token (main/cli.ts prints it first so
 * scripts and tests can read it).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { expect, test, type Browser, type BrowserContextOptions, type Page } from '@playwright/test';

const PROJECT_ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const START_TIMEOUT_MS = 30_000;

export interface DiaryServer {
  /** The address `forelog serve` printed, token included. */
  url: string;
  dir: string;
  child: ChildProcess;
}

async function startServer(): Promise<DiaryServer> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'forelog-e2e-'));
  const child = spawn(
    process.execPath,
    ['--import', 'tsx', 'main/cli.ts', 'serve', '--db', path.join(dir, 'diary.sqlite'), '--port', '0'],
    { cwd: PROJECT_ROOT, stdio: ['ignore', 'pipe', 'pipe'] },
  );
  let stderr = '';
  child.stderr?.on('data', (chunk: Buffer) => {
    stderr += chunk.toString();
  });
  const url = await new Promise<string>((resolve, reject) => {
    let stdout = '';
    const timer = setTimeout(() => {
      child.kill('SIGTERM');
      reject(new Error(`forelog serve printed no address within ${START_TIMEOUT_MS} ms. stderr:\n${stderr}`));
    }, START_TIMEOUT_MS);
    child.stdout?.on('data', (chunk: Buffer) => {
      stdout += chunk.toString();
      const newline = stdout.indexOf('\n');
      if (newline >= 0) {
        clearTimeout(timer);
        resolve(stdout.slice(0, newline).trim());
      }
    });
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`forelog serve exited with code ${code} before printing its address. stderr:\n${stderr}`));
    });
  });
  if (!/^http:\/\/127\.0\.0\.1:\d+\/\?token=\S+$/.test(url)) {
    child.kill('SIGTERM');
    throw new Error(`forelog serve's first line is not the expected address: ${url}`);
  }
  return { url, dir, child };
}

async function stopServer(server: DiaryServer): Promise<void> {
  const { child } = server;
  if (child.exitCode === null && child.signalCode === null) {
    const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
    child.kill('SIGTERM');
    const timer = setTimeout(() => child.kill('SIGKILL'), 5_000);
    await exited;
    clearTimeout(timer);
  }
  fs.rmSync(server.dir, { recursive: true, force: true });
}

/**
 * Registers hooks that start a server before the file's first test and stop it after the
 * last; returns a getter for the running server.
 */
export function useDiaryServer(): () => DiaryServer {
  let server: DiaryServer | undefined;
  test.beforeAll(async () => {
    server = await startServer();
  });
  test.afterAll(async () => {
    if (server) await stopServer(server);
    server = undefined;
  });
  return () => {
    if (!server) throw new Error('The diary server is not running (useDiaryServer hooks did not start it).');
    return server;
  };
}

export interface AppPage {
  page: Page;
  /** Console errors and uncaught exceptions seen so far (e.g. a Content-Security-Policy refusal). */
  problems: string[];
  close: () => Promise<void>;
}

/**
 * A new browser context on the served app at the screen `startAt` names ("questions", "desk",
 * "" for the home screen), collecting anything the page complains about. Most specs work on the
 * Questions screen, so it is the default.
 */
export async function openApp(
  browser: Browser,
  server: DiaryServer,
  options: BrowserContextOptions = {},
  startAt = 'questions',
): Promise<AppPage> {
  const context = await browser.newContext(options);
  const page = await context.newPage();
  const problems: string[] = [];
  page.on('console', (message) => {
    // Chromium logs every 4xx answer as a console error; a refused API call is expected in
    // validation tests and shown by the page itself, so only other errors count.
    const fromApi = message.location().url.includes('/api/');
    if (message.type() === 'error' && !fromApi) problems.push(`console: ${message.text()}`);
  });
  page.on('pageerror', (error) => problems.push(`page error: ${error.message}`));
  await page.goto(startAt ? `${server.url}#/${startAt}` : server.url);
  await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
  return { page, problems, close: () => context.close() };
}

/**
 * Registers hooks that open the app (as `openApp` does, on `startAt`) before each test and,
 * after it, close it and fail the test if the page logged an error. Returns the app of the
 * running test: its `page` and `problems` are those of the test in progress.
 */
export function useAppPage(server: () => DiaryServer, startAt = 'questions'): AppPage {
  let current: AppPage | undefined;
  const running = (): AppPage => {
    if (!current) throw new Error('The app is not open (useAppPage hooks did not open it).');
    return current;
  };
  test.beforeEach(async ({ browser }) => {
    current = await openApp(browser, server(), {}, startAt);
  });
  test.afterEach(async () => {
    const app = running();
    current = undefined;
    const problems = [...app.problems];
    await app.close();
    expect(problems, 'the page logged errors').toEqual([]);
  });
  return {
    get page() {
      return running().page;
    },
    get problems() {
      return running().problems;
    },
    close: () => running().close(),
  };
}
