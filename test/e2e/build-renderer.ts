/** Playwright global setup: build the renderer that `forelog serve` will hand to the browser. */
import { build } from 'vite';

export default async function buildRenderer(): Promise<void> {
  await build({ configFile: 'vite.config.ts', logLevel: 'warn' });
}
