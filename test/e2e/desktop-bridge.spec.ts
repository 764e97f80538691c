/**
 * The renderer over the desktop transport. The Electron runtime cannot run here, so the
 * page gets a stand-in `window.forelog` (the ForelogBridge the preload exposes) before its
 * own scripts run; the stand-in forwards each call to the diary over HTTP and records it.
 * This checks what the renderer does differently in the desktop app: it talks only through
 * the bridge, follows `onOpenQuestion` (a clicked notification), and offers "Save as PDF…"
 * for the briefing through `saveBriefingPdf`.
 */
import { expect, test } from '@playwright/test';
import type { ForelogBridge } from '../../shared/bridge';
import { useDiaryServer } from './serve';

const server = useDiaryServer();

declare global {
  interface Window {
    forelog?: ForelogBridge;
    __bridgeCalls: { operation: string; request: unknown }[];
    __pdfRequests: unknown[];
    __openQuestion: ((id: string) => void) | null;
  }
}

test('the page uses the desktop bridge for every call, follows notification clicks and saves the briefing as PDF', async ({ browser }) => {
  const ctx = await browser.newContext();
  await ctx.addInitScript(() => {
    const token = new URLSearchParams(window.location.search).get('token');
    window.__bridgeCalls = [];
    window.__pdfRequests = [];
    window.__openQuestion = null;
    window.forelog = {
      async call(operation, request) {
        window.__bridgeCalls.push({ operation, request });
        const response = await fetch(`/api/${operation}`, {
          method: 'POST',
          headers: { 'Content-Type': 'application/json', Authorization: `Bearer ${token}` },
          body: JSON.stringify(request),
        });
        return response.json();
      },
      onOpenQuestion(listener) {
        window.__openQuestion = listener;
        return () => {
          window.__openQuestion = null;
        };
      },
      async saveBriefingPdf(request) {
        window.__pdfRequests.push(request);
        return { ok: true, value: { file: '/home/tester/Documents/forelog-briefing.pdf' } };
      },
    };
  });
  const page = await ctx.newPage();
  const httpCallsFromPage: string[] = [];
  page.on('request', (r) => {
    if (r.url().includes('/api/') && !r.frame().url().includes('about:')) httpCallsFromPage.push(r.url());
  });
  try {
    await page.goto(`${server().url}#/questions`);
    await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
    await page.getByRole('button', { name: /load the example diary/i }).click();
    await expect(page.getByRole('link', { name: /Norrowby/ }).first()).toBeVisible();
    const calls = await page.evaluate(() => window.__bridgeCalls.map((c) => c.operation));
    expect(calls).toContain('loadDemo');
    expect(calls).toContain('listQuestions');
    // Every API request the page made went through the stand-in bridge (one fetch per call).
    expect(httpCallsFromPage.length).toBe(calls.length);

    // A clicked notification: main sends the question id; the window shows that question.
    const id = await page.evaluate(async () => {
      const list = (await window.forelog!.call('listQuestions', {})) as { ok: true; value: { questions: { id: string; title: string }[] } };
      const first = list.value.questions[0]!;
      window.__openQuestion!(first.id);
      return first.id;
    });
    await expect.poll(() => page.evaluate(() => window.location.hash)).toBe(`#/questions/${encodeURIComponent(id)}`);

    // The briefing: the desktop app offers Save as PDF, which goes to the shell with the tag.
    await page.goto(`${server().url}#/hindsight`);
    await page.getByLabel('Tag', { exact: true }).selectOption('delivery');
    await page.getByRole('button', { name: /briefing for this tag/i }).click();
    await page.getByRole('button', { name: 'Save as PDF…' }).click();
    await expect(page.getByText('Saved the briefing as /home/tester/Documents/forelog-briefing.pdf.')).toBeVisible();
    expect(await page.evaluate(() => window.__pdfRequests)).toEqual([{ tag: 'delivery', threshold: 0.8 }]);
  } finally {
    await ctx.close();
  }
});
