/**
 * End-to-end tests: the built renderer in Debian's Chromium against `forelog serve` with a
 * real diary file (see test/e2e/serve.ts). The renderer is rebuilt first so the tests never
 * run against a stale build.
 */
import { defineConfig } from '@playwright/test';

export default defineConfig({
  testDir: 'test/e2e',
  testMatch: '**/*.spec.ts',
  outputDir: 'test-results',
  globalSetup: './test/e2e/build-renderer.ts',
  workers: 1,
  // One retry, common practice for browser tests on a shared CI machine: a test that fails
  // twice still fails the run, and one that passes only on its retry is listed as "flaky"
  // in the log, so a timing race stays visible without costing a whole run.
  retries: 1,
  fullyParallel: false,
  forbidOnly: true,
  reporter: 'list',
  timeout: 30_000,
  expect: { timeout: 5_000 },
  use: {
    launchOptions: {
      executablePath: '/usr/bin/chromium',
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    },
    viewport: { width: 1280, height: 860 },
    locale: 'en-GB',
    timezoneId: 'Europe/London',
    trace: 'off',
  },
});
