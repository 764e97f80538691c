/**
 * The Desk, the home screen: what is due, grouped, and answered in one click. One diary for
 * the whole file, set up through the API with questions placed around "now":
 *   overdue   — closed 6 days ago (the default "overdue after" is 3 days);
 *   closed    — closed 2 days ago (window closed, not yet overdue);
 *   closing   — closes in 5 hours (inside the default 24-hour warning);
 *   check-in  — last revised 20 days ago (default cadence 7 days), 90% with 10 of 30 days
 *               left: its glide path 1 − 0.1^(10/30) ≈ 54% is far below 90%, so stale
 *               (derived from the glide path formula in shared/scoring/helpers.ts).
 * The tests run in order: look, scan and photograph first, then act on each item.
 */
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Locator, type Page } from '@playwright/test';
import type { DueList } from '../../shared/contract';
import type { BinaryQuestion, Question } from '../../shared/domain';
import { openApp, useDiaryServer, type DiaryServer } from './serve';

const server = useDiaryServer();
test.describe.configure({ mode: 'serial' });

const HOUR = 3_600_000;
const DAY = 24 * HOUR;
const TITLES = {
  overdue: 'Regulator rules on the Harbour merger',
  closed: 'Northgate signs phase 2',
  closing: 'Pilot reaches 500 weekly users',
  checkin: 'Board approves the depot sale',
};

/** Calls the diary's HTTP API with the launch token, as the page does. */
async function call<T>(s: DiaryServer, operation: string, request: unknown): Promise<T> {
  const url = new URL(s.url);
  const response = await fetch(`${url.origin}/api/${operation}`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Authorization: `Bearer ${url.searchParams.get('token')}` },
    body: JSON.stringify(request),
  });
  const envelope = (await response.json()) as { ok: true; value: T } | { ok: false; error: { message: string } };
  if (!envelope.ok) throw new Error(`${operation} was refused: ${envelope.error.message}`);
  return envelope.value;
}

const iso = (ms: number) => new Date(ms).toISOString();
const ids: Record<keyof typeof TITLES, string> = { overdue: '', closed: '', closing: '', checkin: '' };

async function expectNoSeriousViolations(page: Page, what: string): Promise<void> {
  const results = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa', 'best-practice'])
    .analyze();
  const serious = results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
  expect(serious, `axe found serious or critical problems on ${what}`).toEqual([]);
}

function item(page: Page, title: string): Locator {
  return page.getByTestId('desk-item').filter({ has: page.getByRole('heading', { name: title }) });
}

async function expectCount(page: Page, n: number): Promise<void> {
  await expect(page).toHaveTitle(n > 0 ? `(${n}) Forelog` : 'Forelog');
  const badge = page.getByRole('navigation', { name: 'Main' }).getByTestId('due-count');
  if (n > 0) await expect(badge).toHaveText(`${n} due`);
  else await expect(badge).toHaveCount(0);
}

test('setup: a diary with one question of each kind of due', async () => {
  const now = Date.now();
  const create = (request: object) => call<Question>(server(), 'createQuestion', { time_zone: 'Europe/London', ...request });
  ids.overdue = (await create({ title: TITLES.overdue, opened_at: iso(now - 30 * DAY), closes_at: iso(now - 6 * DAY), first_forecast: { p: 0.3, at: iso(now - 30 * DAY) } })).id;
  ids.closed = (await create({ title: TITLES.closed, opened_at: iso(now - 10 * DAY), closes_at: iso(now - 2 * DAY), first_forecast: { p: 0.7, at: iso(now - 10 * DAY) } })).id;
  ids.closing = (await create({ title: TITLES.closing, opened_at: iso(now - DAY), closes_at: iso(now + 5 * HOUR), first_forecast: { p: 0.55, at: iso(now - DAY) } })).id;
  ids.checkin = (await create({ title: TITLES.checkin, opened_at: iso(now - 21 * DAY), closes_at: iso(now + 10 * DAY), first_forecast: { p: 0.9, at: iso(now - 20 * DAY) } })).id;
  const due = await call<DueList>(server(), 'due', {});
  // The preconditions the Desk is tested against, straight from the diary.
  expect(due.nudges.map((n) => `${n.title}|${n.kind}`).sort()).toEqual(
    [`${TITLES.overdue}|overdue`, `${TITLES.closed}|window_closed`, `${TITLES.closing}|closing_soon`, `${TITLES.checkin}|checkin`].sort(),
  );
  expect(due.nudges.find((n) => n.id === ids.checkin)?.stale).toBe(true);
});

