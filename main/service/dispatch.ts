/**
 * The one entry both transports and the command line use: validate the request against
 * the contract, run the handler, and answer with an envelope that never throws.
 */
import { ApiError, isOperationName, parseRequest, type ApiErrorCode, type Handlers, type OperationName } from '../../shared/contract';
import type { Envelope } from '../../shared/bridge';
import { toStoreError, type StoreProblem } from '../store/errors';

export type Dispatch = (operation: string, request: unknown) => Promise<Envelope>;

/** The API code each failure of the diary file travels under. */
const STORE_CODES: Record<StoreProblem, ApiErrorCode> = {
  missing: 'not_found',
  busy: 'busy',
  read_only: 'read_only',
  disk_full: 'disk_full',
  damaged: 'storage',
  io_error: 'storage',
  not_a_diary: 'storage',
};

/**
 * The ApiError for a failure of the diary file at `location` (busy, read-only, disk full,
 * damaged, unreadable), or null when `err` is something else. The command line prints the
 * same messages.
 */
export function storeFailure(err: unknown, location: string): ApiError | null {
  const failure = toStoreError(err, location);
  return failure ? new ApiError(STORE_CODES[failure.problem], failure.message) : null;
}

/** `location` is the diary file's path, named in messages about the file itself. */
export function createDispatch(handlers: Handlers, onInternalError: (err: unknown) => void, location: string): Dispatch {
  return async (operation, request) => {
    try {
      if (!isOperationName(operation)) {
        throw new ApiError('invalid', `Unknown operation "${operation}". Nothing was changed.`);
      }
      const valid = parseRequest(operation, request);
      const handler = handlers[operation] as (r: unknown) => unknown;
      const value = await handler(valid);
      return { ok: true, value };
    } catch (err) {
      return { ok: false, error: toErrorBody(err, location, onInternalError) };
    }
  };
}

function toErrorBody(err: unknown, location: string, onInternalError: (err: unknown) => void): Extract<Envelope, { ok: false }>['error'] {
  if (err instanceof ApiError) return err.toBody().error;
  const failure = storeFailure(err, location);
  if (failure) return failure.toBody().error;
  onInternalError(err);
  const detail = err instanceof Error ? err.message : String(err);
  return {
    code: 'internal',
    message: `Forelog could not complete this: ${detail}. Nothing was changed; if it happens again, make a backup and report it.`,
    fields: [],
  };
}

/** Calls an operation and returns its value, or throws the ApiError it answered with. */
export async function callOrThrow<K extends OperationName>(dispatch: Dispatch, operation: K, request: unknown): Promise<unknown> {
  const answer = await dispatch(operation, request);
  if (!answer.ok) throw new ApiError(answer.error.code, answer.error.message, answer.error.fields, answer.error.conflicts);
  return answer.value;
}
