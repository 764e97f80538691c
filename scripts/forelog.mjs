#!/usr/bin/env node
/**
 * `forelog` from a checkout (`npm run forelog -- …`, or the command `npm link` and
 * `npm install -g .` put on the PATH): runs the built command line, dist/main/cli.cjs,
 * rebuilding it first when its sources changed since the last build. Running compiled
 * code is what keeps a call fast; the freshness check costs a few milliseconds.
 *
 * Build messages go to stderr, so stdout carries only the command's own output (`serve`'s
 * first line stays its address; `export` without a file stays a clean file).
 */
import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { BUILD_OUTPUTS, isCheckout, staleReason } from './freshness.mjs';

// A linked or global install runs through a symlink; Node resolves it, so this is the checkout.
const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const cli = path.join(root, BUILD_OUTPUTS.cli);

async function main() {
  if (isCheckout(root)) {
    const reason = staleReason(root, 'cli');
    if (reason !== null) {
      process.stderr.write(`Building the command line (${reason})…\n`);
      const { buildMain } = await import('./build-main.mjs');
      await buildMain(['cli'], { log: (line) => process.stderr.write(`${line}\n`) });
    }
  } else if (!fs.existsSync(cli)) {
    throw new Error(`${cli} is missing and there are no sources here to build it from; reinstall Forelog.`);
  }
  // In this process: the command line reads its arguments from process.argv.slice(2), as here.
  createRequire(import.meta.url)(cli);
}

main().catch((err) => {
  process.stderr.write(`forelog: ${err instanceof Error ? err.message : String(err)}\n`);
  process.exitCode = 1;
});
