/**
 * The `forelog` launcher of a checkout (scripts/forelog.mjs) and the freshness check it
 * shares with `forelog serve`: it runs the built command line, rebuilds it only when a
 * source is newer than the build, and keeps its own messages off stdout.
 *
 * Runs in a throwaway copy of the checkout's layout whose build step is a stand-in that
 * writes a tiny command line, so the test neither waits for esbuild nor touches dist/.
 */
import assert from 'node:assert/strict';
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { BUILD_OUTPUTS, isCheckout, staleReason } from '../../scripts/freshness.mjs';
import { tempDir } from '../support/temp-diary';

const ROOT = path.resolve(import.meta.dirname, '..', '..');

/** Sets a file's modification time to `seconds` after the epoch (creating it if needed). */
function touch(file: string, seconds: number): void {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  if (!fs.existsSync(file)) fs.writeFileSync(file, '');
  fs.utimesSync(file, seconds, seconds);
}

function fakeCheckout(): string {
  const root = tempDir('forelog-launcher-');
  fs.mkdirSync(path.join(root, 'scripts'));
  for (const f of ['forelog.mjs', 'freshness.mjs']) fs.copyFileSync(path.join(ROOT, 'scripts', f), path.join(root, 'scripts', f));
  // Stand-in for scripts/build-main.mjs: the "command line" it builds prints its arguments.
  fs.writeFileSync(
    path.join(root, 'scripts', 'build-main.mjs'),
    `import fs from 'node:fs';
export async function buildMain(names, { log }) {
  fs.mkdirSync(new URL('../dist/main/', import.meta.url), { recursive: true });
  fs.writeFileSync(new URL('../dist/main/cli.cjs', import.meta.url), 'process.stdout.write(JSON.stringify(process.argv.slice(2)) + "\\\\n");');
  log('built ' + names.join(','));
}
`,
  );
  for (const f of ['main/cli.ts', 'shared/domain.ts', 'vite.config.ts', 'renderer/index.html', 'scripts/build-main.mjs', 'scripts/freshness.mjs']) touch(path.join(root, f), 1_000);
  return root;
}

function launch(root: string, ...args: string[]) {
  const r = spawnSync(process.execPath, [path.join(root, 'scripts', 'forelog.mjs'), ...args], { encoding: 'utf8' });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

test('the launcher builds on first run, then runs the build as it is until a source changes', () => {
  const root = fakeCheckout();
  const first = launch(root, 'export', '--format', 'csv');
  assert.equal(first.status, 0, first.stderr);
  assert.equal(first.stdout, '["export","--format","csv"]\n', 'stdout holds only the command’s own output');
  assert.match(first.stderr, /^Building the command line \(first run in this checkout\)…\nbuilt cli\n$/);

  touch(path.join(root, BUILD_OUTPUTS.cli), 2_000);
  const again = launch(root, 'due');
  assert.deepEqual([again.status, again.stdout, again.stderr], [0, '["due"]\n', ''], 'no rebuild while the build is newer');

  touch(path.join(root, 'shared', 'domain.ts'), 3_000);
  const changed = launch(root, 'due');
  assert.equal(changed.stdout, '["due"]\n');
  assert.match(changed.stderr, /the sources changed since the last build/);
});

test('freshness: a build is stale when missing or older than any of its sources, to the millisecond', () => {
  const root = fakeCheckout();
  assert.ok(isCheckout(root));
  assert.equal(isCheckout(path.join(root, 'scripts')), false);
  assert.equal(staleReason(root, 'renderer'), 'first run in this checkout');
  touch(path.join(root, BUILD_OUTPUTS.renderer), 2_000);
  assert.equal(staleReason(root, 'renderer'), null);
  touch(path.join(root, 'renderer', 'src', 'deep', 'screen.tsx'), 2_000);
  assert.equal(staleReason(root, 'renderer'), null, 'a source as old as the build is not newer');
  touch(path.join(root, 'renderer', 'src', 'deep', 'screen.tsx'), 2_000.001);
  assert.equal(staleReason(root, 'renderer'), 'the sources changed since the last build');
  touch(path.join(root, 'renderer', 'src', 'deep', 'screen.tsx'), 1_999);
  touch(path.join(root, 'renderer', 'node_modules', 'dep.js'), 9_000);
  assert.equal(staleReason(root, 'renderer'), null, 'node_modules is not a source');
  touch(path.join(root, 'vite.config.ts'), 2_500);
  assert.equal(staleReason(root, 'renderer'), 'the sources changed since the last build');
});

test('an installed copy without sources runs its build, and says so when it is missing', () => {
  const root = fakeCheckout();
  fs.rmSync(path.join(root, 'main'), { recursive: true });
  const missing = launch(root, 'due');
  assert.equal(missing.status, 1);
  assert.match(missing.stderr, /dist\/main\/cli\.cjs is missing and there are no sources here to build it from; reinstall Forelog\./);
  assert.equal(missing.stdout, '');
});

/** Runs the launcher without waiting for it, to start several at once. */
function launchAsync(root: string, ...args: string[]): Promise<{ status: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, [path.join(root, 'scripts', 'forelog.mjs'), ...args]);
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d) => (stdout += d));
    child.stderr.on('data', (d) => (stderr += d));
    child.on('close', (status) => resolve({ status, stdout, stderr }));
  });
}

test('several launches at once after a change each run a whole command line, never one half rebuilt', async () => {
  // A copy of the checkout's sources with the real build (esbuild): each launch that finds
  // the sources changed rebuilds, while the others load the bundle. Written in place, a
  // bundle was once loaded half written ("Unexpected end of input").
  const root = tempDir('forelog-launcher-real-');
  for (const entry of ['main', 'shared', 'scripts', 'package.json', 'package-lock.json', 'tsconfig.json', 'tsconfig.base.json', 'vite.config.ts']) {
    fs.cpSync(path.join(ROOT, entry), path.join(root, entry), { recursive: true });
  }
  fs.symlinkSync(path.join(ROOT, 'node_modules'), path.join(root, 'node_modules'), 'dir');
  const version = (JSON.parse(fs.readFileSync(path.join(ROOT, 'package.json'), 'utf8')) as { version: string }).version;
  for (let round = 0; round < 2; round++) {
    const later = Date.now() / 1000 + 1 + round;
    fs.utimesSync(path.join(root, 'shared', 'domain.ts'), later, later);
    const runs = await Promise.all(Array.from({ length: 6 }, () => launchAsync(root, '--version')));
    for (const run of runs) assert.deepEqual([run.status, run.stdout], [0, `forelog ${version}\n`], run.stderr);
  }
});
