/**
 * Bundles the main-process programs with esbuild into CommonJS files under dist/main:
 *   main/app.ts     → dist/main/app.cjs      (Electron main process; package.json "main")
 *   main/preload.ts → dist/main/preload.cjs  (sandboxed preload: may require 'electron' only)
 *   main/cli.ts     → dist/main/cli.cjs      (the `forelog` command; package.json "bin")
 * and copies the window and tray icons from build/ to dist/main/assets.
 *
 * Usage: node scripts/build-main.mjs [app] [preload] [cli]   (no names: all three)
 * The launcher (scripts/forelog.mjs) imports `buildMain` to rebuild the command line when
 * its sources changed, with progress on stderr so the command's own stdout stays clean.
 *
 * CommonJS because Electron loads a sandboxed preload only as a script, and one format
 * for all three keeps them alike; the .cjs extension overrides the package's "type": "module".
 * Native and runtime-provided packages stay outside the bundle and are required at run
 * time; 'vite' is only reached by `forelog serve` in a source checkout.
 */
import { build } from 'esbuild';
import { chmod, copyFile, mkdir, readFile, rename, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = fileURLToPath(new URL('../', import.meta.url));
const EXTERNAL = ['electron', 'better-sqlite3', 'node-cron', 'vite'];

/**
 * `import.meta` has no meaning in CommonJS (esbuild would leave an empty object), so in
 * the Node bundles it is rebuilt from the bundle's own file. Paths derived from it point
 * into dist/main, not the source folder: read nothing relative to a module at run time.
 */
const IMPORT_META_BANNER = '"use strict";\nconst __importMetaUrl = require("node:url").pathToFileURL(__filename).href;';
const IMPORT_META_DEFINE = {
  'import.meta.url': '__importMetaUrl',
  'import.meta.dirname': '__dirname',
  'import.meta.filename': '__filename',
};

const TARGETS = {
  app: { entry: 'main/app.ts', outfile: 'dist/main/app.cjs', node: true },
  // The sandboxed preload cannot require node: modules, so it gets no import.meta shim
  // and may import nothing but 'electron'.
  preload: { entry: 'main/preload.ts', outfile: 'dist/main/preload.cjs', node: false, onlyExternals: ['electron'] },
  // The command line runs under plain Node, where require('electron') is not the API.
  cli: { entry: 'main/cli.ts', outfile: 'dist/main/cli.cjs', node: true, forbiddenExternals: ['electron'], executable: true },
};

const ASSETS = ['icon.png', 'tray.png', 'tray@2x.png'];

/**
 * zod re-exports its messages in about fifty languages (z.locales), some 400 kB that every
 * start of the command line would parse; Forelog speaks English only, so the bundle keeps
 * English alone. zod registers English itself, so nothing else changes.
 */
const ENGLISH_ONLY_ZOD = {
  name: 'english-only-zod',
  setup(b) {
    b.onResolve({ filter: /^\.\.\/locales\/index\.js$/ }, (args) =>
      args.importer.includes(`${path.sep}node_modules${path.sep}zod${path.sep}`) ? { path: 'zod-locales-en', namespace: 'english-only-zod', pluginData: args.resolveDir } : undefined,
    );
    b.onLoad({ filter: /.*/, namespace: 'english-only-zod' }, (args) => ({
      contents: 'export { default as en } from "../locales/en.js";',
      resolveDir: args.pluginData,
      loader: 'js',
    }));
  },
};

class BuildError extends Error {}

/**
 * Writes a built file beside its place under a name of its own, then renames it into
 * place: two `npm run forelog` calls that both find the sources changed rebuild at the same
 * time, and a third may start meanwhile; each must load a whole bundle (the old or the
 * new), never one half written.
 */
async function writeWhole(file, contents, mode) {
  await mkdir(path.dirname(file), { recursive: true });
  const temporary = `${file}.${process.pid}.${Date.now()}.tmp`;
  try {
    await writeFile(temporary, contents, { mode });
    await chmod(temporary, mode);
    await rename(temporary, file);
  } catch (err) {
    await rm(temporary, { force: true });
    throw err;
  }
}

function fail(message) {
  throw new BuildError(message);
}

/**
 * Builds the named targets (all when `names` is empty). `log` receives one line per output;
 * a failure throws an Error whose message says what to fix (esbuild's own messages go to
 * stderr first).
 */
export async function buildMain(names = [], { log = (line) => console.log(line) } = {}) {
  for (const name of names) {
    if (!(name in TARGETS)) fail(`unknown target "${name}"; choose from ${Object.keys(TARGETS).join(', ')}.`);
  }
  const chosen = names.length > 0 ? names : Object.keys(TARGETS);

  for (const name of chosen) {
    const target = TARGETS[name];
    const source = await readFile(root + target.entry, 'utf8').catch(() =>
      fail(`${target.entry} does not exist; it is needed to build ${target.outfile}.`),
    );
    let banner = target.node ? IMPORT_META_BANNER : '';
    // esbuild keeps an entry's own #! line; add one only if the source has none.
    if (target.executable && !source.startsWith('#!')) banner = `#!/usr/bin/env node\n${banner}`;

    const result = await build({
      absWorkingDir: root,
      entryPoints: [target.entry],
      outfile: target.outfile,
      bundle: true,
      platform: 'node',
      target: 'node20',
      format: 'cjs',
      external: EXTERNAL,
      define: target.node ? IMPORT_META_DEFINE : {},
      banner: banner ? { js: banner } : {},
      metafile: true,
      // Written below, each file whole or not at all (see writeWhole).
      write: false,
      plugins: [ENGLISH_ONLY_ZOD],
      logLevel: 'warning',
    }).catch(() => fail(`bundling ${target.entry} failed (esbuild's messages are above).`));

    if (result.warnings.length > 0) fail(`bundling ${target.entry} gave warnings (above); fix them so the bundle behaves like the source.`);

    const output = result.metafile.outputs[target.outfile];
    const externals = [...new Set(output.imports.filter((i) => i.external).map((i) => i.path))].sort();
    const notAllowed = target.onlyExternals ? externals.filter((e) => !target.onlyExternals.includes(e)) : [];
    const forbidden = target.forbiddenExternals ? externals.filter((e) => target.forbiddenExternals.includes(e)) : [];
    if (notAllowed.length > 0 || forbidden.length > 0) {
      fail(`${target.outfile} would require ${[...notAllowed, ...forbidden].join(', ')} at run time, which cannot work there; remove that import from ${target.entry}.`);
    }
    for (const file of result.outputFiles) await writeWhole(file.path, file.contents, target.executable ? 0o755 : 0o644);
    const size = `${(output.bytes / 1024).toFixed(1)} kB`;
    log(`built ${target.outfile}  ${size}  requires at run time: ${externals.join(', ') || 'nothing'}`);
  }

  if (chosen.includes('app')) {
    await mkdir(root + 'dist/main/assets', { recursive: true });
    for (const asset of ASSETS) {
      await copyFile(root + 'build/' + asset, root + 'dist/main/assets/' + asset).catch(() =>
        fail(`build/${asset} is missing; regenerate the icons with "node build/make-icons.mjs".`),
      );
    }
    log(`copied ${ASSETS.map((a) => `build/${a}`).join(', ')} → dist/main/assets/`);
  }
}

// Run as a script (not imported by the launcher).
if (process.argv[1] && import.meta.url === pathToFileURL(path.resolve(process.argv[1])).href) {
  await buildMain(process.argv.slice(2)).catch((err) => {
    console.error(`build-main: ${err instanceof BuildError ? err.message : (err?.stack ?? String(err))}`);
    process.exit(1);
  });
}
