/**
 * `npm run screenshots`: the pictures in the README, taken from the example diary in
 * browser mode with Debian's Chromium (light theme, 1280×860). Builds first if needed.
 */
import { chromium } from '@playwright/test';
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import readline from 'node:readline';

const ROOT = path.resolve(path.dirname(process.argv[1] ?? '.'), '..');
const OUT = path.join(ROOT, 'docs', 'screenshots');

async function main(): Promise<void> {
  if (!fs.existsSync(path.join(ROOT, 'dist', 'renderer', 'index.html'))) {
    spawnSync('npm', ['run', 'build:renderer'], { cwd: ROOT, stdio: 'inherit' });
  }
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'forelog-shots-'));
  const db = path.join(dir, 'example.sqlite');
  const cli = ['--import', 'tsx', path.join(ROOT, 'main', 'cli.ts')];
  spawnSync(process.execPath, [...cli, 'demo', '--db', db], { cwd: ROOT, stdio: 'inherit' });
  const server = spawn(process.execPath, [...cli, 'serve', '--db', db, '--port', '0'], { cwd: ROOT, stdio: ['ignore', 'pipe', 'inherit'] });
  const url = await new Promise<string>((resolve) => readline.createInterface({ input: server.stdout! }).once('line', resolve));
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  try {
    const page = await browser.newPage({ viewport: { width: 1280, height: 860 }, colorScheme: 'light' });
    fs.mkdirSync(OUT, { recursive: true });
    const shoot = async (hash: string, name: string, ready: () => Promise<unknown>) => {
      await page.goto(`${url}#/${hash}`);
      await ready();
      await page.waitForTimeout(400); // chart animations are off, but fonts settle
      await page.screenshot({ path: path.join(OUT, `${name}.png`) });
      process.stdout.write(`wrote docs/screenshots/${name}.png\n`);
    };
    const h1 = () => page.getByRole('heading', { level: 1 }).waitFor();
    await shoot('desk', 'desk', h1);
    await shoot('questions', 'questions', h1);
    await page.goto(`${url}#/questions`);
    // The list draws only the rows in view: find the question by searching, as a user would.
    await page.getByLabel('Search').fill('Norrowby Freight signs');
    await page.getByRole('link', { name: /Norrowby Freight signs the phase-2/ }).click();
    await h1();
    await page.waitForTimeout(400);
    await page.screenshot({ path: path.join(OUT, 'question.png') });
    process.stdout.write('wrote docs/screenshots/question.png\n');
    await shoot('scorecard', 'scorecard', () => page.locator('[data-scorecard-ready="true"]').waitFor());
    await shoot('hindsight', 'hindsight', h1);
  } finally {
    await browser.close();
    server.kill();
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((err: unknown) => {
  process.stderr.write(`screenshots failed: ${err instanceof Error ? err.message : String(err)}\n`);
  process.exitCode = 1;
});
