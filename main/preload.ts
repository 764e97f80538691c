/**
 * The preload: puts `window.forelog` (ForelogBridge) into the page's world and nothing
 * else. It runs sandboxed, so it may require only 'electron'; scripts/build-main.mjs
 * bundles it to CommonJS and fails the build if anything else is required. The IPC
 * event object is never handed to the page, only the question id it carries.
 */
import { contextBridge, ipcRenderer, type IpcRendererEvent } from 'electron';
import { IPC_BRIEFING_PDF_CHANNEL, IPC_CALL_CHANNEL, IPC_OPEN_QUESTION_CHANNEL, type Envelope, type ForelogBridge } from '../shared/bridge';

const bridge: ForelogBridge = {
  call(operation, request): Promise<Envelope> {
    return ipcRenderer.invoke(IPC_CALL_CHANNEL, operation, request);
  },
  onOpenQuestion(listener) {
    const relay = (_event: IpcRendererEvent, questionId: unknown) => {
      if (typeof questionId === 'string') listener(questionId);
    };
    ipcRenderer.on(IPC_OPEN_QUESTION_CHANNEL, relay);
    return () => {
      ipcRenderer.removeListener(IPC_OPEN_QUESTION_CHANNEL, relay);
    };
  },
  saveBriefingPdf(request) {
    return ipcRenderer.invoke(IPC_BRIEFING_PDF_CHANNEL, request);
  },
};

contextBridge.exposeInMainWorld('forelog', bridge);
