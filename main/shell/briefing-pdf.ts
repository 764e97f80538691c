/**
 * "Save briefing as PDF" in the desktop app: the service renders the briefing's HTML (the
 * same page browser mode previews and prints), the shell lays it out in a hidden,
 * script-less window and prints it to an A4 PDF. Everything Electron-specific comes in as
 * functions, so this runs without Electron.
 */
import type { Envelope } from '../../shared/bridge';
import { ApiError, parseRequest } from '../../shared/contract';
import { writeFileAtomic } from '../files/atomic-write';
import { localDateStamp } from './diary-files';

export interface BriefingPdfDeps {
  dispatch(operation: 'briefing', request: unknown): Promise<Envelope>;
  /** Resolves to the chosen path, or null when the user cancelled. */
  chooseSavePath(defaultName: string): Promise<string | null>;
  /** Lays the HTML out and prints it; resolves to the PDF's bytes. */
  renderPdf(html: string): Promise<Uint8Array>;
  today(): Date;
}

/** A file-name-safe form of a tag (`client:norrowby` → `client-norrowby`). */
export function briefingFileName(tag: string | undefined, today: Date): string {
  const subject = tag ? tag.replace(/[^a-z0-9_-]+/gi, '-').replace(/^-+|-+$/g, '') : 'whole-diary';
  return `forelog-briefing-${subject || 'tag'}-${localDateStamp(today)}.pdf`;
}

/**
 * Returns the handler behind `window.forelog.saveBriefingPdf(request)`: `{ file }` when
 * saved, `null` when the user cancelled, an error envelope (nothing written) otherwise.
 */
export function briefingPdfSaver(deps: BriefingPdfDeps): (request: unknown) => Promise<Envelope<{ file: string } | null>> {
  return async (request) => {
    try {
      const valid = parseRequest('briefing', request ?? {});
      const answer = await deps.dispatch('briefing', valid);
      if (!answer.ok) return answer;
      const { html } = answer.value as { html: string };
      const file = await deps.chooseSavePath(briefingFileName(valid.tag, deps.today()));
      if (file === null) return { ok: true, value: null };
      const pdf = await deps.renderPdf(html);
      // Whole or not at all, so a failed save never leaves half a PDF behind.
      writeFileAtomic(file, pdf);
      return { ok: true, value: { file } };
    } catch (error) {
      if (error instanceof ApiError) return { ok: false, error: error.toBody().error };
      const detail = error instanceof Error ? error.message : String(error);
      return {
        ok: false,
        error: { code: 'internal', message: `The briefing could not be saved as PDF: ${detail}. Choose another folder, or use Download HTML and print it from a browser.`, fields: [] },
      };
    }
  };
}
