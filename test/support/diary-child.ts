/**
 * A second, real process holding a diary open, driven by the tests over stdin/stdout with
 * one JSON object per line — the way `forelog serve` or the desktop app holds the diary
 * while a command works on the same file. Started by `startDiaryProcess` (diary-process.ts).
 *
 * Requests:
 *   {"call": op, "request": {…}}                    one operation → {"envelope": …}
 *   {"loop": op, "request": {…}, "count": n}        n operations → {"done": n, "failures": [messages]}
 *   {"backup": file, "pauseMidway": true}           a backup that blocks this process once it is
 *                                                   partly written → {"paused": true}, then never returns
 *   {"close": true}                                 closes the diary and exits
 */
import readline from 'node:readline';
import { openDiary } from '../../main/service/index';

const [dbPath, busyTimeout] = process.argv.slice(2);
if (!dbPath) throw new Error('usage: diary-child.ts DB_PATH [BUSY_TIMEOUT_MS]');

const service = openDiary({ dbPath, busyTimeoutMs: busyTimeout ? Number(busyTimeout) : undefined, timeZone: 'UTC' });
const reply = (value: unknown) => process.stdout.write(`${JSON.stringify(value)}\n`);
reply({ ready: true, pid: process.pid });

const lines = readline.createInterface({ input: process.stdin });
let queue = Promise.resolve();
lines.on('line', (line) => {
  // One request at a time, in order, as a user's clicks reach the service.
  queue = queue
    .then(() => handle(JSON.parse(line) as Record<string, unknown>))
    .catch((err: unknown) => {
      reply({ crashed: String(err) });
    });
});

async function handle(msg: Record<string, unknown>): Promise<void> {
  if (typeof msg.call === 'string') {
    reply({ envelope: await service.dispatch(msg.call, msg.request) });
  } else if (typeof msg.loop === 'string') {
    const failures: string[] = [];
    const count = Number(msg.count);
    for (let i = 0; i < count; i++) {
      const answer = await service.dispatch(msg.loop, msg.request);
      if (!answer.ok) failures.push(`${answer.error.code}: ${answer.error.message}`);
    }
    reply({ done: count, failures });
  } else if (typeof msg.backup === 'string') {
    await service.backupTo(msg.backup, (percent) => {
      if (msg.pauseMidway && percent > 0 && percent < 100) {
        reply({ paused: true });
        // Block this process mid-copy so the test can kill it there.
        Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 120_000);
      }
    });
    reply({ backedUp: msg.backup });
  } else if (msg.close) {
    service.close();
    reply({ closed: true });
    process.exit(0);
  }
}
