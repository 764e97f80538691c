/**
 * Test-only: makes `import … from 'electron'` load test/shell/fake-electron.ts, so the
 * shell's wiring can be exercised under plain Node, where the Electron runtime is absent.
 * Use after tsx: node --test --import tsx --import ./test/shell/register-fake-electron.mjs …
 */
import { register } from 'node:module';

register('./fake-electron-resolve.mjs', import.meta.url, {
  data: { fakeUrl: new URL('./fake-electron.ts', import.meta.url).href },
});
