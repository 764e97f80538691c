/**
 * Lists that behave like lists, end to end: the Questions table draws only what is on screen
 * yet reads as the whole table, sorts by clicking or from the keyboard (aria-sort), keeps its
 * search, filters, order and scroll position across opening a question and coming back, and
 * shows a newly added question; the Scorecard's and Hindsight's filters live in the address,
 * so a reload, Back and Forward keep them. With axe scans.
 */
import { expect, test, type Page } from '@playwright/test';
import { apiCall, expectNoSeriousViolations, quickAdd } from './helpers';
import { useAppPage, useDiaryServer } from './serve';

const server = useDiaryServer();
const COUNT = 240;
/** Confident misses beyond Hindsight's first page of 20. */
const MORE_MISSES = 22;
/** Every question in the diary: the numbered calls, two resolved ones and the misses. */
const ALL = COUNT + 2 + MORE_MISSES;
const DAY = 86_400_000;

/** "Call 007 …": three-digit numbers sort the same as text and as numbers. */
const title = (i: number) => `Call ${String(i).padStart(3, '0')} ${i % 2 ? 'for Northgate' : 'for Eastport'}`;

test.beforeAll(async () => {
  const url = server().url;
  const now = Date.now();
  for (let i = 0; i < COUNT; i++) {
    // Closing times run the other way from the numbers, so "by title" and "by close" differ.
    await apiCall(url, 'createQuestion', {
      title: title(i),
      closes_at: new Date(now + (COUNT - i + 10) * DAY).toISOString(),
      tags: [i % 2 ? 'client:northgate' : 'client:eastport'],
      checkin_days: 0,
      first_forecast: { p: 0.2 + (i % 7) / 10 },
    });
  }
  // Two resolved calls for the Scorecard and Hindsight.
  const past = now - 40 * DAY;
  for (const [name, p, outcome] of [['Board approves the case', 0.9, 'no'], ['Renewal signed', 0.85, 'yes']] as const) {
    const q = await apiCall<{ id: string }>(url, 'createQuestion', {
      title: name,
      opened_at: new Date(past).toISOString(),
      closes_at: new Date(past + 30 * DAY).toISOString(),
      tags: ['client:northgate'],
      first_forecast: { p, at: new Date(past).toISOString() },
    });
    await apiCall(url, 'resolveQuestion', { id: q.id, outcome, at: new Date(past + 30 * DAY).toISOString() });
  }
  // More confident misses (at 82%) than Hindsight lists at first.
  for (let i = 0; i < MORE_MISSES; i++) {
    const q = await apiCall<{ id: string }>(url, 'createQuestion', {
      title: `Westhaven call ${i + 1}`,
      opened_at: new Date(past).toISOString(),
      closes_at: new Date(past + 30 * DAY).toISOString(),
      tags: ['client:westhaven'],
      first_forecast: { p: 0.82, at: new Date(past).toISOString() },
    });
    await apiCall(url, 'resolveQuestion', { id: q.id, outcome: 'no', at: new Date(past + 30 * DAY).toISOString() });
  }
});

const app = useAppPage(server);

const rows = (page: Page) => page.getByTestId('question-table').locator('tbody tr.question-row');
const firstTitle = (page: Page) => rows(page).first().getByRole('link');

test('the table reads as the whole list but draws only what is on screen, and scrolls to the end', async () => {
  const { page } = app;
  const table = page.getByTestId('question-table');
  await expect(table.locator('caption')).toContainText(`${ALL} questions`);
  await expect(table).toHaveAttribute('aria-rowcount', String(ALL + 1));
  const drawn = await rows(page).count();
  expect(drawn, 'rows in the document').toBeLessThan(60);
  expect(drawn).toBeGreaterThan(5);
  await expect(rows(page).first()).toHaveAttribute('aria-rowindex', '2');
  // The last row comes into the document when scrolled to (its page is fetched then).
  // Rows are measured as they are drawn, so the height grows towards the end: scroll until it stops.
  const last = table.locator(`tr[aria-rowindex="${ALL + 1}"]`).getByRole('link');
  await expect
    .poll(async () => {
      await page.evaluate(() => window.scrollTo(0, document.body.scrollHeight));
      return last.count();
    })
    .toBe(1);
  await expect(last).toBeInViewport();
  expect(await rows(page).count()).toBeLessThan(60);
  await expectNoSeriousViolations(page, 'the Questions table scrolled to its end');
});

