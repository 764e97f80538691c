/**
 * The preload as the sandbox runs it: the file scripts/build-main.mjs writes, executed in a
 * bare V8 context with a `require` that knows only 'electron'. Source: Electron's process
 * sandboxing guide and preload tutorial — a sandboxed preload gets a polyfilled `require`
 * limited to Electron's renderer modules (and events, timers, url), no Node built-ins, no
 * other files, so the preload must be one self-contained script. We allow 'electron' only.
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import vm from 'node:vm';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));

test('the built preload is one script that requires only electron and runs without Node', () => {
  const build = spawnSync(process.execPath, ['scripts/build-main.mjs', 'preload'], { cwd: ROOT, encoding: 'utf8' });
  assert.equal(build.status, 0, build.stderr);
  assert.match(build.stdout, /dist\/main\/preload\.cjs .* requires at run time: electron$/m);

  const source = readFileSync(`${ROOT}dist/main/preload.cjs`, 'utf8');
  const required = [...source.matchAll(/\brequire\(\s*(["'])([^"']+)\1\s*\)/g)].map((match) => match[2]);
  assert.deepEqual(required, ['electron']);
  assert.equal(source.match(/\brequire\(/g)?.length, 1, 'no require with a computed name');

  const exposed: { key: string; api: Record<string, unknown> }[] = [];
  const electron = {
    contextBridge: {
      exposeInMainWorld: (key: string, api: Record<string, unknown>) => exposed.push({ key, api }),
    },
    ipcRenderer: { invoke: async () => null, on: () => undefined, removeListener: () => undefined },
  };
  const sandboxRequire = (name: string) => {
    if (name === 'electron') return electron;
    throw new Error(`module not found: ${name}`);
  };
  // A fresh context has no process, Buffer, __dirname or require of its own.
  const run = vm.runInNewContext(`(function (require, module, exports) {\n${source}\n})`, {}, { filename: 'preload.cjs' });
  const module = { exports: {} };
  run(sandboxRequire, module, module.exports);

  assert.deepEqual(
    exposed.map((entry) => [entry.key, Object.keys(entry.api).sort()]),
    [['forelog', ['call', 'onOpenQuestion', 'saveBriefingPdf']]],
  );
});
