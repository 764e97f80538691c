/**
 * The addresses the desktop menu opens (main/shell/menu.ts ROUTES) all lead somewhere:
 * each screen's heading shows, and "New question…" (#/questions?new=1) opens the quick-add
 * form and takes the flag off the address so Back does not reopen it.
 */
import { expect, test } from '@playwright/test';
import { ROUTES } from '../../main/shell/menu';
import { openApp, useDiaryServer } from './serve';

const server = useDiaryServer();

test('every menu route shows a screen', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, '');
  try {
    for (const route of Object.values(ROUTES)) {
      await app.page.evaluate((hash) => {
        window.location.hash = hash;
      }, route);
      await expect(app.page.getByRole('heading', { level: 1 })).toBeVisible();
      await expect(app.page.getByText('Nothing lives at this address')).toHaveCount(0);
    }
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('New question from the menu opens the quick-add form', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, 'questions?new=1');
  try {
    await expect(app.page.getByRole('dialog')).toBeVisible();
    await expect.poll(() => app.page.evaluate(() => window.location.hash)).toBe('#/questions');
  } finally {
    await app.close();
  }
});
