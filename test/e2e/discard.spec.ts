/**
 * Typed text is never thrown away without asking: a half-filled dialog closed by Escape,
 * its × button, a click outside it or Cancel asks "Discard your changes?" (Keep editing /
 * Discard), while an untouched one just closes; Back or a reload behind a half-filled dialog
 * asks the same; leaving Settings with unsaved changes — a link, Back, or closing the tab —
 * asks too, and leaving after saving does not.
 */
import { expect, test, type Locator, type Page } from '@playwright/test';
import type { Settings } from '../../shared/domain';
import { apiCall, expectNoSeriousViolations, openNewQuestion } from './helpers';
import { openApp, useDiaryServer } from './serve';

const server = useDiaryServer();
test.describe.configure({ mode: 'serial' });

const prompt = (page: Page) => page.getByRole('alertdialog', { name: 'Discard your changes?' });

async function openQuickAdd(page: Page): Promise<Locator> {
  await page.getByRole('main').focus();
  await page.keyboard.press('n');
  const dialog = page.getByRole('dialog', { name: 'New question' });
  await expect(dialog).toBeVisible();
  return dialog;
}

test('an untouched New question closes without asking, even when the diary’s time zone arrives after it opened', async ({ browser }) => {
  // The diary's zone differs from this computer's, and its answer is held back until the form is open.
  await apiCall(server().url, 'updateSettings', { time_zone: 'Europe/Lisbon' });
  const context = await browser.newContext({ timezoneId: 'Pacific/Auckland' });
  const page = await context.newPage();
  let release = () => {};
  const held = new Promise<void>((resolve) => (release = resolve));
  await page.route('**/api/diaryInfo', async (route) => {
    await held;
    await route.continue();
  });
  try {
    await page.goto(`${server().url}#/questions`);
    await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
    const dialog = await openQuickAdd(page);
    const answered = page.waitForResponse('**/api/diaryInfo');
    release();
    await answered;
    await expect(dialog.getByRole('combobox', { name: 'Time zone for closes' })).toHaveValue('Europe/Lisbon');
    await page.keyboard.press('Escape');
    await expect(dialog).toBeHidden();
    await expect(prompt(page)).toHaveCount(0);
  } finally {
    await context.close();
  }
});

