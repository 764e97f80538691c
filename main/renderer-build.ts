/**
 * Brings a checkout's built screens (dist/renderer) up to date for `forelog serve`, safely
 * while other servers run or start from the same checkout.
 *
 * Vite empties its output folder before it writes, so building straight into dist/renderer
 * left a server that was already running (or one that started while another rebuilt)
 * serving an empty or half-written folder for as long as the build took. Here:
 * - one build at a time per checkout: a lock file (`dist/renderer.lock`, created
 *   exclusively, holding the builder's pid); a process that finds it waits, then looks
 *   again whether a build is still needed, so servers started together build once;
 * - the build goes to a folder of its own (`dist/renderer.<pid>.tmp`) and its files are
 *   then renamed into dist/renderer one by one, each rename replacing a file in one step,
 *   index.html last: every request finds the old file or the new one, and the new
 *   index.html appears only once the files it names are in place. Files only the old
 *   build had are removed after that.
 * A lock left by a killed build (its pid no longer runs) is taken over, and staging folders
 * left by killed builds are removed by the next build.
 */
import fs from 'node:fs';
import path from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { staleReason } from '../scripts/freshness.mjs';

/** Writes a whole build of the screens into `outDir` (which it may empty first, as vite does). */
export type BuildScreens = (outDir: string) => Promise<void>;

const LOCK_POLL_MS = 100;

/** Does the process `pid` still run? (EPERM: it runs, under another user.) */
function running(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** The pid written in a lock file, or null when it is unreadable or half written. */
function lockOwner(lock: string): number | null {
  try {
    const pid = Number(fs.readFileSync(lock, 'utf8'));
    return Number.isInteger(pid) && pid > 0 ? pid : null;
  } catch {
    return null;
  }
}

/** Takes the checkout's build lock, waiting while a running process holds it; returns its release. */
async function takeLock(lock: string): Promise<() => void> {
  fs.mkdirSync(path.dirname(lock), { recursive: true });
  for (;;) {
    try {
      // Written whole through a name of our own, then linked into place: link fails when
      // the lock exists, so whoever sees the lock also sees the pid in it.
      const mine = `${lock}.${process.pid}`;
      fs.writeFileSync(mine, String(process.pid));
      try {
        fs.linkSync(mine, lock);
      } finally {
        fs.rmSync(mine, { force: true });
      }
      return () => fs.rmSync(lock, { force: true });
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
    }
    const owner = lockOwner(lock);
    // The owner died mid-build (kill -9): its lock protects nothing any more. It is moved
    // aside before it is removed, so of several waiters only one takes it; one that moved
    // a live lock taken meanwhile puts it back.
    if (owner !== null && !running(owner)) {
      const aside = `${lock}.stale.${process.pid}`;
      try {
        fs.renameSync(lock, aside);
        if (lockOwner(aside) !== owner) fs.linkSync(aside, lock);
      } catch {
        // Another waiter moved it first, or took the lock meanwhile: look again.
      } finally {
        fs.rmSync(aside, { force: true });
      }
      continue;
    }
    await sleep(LOCK_POLL_MS);
  }
}

/** Removes the staging folders of builds whose process no longer runs. */
function removeKilledBuilds(dist: string): void {
  for (const name of fs.readdirSync(dist)) {
    const pid = /^renderer\.(\d+)\.tmp$/.exec(name)?.[1];
    if (pid !== undefined && !running(Number(pid))) fs.rmSync(path.join(dist, name), { recursive: true, force: true });
  }
}

/** Every file under `dir`, as paths relative to it. */
function filesUnder(dir: string, prefix = ''): string[] {
  const out: string[] = [];
  for (const entry of fs.readdirSync(path.join(dir, prefix), { withFileTypes: true })) {
    const relative = path.join(prefix, entry.name);
    if (entry.isDirectory()) out.push(...filesUnder(dir, relative));
    else out.push(relative);
  }
  return out;
}

/** Moves a finished build from `staging` into `target`, index.html last, then drops what only the old build had. */
function install(staging: string, target: string): void {
  const fresh = filesUnder(staging);
  const ordered = [...fresh.filter((f) => f !== 'index.html'), ...fresh.filter((f) => f === 'index.html')];
  for (const file of ordered) {
    fs.mkdirSync(path.dirname(path.join(target, file)), { recursive: true });
    fs.renameSync(path.join(staging, file), path.join(target, file));
  }
  const kept = new Set(fresh);
  for (const file of filesUnder(target)) if (!kept.has(file)) fs.rmSync(path.join(target, file), { force: true });
  removeEmptyFolders(target);
  fs.rmSync(staging, { recursive: true, force: true });
}

function removeEmptyFolders(dir: string): void {
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    if (!entry.isDirectory()) continue;
    const sub = path.join(dir, entry.name);
    removeEmptyFolders(sub);
    if (fs.readdirSync(sub).length === 0) fs.rmdirSync(sub);
  }
}

/**
 * Rebuilds dist/renderer under `root` with `build` when it is older than its sources (or
 * missing); `announce` receives why, once, before a build starts. Returns the folder to serve.
 */
export async function freshRenderer(root: string, build: BuildScreens, announce: (reason: string) => void): Promise<string> {
  const dist = path.join(root, 'dist');
  const target = path.join(dist, 'renderer');
  if (staleReason(root, 'renderer') === null) return target;
  const release = await takeLock(path.join(dist, 'renderer.lock'));
  try {
    // A build that finished while we waited for the lock has done our work.
    const reason = staleReason(root, 'renderer');
    if (reason === null) return target;
    announce(reason);
    removeKilledBuilds(dist);
    const staging = path.join(dist, `renderer.${process.pid}.tmp`);
    try {
      await build(staging);
      fs.mkdirSync(target, { recursive: true });
      install(staging, target);
    } finally {
      fs.rmSync(staging, { recursive: true, force: true });
    }
    return target;
  } finally {
    release();
  }
}
