/**
 * The project documents itself: a reader of the checkout finds everything in it. Every
 * relative link in the project's Markdown files must lead to a file in the checkout (and,
 * for `file.md#heading`, to a heading that exists), and no document may point at the
 * specifications the team worked from (`../shared/…`), which a user's checkout lacks.
 */
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { test } from 'node:test';
import { parseDiaryFile } from '../../shared/diary-file';
import { tempDir } from '../support/temp-diary';

const ROOT = path.resolve(import.meta.dirname, '..', '..');

/** Folders that are never part of a checkout's documents (installed, built or generated). */
const NOT_IN_CHECKOUT = new Set(['node_modules', '.git', 'dist', 'artifacts']);

/** Text that points outside the checkout, to files only the build machine has. */
const OUTSIDE_REFERENCES = ['../shared', '/work/shared'];

/**
 * The files a checkout holds, relative to `root` with `/` separators: what git tracks plus
 * new files it does not ignore (so a page written but not yet committed is checked too).
 * Outside a git checkout, every file except installed and built folders.
 */
function checkoutFiles(root: string): string[] {
  try {
    const out = execFileSync('git', ['-C', root, 'ls-files', '-z', '--cached', '--others', '--exclude-standard'], {
      encoding: 'utf8',
      stdio: ['ignore', 'pipe', 'ignore'],
    });
    return out.split('\0').filter((f) => f !== '' && fs.existsSync(path.join(root, f)));
  } catch {
    const walk = (dir: string): string[] =>
      fs.readdirSync(path.join(root, dir), { withFileTypes: true }).flatMap((e) => {
        const rel = dir ? `${dir}/${e.name}` : e.name;
        if (e.isDirectory()) return NOT_IN_CHECKOUT.has(e.name) ? [] : walk(rel);
        return e.isFile() ? [rel] : [];
      });
    return walk('');
  }
}

/** The Markdown text with fenced code blocks blanked out (line breaks kept, so offsets still give line numbers). */
function withoutFences(text: string): string {
  let fence: string | null = null;
  return text
    .split('\n')
    .map((line) => {
      const opener = /^ {0,3}(`{3,}|~{3,})/.exec(line);
      if (fence === null) {
        if (!opener) return line;
        fence = opener[1]!;
        return '';
      }
      if (opener && opener[1]![0] === fence[0] && opener[1]!.length >= fence.length && line.trim() === opener[1]) fence = null;
      return '';
    })
    .join('\n');
}

/** Also blanks inline code: a link or heading shown as an example is not one. */
function withoutCode(text: string): string {
  return withoutFences(text).replace(/(`+)[\s\S]*?\1/g, (code) => code.replace(/[^\n]/g, ' '));
}

/** GitHub's anchor for a heading: lower case, punctuation and symbols dropped, spaces to hyphens. */
function headingSlug(heading: string): string {
  const plain = heading
    .replace(/!?\[([^\]]*)\]\([^)]*\)/g, '$1')
    .replace(/`/g, '')
    .replace(/\*/g, '');
  return plain
    .trim()
    .toLowerCase()
    .replace(/[^\p{L}\p{M}\p{N}\p{Pc} -]/gu, '')
    .replace(/ /g, '-');
}

/** Every anchor a Markdown file offers: its headings' slugs (repeats get -1, -2, …) and explicit ids. */
function anchorsOf(text: string): Set<string> {
  const anchors = new Set<string>();
  const seen = new Map<string, number>();
  // Headings keep their inline code (GitHub spells it into the anchor); fenced blocks go.
  for (const m of withoutFences(text).matchAll(/^ {0,3}#{1,6}[ \t]+(.*?)(?:[ \t]+#+)?[ \t]*$/gm)) {
    const slug = headingSlug(m[1]!);
    const count = seen.get(slug) ?? 0;
    seen.set(slug, count + 1);
    anchors.add(count === 0 ? slug : `${slug}-${count}`);
  }
  for (const m of withoutCode(text).matchAll(/<a\s[^>]*\b(?:id|name)="([^"]+)"/g)) anchors.add(m[1]!);
  return anchors;
}

interface Link {
  target: string;
  line: number;
}

/** Inline links and images, reference definitions, and HTML href/src attributes, outside code. */
function linksIn(text: string): Link[] {
  const prose = withoutCode(text);
  const lineAt = (index: number) => prose.slice(0, index).split('\n').length;
  const links: Link[] = [];
  for (const m of prose.matchAll(/!?\[[^\]]*\]\(\s*(<[^>]*>|[^)\s]+)(?:\s+(?:"[^"]*"|'[^']*'))?\s*\)/g)) {
    links.push({ target: m[1]!.replace(/^<|>$/g, ''), line: lineAt(m.index) });
  }
  for (const m of prose.matchAll(/^ {0,3}\[[^\]]+\]:[ \t]*<?([^\s>]+)>?/gm)) links.push({ target: m[1]!, line: lineAt(m.index) });
  for (const m of prose.matchAll(/<[a-z]+\s[^>]*\b(?:href|src)="([^"]+)"/gi)) links.push({ target: m[1]!, line: lineAt(m.index) });
  return links;
}

/**
 * Checks every Markdown file of the checkout at `root`; returns one `file:line: problem`
 * line per broken relative link and per reference to files outside the checkout.
 */
function documentationProblems(root: string): string[] {
  const files = checkoutFiles(root);
  const fileSet = new Set(files);
  const dirSet = new Set(files.flatMap((f) => f.split('/').slice(0, -1).map((_, i, parts) => parts.slice(0, i + 1).join('/'))));
  const anchorCache = new Map<string, Set<string>>();
  const anchors = (file: string) => {
    let found = anchorCache.get(file);
    if (!found) anchorCache.set(file, (found = anchorsOf(fs.readFileSync(path.join(root, file), 'utf8'))));
    return found;
  };
  const problems: string[] = [];
  for (const file of files.filter((f) => /\.md$/i.test(f)).sort()) {
    const text = fs.readFileSync(path.join(root, file), 'utf8');
    text.split('\n').forEach((line, i) => {
      for (const outside of OUTSIDE_REFERENCES) {
        if (line.includes(outside)) problems.push(`${file}:${i + 1}: mentions ${outside}, which a user's checkout does not have; point to docs/ instead`);
      }
    });
    for (const { target, line } of linksIn(text)) {
      if (/^[a-z][a-z0-9+.-]*:/i.test(target) || target.startsWith('//')) continue; // a web address or mailto:
      const hash = target.indexOf('#');
      const rawPath = hash === -1 ? target : target.slice(0, hash);
      const anchor = hash === -1 ? null : decodeURIComponent(target.slice(hash + 1));
      let targetPath: string;
      if (rawPath === '') targetPath = file;
      else {
        const decoded = decodeURIComponent(rawPath);
        const absolute = decoded.startsWith('/') ? path.join(root, decoded) : path.resolve(root, path.dirname(file), decoded);
        targetPath = path.relative(root, absolute).split(path.sep).join('/');
        if (targetPath.startsWith('..') || path.isAbsolute(targetPath)) {
          problems.push(`${file}:${line}: links to ${target}, outside the checkout`);
          continue;
        }
        targetPath = targetPath.replace(/\/$/, '');
        if (!fileSet.has(targetPath) && !dirSet.has(targetPath)) {
          problems.push(`${file}:${line}: links to ${target}, but ${targetPath} is not in the checkout`);
          continue;
        }
      }
      if (anchor && /\.md$/i.test(targetPath) && fileSet.has(targetPath) && !anchors(targetPath).has(anchor)) {
        problems.push(`${file}:${line}: links to ${target}, but ${targetPath} has no heading #${anchor}`);
      }
    }
  }
  return problems;
}

