/**
 * The one entry both transports and the command line use: validate the request against
 * the contract, run the handler, and answer with an envelope that never throws.
 */
import { ApiError, isOperationName, parseRequest, type Handlers, type OperationName } from '../../shared/contract';
import type { Envelope } from '../../shared/bridge';

export type Dispatch = (operation: string, request: unknown) => Promise<Envelope>;

export function createDispatch(handlers: Handlers, onInternalError: (err: unknown) => void = () => {}): Dispatch {
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
      return { ok: false, error: toErrorBody(err, onInternalError) };
    }
  };
}

function toErrorBody(err: unknown, onInternalError: (err: unknown) => void): Extract<Envelope, { ok: false }>['error'] {
  if (err instanceof ApiError) return err.toBody().error;
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
  if (!answer.ok) throw new ApiError(answer.error.code, answer.error.message, answer.error.fields);
  return answer.value;
}
