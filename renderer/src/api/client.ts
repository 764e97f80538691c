/**
 * The renderer's single door to the diary. Every operation of the shared contract becomes
 * `api.<operation>(request)`; underneath there is one `call`, which uses the desktop bridge
 * when the preload provided one and HTTP to `forelog serve` otherwise. Both answer with an
 * Envelope; a refusal becomes a thrown RequestError.
 */
import { API_PREFIX, type Envelope } from '../../../shared/bridge';
import { operations, type Api, type OperationName } from '../../../shared/contract';
import { RequestError } from './errors';
import { currentToken, takeTokenFromUrl } from './token';

takeTokenFromUrl();

async function viaHttp(operation: OperationName, request: unknown): Promise<Envelope> {
  const token = currentToken();
  let response: Response;
  try {
    response = await fetch(`${API_PREFIX}${operation}`, {
      method: 'POST',
      headers: {
        'Content-Type': 'application/json',
        ...(token ? { Authorization: `Bearer ${token}` } : {}),
      },
      body: JSON.stringify(request ?? {}),
    });
  } catch {
    throw new RequestError(
      'unreachable',
      'The diary did not answer. Check that forelog serve is still running in its terminal, then reload the page.',
      [],
      operation,
    );
  }
  if (response.status === 401 || response.status === 403) {
    throw new RequestError(
      'unauthorized',
      'The diary did not accept this page’s access token: the server was probably restarted, and each run has its own token. Open the address forelog serve printed when it started (its first line).',
      [],
      operation,
    );
  }
  try {
    return (await response.json()) as Envelope;
  } catch {
    throw new RequestError(
      'internal',
      `The diary answered ${response.status} without a readable reply. Reload the page; if it persists, stop forelog serve and start it again.`,
      [],
      operation,
    );
  }
}

async function call(operation: OperationName, request: unknown): Promise<unknown> {
  const bridge = window.forelog;
  const envelope = bridge ? await bridge.call(operation, request ?? {}) : await viaHttp(operation, request);
  if (envelope.ok) return envelope.value;
  const { code, message, fields, conflicts } = envelope.error;
  throw new RequestError(code, message, fields ?? [], operation, conflicts ?? []);
}

function buildApi(): Api {
  const entries = (Object.keys(operations) as OperationName[]).map((name) => [
    name,
    (request: unknown) => call(name, request),
  ]);
  return Object.fromEntries(entries) as Api;
}

export const api: Api = buildApi();

/**
 * Desktop-only: save the briefing for a tag as a PDF (the shell asks where). Null in browser
 * mode, where the page prints through the browser's own dialog instead. Resolves the saved
 * file's path, or null when the user cancelled.
 */
export const saveBriefingPdf: ((request: { tag?: string; threshold?: number }) => Promise<string | null>) | null = window.forelog
  ?.saveBriefingPdf
  ? async (request) => {
      const envelope = await window.forelog!.saveBriefingPdf!(request);
      if (!envelope.ok) {
        const { code, message, fields } = envelope.error;
        throw new RequestError(code, message, fields ?? [], 'briefing');
      }
      return envelope.value?.file ?? null;
    }
  : null;
