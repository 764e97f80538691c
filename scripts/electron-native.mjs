#!/usr/bin/env node
/**
 * `npm start` from a checkout: SQLite's native module in node_modules is built for Node
 * (the tests and the command line need that one), but Electron has its own ABI. This
 * builds a second copy for the installed Electron version into dist/native/, which the
 * shell passes to better-sqlite3 as `nativeBinding`, leaving node_modules untouched.
 * Packaged apps do not need it: electron-builder rebuilds native modules for Electron.
 *
 * It needs the network once (Electron's headers or a prebuilt binary), which a user's
 * machine has; it is skipped when the copy for this Electron version already exists.
 */
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const require = (await import('node:module')).createRequire(import.meta.url);
const electronVersion = require('electron/package.json').version;
const sqliteDir = path.dirname(require.resolve('better-sqlite3/package.json'));
const sqliteVersion = require('better-sqlite3/package.json').version;
const outDir = path.join(root, 'dist', 'native');
const out = path.join(outDir, 'better_sqlite3.node');
const stamp = path.join(outDir, 'built-for.json');
const wanted = { electron: electronVersion, 'better-sqlite3': sqliteVersion, arch: process.arch, platform: process.platform };

if (fs.existsSync(out) && fs.existsSync(stamp) && JSON.stringify(JSON.parse(fs.readFileSync(stamp, 'utf8'))) === JSON.stringify(wanted)) {
  console.log(`SQLite for Electron ${electronVersion} is ready (${path.relative(root, out)}).`);
  process.exit(0);
}

console.log(`Building SQLite's native module for Electron ${electronVersion} (once per version)…`);
const work = fs.mkdtempSync(path.join(os.tmpdir(), 'forelog-native-'));
try {
  const copy = path.join(work, 'better-sqlite3');
  fs.cpSync(sqliteDir, copy, { recursive: true, filter: (src) => !src.includes(`${path.sep}build${path.sep}`) && !src.endsWith(`${path.sep}build`) });
  const run = (cmd, args) => execFileSync(cmd, args, { cwd: copy, stdio: 'inherit', shell: process.platform === 'win32' });
  const npx = process.platform === 'win32' ? 'npx.cmd' : 'npx';
  try {
    run(npx, ['--yes', 'prebuild-install', '--runtime', 'electron', '--target', electronVersion, '--arch', process.arch]);
  } catch {
    console.log('No prebuilt binary for this Electron; compiling from source (a few minutes)…');
    run(npx, ['--yes', 'node-gyp', 'rebuild', '--release', '--runtime=electron', `--target=${electronVersion}`, `--arch=${process.arch}`, '--dist-url=https://electronjs.org/headers']);
  }
  fs.mkdirSync(outDir, { recursive: true });
  fs.copyFileSync(path.join(copy, 'build', 'Release', 'better_sqlite3.node'), out);
  fs.writeFileSync(stamp, `${JSON.stringify(wanted)}\n`);
  console.log(`Built ${path.relative(root, out)}.`);
} catch (err) {
  console.error(
    `Could not build SQLite for Electron: ${err instanceof Error ? err.message : String(err)}\n` +
      'This step needs the network once (Electron headers or a prebuilt binary). Browser mode works without it: npm run forelog -- serve',
  );
  process.exitCode = 1;
} finally {
  fs.rmSync(work, { recursive: true, force: true });
}