test('columns sort by click and by keyboard, with aria-sort, and the order is in the address', async () => {
  const { page } = app;
  const header = (name: string) => page.getByRole('columnheader', { name });
  // Needs attention first: nothing is due, so the open ones by close, soonest first.
  await expect(firstTitle(page)).toHaveText(title(COUNT - 1));
  await expect(page.locator('th[aria-sort]')).toHaveCount(0);

  await header('Question').getByRole('button').click();
  await expect(header('Question')).toHaveAttribute('aria-sort', 'ascending');
  await expect(firstTitle(page)).toHaveText('Board approves the case');
  expect(page.url()).toContain('sort=title');

  await header('Question').getByRole('button').focus();
  await page.keyboard.press('Enter');
  await expect(header('Question')).toHaveAttribute('aria-sort', 'descending');
  await expect(firstTitle(page)).toHaveText('Westhaven call 9');
  expect(page.url()).toContain('dir=desc');

  await page.keyboard.press('Tab');
  await expect(header('Status').getByRole('button')).toBeFocused();
  await page.keyboard.press('Space');
  await expect(header('Status')).toHaveAttribute('aria-sort', 'ascending');
  await expect(header('Question')).not.toHaveAttribute('aria-sort', /./);

  await page.getByLabel('Order').selectOption('closes:desc');
  await expect(header('Closes')).toHaveAttribute('aria-sort', 'descending');
  await expect(firstTitle(page)).toHaveText(title(0));
  await expectNoSeriousViolations(page, 'the Questions table sorted by close');
});

test('search, filters, order and scroll survive opening a question and coming back', async () => {
  const { page } = app;
  await page.getByLabel('Search').fill('northgate');
  await page.getByLabel('Order').selectOption('title:asc');
  await expect(page.getByTestId('question-table').locator('caption')).toContainText(`of ${ALL} questions`);
  await expect(firstTitle(page)).toHaveText('Board approves the case');
  await page.evaluate(() => window.scrollTo(0, 2500));
  // Rows measured on arrival may nudge the offset by a few pixels; take where it settled.
  await page.waitForTimeout(300);
  const left = await page.evaluate(() => window.scrollY);
  expect(left).toBeGreaterThan(2000);
  /** Back where it was, to within a few pixels (rows are measured again as they are drawn). */
  const backWhereLeft = () => expect.poll(async () => Math.abs((await page.evaluate(() => window.scrollY)) - left)).toBeLessThan(20);
  const target = rows(page).filter({ hasText: 'Call 0' }).nth(10).getByRole('link');
  await expect(target).toBeInViewport();
  const name = (await target.textContent())!;
  await target.click();
  await expect(page.getByRole('heading', { level: 1, name })).toBeVisible();

  await page.goBack();
  await expect(page.getByLabel('Search')).toHaveValue('northgate');
  await expect(page.getByLabel('Order')).toHaveValue('title:asc');
  await backWhereLeft();
  await expect(page.getByRole('link', { name })).toBeInViewport();

  // Through the navigation bar, whose link carries no filters, the list is as it was left.
  await page.getByRole('link', { name, exact: true }).click();
  await expect(page.getByRole('heading', { level: 1, name })).toBeVisible();
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Questions' }).click();
  await expect(page.getByLabel('Search')).toHaveValue('northgate');
  await expect(page.getByRole('columnheader', { name: 'Question' })).toHaveAttribute('aria-sort', 'ascending');
  await backWhereLeft();

  // A reload keeps what the address holds.
  await page.reload();
  await expect(page.getByLabel('Search')).toHaveValue('northgate');
  await expect(page.getByLabel('Order')).toHaveValue('title:asc');
});

