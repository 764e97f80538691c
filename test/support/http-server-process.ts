/**
 * Runs the real browser-mode server in a process of its own, so a test can tell whether a
 * request ended it. Arguments: the diary file and the folder of renderer files to serve.
 * Prints one line, `<port> <token>`, once it listens; stops on SIGTERM.
 */
import { openDiary } from '../../main/service/index';
import { startHttpServer } from '../../main/transport/http';

const [dbPath, rendererDir] = process.argv.slice(2);
if (!dbPath || !rendererDir) throw new Error('usage: http-server-process.ts DB RENDERER_DIR');
const service = openDiary({ dbPath, timeZone: 'UTC' });
const server = await startHttpServer({ dispatch: service.dispatch, rendererDir, port: 0 });
process.stdout.write(`${server.port} ${server.token}\n`);
process.on('SIGTERM', () => {
  void server.close().then(() => {
    service.close();
    process.exit(0);
  });
});
