/**
 * The layering rule, checked on every `npm test` (`npm run lint`):
 * - shared/ imports neither main/ nor renderer/, no Node built-ins and no electron;
 * - renderer/ never imports main/ (it reaches data only through the API contract);
 * - only main/app.ts, main/preload.ts and main/transport/ipc.ts import electron.
 * Prints each violation as file:line and exits non-zero.
 */
import fs from 'node:fs';
import path from 'node:path';

const root = path.resolve(path.dirname(process.argv[1] ?? '.'), '..');
const ELECTRON_ALLOWED = new Set(['main/app.ts', 'main/preload.ts', 'main/transport/ipc.ts']);
const IMPORT_RE = /(?:^|\n)\s*(?:import|export)\s[^;]*?from\s+['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)|require\(\s*['"]([^'"]+)['"]\s*\)/g;

function walk(dir: string): string[] {
  if (!fs.existsSync(dir)) return [];
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) return e.name === 'node_modules' ? [] : walk(p);
    return /\.(ts|tsx|mts|cts)$/.test(e.name) ? [p] : [];
  });
}

const problems: string[] = [];
for (const layer of ['shared', 'renderer', 'main']) {
  for (const file of walk(path.join(root, layer))) {
    const rel = path.relative(root, file).split(path.sep).join('/');
    const text = fs.readFileSync(file, 'utf8');
    for (const m of text.matchAll(IMPORT_RE)) {
      const spec = m[1] ?? m[2] ?? m[3]!;
      const line = text.slice(0, m.index).split('\n').length + (m[0].startsWith('\n') ? 1 : 0);
      const target = spec.startsWith('.') ? path.relative(root, path.resolve(path.dirname(file), spec)).split(path.sep).join('/') : null;
      const where = `${rel}:${line}`;
      if (spec === 'electron' && !ELECTRON_ALLOWED.has(rel)) problems.push(`${where}: only the shell files may import electron`);
      if (layer === 'shared') {
        if (target && !target.startsWith('shared/')) problems.push(`${where}: shared/ must not import ${target}`);
        if (spec.startsWith('node:') || spec === 'electron') problems.push(`${where}: shared/ is pure; it must not import ${spec}`);
      }
      if (layer === 'renderer' && target?.startsWith('main/')) problems.push(`${where}: the renderer must not import main/ (${spec}); use the API`);
    }
  }
}
if (problems.length) {
  process.stderr.write(`Layering rule broken:\n${problems.join('\n')}\n`);
  process.exit(1);
}
process.stdout.write('Layering rule holds: shared is pure, the renderer talks only through the API, electron stays in the shell.\n');