test('every relative link in the project’s Markdown files leads to a file and heading in the checkout', () => {
  const problems = documentationProblems(ROOT);
  assert.deepEqual(problems, [], `Broken documentation links:\n${problems.join('\n')}`);
});

test('the documentation pages the README and DEVELOPERS.md send readers to are in docs/', () => {
  for (const page of ['docs/README.md', 'docs/diary-file.md', 'docs/command-line.md', 'docs/scoring.md', 'docs/csv-format.md']) {
    assert.ok(fs.existsSync(path.join(ROOT, page)), `${page} is missing`);
  }
  const readme = fs.readFileSync(path.join(ROOT, 'README.md'), 'utf8');
  for (const page of ['docs/diary-file.md', 'docs/command-line.md', 'docs/scoring.md']) {
    assert.ok(linksIn(readme).some((l) => l.target === page), `README.md does not link to ${page}`);
  }
});

test('the link check finds a missing file, a missing heading, a link out of the checkout and a ../shared mention', () => {
  const root = tempDir('forelog-docs-');
  fs.mkdirSync(path.join(root, 'docs'));
  fs.writeFileSync(path.join(root, 'docs', 'a.md'), '# Page A\n\n## Which forecasts count\n\nText.\n');
  fs.writeFileSync(
    path.join(root, 'README.md'),
    [
      '# Readme',
      '[fine](docs/a.md) and [fine too](docs/a.md#which-forecasts-count) and [web](https://example.org/x.md)',
      '[gone](docs/b.md)',
      '[no such heading](docs/a.md#which-forecast-counts)',
      '[outside](../elsewhere/x.md)',
      'See ../shared/SCORING.md.',
      '```md',
      '[only an example](docs/nothing.md)',
      '```',
      'Inline `[also an example](docs/nothing.md)` too.',
      '',
      '[ref]: docs/c.md',
    ].join('\n'),
  );
  assert.deepEqual(documentationProblems(root), [
    "README.md:6: mentions ../shared, which a user's checkout does not have; point to docs/ instead",
    'README.md:3: links to docs/b.md, but docs/b.md is not in the checkout',
    'README.md:4: links to docs/a.md#which-forecast-counts, but docs/a.md has no heading #which-forecast-counts',
    'README.md:5: links to ../elsewhere/x.md, outside the checkout',
    'README.md:12: links to docs/c.md, but docs/c.md is not in the checkout',
  ]);
});

test('heading anchors follow GitHub’s spelling', () => {
  assert.equal(headingSlug('Which forecasts count'), 'which-forecasts-count');
  assert.equal(headingSlug('Consequences: acting on a forecast'), 'consequences-acting-on-a-forecast');
  assert.equal(headingSlug('The `score --json` object'), 'the-score---json-object');
  assert.equal(headingSlug('`--db PATH`: which diary'), '--db-path-which-diary');
  assert.equal(headingSlug('"Did I see it first?": lead over a reference'), 'did-i-see-it-first-lead-over-a-reference');
});

test('the complete example in docs/diary-file.md is a diary file Forelog imports', () => {
  const page = fs.readFileSync(path.join(ROOT, 'docs', 'diary-file.md'), 'utf8');
  const section = page.slice(page.indexOf('## A complete example'));
  const json = /```json\n([\s\S]*?)```/.exec(section)?.[1];
  assert.ok(json, 'docs/diary-file.md has no JSON example under "A complete example"');
  const diary = parseDiaryFile(JSON.parse(json));
  assert.equal(diary.questions.length, 2);
  assert.equal(diary.questions[0]!.id, 'northgate-phase-2');
  assert.equal(diary.questions[1]!.id, undefined, 'the second question shows an import without an id');
  assert.equal(diary.settings?.default_miss_cost, 4);
});
