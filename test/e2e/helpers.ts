/** Steps several e2e files share: adding a question through the quick-add form, or through the API and opening its page. */
import { expect, type Page } from '@playwright/test';

export interface QuickAddInput {
  title: string;
  rule?: string;
  /** datetime-local text, "YYYY-MM-DDTHH:MM" */
  closes: string;
  timeZone?: string;
  baseRate?: string;
  probability?: string;
  tags?: string[];
}

export async function fillQuickAdd(page: Page, input: QuickAddInput): Promise<void> {
  const dialog = page.getByRole('dialog', { name: 'New question' });
  await expect(dialog).toBeVisible();
  await dialog.getByRole('textbox', { name: 'Question', exact: true }).fill(input.title);
  if (input.rule) await dialog.getByLabel('Resolution rule').fill(input.rule);
  await dialog.getByRole('textbox', { name: 'Closes', exact: true }).fill(input.closes);
  if (input.timeZone) await dialog.getByLabel('Time zone for closes').selectOption(input.timeZone);
  if (input.baseRate) await dialog.getByRole('spinbutton', { name: 'Base rate', exact: true }).fill(input.baseRate);
  if (input.probability) await dialog.getByRole('spinbutton', { name: 'Your probability', exact: true }).fill(input.probability);
  for (const tag of input.tags ?? []) {
    await dialog.getByLabel('Tags', { exact: true }).fill(tag);
    await dialog.getByLabel('Tags', { exact: true }).press('Enter');
  }
}

export async function quickAdd(page: Page, input: QuickAddInput): Promise<void> {
  await page.getByRole('main').focus();
  await page.keyboard.press('n');
  await fillQuickAdd(page, input);
  await page.getByRole('dialog', { name: 'New question' }).getByRole('button', { name: 'Save question' }).click();
  await expect(page.getByRole('dialog', { name: 'New question' })).toBeHidden();
  await expect(page.getByTestId('toast').filter({ hasText: `Added “${input.title}”` })).toBeVisible();
}

/** The ISO 8601 instant `days` before now (negative: ahead), for times of seeded questions. */
export function daysAgo(days: number): string {
  return new Date(Date.now() - days * 86_400_000).toISOString();
}

/** A datetime-local value `days` from now (UTC clock), for closes that must lie ahead. */
export function daysFromNow(days: number): string {
  return new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 16);
}

/** POST /api/<operation> with the launch token, as the page itself does; throws on a refusal. */
export async function apiCall<T>(serverUrl: string, operation: string, request: object = {}): Promise<T> {
  const url = new URL(serverUrl);
  const response = await fetch(`${url.origin}/api/${operation}`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Authorization: `Bearer ${url.searchParams.get('token')}` },
    body: JSON.stringify(request),
  });
  const envelope = (await response.json()) as { ok: true; value: T } | { ok: false; error: unknown };
  if (!envelope.ok) throw new Error(`${operation} was refused: ${JSON.stringify(envelope.error)}`);
  return envelope.value;
}

/** Creates a question through the API (`request` as createQuestion takes it) and opens its page; returns its id. */
export async function openNewQuestion(page: Page, serverUrl: string, request: object): Promise<string> {
  const { id } = await apiCall<{ id: string }>(serverUrl, 'createQuestion', request);
  await page.goto(`${serverUrl.split('?')[0]}#/questions/${encodeURIComponent(id)}`);
  return id;
}

/** An axe scan with the WCAG 2.2 AA and best-practice rules; serious or critical findings fail. */
export async function expectNoSeriousViolations(page: Page, what: string): Promise<void> {
  const { default: AxeBuilder } = await import('@axe-core/playwright');
  const results = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa', 'best-practice'])
    .analyze();
  const serious = results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
  expect(serious, `axe found serious or critical problems on ${what}`).toEqual([]);
}

/**
 * Waits two animation frames: after a viewport change Chart.js redraws its canvases on the
 * next frame (its resize listener is throttled to animation frames), so a screenshot taken
 * at once can catch a cleared canvas.
 */
export async function afterRedraw(page: Page): Promise<void> {
  await page.evaluate(() => new Promise((resolve) => requestAnimationFrame(() => requestAnimationFrame(() => resolve(null)))));
}

/**
 * Waits for every Scorecard chart before a full-page photograph: a chart more than a screen's
 * height below the visible part is created just after the page appears, one per task.
 */
export async function drawEveryChart(page: Page): Promise<void> {
  await expect(page.locator('[data-scorecard-ready] canvas:not([data-drawn])')).toHaveCount(0);
  await afterRedraw(page);
}