test('the Desk is home: each question in its group, with why it is due, and the count in the title and the nav', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, '');
  const { page } = app;
  try {
    await expect(page.getByRole('heading', { level: 1 })).toHaveText('Desk');
    await expect(page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: /^Desk/ })).toHaveAttribute('aria-current', 'page');
    await expectCount(page, 4);

    const resolve = page.getByRole('region', { name: /To resolve/ });
    const closing = page.getByRole('region', { name: /Closing soon/ });
    const checkins = page.getByRole('region', { name: /Check-ins/ });
    // Overdue first: it has waited longest.
    await expect(resolve.getByRole('heading', { level: 3 })).toHaveText([TITLES.overdue, TITLES.closed]);
    await expect(closing.getByRole('heading', { level: 3 })).toHaveText([TITLES.closing]);
    await expect(checkins.getByRole('heading', { level: 3 })).toHaveText([TITLES.checkin]);
    await expect(page.getByTestId('desk-summary')).toHaveText('2 to resolve · 1 closing soon · 1 check-in');

    // Why each is due, in words, with the time on the question's clocks and its zone.
    await expect(item(page, TITLES.overdue)).toContainText('Overdue by 3 days');
    await expect(item(page, TITLES.overdue)).toContainText(/Closed 6 days ago, \S+ \d\d:\d\d GMT(\+1)?(?!\d)/);
    await expect(item(page, TITLES.closed)).toContainText(/Closed 2 days ago, \S+ \d\d:\d\d GMT(\+1)?(?!\d)/);
    await expect(item(page, TITLES.closed)).not.toContainText('Overdue');
    await expect(item(page, TITLES.closing)).toContainText(/Closes (today|tomorrow) \d\d:\d\d GMT(\+1)?, in (4|5) hours/);
    await expect(item(page, TITLES.checkin)).toContainText('Check-in due since');
    await expect(item(page, TITLES.closed)).toContainText('Last forecast 70%');
    await expect(item(page, TITLES.checkin)).toContainText('Last forecast 90%, 20 days ago');
    // The stale flag is explained where it is shown; only the flagged question carries it.
    await expect(item(page, TITLES.checkin)).toContainText('Stale');
    await expect(item(page, TITLES.checkin)).toContainText('well above its glide path and not revised for longer than its check-in cadence');
    await expect(item(page, TITLES.closing)).not.toContainText('Stale');

    // Titles lead to the question.
    await item(page, TITLES.closed).getByRole('link', { name: TITLES.closed }).click();
    await expect(page).toHaveURL(new RegExp(`#/questions/${ids.closed}$`));
    await expect(page.getByRole('heading', { level: 1 })).toHaveText(TITLES.closed);
    // Another screen keeps the count in front of its own name.
    await expect(page).toHaveTitle(/^\(4\) .+ — Forelog$/);
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

for (const scheme of ['light', 'dark'] as const) {
  test(`the Desk passes an axe scan and is photographed (${scheme})`, async ({ browser }) => {
    const app = await openApp(browser, server(), { colorScheme: scheme }, '');
    const { page } = app;
    try {
      await expect(page.getByTestId('desk-item')).toHaveCount(4);
      if (scheme === 'dark') {
        // The dark picture shows the inline panels: a resolution note and a revision.
        await item(page, TITLES.closed).getByRole('button', { name: 'Add a note' }).click();
        await expect(item(page, TITLES.closed).getByLabel('Resolution note')).toBeFocused();
        await item(page, TITLES.checkin).getByRole('button', { name: 'Revise' }).click();
        await expect(item(page, TITLES.checkin).getByRole('spinbutton', { name: 'New probability' })).toBeFocused();
      }
      await expectNoSeriousViolations(page, `the Desk (${scheme})`);
      // Opening a panel scrolled the page; the picture starts at the top like the window does.
      await page.evaluate('window.scrollTo(0, 0)');
      await page.screenshot({ path: `test/e2e/artifacts/desk-${scheme}.png`, fullPage: true });
      expect(app.problems).toEqual([]);
    } finally {
      await app.close();
    }
  });
}

