/**
 * The shell's Content-Security-Policy, enforced by a real Chromium (Debian's, driven by
 * Playwright), on a page that does what the renderer does: React elements with style
 * props and a Chart.js chart. Checks that the policy needs no 'unsafe-inline' for styles
 * (React and Chart.js style through the CSSOM, which CSP does not govern — W3C CSP Level 3,
 * §6.1.3 'style-src-attr' covers only style attributes set from markup or setAttribute),
 * and that what it exists to stop is stopped: inline script, eval, inline <style>, style
 * attributes in markup.
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { build } from 'esbuild';
import { chromium } from '@playwright/test';
import { withContentSecurityPolicy } from '../../main/shell/csp';

const CHROMIUM = process.env.FORELOG_CHROMIUM ?? '/usr/bin/chromium';
const ORIGIN = 'http://forelog.test';

const PAGE_SCRIPT = `
import { createElement } from 'react';
import { flushSync } from 'react-dom';
import { createRoot } from 'react-dom/client';
import Chart from 'chart.js/auto';

const root = createRoot(document.getElementById('root'));
flushSync(() => {
  root.render(createElement('div', null,
    createElement('div', { id: 'react-styled', style: { width: '37px', height: '11px', backgroundColor: 'rgb(1, 2, 3)' } }),
    createElement('div', { style: { width: '300px', height: '150px' } }, createElement('canvas', { id: 'chart' })),
  ));
});
const chart = new Chart(document.getElementById('chart'), {
  type: 'line',
  data: { labels: ['a', 'b', 'c'], datasets: [{ label: 'Brier', data: [0.2, 0.15, 0.1] }] },
  options: { animation: false },
});
let evalBlocked = false;
try { eval('1 + 1'); } catch (error) { evalBlocked = error instanceof EvalError; }
window.__result = {
  reactWidth: getComputedStyle(document.getElementById('react-styled')).width,
  reactColour: getComputedStyle(document.getElementById('react-styled')).backgroundColor,
  chartWidth: chart.width,
  chartImage: chart.toBase64Image().startsWith('data:image/png'),
  inlineScriptRan: window.__inlineScriptRan === true,
  attributeWidth: getComputedStyle(document.getElementById('attribute-styled')).width,
  inlineStyleColour: getComputedStyle(document.getElementById('inline-styled')).color,
  evalBlocked,
};
`;

const PAGE_HTML = `<!doctype html>
<html><head><meta charset="utf-8"><title>csp</title>
<style>#inline-styled { color: rgb(200, 0, 0); }</style>
<script>window.__inlineScriptRan = true;</script>
</head><body>
<div id="root"></div>
<div id="attribute-styled" style="width: 50px">x</div>
<p id="inline-styled">text</p>
<script src="/app.js"></script>
</body></html>`;

test('the policy lets React style props and Chart.js work, and blocks inline script, eval and inline styles', async () => {
  const bundled = await build({
    stdin: { contents: PAGE_SCRIPT, resolveDir: process.cwd(), loader: 'js' },
    bundle: true,
    write: false,
    format: 'iife',
    platform: 'browser',
    define: { 'process.env.NODE_ENV': '"production"' },
    logLevel: 'silent',
  });
  const script = bundled.outputFiles[0]!.text;

  const browser = await chromium.launch({ executablePath: CHROMIUM });
  try {
    const page = await browser.newPage();
    const refusals: string[] = [];
    page.on('console', (message) => {
      if (message.text().includes('Content Security Policy')) refusals.push(message.text());
    });
    await page.route(`${ORIGIN}/**`, (route) => {
      const isScript = route.request().url().endsWith('/app.js');
      return route.fulfill({
        status: 200,
        headers: withContentSecurityPolicy({ 'content-type': [isScript ? 'text/javascript' : 'text/html'] }) as Record<string, string>,
        body: isScript ? script : PAGE_HTML,
      });
    });
    await page.goto(`${ORIGIN}/index.html`);
    // globalThis is the page's window; this project's Node lib has no DOM types.
    await page.waitForFunction(() => (globalThis as { __result?: unknown }).__result !== undefined);
    const result = await page.evaluate(() => (globalThis as unknown as { __result: Record<string, unknown> }).__result);

    // Allowed: CSSOM styles from React and Chart.js, data: images.
    assert.equal(result.reactWidth, '37px');
    assert.equal(result.reactColour, 'rgb(1, 2, 3)');
    assert.ok((result.chartWidth as number) > 0, 'the chart was laid out');
    assert.equal(result.chartImage, true);
    // Blocked: inline <script>, eval, inline <style>, style="" in markup.
    assert.equal(result.inlineScriptRan, false);
    assert.equal(result.evalBlocked, true);
    assert.notEqual(result.attributeWidth, '50px');
    assert.notEqual(result.inlineStyleColour, 'rgb(200, 0, 0)');
    // The console names each refused inline item: one script, one <style>, one style="";
    // nothing else was refused, so React and Chart.js caused none.
    assert.equal(refusals.length, 3, refusals.join('\n'));
    assert.equal(refusals.filter((text) => /inline script violates .*script-src 'self'/.test(text)).length, 1);
    assert.equal(refusals.filter((text) => /inline style violates .*style-src 'self'/.test(text)).length, 2);
  } finally {
    await browser.close();
  }
});
