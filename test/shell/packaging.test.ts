/**
 * electron-builder.yml as electron-builder itself reads and validates it (its own loader and
 * JSON schema, where FuseOptionsV1 allows no unknown keys, so a misspelt fuse fails here
 * rather than being ignored at packaging time). Expected fuse values: Electron's "Electron
 * Fuses" guide and security checklist; key names: app-builder-lib's FuseOptionsV1.
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { fileURLToPath } from 'node:url';
import { getConfig, validateConfiguration } from 'app-builder-lib/out/util/config/config';
import { DebugLogger } from 'builder-util';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));

test('the packaged binary gets the hardening fuses, under the key names electron-builder knows', async () => {
  const config = await getConfig(ROOT, 'electron-builder.yml', null);
  await validateConfiguration(config, new DebugLogger(false));
  assert.deepEqual(config.electronFuses, {
    runAsNode: false,
    enableCookieEncryption: true,
    enableNodeOptionsEnvironmentVariable: false,
    enableNodeCliInspectArguments: false,
    enableEmbeddedAsarIntegrityValidation: true,
    onlyLoadAppFromAsar: true,
    grantFileProtocolExtraPrivileges: false,
  });
  // The fuses that guard app.asar need an asar to guard: packing into one stays on.
  assert.notEqual(config.asar, false);

  // The check can fail: one letter off in a fuse name is refused.
  const misspelt = { ...config, electronFuses: { ...config.electronFuses, runAsnode: false } };
  await assert.rejects(validateConfiguration(misspelt, new DebugLogger(false)), /electronFuses/);
});
