/**
 * Is a build in this checkout older than the sources it is made from? One answer for both
 * builds a checkout makes on demand: the command line (scripts/forelog.mjs builds
 * dist/main/cli.cjs) and the app screens (`forelog serve` builds dist/renderer).
 *
 * Plain JavaScript because the launcher runs it before anything is built or compiled;
 * main/cli.ts imports it too (esbuild bundles it).
 */
import fs from 'node:fs';
import path from 'node:path';

/** What each build is made from, relative to the checkout root. */
export const BUILD_SOURCES = {
  cli: ['main', 'shared', 'scripts/build-main.mjs', 'scripts/freshness.mjs', 'package-lock.json'],
  renderer: ['renderer', 'shared', 'vite.config.ts', 'package-lock.json'],
};

/** What each build writes; its modification time is the build's. */
export const BUILD_OUTPUTS = {
  cli: 'dist/main/cli.cjs',
  renderer: 'dist/renderer/index.html',
};

/** A source checkout (not an installed copy without sources) has these at its root. */
export function isCheckout(root) {
  return fs.existsSync(path.join(root, 'main', 'cli.ts')) && fs.existsSync(path.join(root, 'vite.config.ts'));
}

/** True as soon as a file at or under `target` was modified after `time` (ms). */
function changedSince(target, time) {
  let stat;
  try {
    stat = fs.statSync(target);
  } catch {
    return false;
  }
  if (!stat.isDirectory()) return stat.mtimeMs > time;
  for (const entry of fs.readdirSync(target, { withFileTypes: true })) {
    if (entry.name === 'node_modules') continue;
    if (changedSince(path.join(target, entry.name), time)) return true;
  }
  return false;
}

/**
 * Why `build` ('cli' or 'renderer') must be made again in the checkout at `root`, or null
 * when its output is newer than every source.
 */
export function staleReason(root, build) {
  let built;
  try {
    built = fs.statSync(path.join(root, BUILD_OUTPUTS[build])).mtimeMs;
  } catch {
    return 'first run in this checkout';
  }
  return BUILD_SOURCES[build].some((source) => changedSince(path.join(root, source), built)) ? 'the sources changed since the last build' : null;
}