test('the top bar asks only for the count; the Desk asks for its list once', async ({ browser }) => {
  const context = await browser.newContext();
  /** A new tab at `screen`, and the due operations it asks for. */
  async function open(screen: string): Promise<{ page: Page; asked: string[] }> {
    const page = await context.newPage();
    const asked: string[] = [];
    page.on('request', (request) => {
      const op = new URL(request.url()).pathname.match(/^\/api\/(\w+)$/)?.[1];
      if (op === 'due' || op === 'dueCount') asked.push(op);
    });
    await page.goto(`${server().url}${screen}`);
    return { page, asked };
  }
  try {
    const desk = await open('');
    await expect(desk.page.getByTestId('desk-item')).toHaveCount(4);
    await expectCount(desk.page, 4);
    expect(desk.asked.filter((op) => op === 'due'), 'the Desk fetched its list once').toEqual(['due']);

    const questions = await open('#/questions');
    await expect(questions.page.getByRole('navigation', { name: 'Main' }).getByTestId('due-count')).toHaveText('4 due');
    expect(questions.asked, 'another screen shows the count without the list').toEqual(['dueCount']);
  } finally {
    await context.close();
  }
});

test('resolving Yes from the Desk, with a note, removes the item and lowers the count', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, '');
  const { page } = app;
  try {
    const closed = item(page, TITLES.closed);
    await closed.getByRole('button', { name: 'Add a note' }).click();
    await closed.getByLabel('Resolution note').fill('Signed on the last day; see the client e-mail.');
    await closed.getByRole('group', { name: 'Resolve' }).getByRole('button', { name: 'Yes' }).click();
    await expect(page.getByTestId('toast').filter({ hasText: `Resolved “${TITLES.closed}”: Yes, with your note.` })).toBeVisible();
    await expect(closed).toHaveCount(0);
    await expectCount(page, 3);
    // Focus moves on to the item that followed, so the keyboard can carry on down the list.
    await expect(item(page, TITLES.closing).getByRole('link', { name: TITLES.closing })).toBeFocused();
    const question = await call<Question>(server(), 'getQuestion', { id: ids.closed });
    expect(question.resolution?.outcome).toBe('yes');
    expect(question.resolution?.note).toBe('Signed on the last day; see the client e-mail.');

    // Undo brings the question back with the note as it was typed, its box open, not an
    // empty card; resolving again saves the same note.
    await page.getByTestId('toast').filter({ hasText: `Resolved “${TITLES.closed}”` }).getByRole('button', { name: 'Undo' }).click();
    await expect(closed.getByLabel('Resolution note')).toHaveValue('Signed on the last day; see the client e-mail.');
    await expectCount(page, 4);
    await closed.getByRole('group', { name: 'Resolve' }).getByRole('button', { name: 'Yes' }).click();
    await expect(closed).toHaveCount(0);
    await expectCount(page, 3);
    expect((await call<Question>(server(), 'getQuestion', { id: ids.closed })).resolution?.note).toBe('Signed on the last day; see the client e-mail.');
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('snoozing with the keyboard removes the item until the snooze runs out', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, '');
  const { page } = app;
  try {
    const closing = item(page, TITLES.closing);
    await closing.getByRole('button', { name: 'Snooze' }).focus();
    await page.keyboard.press('Enter');
    await expect(closing.getByRole('button', { name: 'Snooze' })).toHaveAttribute('aria-expanded', 'true');
    // The first choice takes focus; Escape closes the choices without snoozing and returns to the button.
    await expect(closing.getByRole('button', { name: 'In 1 hour' })).toBeFocused();
    await page.keyboard.press('Escape');
    await expect(closing.getByRole('button', { name: 'In 1 hour' })).toHaveCount(0);
    await expect(closing.getByRole('button', { name: 'Snooze' })).toBeFocused();
    await page.keyboard.press('Enter');
    await expect(closing.getByRole('button', { name: 'In 1 hour' })).toBeFocused();
    await page.keyboard.press('Enter');
    await expect(page.getByTestId('toast').filter({ hasText: `Snoozed “${TITLES.closing}” until` })).toBeVisible();
    await expect(closing).toHaveCount(0);
    await expectCount(page, 2);
    const due = await call<DueList>(server(), 'due', {});
    expect(due.nudges.some((n) => n.id === ids.closing)).toBe(false);
    // An hour and a minute later it is due again (snooze preset 'hour').
    const later = await call<DueList>(server(), 'due', { at: iso(Date.now() + HOUR + 60_000) });
    expect(later.nudges.some((n) => n.id === ids.closing && n.kind === 'closing_soon')).toBe(true);
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('revising a check-in from the Desk saves the new number and clears the check-in', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, '');
  const { page } = app;
  try {
    const checkin = item(page, TITLES.checkin);
    await checkin.getByRole('button', { name: 'Revise' }).click();
    const box = checkin.getByRole('spinbutton', { name: 'New probability' });
    await expect(box).toHaveValue('90');
    // The last number is selected, so typing replaces it. One out of range is refused beside
    // the field, and nothing is saved.
    await expect(box).toBeFocused();
    await page.keyboard.type('140');
    await expect(box).toHaveValue('140');
    await checkin.getByRole('button', { name: 'Save revision' }).click();
    await expect(checkin.getByTestId('field-error')).toHaveText(/between 0% and 100%/);
    await box.fill('60');
    await checkin.getByLabel('What changed').fill('The board moved the vote to next quarter.');
    await checkin.getByRole('button', { name: 'Save revision' }).click();
    await expect(page.getByTestId('toast').filter({ hasText: `Revised “${TITLES.checkin}” to 60%.` })).toBeVisible();
    await expect(checkin).toHaveCount(0);
    await expectCount(page, 1);
    const question = await call<BinaryQuestion>(server(), 'getQuestion', { id: ids.checkin });
    expect(question.forecasts.map((f) => f.p)).toEqual([0.9, 0.6]);
    expect(question.forecasts[1]?.note).toBe('The board moved the vote to next quarter.');

    // Undo brings back the revision as typed, in its open form; saving it again adds it once more.
    await page.getByTestId('toast').filter({ hasText: `Revised “${TITLES.checkin}”` }).getByRole('button', { name: 'Undo' }).click();
    await expect(checkin.getByRole('spinbutton', { name: 'New probability' })).toHaveValue('60');
    await expect(checkin.getByLabel('What changed')).toHaveValue('The board moved the vote to next quarter.');
    await expectCount(page, 2);
    await checkin.getByRole('button', { name: 'Save revision' }).click();
    await expect(checkin).toHaveCount(0);
    await expectCount(page, 1);
    expect((await call<BinaryQuestion>(server(), 'getQuestion', { id: ids.checkin })).forecasts.map((f) => f.p)).toEqual([0.9, 0.6]);
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('once the last item is answered the Desk says nothing is due', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, '');
  const { page } = app;
  try {
    const overdue = item(page, TITLES.overdue);
    await overdue.getByRole('button', { name: 'No', exact: true }).click();
    await expect(page.getByTestId('toast').filter({ hasText: `Resolved “${TITLES.overdue}”: No.` })).toBeVisible();
    await expect(page.getByRole('heading', { name: 'Nothing is due right now' })).toBeVisible();
    await expectCount(page, 0);
    await expect(page.getByRole('heading', { level: 1, name: 'Desk' })).toBeFocused();
    await expect(page.getByRole('link', { name: 'See all questions' })).toHaveAttribute('href', '#/questions');
    // The link's words sit on the button's middle line, not level with its top edge.
    const textMiddle = (name: string) =>
      page.getByRole(name === 'See all questions' ? 'link' : 'button', { name }).evaluate((el) => {
        const range = document.createRange();
        range.selectNodeContents(el);
        const box = range.getBoundingClientRect();
        return box.top + box.height / 2;
      });
    expect(Math.abs((await textMiddle('See all questions')) - (await textMiddle('Write a new question')))).toBeLessThanOrEqual(2);
    await expectNoSeriousViolations(page, 'the empty Desk');
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});
