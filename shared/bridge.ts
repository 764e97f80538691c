/**
 * The wire shape shared by both transports. Each call answers with an envelope rather
 * than a thrown error, because Electron's IPC keeps only an error's message and we want
 * the code and the per-field reasons to reach the screen intact.
 */
import type { ApiErrorBody, OperationName } from './contract';

export type Envelope<T = unknown> = { ok: true; value: T } | { ok: false; error: ApiErrorBody['error'] };

/** What the desktop preload puts on `window.forelog`, and nothing else. */
export interface ForelogBridge {
  call(operation: OperationName, request: unknown): Promise<Envelope>;
  /** Main asks the window to show a question (a notification was clicked). Returns an unsubscribe. */
  onOpenQuestion(listener: (questionId: string) => void): () => void;
  /**
   * Desktop app only: asks where to save, then prints the briefing for a tag to PDF.
   * Resolves `{ file }`, or `null` when the user cancelled. Browser mode has no such
   * method (the page prints through the browser instead).
   */
  saveBriefingPdf?(request: { tag?: string; threshold?: number }): Promise<Envelope<{ file: string } | null>>;
}

/** IPC channel names: one for calls, one for main → window navigation. */
export const IPC_CALL_CHANNEL = 'forelog:call';
export const IPC_OPEN_QUESTION_CHANNEL = 'forelog:open-question';
export const IPC_BRIEFING_PDF_CHANNEL = 'forelog:briefing-pdf';

/** HTTP: POST `${API_PREFIX}${operation}` with a JSON body and `Authorization: Bearer <token>`. */
export const API_PREFIX = '/api/';
