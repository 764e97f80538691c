/**
 * `forelog serve` in a checkout rebuilds the screens when their sources changed
 * (main/renderer-build.ts). Servers already running, or started together, serve the same
 * folder meanwhile: every moment of a rebuild must leave it whole (an index.html whose
 * files are all there), and servers started at once build once.
 *
 * The build is a stand-in that behaves as vite does — empties its output folder, writes
 * the assets, then index.html — and pauses between steps so the test can look at the
 * served folder mid-build; a real build runs in test/e2e, which starts `forelog serve`.
 */
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { freshRenderer } from '../../main/renderer-build';
import { tempDir } from '../support/temp-diary';

function touch(file: string, seconds: number): void {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  if (!fs.existsSync(file)) fs.writeFileSync(file, '');
  fs.utimesSync(file, seconds, seconds);
}

/** A checkout whose screens were built at t=2000 s as build "old", with a source changed since. */
function checkoutWithStaleScreens(): string {
  const root = tempDir('forelog-screens-');
  for (const f of ['main/cli.ts', 'shared/domain.ts', 'vite.config.ts', 'package-lock.json']) touch(path.join(root, f), 1_000);
  writeBuild(path.join(root, 'dist', 'renderer'), 'old');
  touch(path.join(root, 'dist', 'renderer', 'index.html'), 2_000);
  touch(path.join(root, 'renderer', 'src', 'screen.tsx'), 3_000);
  return root;
}

function writeBuild(dir: string, name: string): void {
  fs.mkdirSync(path.join(dir, 'assets'), { recursive: true });
  fs.writeFileSync(path.join(dir, 'assets', `index-${name}.js`), `/* ${name} */`);
  fs.writeFileSync(path.join(dir, 'index.html'), `<script src="./assets/index-${name}.js"></script>`);
}

/** What a server would answer for the page: its index.html and every file it names, or why not. */
function servedPage(root: string): string {
  const dir = path.join(root, 'dist', 'renderer');
  const index = path.join(dir, 'index.html');
  if (!fs.existsSync(index)) return 'index.html is missing';
  const html = fs.readFileSync(index, 'utf8');
  for (const [, src] of html.matchAll(/src="\.\/([^"]+)"/g)) if (!fs.existsSync(path.join(dir, src!))) return `${src} is missing`;
  return html;
}

/** A vite-like build that lets `look` see the served folder after each of its steps. */
function steppedBuild(name: string, look: () => void, count: { builds: number }) {
  return async (outDir: string): Promise<void> => {
    count.builds++;
    fs.rmSync(outDir, { recursive: true, force: true });
    fs.mkdirSync(path.join(outDir, 'assets'), { recursive: true });
    await new Promise((resolve) => setImmediate(resolve));
    look();
    fs.writeFileSync(path.join(outDir, 'assets', `index-${name}.js`), `/* ${name} */`);
    await new Promise((resolve) => setImmediate(resolve));
    look();
    fs.writeFileSync(path.join(outDir, 'index.html'), `<script src="./assets/index-${name}.js"></script>`);
    await new Promise((resolve) => setImmediate(resolve));
    look();
  };
}

test('while the screens rebuild, the folder being served stays whole, and then holds only the new build', async () => {
  const root = checkoutWithStaleScreens();
  const seen: string[] = [];
  const count = { builds: 0 };
  const reasons: string[] = [];
  const dir = await freshRenderer(root, steppedBuild('new', () => seen.push(servedPage(root)), count), (r) => reasons.push(r));
  assert.equal(dir, path.join(root, 'dist', 'renderer'));
  assert.deepEqual(reasons, ['the sources changed since the last build']);
  for (const page of seen) assert.match(page, /^<script/, `a server mid-build would have answered: ${page}`);
  assert.equal(servedPage(root), '<script src="./assets/index-new.js"></script>');
  assert.deepEqual(fs.readdirSync(path.join(root, 'dist', 'renderer', 'assets')), ['index-new.js'], 'the old build’s files are gone');
  assert.deepEqual(fs.readdirSync(path.join(root, 'dist')).sort(), ['renderer'], 'no staging folder or lock is left behind');
});

test('servers started together after a change build the screens once, and none sees a half-built folder', async () => {
  const root = checkoutWithStaleScreens();
  const seen: string[] = [];
  const count = { builds: 0 };
  const look = () => seen.push(servedPage(root));
  const dirs = await Promise.all(['a', 'b', 'c'].map((name) => freshRenderer(root, steppedBuild(name, look, count), () => {})));
  assert.equal(count.builds, 1);
  for (const dir of dirs) assert.equal(dir, path.join(root, 'dist', 'renderer'));
  for (const page of seen) assert.match(page, /^<script/, `a server mid-build would have answered: ${page}`);
  assert.match(servedPage(root), /^<script src="\.\/assets\/index-[abc]\.js"><\/script>$/);
  // Fresh now: a later start builds nothing.
  await freshRenderer(root, steppedBuild('d', look, count), () => {});
  assert.equal(count.builds, 1);
});

test('a build killed midway (its lock and staging folder left behind) does not stop the next one', async () => {
  const root = checkoutWithStaleScreens();
  // The pid of a process that has ended.
  const dead = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], { encoding: 'utf8' }).stdout;
  fs.writeFileSync(path.join(root, 'dist', 'renderer.lock'), dead);
  writeBuild(path.join(root, 'dist', `renderer.${dead}.tmp`), 'half');
  const count = { builds: 0 };
  await freshRenderer(root, steppedBuild('new', () => {}, count), () => {});
  assert.equal(count.builds, 1);
  assert.equal(servedPage(root), '<script src="./assets/index-new.js"></script>');
  assert.deepEqual(fs.readdirSync(path.join(root, 'dist')).sort(), ['renderer']);
});

test('a failed build leaves the screens that were there, and no staging folder or lock', async () => {
  const root = checkoutWithStaleScreens();
  await assert.rejects(
    freshRenderer(
      root,
      async (outDir) => {
        fs.mkdirSync(outDir, { recursive: true });
        fs.writeFileSync(path.join(outDir, 'index.html'), 'half');
        throw new Error('Transform failed: screen.tsx:1:1');
      },
      () => {},
    ),
    /Transform failed/,
  );
  assert.equal(servedPage(root), '<script src="./assets/index-old.js"></script>');
  assert.deepEqual(fs.readdirSync(path.join(root, 'dist')).sort(), ['renderer']);
});
