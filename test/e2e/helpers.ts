/** Steps several e2e files share: adding a question through the quick-add form. */
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

/** A datetime-local value `days` from now (UTC clock), for closes that must lie ahead. */
export function daysFromNow(days: number): string {
  return new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 16);
}