test('a half-filled dialog asks before Escape, ×, a click outside or Cancel throw the text away', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, 'questions');
  const { page } = app;
  try {
    // Untouched: Escape just closes.
    let dialog = await openQuickAdd(page);
    await page.keyboard.press('Escape');
    await expect(dialog).toBeHidden();
    await expect(prompt(page)).toHaveCount(0);

    dialog = await openQuickAdd(page);
    const title = dialog.getByRole('textbox', { name: 'Question', exact: true });
    await title.fill('Ferry operator confirms the winter timetable');

    const ways: [string, () => Promise<void>][] = [
      ['Escape', () => page.keyboard.press('Escape')],
      ['the × button', () => dialog.getByRole('button', { name: 'Close dialog' }).click()],
      // Top left of the window: on the backdrop, outside the dialog.
      ['a click outside', () => page.mouse.click(8, 8)],
      ['Cancel', () => dialog.getByRole('button', { name: 'Cancel' }).click()],
    ];
    for (const [way, close] of ways) {
      await close();
      await expect(prompt(page), way).toBeVisible();
      // Keep editing is the default: a reflexive Enter keeps the text.
      await expect(prompt(page).getByRole('button', { name: 'Keep editing' }), way).toBeFocused();
      if (way === 'Escape') {
        await expectNoSeriousViolations(page, 'the discard prompt');
        await page.screenshot({ path: 'test/e2e/artifacts/discard-prompt.png' });
      }
      await page.keyboard.press('Enter');
      await expect(prompt(page), way).toBeHidden();
      await expect(dialog, way).toBeVisible();
      await expect(title, way).toHaveValue('Ferry operator confirms the winter timetable');
    }

    // A click inside the dialog is not a click outside.
    await dialog.getByText('Write the call down now').click();
    await expect(prompt(page)).toHaveCount(0);

    await page.keyboard.press('Escape');
    await prompt(page).getByRole('button', { name: 'Discard' }).click();
    await expect(dialog).toBeHidden();
    await expect(page.getByRole('main')).toBeFocused();
    const list = await apiCall<{ questions: unknown[] }>(server().url, 'listQuestions', {});
    expect(list.questions).toHaveLength(0);
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('Edit asks only when something was changed', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, 'questions');
  const { page } = app;
  try {
    await openNewQuestion(page, server().url, {
      title: 'Depot lease renewed',
      closes_at: new Date(Date.now() + 30 * 86_400_000).toISOString(),
    });
    await page.getByRole('button', { name: 'Edit' }).click();
    const dialog = page.getByRole('dialog', { name: 'Edit question' });
    await page.keyboard.press('Escape');
    await expect(dialog).toBeHidden();

    await page.getByRole('button', { name: 'Edit' }).click();
    await dialog.getByRole('spinbutton', { name: 'Check in every' }).fill('3');
    await page.keyboard.press('Escape');
    await expect(prompt(page)).toBeVisible();
    await prompt(page).getByRole('button', { name: 'Discard' }).click();
    await expect(dialog).toBeHidden();
    await expect(page.getByRole('button', { name: 'Edit' })).toBeFocused();
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('what is typed in a Desk revise panel survives closing the panel', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, 'desk');
  const { page } = app;
  try {
    const now = Date.now();
    // A forecast 9 days old on a question with the default 7-day check-in: a check-in is due.
    await apiCall(server().url, 'createQuestion', {
      title: 'Canal bridge reopens before the festival',
      opened_at: new Date(now - 10 * 86_400_000).toISOString(),
      closes_at: new Date(now + 30 * 86_400_000).toISOString(),
      first_forecast: { p: 0.4, at: new Date(now - 9 * 86_400_000).toISOString() },
    });
    await page.reload();
    const item = page.getByTestId('desk-item').filter({ hasText: 'Canal bridge reopens' });
    await item.getByRole('button', { name: 'Revise' }).click();
    await item.getByRole('spinbutton', { name: 'New probability', exact: true }).fill('55');
    await item.getByRole('textbox', { name: 'What changed' }).fill('Contractor says the deck is poured');
    await page.keyboard.press('Escape');
    await expect(item.getByRole('textbox', { name: 'What changed' })).toHaveCount(0);
    await item.getByRole('button', { name: 'Revise' }).click();
    await expect(item.getByRole('spinbutton', { name: 'New probability', exact: true })).toHaveValue('55');
    await expect(item.getByRole('textbox', { name: 'What changed' })).toHaveValue('Contractor says the deck is poured');
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('Back or a reload with a half-filled dialog open asks before the text goes', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, 'questions');
  const { page } = app;
  try {
    const created = await apiCall<{ id: string }>(server().url, 'createQuestion', {
      title: 'Harbour crane contract is extended',
      closes_at: new Date(Date.now() + 30 * 86_400_000).toISOString(),
      first_forecast: { p: 0.4 },
    });
    await page.reload();
    await page.getByRole('link', { name: 'Harbour crane contract is extended' }).click();
    await expect(page.getByRole('heading', { level: 1 })).toHaveText('Harbour crane contract is extended');
    await page.getByRole('button', { name: 'Revise' }).click();
    const dialog = page.getByRole('dialog', { name: 'Revise your forecast' });
    const note = dialog.getByRole('textbox', { name: 'What changed' });
    await note.fill('Port authority board moved the vote forward');

    // Back: the dialog goes with its screen, so the address stays until the user answers.
    // (history.back: Playwright's goBack would wait for a navigation the guard holds back.)
    await page.evaluate(() => window.history.back());
    await expect(prompt(page)).toBeVisible();
    await expect(page).toHaveURL(new RegExp(`#/questions/${encodeURIComponent(created.id)}$`));
    await prompt(page).getByRole('button', { name: 'Keep editing' }).click();
    await expect(note).toHaveValue('Port authority board moved the vote forward');

    // A second Back asks again; Discard goes where Back was going, and nothing was saved.
    await page.evaluate(() => window.history.back());
    await prompt(page).getByRole('button', { name: 'Discard' }).click();
    await expect(page.getByRole('heading', { level: 1 })).toHaveText('Questions');
    await expect(dialog).toHaveCount(0);
    const saved = await apiCall<{ forecasts: unknown[] }>(server().url, 'getQuestion', { id: created.id });
    expect(saved.forecasts).toHaveLength(1);

    // A reload or closing the tab: the browser's own prompt; dismissing it keeps the text.
    await page.getByRole('link', { name: 'Harbour crane contract is extended' }).click();
    await page.getByRole('button', { name: 'Revise' }).click();
    await note.fill('Second thoughts on the vote');
    const asked = new Promise<string>((resolve) => {
      page.once('dialog', (browserDialog) => {
        resolve(browserDialog.type());
        void browserDialog.dismiss();
      });
    });
    await page.close({ runBeforeUnload: true });
    expect(await asked).toBe('beforeunload');
    await expect(note).toHaveValue('Second thoughts on the vote');
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

async function settingsNow(): Promise<Settings> {
  return apiCall<Settings>(server().url, 'getSettings');
}

for (const scheme of ['light', 'dark'] as const) {
  test(`leaving Settings with unsaved changes asks first (${scheme})`, async ({ browser }) => {
    const app = await openApp(browser, server(), { colorScheme: scheme }, 'desk');
    const { page } = app;
    const cadence = page.getByRole('spinbutton', { name: 'Check in every', exact: true });
    const nav = page.getByRole('navigation', { name: 'Main' });
    try {
      await nav.getByRole('link', { name: 'Settings' }).click();
      await cadence.fill('11');

      // A link: held, asked about; Keep editing stays with the text.
      await nav.getByRole('link', { name: 'Scorecard' }).click();
      await expect(prompt(page)).toBeVisible();
      await expect(prompt(page)).toContainText('“Settings”');
      await expectNoSeriousViolations(page, `Settings' discard prompt (${scheme})`);
      await page.screenshot({ path: `test/e2e/artifacts/discard-settings-${scheme}.png` });
      await prompt(page).getByRole('button', { name: 'Keep editing' }).click();
      await expect(page).toHaveURL(/#\/settings$/);
      await expect(page.getByRole('heading', { level: 1 })).toHaveText('Settings');
      await expect(cadence).toHaveValue('11');

      // Back: the address stays on Settings until the user answers.
      await page.goBack();
      await expect(prompt(page)).toBeVisible();
      await expect(page).toHaveURL(/#\/settings$/);
      await prompt(page).getByRole('button', { name: 'Keep editing' }).click();
      await expect(cadence).toHaveValue('11');

      // Closing the tab or reloading: the browser's own prompt; dismissing it keeps the page.
      const asked = new Promise<string>((resolve) => {
        page.once('dialog', (dialog) => {
          resolve(dialog.type());
          void dialog.dismiss();
        });
      });
      await page.close({ runBeforeUnload: true });
      expect(await asked).toBe('beforeunload');
      await expect(cadence).toHaveValue('11');

      // Discard follows the link, and nothing was saved.
      await nav.getByRole('link', { name: 'Scorecard' }).click();
      await prompt(page).getByRole('button', { name: 'Discard' }).click();
      await expect(page.getByRole('heading', { level: 1 })).toHaveText('Scorecard');
      expect((await settingsNow()).default_checkin_days).toBe(7);

      // Saved changes leave without a word.
      await nav.getByRole('link', { name: 'Settings' }).click();
      await cadence.fill('10');
      await page.getByRole('button', { name: 'Save settings' }).click();
      await expect(page.getByTestId('toast').filter({ hasText: 'Settings saved.' })).toBeVisible();
      await nav.getByRole('link', { name: 'Desk' }).click();
      await expect(page.getByRole('heading', { level: 1 })).toHaveText('Desk');
      await expect(prompt(page)).toHaveCount(0);
      expect((await settingsNow()).default_checkin_days).toBe(10);
      await apiCall(server().url, 'updateSettings', { default_checkin_days: 7 });
      expect(app.problems).toEqual([]);
    } finally {
      await app.close();
    }
  });
}
