/**
 * The preload exposes exactly `window.forelog` (ForelogBridge) and routes calls to
 * ipcRenderer.invoke. Run with the fake electron module (see register-fake-electron.mjs).
 * Source for the expected pattern: Electron docs, "Context Isolation" and
 * "Inter-Process Communication" (contextBridge.exposeInMainWorld + ipcRenderer.invoke,
 * never exposing ipcRenderer or the IPC event itself).
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { fake, ipcRenderer } from './fake-electron';
import '../../main/preload';
import { IPC_BRIEFING_PDF_CHANNEL, IPC_CALL_CHANNEL, IPC_OPEN_QUESTION_CHANNEL, type ForelogBridge } from '../../shared/bridge';

function exposedBridge(): ForelogBridge {
  assert.equal(fake.exposed.length, 1);
  return fake.exposed[0]!.api as ForelogBridge;
}

test('exposes one key, forelog, with only call, onOpenQuestion and saveBriefingPdf', () => {
  assert.deepEqual(
    fake.exposed.map((e) => e.key),
    ['forelog'],
  );
  assert.deepEqual(Object.keys(exposedBridge()).sort(), ['call', 'onOpenQuestion', 'saveBriefingPdf']);
});

test('saveBriefingPdf(req) is ipcRenderer.invoke on its own channel with the request only', async () => {
  fake.invocations.length = 0;
  fake.invokeResult = { ok: true, value: { file: '/home/tester/briefing.pdf' } };
  const answer = await exposedBridge().saveBriefingPdf!({ tag: 'renewals' });
  assert.deepEqual(fake.invocations, [{ channel: IPC_BRIEFING_PDF_CHANNEL, args: [{ tag: 'renewals' }] }]);
  assert.deepEqual(answer, fake.invokeResult);
});

test('call(op, req) is ipcRenderer.invoke on the call channel with op and req, and returns its answer', async () => {
  fake.invocations.length = 0;
  fake.invokeResult = { ok: true, value: { questions: [], tags: [], total: 0 } };
  const request = { status: 'open' };
  const answer = await exposedBridge().call('listQuestions', request);
  assert.deepEqual(fake.invocations, [{ channel: IPC_CALL_CHANNEL, args: ['listQuestions', request] }]);
  assert.deepEqual(answer, fake.invokeResult);
});

test('onOpenQuestion passes on the question id only, and its unsubscribe stops delivery', () => {
  const received: unknown[] = [];
  const unsubscribe = exposedBridge().onOpenQuestion((id) => received.push(id));
  const ipcEvent = { sender: 'main-process-internals' };
  ipcRenderer.emit(IPC_OPEN_QUESTION_CHANNEL, ipcEvent, 'q-7');
  ipcRenderer.emit(IPC_OPEN_QUESTION_CHANNEL, ipcEvent, { not: 'an id' });
  assert.deepEqual(received, ['q-7']);
  assert.equal(ipcRenderer.listenerCount(IPC_OPEN_QUESTION_CHANNEL), 1);
  unsubscribe();
  assert.equal(ipcRenderer.listenerCount(IPC_OPEN_QUESTION_CHANNEL), 0);
  ipcRenderer.emit(IPC_OPEN_QUESTION_CHANNEL, ipcEvent, 'q-8');
  assert.deepEqual(received, ['q-7']);
});
