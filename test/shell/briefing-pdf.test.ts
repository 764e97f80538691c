/**
 * Saving the briefing as PDF in the desktop app: the request is validated like every API
 * call, the user picks the file, the PDF is written whole or not at all, and a cancelled
 * dialog writes nothing. Electron's parts are plain functions here.
 */
import assert from 'node:assert/strict';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { test } from 'node:test';
import type { Envelope } from '../../shared/bridge';
import { briefingFileName, briefingPdfSaver, type BriefingPdfDeps } from '../../main/shell/briefing-pdf';

const PDF = new TextEncoder().encode('%PDF-1.7\n…');

function setup(overrides: Partial<BriefingPdfDeps> = {}) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'forelog-pdf-'));
  const calls: { operation: string; request: unknown }[] = [];
  const rendered: string[] = [];
  const deps: BriefingPdfDeps = {
    async dispatch(operation, request): Promise<Envelope> {
      calls.push({ operation, request });
      return { ok: true, value: { html: '<!doctype html><title>b</title>', title: 'b' } };
    },
    chooseSavePath: async (name) => path.join(dir, name),
    renderPdf: async (html) => {
      rendered.push(html);
      return PDF;
    },
    today: () => new Date(2026, 11, 1),
    ...overrides,
  };
  return { dir, calls, rendered, save: briefingPdfSaver(deps) };
}

test('saves the briefing for a tag as a PDF under a file name made from the tag', async () => {
  const { dir, calls, rendered, save } = setup();
  const answer = await save({ tag: 'client:norrowby' });
  const file = path.join(dir, 'forelog-briefing-client-norrowby-2026-12-01.pdf');
  assert.deepEqual(answer, { ok: true, value: { file } });
  assert.deepEqual(calls, [{ operation: 'briefing', request: { tag: 'client:norrowby', threshold: 0.8 } }]);
  assert.deepEqual(rendered, ['<!doctype html><title>b</title>']);
  assert.deepEqual(new Uint8Array(fs.readFileSync(file)), PDF);
  assert.deepEqual(fs.readdirSync(dir), [path.basename(file)], 'no temporary file left');
  assert.equal(briefingFileName(undefined, new Date(2026, 0, 5)), 'forelog-briefing-whole-diary-2026-01-05.pdf');
});

test('a cancelled dialog writes nothing; a bad request is refused before anything runs', async () => {
  const cancelled = setup({ chooseSavePath: async () => null });
  assert.deepEqual(await cancelled.save({}), { ok: true, value: null });
  assert.deepEqual(fs.readdirSync(cancelled.dir), []);
  assert.deepEqual(cancelled.rendered, []);

  const bad = setup();
  const answer = await bad.save({ tag: 'Not A Tag', threshold: 2 });
  assert.equal(answer.ok, false);
  assert.ok(!answer.ok && answer.error.code === 'invalid' && /tag: is not a valid tag/.test(answer.error.message));
  assert.deepEqual(bad.calls, []);
});

test('a failed print reports what to do and leaves no partial file', async () => {
  const { dir, save } = setup({
    renderPdf: async () => {
      throw new Error('printing failed');
    },
  });
  const answer = await save({ tag: 'renewals' });
  assert.ok(!answer.ok && /could not be saved as PDF: printing failed/.test(answer.error.message));
  assert.deepEqual(fs.readdirSync(dir), []);
});
