/**
 * registerIpc: one handler on the call channel that refuses frames other than our own
 * page, refuses unknown operation names, and otherwise answers with dispatch's envelope.
 * Source: Electron security checklist, "Validate the sender of all IPC messages"
 * (electronjs.org/docs/latest/tutorial/security), and shared/contract.ts for the names.
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { registerIpc, UNTRUSTED_SENDER_MESSAGE, type Dispatch } from '../../main/transport/ipc';
import { IPC_CALL_CHANNEL, type Envelope } from '../../shared/bridge';
import { APP_INDEX_URL, isAppDocument } from '../../main/shell/app-origin';

const OUR_PAGE = APP_INDEX_URL;

// The event is a stand-in for IpcMainInvokeEvent; only senderFrame is read.
type Handler = (event: any, operation: unknown, request: unknown) => Promise<Envelope>;

function setUp(dispatch?: Dispatch) {
  const registered = new Map<string, Handler>();
  const dispatched: { operation: string; request: unknown }[] = [];
  const ipcMain = {
    handle(channel: string, handler: Handler) {
      registered.set(channel, handler);
    },
  };
  registerIpc(
    ipcMain,
    dispatch ??
      (async (operation, request) => {
        dispatched.push({ operation, request });
        return { ok: true, value: { answered: operation } };
      }),
    isAppDocument,
  );
  assert.deepEqual([...registered.keys()], [IPC_CALL_CHANNEL]);
  return { handler: registered.get(IPC_CALL_CHANNEL)!, dispatched };
}

const from = (url: string | null) => ({ senderFrame: url === null ? null : { url } });

test('a call from our page reaches dispatch and its envelope comes back unchanged', async () => {
  const { handler, dispatched } = setUp();
  const answer = await handler(from(`${OUR_PAGE}#/questions`), 'getQuestion', { id: 'q1' });
  assert.deepEqual(dispatched, [{ operation: 'getQuestion', request: { id: 'q1' } }]);
  assert.deepEqual(answer, { ok: true, value: { answered: 'getQuestion' } });
});

test('a call from any other frame, or from a frame that has gone, is refused before dispatch', async () => {
  const { handler, dispatched } = setUp();
  for (const sender of [from('https://example.org/'), from('file:///tmp/evil.html'), from('forelog-app://app/other.html'), from(null), {}]) {
    const answer = await handler(sender, 'deleteQuestion', { id: 'q1' });
    assert.deepEqual(answer, { ok: false, error: { code: 'invalid', message: UNTRUSTED_SENDER_MESSAGE, fields: [] } });
  }
  assert.deepEqual(dispatched, []);
});

test('an unknown or non-text operation name is refused as invalid, naming it', async () => {
  const { handler, dispatched } = setUp();
  const unknown = await handler(from(OUR_PAGE), 'dropDatabase', {});
  assert.equal(unknown.ok, false);
  assert.ok(!unknown.ok && unknown.error.code === 'invalid' && unknown.error.message.includes('"dropDatabase"'));
  // Inherited object keys must not count as operations.
  const inherited = await handler(from(OUR_PAGE), 'toString', {});
  assert.ok(!inherited.ok && inherited.error.code === 'invalid');
  const numeric = await handler(from(OUR_PAGE), 42, {});
  assert.ok(!numeric.ok && numeric.error.message.includes('of type number'));
  assert.deepEqual(dispatched, []);
});

test('a dispatch that throws still answers with an internal envelope', async () => {
  const { handler } = setUp(async () => {
    throw new Error('disk I/O error');
  });
  const answer = await handler(from(OUR_PAGE), 'diaryInfo', {});
  assert.ok(!answer.ok);
  assert.equal(answer.error.code, 'internal');
  assert.match(answer.error.message, /disk I\/O error/);
});
