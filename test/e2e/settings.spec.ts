/**
 * Settings: changed values are saved and survive a reload; values the diary refuses are
 * explained beside their own field and change nothing; the action threshold follows the
 * costs (α = FA / (FA + M), the cost-loss threshold, Thompson 1952 — see
 * shared/scoring/decisions.ts); the screen passes an axe scan and is photographed.
 */
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import type { Settings } from '../../shared/domain';
import { openApp, useDiaryServer, type DiaryServer } from './serve';

const server = useDiaryServer();
test.describe.configure({ mode: 'serial' });

async function settingsNow(s: DiaryServer): Promise<Settings> {
  const url = new URL(s.url);
  const response = await fetch(`${url.origin}/api/getSettings`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Authorization: `Bearer ${url.searchParams.get('token')}` },
    body: '{}',
  });
  const envelope = (await response.json()) as { ok: true; value: Settings };
  return envelope.value;
}

async function expectNoSeriousViolations(page: Page, what: string): Promise<void> {
  const results = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa', 'best-practice'])
    .analyze();
  const serious = results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
  expect(serious, `axe found serious or critical problems on ${what}`).toEqual([]);
}

const field = (page: Page, label: string) => page.getByRole('spinbutton', { name: label, exact: true });

test('changed settings are saved and still there after a reload', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, '');
  const { page } = app;
  try {
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Settings' }).click();
    await expect(page.getByRole('heading', { level: 1 })).toHaveText('Settings');
    await expect(page).toHaveTitle('Settings — Forelog');
    // The diary's defaults (shared/domain.ts defaultSettings) are what the form starts with.
    await expect(field(page, 'Check in every')).toHaveValue('7');
    await expect(field(page, 'Closing-soon warning')).toHaveValue('24');
    await expect(field(page, 'Overdue after')).toHaveValue('3');
    await expect(page.getByRole('checkbox', { name: /quiet hours/ })).not.toBeChecked();
    await expect(page.getByTestId('diary-location')).toContainText('diary.sqlite');

    await field(page, 'Check in every').fill('14');
    await field(page, 'Closing-soon warning').fill('48');
    await page.getByRole('checkbox', { name: /quiet hours/ }).check();
    await page.getByLabel('Quiet from').fill('22:30');
    await page.getByLabel('Quiet until').fill('06:45');
    await page.getByLabel('Diary time zone').selectOption('America/New_York');
    // α = 1 / (1 + 4) = 20% (derived from α = FA / (FA + M)).
    await field(page, 'False-alarm cost').fill('1');
    await field(page, 'Miss cost').fill('4');
    await expect(page.getByTestId('action-threshold')).toContainText('Act when your probability is above 20%');
    await expect(page.getByText('You have unsaved changes.')).toBeVisible();
    await page.getByRole('button', { name: 'Save settings' }).click();
    await expect(page.getByTestId('toast').filter({ hasText: 'Settings saved.' })).toBeVisible();

    await page.reload();
    await expect(field(page, 'Check in every')).toHaveValue('14');
    await expect(field(page, 'Closing-soon warning')).toHaveValue('48');
    await expect(page.getByRole('checkbox', { name: /quiet hours/ })).toBeChecked();
    await expect(page.getByLabel('Quiet from')).toHaveValue('22:30');
    await expect(page.getByLabel('Quiet until')).toHaveValue('06:45');
    await expect(page.getByLabel('Diary time zone')).toHaveValue('America/New_York');
    await expect(field(page, 'Miss cost')).toHaveValue('4');
    await expect(page.getByTestId('action-threshold')).toContainText('above 20%');
    expect(await settingsNow(server())).toMatchObject({
      default_checkin_days: 14,
      closing_soon_hours: 48,
      quiet_hours: { start: '22:30', end: '06:45' },
      time_zone: 'America/New_York',
      default_false_alarm_cost: 1,
      default_miss_cost: 4,
    });
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('on a 12-hour clock (en-US) quiet hours are shown and typed as 10:15 PM, pasted spaces and all, and stored as the diary’s HH:MM', async ({ browser }) => {
  const app = await openApp(browser, server(), { locale: 'en-US' }, 'settings');
  const { page } = app;
  try {
    const before = await settingsNow(server());
    // The quiet hours the first test saved (22:30–06:45), written as the rest of the app writes times here.
    expect(before.quiet_hours).toEqual({ start: '22:30', end: '06:45' });
    await expect(page.getByLabel('Quiet from')).toHaveValue('10:30 PM');
    await expect(page.getByLabel('Quiet until')).toHaveValue('6:45 AM');
    // Typed whole (no box cuts "10:15 PM" to "10:15", a morning), with a pasted space or two.
    await page.getByLabel('Quiet from').fill('');
    await page.getByLabel('Quiet from').pressSequentially('10:15 PM');
    await expect(page.getByLabel('Quiet from')).toHaveValue('10:15 PM');
    await page.getByLabel('Quiet until').fill(' 6:50 am ');
    await page.getByRole('button', { name: 'Save settings' }).click();
    await expect(page.getByTestId('toast').filter({ hasText: 'Settings saved.' })).toBeVisible();
    expect((await settingsNow(server())).quiet_hours).toEqual({ start: '22:15', end: '06:50' });
    await page.reload();
    await expect(page.getByLabel('Quiet from')).toHaveValue('10:15 PM');
    await expect(page.getByLabel('Quiet until')).toHaveValue('6:50 AM');
    // A time that is not one says how to write it, in this clock.
    await page.getByLabel('Quiet until').fill('13 pm');
    await page.getByRole('button', { name: 'Save settings' }).click();
    const quietUntil = page.locator('.field').filter({ has: page.getByLabel('Quiet until') });
    await expect(quietUntil.getByTestId('field-error')).toHaveText(/13 is not an hour on a 12-hour clock/);
    await expect(page.getByLabel('Quiet until')).toBeFocused();
    expect((await settingsNow(server())).quiet_hours).toEqual({ start: '22:15', end: '06:50' });
    // Put the diary back for the tests that follow.
    await page.getByRole('button', { name: 'Discard changes' }).click();
    const url = new URL(server().url);
    await fetch(`${url.origin}/api/updateSettings`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', Authorization: `Bearer ${url.searchParams.get('token')}` },
      body: JSON.stringify({ quiet_hours: before.quiet_hours }),
    });
    expect(await settingsNow(server())).toEqual(before);
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('a value the diary refuses is explained beside its field, and nothing is saved', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, 'settings');
  const { page } = app;
  try {
    const before = await settingsNow(server());
    // Refused by the diary (shared/contract.ts settingsPatch): at least 1 hour; whole days.
    await field(page, 'Closing-soon warning').fill('0');
    await field(page, 'Check in every').fill('2.5');
    await page.getByRole('button', { name: 'Save settings' }).click();
    const closing = page.locator('.field').filter({ has: field(page, 'Closing-soon warning') });
    const cadence = page.locator('.field').filter({ has: field(page, 'Check in every') });
    await expect(closing.getByTestId('field-error')).toHaveText(/Must be at least 1 hour/);
    await expect(cadence.getByTestId('field-error')).toHaveText(/Must be a whole number of days/);
    await expect(field(page, 'Closing-soon warning')).toHaveAttribute('aria-invalid', 'true');
    // The first refused field takes the keyboard.
    await expect(field(page, 'Check in every')).toBeFocused();
    expect(await settingsNow(server())).toEqual(before);

    // A time of day must be one (read as every time box reads it, renderer/src/dates.ts parseTimeText).
    await field(page, 'Closing-soon warning').fill('24');
    await field(page, 'Check in every').fill('7');
    await page.getByRole('checkbox', { name: /quiet hours/ }).check();
    await page.getByLabel('Quiet from').fill('25:00');
    await page.getByRole('button', { name: 'Save settings' }).click();
    const quietFrom = page.locator('.field').filter({ has: page.getByLabel('Quiet from') });
    await expect(quietFrom.getByTestId('field-error')).toHaveText(/25 is not an hour; use 0 to 23/);
    await expect(page.getByLabel('Quiet from')).toBeFocused();
    await expect(closing.getByTestId('field-error')).toHaveCount(0);
    expect(await settingsNow(server())).toEqual(before);

    // An empty box is caught before asking the diary.
    await field(page, 'Check in every').fill('10');
    await field(page, 'Closing-soon warning').fill('');
    await page.getByRole('button', { name: 'Save settings' }).click();
    await expect(closing.getByTestId('field-error')).toHaveText(/Enter a number of hours/);
    await expect(cadence.getByTestId('field-error')).toHaveCount(0);
    await expect(page.getByTestId('action-threshold')).toContainText('above 20%');

    // Discarding goes back to what is saved.
    await page.getByRole('button', { name: 'Discard changes' }).click();
    await expect(field(page, 'Closing-soon warning')).toHaveValue(String(before.closing_soon_hours));
    await expect(field(page, 'Check in every')).toHaveValue(String(before.default_checkin_days));
    // …and takes the messages about the discarded values down with them.
    await expect(page.getByTestId('field-error')).toHaveCount(0);
    await expect(field(page, 'Closing-soon warning')).not.toHaveAttribute('aria-invalid', 'true');

    // A comma typed in a cost brings a message under it that wraps in its place: the other
    // cost stays where it was instead of being pushed across the card.
    const missAt = async () => (await field(page, 'Miss cost').boundingBox())!.x;
    const missBefore = await missAt();
    await field(page, 'False-alarm cost').fill('');
    await field(page, 'False-alarm cost').pressSequentially('0,5');
    await expect(page.getByTestId('comma-warning')).toBeVisible();
    expect(await missAt()).toBe(missBefore);
    await page.getByRole('button', { name: 'Discard changes' }).click();
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

for (const scheme of ['light', 'dark'] as const) {
  test(`Settings passes an axe scan and is photographed (${scheme})`, async ({ browser }) => {
    const app = await openApp(browser, server(), { colorScheme: scheme }, 'settings');
    const { page } = app;
    try {
      await expect(field(page, 'Check in every')).toBeVisible();
      await expectNoSeriousViolations(page, `Settings (${scheme})`);
      await page.screenshot({ path: `test/e2e/artifacts/${scheme === 'light' ? 'settings' : 'settings-dark'}.png`, fullPage: true });
      expect(app.problems).toEqual([]);
    } finally {
      await app.close();
    }
  });
}