test('a newly added question appears in the list at once', async () => {
  const { page } = app;
  const fresh = 'Westhaven decides on the warehouse move';
  // It closes before every other open question, so it is first in the default order.
  const closes = new Date(Date.now() + 5 * DAY).toISOString().slice(0, 16);
  await quickAdd(page, { title: fresh, closes, probability: '40' });
  await expect(firstTitle(page)).toHaveText(fresh);
  await expect(page.getByTestId('question-table').locator('caption')).toContainText(`${ALL + 1} questions`);
});

test('Scorecard and Hindsight keep their filters in the address: reload, Back and Forward', async () => {
  const { page } = app;
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Scorecard' }).click();
  await page.locator('[data-scorecard-ready="true"]').waitFor();
  await page.getByLabel('Tag', { exact: true }).selectOption('client:northgate');
  await page.locator('[data-scorecard-ready="true"][data-scorecard-tag="client:northgate"]').waitFor();
  expect(page.url()).toContain('#/scorecard?tag=client%3Anorthgate');
  await page.reload();
  await expect(page.getByLabel('Tag', { exact: true })).toHaveValue('client:northgate');
  await page.locator('[data-scorecard-ready="true"][data-scorecard-tag="client:northgate"]').waitFor();

  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Hindsight' }).click();
  await page.locator('[data-hindsight-ready="true"]').waitFor();
  await page.getByRole('textbox', { name: 'Confident at' }).or(page.getByRole('spinbutton', { name: 'Confident at' })).fill('85');
  await page.getByLabel('Show confident hits too').check();
  await expect.poll(() => page.url()).toContain('confident=85');
  expect(page.url()).toContain('hits=1');
  await page.locator('[data-hindsight-ready="true"]').waitFor();
  await expect(page.getByTestId('hindsight-count')).toContainText('1 confident miss');
  await expect(page.getByTestId('hindsight-count')).toContainText('1 confident hit');
  await expectNoSeriousViolations(page, 'Hindsight with its filters from the address');

  await page.goBack();
  await expect(page.getByRole('heading', { level: 1, name: 'Scorecard' })).toBeVisible();
  await expect(page.getByLabel('Tag', { exact: true })).toHaveValue('client:northgate');
  await page.goForward();
  await expect(page.getByRole('heading', { level: 1, name: 'Hindsight' })).toBeVisible();
  await expect(page.getByLabel('Show confident hits too')).toBeChecked();
  await page.reload();
  await expect(page.getByLabel('Show confident hits too')).toBeChecked();
  await expect(page.getByTestId('hindsight-count')).toContainText('1 confident hit');
});

test('Hindsight lists 10 calls at first and the rest with Show more, keeping the count of all', async () => {
  const { page } = app;
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Hindsight' }).click();
  await page.locator('[data-hindsight-ready="true"]').waitFor();
  const misses = MORE_MISSES + 1;
  await expect(page.getByTestId('hindsight-count')).toContainText(`${misses} confident misses`);
  await expect(page.getByTestId('hindsight-entry')).toHaveCount(10);
  await expect(page.getByTestId('hs-misses').getByRole('heading', { level: 2 })).toHaveText(`Confident misses (${misses})`);
  await page.getByRole('button', { name: `Show ${misses - 10} more` }).click();
  await page.locator('[data-hindsight-ready="true"]').waitFor();
  await expect(page.getByTestId('hindsight-entry')).toHaveCount(misses);
  await expect(page.getByRole('button', { name: /Show \d+ more/ })).toHaveCount(0);
  await expectNoSeriousViolations(page, 'Hindsight with every call listed');
});
