/**
 * Every screen, in the light and the dark colour scheme: an axe-core scan (WCAG 2.0–2.2 A/AA
 * rules, axe's best practices) must find no serious or critical violation, and a full-page
 * screenshot goes to test/e2e/artifacts/<screen>-<scheme>.png for a person to look at.
 * The tests run in order on one diary: empty first, then with the example diary loaded.
 */
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Browser, type Page } from '@playwright/test';
import { openApp, useDiaryServer } from './serve';

const server = useDiaryServer();
test.describe.configure({ mode: 'serial' });

const SCHEMES = ['light', 'dark'] as const;
type Scheme = (typeof SCHEMES)[number];

async function expectNoSeriousViolations(page: Page, screen: string): Promise<void> {
  const results = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa', 'best-practice'])
    .analyze();
  const serious = results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
  expect(serious, `axe found serious or critical problems on ${screen}`).toEqual([]);
}

/** Opens the app in `scheme`, goes to `hash`, lets `prepare` set the scene, then scans and photographs. */
async function checkScreen(
  browser: Browser,
  scheme: Scheme,
  name: string,
  prepare: (page: Page) => Promise<void>,
  shot: 'full-page' | 'viewport' = 'full-page',
): Promise<void> {
  const app = await openApp(browser, server(), { colorScheme: scheme });
  try {
    await prepare(app.page);
    await expectNoSeriousViolations(app.page, `${name} (${scheme})`);
    // A modal covers the viewport only, so a dialog is photographed as the user sees it.
    await app.page.screenshot({ path: `test/e2e/artifacts/${name}-${scheme}.png`, fullPage: shot === 'full-page' });
    expect(app.problems, 'the page logged errors').toEqual([]);
  } finally {
    await app.close();
  }
}

for (const scheme of SCHEMES) {
  test(`Questions with an empty diary (${scheme})`, async ({ browser }) => {
    await checkScreen(browser, scheme, 'questions-empty', async (page) => {
      await expect(page.getByRole('button', { name: 'Load the example diary' })).toBeVisible();
    });
  });
}

test('the example diary loads from the empty screen', async ({ browser }) => {
  const app = await openApp(browser, server());
  try {
    await app.page.getByRole('button', { name: 'Load the example diary' }).click();
    await expect(app.page.getByTestId('toast').filter({ hasText: 'Loaded the example diary' })).toBeVisible();
    await expect(app.page.getByTestId('question-table').getByRole('link').first()).toBeVisible();
    expect(await app.page.getByTestId('question-table').getByRole('link').count()).toBeGreaterThan(3);
  } finally {
    await app.close();
  }
});

/**
 * Filters the list to one status and waits until the list shows that status only: the first
 * link clicked before the filtered page arrives would be a row of the unfiltered list.
 */
async function showOnly(page: Page, status: 'open' | 'resolved'): Promise<void> {
  await page.getByLabel('Status').selectOption(status);
  const table = page.getByTestId('question-table');
  await expect(table.locator(`.status-pill:not([data-status="${status}"])`)).toHaveCount(0);
  await expect(table.locator(`.status-pill[data-status="${status}"]`).first()).toBeVisible();
}

for (const scheme of SCHEMES) {
  test(`Questions with the example diary (${scheme})`, async ({ browser }) => {
    await checkScreen(browser, scheme, 'questions', async (page) => {
      await expect(page.getByTestId('question-table')).toBeVisible();
    });
  });

  test(`a resolved question's page (${scheme})`, async ({ browser }) => {
    await checkScreen(browser, scheme, 'question-resolved', async (page) => {
      await showOnly(page, 'resolved');
      await page.getByTestId('question-table').getByRole('link').first().click();
      await expect(page.getByTestId('history-chart')).toBeVisible();
      await expect(page.getByRole('button', { name: 'Reopen' })).toBeVisible();
    });
  });

  test(`an open question's page (${scheme})`, async ({ browser }) => {
    await checkScreen(browser, scheme, 'question-open', async (page) => {
      await showOnly(page, 'open');
      await page.getByTestId('question-table').getByRole('link').first().click();
      await expect(page.getByTestId('history-chart')).toBeVisible();
      await expect(page.getByRole('button', { name: 'Revise' })).toBeVisible();
    });
  });

  test(`the quick-add dialog (${scheme})`, async ({ browser }) => {
    await checkScreen(browser, scheme, 'quick-add', async (page) => {
      await page.getByRole('button', { name: /New question/ }).click();
      await expect(page.getByRole('dialog', { name: 'New question' })).toBeVisible();
      await expect(page.getByRole('textbox', { name: 'Question', exact: true })).toBeFocused();
    }, 'viewport');
  });
}
