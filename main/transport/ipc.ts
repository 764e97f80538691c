/**
 * The desktop transport: the window's `window.forelog.call(op, req)` arrives here through
 * ipcRenderer.invoke. Each call is checked for where it came from and for a known
 * operation name, then handed to the service's dispatch, which validates the request
 * against the contract. Failures travel back as envelopes, never as thrown errors,
 * because Electron's IPC would keep only an error's message.
 */
import type { IpcMain, IpcMainInvokeEvent } from 'electron';
import { IPC_BRIEFING_PDF_CHANNEL, IPC_CALL_CHANNEL, type Envelope } from '../../shared/bridge';
import { isOperationName, type OperationName } from '../../shared/contract';

export type Dispatch = (operation: OperationName, request: unknown) => Promise<Envelope>;

export const UNTRUSTED_SENDER_MESSAGE =
  "Refused: the request did not come from Forelog's own window. Nothing was changed; use the Forelog window to work with your diary.";

function failure(code: 'invalid' | 'internal', message: string): Envelope {
  return { ok: false, error: { code, message, fields: [] } };
}

/**
 * Registers the one IPC handler. `isTrustedSender` gets the URL of the frame that sent
 * the call; a frame that has gone (null) is refused as well, since its origin is unknown.
 */
export function registerIpc(
  ipcMain: Pick<IpcMain, 'handle'>,
  dispatch: Dispatch,
  isTrustedSender: (frameUrl: string) => boolean,
  saveBriefingPdf?: (request: unknown) => Promise<Envelope>,
): void {
  if (saveBriefingPdf) {
    ipcMain.handle(IPC_BRIEFING_PDF_CHANNEL, async (event: IpcMainInvokeEvent, request: unknown): Promise<Envelope> => {
      const frameUrl = event.senderFrame?.url;
      if (frameUrl === undefined || !isTrustedSender(frameUrl)) return failure('invalid', UNTRUSTED_SENDER_MESSAGE);
      return saveBriefingPdf(request);
    });
  }
  ipcMain.handle(IPC_CALL_CHANNEL, async (event: IpcMainInvokeEvent, operation: unknown, request: unknown): Promise<Envelope> => {
    const frameUrl = event.senderFrame?.url;
    if (frameUrl === undefined || !isTrustedSender(frameUrl)) return failure('invalid', UNTRUSTED_SENDER_MESSAGE);
    if (typeof operation !== 'string' || !isOperationName(operation)) {
      const shown = typeof operation === 'string' ? `"${operation.slice(0, 80)}"` : `of type ${typeof operation}`;
      return failure('invalid', `Unknown operation ${shown}. Nothing was changed; the operation names are listed in shared/contract.ts.`);
    }
    try {
      return await dispatch(operation, request);
    } catch (error) {
      // dispatch promises never to throw; if it does, the window still gets an envelope.
      const message = error instanceof Error ? error.message : String(error);
      return failure('internal', `The diary could not complete "${operation}": ${message}. Nothing was changed; restart Forelog and try again.`);
    }
  });
}
