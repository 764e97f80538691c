/**
 * The forgiving app (issue 10): every change has an Undo in its toast that goes through the
 * diary's own `undo`; an unusual resolution asks first; quick add records when a call was
 * made; the question page shows how its resolution was corrected and that a check-in is
 * snoozed; the Desk keeps snoozed items visible; importing your own export offers a merge.
 * One diary for the file, set up through the API with questions placed around "now".
 * The tests run in order; each leaves the diary as the next one expects.
 */
import { expect, test, type Locator, type Page } from '@playwright/test';
import type { DueList } from '../../shared/contract';
import type { BinaryQuestion, Question } from '../../shared/domain';
import { apiCall, daysFromNow, expectNoSeriousViolations, fillQuickAdd } from './helpers';
import { openApp, useDiaryServer } from './serve';

const server = useDiaryServer();
test.describe.configure({ mode: 'serial' });

const HOUR = 3_600_000;
const DAY = 24 * HOUR;
const iso = (ms: number) => new Date(ms).toISOString();

const TITLES = {
  closed: 'Depot lease signed before the window closed',
  state: 'Backlog is below 50 tickets at the close',
  doomed: 'Harbour pilot extended',
  corrected: 'Regulator publishes the tariff review',
  checkin: 'Warehouse move finished by spring',
  stateShot: 'Night shift fully staffed at the close',
};
const ids: Record<keyof typeof TITLES, string> = { closed: '', state: '', doomed: '', corrected: '', checkin: '', stateShot: '' };

const call = <T>(operation: string, request: object = {}) => apiCall<T>(server().url, operation, request);

function toast(page: Page, text: string | RegExp): Locator {
  return page.getByTestId('toast').filter({ hasText: text });
}

function deskItem(page: Page, title: string): Locator {
  return page.getByTestId('desk-item').filter({ has: page.getByRole('heading', { name: title }) });
}

test('setup: questions to resolve, to correct, to delete and to check in on', async () => {
  const now = Date.now();
  const create = (request: object) => call<Question>('createQuestion', { time_zone: 'Europe/London', ...request });
  ids.closed = (await create({ title: TITLES.closed, opened_at: iso(now - 10 * DAY), closes_at: iso(now - 2 * DAY), first_forecast: { p: 0.7, at: iso(now - 10 * DAY) } })).id;
  ids.state = (await create({ title: TITLES.state, kind: 'state_at_deadline', opened_at: iso(now - 5 * DAY), closes_at: iso(now + 10 * DAY), first_forecast: { p: 0.6, at: iso(now - 5 * DAY) } })).id;
  ids.doomed = (await create({ title: TITLES.doomed, opened_at: iso(now - 4 * DAY), closes_at: iso(now + 30 * DAY), first_forecast: { p: 0.35, at: iso(now - 4 * DAY) } })).id;
  await call('addForecast', { question_id: ids.doomed, p: 0.45, note: 'Second depot asked to join', at: iso(now - 2 * DAY) });
  ids.corrected = (await create({ title: TITLES.corrected, opened_at: iso(now - 40 * DAY), closes_at: iso(now - 3 * DAY), first_forecast: { p: 0.8, at: iso(now - 40 * DAY) } })).id;
  await call('resolveQuestion', { id: ids.corrected, outcome: 'yes', at: iso(now - 4 * DAY), note: 'Published on the website' });
  ids.stateShot = (await create({ title: TITLES.stateShot, kind: 'state_at_deadline', opened_at: iso(now - 5 * DAY), closes_at: iso(now + 60 * DAY) })).id;
  ids.checkin = (await create({ title: TITLES.checkin, opened_at: iso(now - 21 * DAY), closes_at: iso(now + 40 * DAY), first_forecast: { p: 0.5, at: iso(now - 20 * DAY) } })).id;
  const due = await call<DueList>('due');
  expect(due.nudges.map((n) => `${n.title}|${n.kind}`).sort()).toEqual([`${TITLES.checkin}|checkin`, `${TITLES.closed}|window_closed`].sort());
  expect(due.snoozed).toEqual([]);
});

test('resolving from the Desk is undone from its toast, by keyboard, and the item comes back', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, '');
  const { page } = app;
  try {
    await deskItem(page, TITLES.closed).getByRole('button', { name: 'Yes' }).click();
    const done = toast(page, `Resolved “${TITLES.closed}”: Yes.`);
    await expect(done).toBeVisible();
    await expect(deskItem(page, TITLES.closed)).toHaveCount(0);
    expect((await call<Question>('getQuestion', { id: ids.closed })).resolution?.outcome).toBe('yes');

    // F6 takes the keyboard to the newest toast's Undo; Enter presses it.
    await page.keyboard.press('F6');
    await expect(done.getByRole('button', { name: 'Undo' })).toBeFocused();
    await page.keyboard.press('Enter');
    await expect(toast(page, `Undone: “${TITLES.closed}” is back as it was.`)).toBeVisible();
    // Undone from the Desk, the toast links to the question.
    await expect(toast(page, `Undone: “${TITLES.closed}” is back as it was.`).getByRole('link', { name: 'Open question' })).toBeVisible();
    await expect(deskItem(page, TITLES.closed)).toBeVisible();
    const back = await call<Question>('getQuestion', { id: ids.closed });
    expect(back.resolution).toBeNull();
    expect(back.resolution_history).toEqual([]);
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('an unusual resolution asks first: Cancel changes nothing, going ahead resolves it', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, `questions/${ids.state}`);
  const { page } = app;
  try {
    const resolveOnce = async () => {
      await page.getByRole('group', { name: 'Question actions' }).getByRole('button', { name: 'Resolve', exact: true }).click();
      const dialog = page.getByRole('dialog', { name: 'Resolve the question' });
      await dialog.getByRole('radio', { name: 'Yes', exact: true }).check();
      await dialog.getByRole('button', { name: 'Resolve', exact: true }).click();
      return dialog;
    };
    const dialog = await resolveOnce();
    const ask = page.getByRole('alertdialog', { name: 'This is unusual — go ahead?' });
    await expect(ask).toBeVisible();
    // The diary's reason, without its advice to API callers.
    await expect(ask.getByTestId('ask-first-reason')).toContainText(`“${TITLES.state}” asks about the state of things at its close`);
    await expect(ask.getByTestId('ask-first-reason')).not.toContainText('confirm: true');
    // The safe choice has focus.
    await expect(ask.getByRole('button', { name: 'Cancel' })).toBeFocused();
    await expectNoSeriousViolations(page, 'the warning before an unusual resolution');
    await ask.getByRole('button', { name: 'Cancel' }).click();
    await expect(ask).toBeHidden();
    // Still in the resolve dialog, as typed; nothing changed in the diary.
    await expect(dialog.getByRole('radio', { name: 'Yes', exact: true })).toBeChecked();
    expect((await call<Question>('getQuestion', { id: ids.state })).resolution).toBeNull();

    await dialog.getByRole('button', { name: 'Resolve', exact: true }).click();
    await ask.getByRole('button', { name: 'Resolve Yes anyway' }).click();
    await expect(dialog).toBeHidden();
    await expect(toast(page, 'Resolved Yes.')).toBeVisible();
    await expect(page.getByRole('heading', { name: /^Resolved Yes/ })).toBeVisible();
    expect((await call<Question>('getQuestion', { id: ids.state })).resolution?.outcome).toBe('yes');

    // A time that cannot be true is refused beside its field, in plain words.
    await page.getByRole('button', { name: 'Correct' }).click();
    const correct = page.getByRole('dialog', { name: 'Correct the resolution' });
    await correct.getByRole('textbox', { name: 'Resolved at', exact: true }).fill(daysFromNow(3));
    await correct.getByRole('button', { name: 'Save correction' }).click();
    await expect(correct.getByText(/Must not be in the future: a resolution records something that has already happened/)).toBeVisible();
    await correct.getByRole('button', { name: 'Cancel' }).click();
    await page.getByRole('alertdialog', { name: 'Discard your changes?' }).getByRole('button', { name: 'Discard' }).click();
    await expect(correct).toBeHidden();
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('a correction keeps the earlier resolution in the history shown on the question page, and Undo takes it back', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, `questions/${ids.corrected}`);
  const { page } = app;
  try {
    await expect(page.getByTestId('resolution-history')).toHaveCount(0);
    await page.getByRole('button', { name: 'Correct' }).click();
    const dialog = page.getByRole('dialog', { name: 'Correct the resolution' });
    await dialog.getByRole('radio', { name: 'No', exact: true }).check();
    await dialog.getByLabel('Note', { exact: true }).fill('The review was postponed to next year');
    await dialog.getByLabel('Why the correction').fill('Misread the draft as the final review');
    await dialog.getByRole('button', { name: 'Save correction' }).click();
    await expect(toast(page, 'Resolution corrected to No.')).toBeVisible();

    const history = page.getByRole('region', { name: 'Resolution history' });
    const rows = history.getByTestId('resolution-history-row');
    await expect(rows).toHaveCount(1);
    await expect(rows.first()).toContainText('Yes');
    await expect(rows.first()).toContainText('Published on the website');
    await expect(rows.first()).toContainText('Corrected');
    await expect(rows.first()).toContainText('Misread the draft as the final review');
    await expect(page.getByRole('heading', { name: /^Resolved No/ })).toBeVisible();
    await expectNoSeriousViolations(page, 'a question page with a resolution history');

    // Reopening keeps the correction in the history too, with its reason.
    await page.getByRole('button', { name: 'Reopen', exact: true }).click();
    const reopen = page.getByRole('alertdialog', { name: 'Reopen this question?' });
    await reopen.getByLabel('Why reopen').fill('The regulator withdrew the postponement');
    await reopen.getByRole('button', { name: 'Reopen', exact: true }).click();
    await expect(rows).toHaveCount(2);
    await expect(rows.nth(1)).toContainText('Reopened');
    await expect(rows.nth(1)).toContainText('The regulator withdrew the postponement');

    // Undo the reopening, then the correction: newest first, back to the first resolution.
    await toast(page, 'Reopened').getByRole('button', { name: 'Undo' }).click();
    await expect(rows).toHaveCount(1);
    // The undone reopening's confirmation opens again with why, as typed.
    await expect(reopen.getByLabel('Why reopen')).toHaveValue('The regulator withdrew the postponement');
    await reopen.getByRole('button', { name: 'Cancel' }).click();
    await expect(reopen).toBeHidden();
    await toast(page, 'Resolution corrected to No.').getByRole('button', { name: 'Undo' }).click();
    await expect(page.getByTestId('resolution-history')).toHaveCount(0);
    await expect(page.getByRole('heading', { name: /^Resolved Yes/ })).toBeVisible();
    // The undone correction's dialog opens again as it was typed, to save it again or discard it.
    const again = page.getByRole('dialog', { name: 'Correct the resolution' });
    await expect(again.getByRole('radio', { name: 'No', exact: true })).toBeChecked();
    await expect(again.getByLabel('Note', { exact: true })).toHaveValue('The review was postponed to next year');
    await expect(again.getByLabel('Why the correction')).toHaveValue('Misread the draft as the final review');
    await again.getByRole('button', { name: 'Cancel' }).click();
    await page.getByRole('alertdialog', { name: 'Discard your changes?' }).getByRole('button', { name: 'Discard', exact: true }).click();
    await expect(again).toBeHidden();
    // Two undos of one question say the same thing: one message, not a stack of twins.
    // Counted once, not waited for: the first toast would go by itself after a few seconds.
    expect(await toast(page, `Undone: “${TITLES.corrected}” is back as it was.`).count()).toBe(1);
    const q = await call<Question>('getQuestion', { id: ids.corrected });
    expect(q.resolution?.note).toBe('Published on the website');
    expect(q.resolution_history).toEqual([]);
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('deleting a revision and then the question are both undone from their toasts', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, `questions/${ids.doomed}`);
  const { page } = app;
  try {
    const before = await call<Question>('getQuestion', { id: ids.doomed });
    await page.getByRole('button', { name: /^Delete the 45% forecast of/ }).click();
    const confirm = page.getByRole('alertdialog', { name: 'Delete this revision?' });
    await expect(confirm).toContainText('Undo in the message that follows brings it back.');
    await confirm.getByRole('button', { name: 'Delete', exact: true }).click();
    await expect(page.getByTestId('revision-row')).toHaveCount(1);
    await toast(page, 'Revision deleted.').getByRole('button', { name: 'Undo' }).click();
    await expect(page.getByTestId('revision-row')).toHaveCount(2);

    await page.getByRole('group', { name: 'Question actions' }).getByRole('button', { name: 'Delete', exact: true }).click();
    await page.getByRole('alertdialog', { name: 'Delete this question?' }).getByRole('button', { name: 'Delete question' }).click();
    await expect(page).toHaveURL(/#\/questions$/);
    await expect(page.getByRole('link', { name: TITLES.doomed })).toHaveCount(0);
    await toast(page, `Deleted “${TITLES.doomed}”.`).getByRole('button', { name: 'Undo' }).click();
    // Undo brings the question back whole and goes back to its page.
    await expect(page).toHaveURL(new RegExp(`#/questions/${ids.doomed}$`));
    await expect(page.getByRole('heading', { level: 1 })).toHaveText(TITLES.doomed);
    await expect(page.getByTestId('revision-row')).toHaveCount(2);
    const after = await call<Question>('getQuestion', { id: ids.doomed });
    expect(after.forecasts).toEqual(before.forecasts);
    expect(after.opened_at).toBe(before.opened_at);
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('a snoozed check-in stays visible: a collapsed section on the Desk, a mark on the question page, Unsnooze', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, '');
  const { page } = app;
  try {
    await expect(page.getByTestId('desk-snoozed')).toHaveCount(0);
    await deskItem(page, TITLES.checkin).getByRole('button', { name: 'Snooze' }).click();
    await deskItem(page, TITLES.checkin).getByRole('button', { name: 'Next week' }).click();
    await expect(toast(page, `Snoozed “${TITLES.checkin}” until`)).toBeVisible();
    await expect(deskItem(page, TITLES.checkin)).toHaveCount(0);

    const snoozed = page.getByTestId('desk-snoozed');
    await expect(snoozed).toBeVisible();
    // Collapsed until asked.
    await expect(snoozed.getByTestId('desk-snoozed-item')).toBeHidden();
    await snoozed.locator('summary').click();
    const row = snoozed.getByTestId('desk-snoozed-item');
    await expect(row).toHaveCount(1);
    await expect(row).toContainText(TITLES.checkin);
    await expect(row).toContainText(/Back \S+/);
    await expectNoSeriousViolations(page, 'the Desk with its snoozed section open');

    // Undo of the snooze puts the check-in back on the Desk.
    await toast(page, `Snoozed “${TITLES.checkin}” until`).getByRole('button', { name: 'Undo' }).click();
    await expect(deskItem(page, TITLES.checkin)).toBeVisible();
    await expect(page.getByTestId('desk-snoozed')).toHaveCount(0);

    // Snoozed again, then marked on the question page, and ended there.
    await deskItem(page, TITLES.checkin).getByRole('button', { name: 'Snooze' }).click();
    await deskItem(page, TITLES.checkin).getByRole('button', { name: 'Tomorrow morning' }).click();
    await expect(page.getByTestId('desk-snoozed')).toBeVisible();
    await page.getByTestId('desk-snoozed').locator('summary').click();
    await page.getByTestId('desk-snoozed-item').getByRole('link', { name: TITLES.checkin }).click();
    const note = page.getByTestId('snooze-note');
    await expect(note).toContainText('The check-in nudge comes back');
    await expectNoSeriousViolations(page, 'a question page with a snoozed check-in');
    await note.getByRole('button', { name: 'Unsnooze' }).click();
    await expect(toast(page, /Snooze ended/)).toBeVisible();
    await expect(page.getByTestId('snooze-note')).toHaveCount(0);
    expect((await call<DueList>('due')).nudges.some((n) => n.id === ids.checkin)).toBe(true);

    // And from the Desk's section.
    await call('snooze', { question_id: ids.checkin, kind: 'checkin', preset: 'next_week' });
    await page.goto(`${server().url}#/`);
    await page.getByTestId('desk-snoozed').locator('summary').click();
    await page.getByRole('button', { name: `Unsnooze “${TITLES.checkin}”` }).click();
    await expect(deskItem(page, TITLES.checkin)).toBeVisible();
    await expect(page.getByTestId('desk-snoozed')).toHaveCount(0);
    await expect(toast(page, `Unsnoozed “${TITLES.checkin}”.`)).toBeVisible();
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('quick add records when a call was made: the opening and the first forecast are dated then', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, 'questions');
  const { page } = app;
  try {
    await page.getByRole('main').focus();
    await page.keyboard.press('n');
    const dialog = page.getByRole('dialog', { name: 'New question' });
    await fillQuickAdd(page, { title: 'Client renews the support contract', closes: daysFromNow(20), probability: '65', timeZone: 'Europe/London' });
    // An opening in the future cannot be true: refused beside the field, before anything is sent.
    await dialog.getByRole('textbox', { name: 'Opened', exact: true }).fill(daysFromNow(2));
    await dialog.getByRole('button', { name: 'Save question' }).click();
    await expect(dialog.getByText(/Must not be in the future: the opening time \(when the question was posed\) records something/)).toBeVisible();
    await expectNoSeriousViolations(page, 'quick add with an opening time in the future');
    await dialog.screenshot({ path: 'test/e2e/artifacts/forgiving-quick-add-opened.png' });

    const opened = new Date(Date.now() - 3 * DAY);
    opened.setUTCSeconds(0, 0);
    // The boxes read times on the form's zone (Europe/London); the test names an instant in UTC.
    const londonLocal = new Intl.DateTimeFormat('sv-SE', { timeZone: 'Europe/London', dateStyle: 'short', timeStyle: 'short' }).format(opened).replace(' ', 'T');
    await dialog.getByRole('textbox', { name: 'Opened', exact: true }).fill(londonLocal);
    await dialog.getByRole('button', { name: 'Save question' }).click();
    await expect(dialog).toBeHidden();
    await toast(page, 'Added “Client renews the support contract”.').getByRole('link', { name: 'Open the question' }).click();
    await expect(page.getByRole('heading', { level: 1 })).toHaveText('Client renews the support contract');
    const id = decodeURIComponent(page.url().split('#/questions/')[1]!);
    const q = await call<BinaryQuestion>('getQuestion', { id });
    expect(q.opened_at).toBe(opened.toISOString());
    expect(q.forecasts.map((f) => [f.at, f.p])).toEqual([[opened.toISOString(), 0.65]]);
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

/** The whole diary as a JSON v1 file, as the app exports it. */
async function exportedDiary(): Promise<{ format: string; version: number; questions: Record<string, unknown>[] }> {
  return call('exportDiary');
}

test('importing your own export offers a merge; changed questions are listed and nothing is imported', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, 'settings');
  const { page } = app;
  try {
    const diary = await exportedDiary();
    const count = diary.questions.length;
    const section = page.getByRole('region', { name: 'Your data' });
    const input = section.getByLabel('Import a diary file…');
    const file = (name: string, body: unknown) => ({ name, mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(body)) });

    // Unchanged: everything is skipped.
    await input.setInputFiles(file('mine.json', diary));
    const overlap = page.getByTestId('import-overlap');
    await expect(overlap.getByRole('heading', { name: 'mine.json has questions that are already in this diary' })).toBeFocused();
    await expect(overlap).toContainText('is already in this diary');
    await expectNoSeriousViolations(page, 'the merge offer');
    await overlap.getByRole('button', { name: 'Merge (skip questions already here unchanged)' }).click();
    await expect(toast(page, `Merged mine.json: 0 questions added, ${count} questions already here unchanged and skipped.`)).toBeVisible();
    await expect(overlap).toHaveCount(0);

    // One new question and one changed: nothing imported, the changed one named.
    const changed = structuredClone(diary);
    const second = changed.questions[1]!;
    second.title = `${String(second.title)} (edited elsewhere)`;
    changed.questions.push({ title: 'A new question from the other laptop', closes_at: '2031-01-01T00:00:00Z', forecasts: [] });
    await input.setInputFiles(file('edited.json', changed));
    await overlap.getByRole('button', { name: 'Merge (skip questions already here unchanged)' }).click();
    const conflicts = overlap.getByTestId('import-conflicts');
    await expect(conflicts.getByRole('listitem')).toHaveCount(1);
    await expect(conflicts).toContainText(`Question 2, “${String(second.title)}” (${String(second.id)}): differs in title`);
    await expect(overlap).toContainText('Nothing was imported');
    await expectNoSeriousViolations(page, 'a refused merge with its conflicts');
    await overlap.screenshot({ path: 'test/e2e/artifacts/forgiving-merge-conflicts.png' });
    expect((await exportedDiary()).questions).toHaveLength(count);
    await overlap.getByRole('button', { name: 'Close' }).click();
    await expect(overlap).toHaveCount(0);

    // Only the new one beside unchanged ones: it is added, the rest skipped.
    const grown = structuredClone(diary);
    grown.questions.push({ title: 'A new question from the other laptop', closes_at: '2031-01-01T00:00:00Z', forecasts: [] });
    await input.setInputFiles(file('grown.json', grown));
    await overlap.getByRole('button', { name: 'Merge (skip questions already here unchanged)' }).click();
    await expect(toast(page, `Merged grown.json: 1 question added, ${count} questions already here unchanged and skipped.`)).toBeVisible();
    expect((await exportedDiary()).questions).toHaveLength(count + 1);
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('saving settings, and the Scorecard’s default costs, has an Undo that puts the earlier values back', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, 'settings');
  const { page } = app;
  try {
    const before = await call<{ closing_soon_hours: number; default_false_alarm_cost: number }>('getSettings');
    const field = page.getByRole('spinbutton', { name: /Closing-soon warning/ });
    await field.fill(String(before.closing_soon_hours + 12));
    await page.getByRole('button', { name: 'Save settings' }).click();
    await expect(toast(page, 'Settings saved.')).toBeVisible();
    expect((await call<{ closing_soon_hours: number }>('getSettings')).closing_soon_hours).toBe(before.closing_soon_hours + 12);
    await toast(page, 'Settings saved.').getByRole('button', { name: 'Undo' }).click();
    await expect(toast(page, 'Undone: the settings are as they were before that save.')).toBeVisible();
    await expect(field).toHaveValue(String(before.closing_soon_hours));
    expect(await call('getSettings')).toEqual(before);

    // The Scorecard's default costs are settings too.
    await page.goto(`${server().url}#/scorecard`);
    const falseAlarm = page.getByLabel('False-alarm cost', { exact: true });
    await falseAlarm.fill('2.5');
    await page.getByRole('button', { name: 'Save defaults' }).click();
    await expect(toast(page, 'Saved the default costs')).toBeVisible();
    expect((await call<{ default_false_alarm_cost: number }>('getSettings')).default_false_alarm_cost).toBe(2.5);
    await toast(page, 'Saved the default costs').getByRole('button', { name: 'Undo' }).click();
    await expect(toast(page, 'Undone: the settings are as they were before that save.')).toBeVisible();
    await expect(falseAlarm).toHaveValue(String(before.default_false_alarm_cost));
    expect(await call('getSettings')).toEqual(before);
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

const SIZES = [
  { width: 1024, height: 700 },
  { width: 1920, height: 1080 },
] as const;

for (const scheme of ['light', 'dark'] as const) {
  for (const size of SIZES) {
    test(`photographed at ${size.width} (${scheme}): the Desk's snoozed section, history and snooze on a question, the warning, the merge offer`, async ({ browser }) => {
      const app = await openApp(browser, server(), { colorScheme: scheme, viewport: size }, '');
      const { page } = app;
      const shot = (name: string, fullPage = true) => page.screenshot({ path: `test/e2e/artifacts/forgiving-${name}-${size.width}-${scheme}.png`, fullPage });
      try {
        // A snoozed check-in and a corrected resolution to show.
        await call('snooze', { question_id: ids.checkin, kind: 'checkin', preset: 'next_week' });
        const corrected = await call<Question & { undo: string }>('resolveQuestion', { id: ids.corrected, outcome: 'no', note: 'Postponed', correction_note: 'Misread the draft' });
        await page.reload();
        await page.getByTestId('desk-snoozed').locator('summary').click();
        await expect(page.getByTestId('desk-snoozed-item')).toBeVisible();
        await shot('desk');

        await page.goto(`${server().url}#/questions/${ids.checkin}`);
        await expect(page.getByTestId('snooze-note')).toBeVisible();
        await shot('snoozed-question');
        await page.goto(`${server().url}#/questions/${ids.corrected}`);
        await expect(page.getByTestId('resolution-history-row')).toHaveCount(1);
        await shot('history');

        await page.goto(`${server().url}#/questions/${ids.closed}`);
        await page.getByRole('group', { name: 'Question actions' }).getByRole('button', { name: 'Resolve', exact: true }).click();
        const dialog = page.getByRole('dialog', { name: 'Resolve the question' });
        await dialog.getByRole('radio', { name: 'Yes', exact: true }).check();
        // A closed event question is not unusual: this one resolves at once, then is undone.
        await dialog.getByRole('button', { name: 'Resolve', exact: true }).click();
        await expect(toast(page, 'Resolved Yes.')).toBeVisible();
        await shot('undo-toast', false);
        await toast(page, 'Resolved Yes.').getByRole('button', { name: 'Undo' }).click();
        await expect(toast(page, /^Undone/)).toBeVisible();

        await page.goto(`${server().url}#/questions/${ids.stateShot}`);
        await page.getByRole('group', { name: 'Question actions' }).getByRole('button', { name: 'Resolve', exact: true }).click();
        const early = page.getByRole('dialog', { name: 'Resolve the question' });
        await early.getByRole('radio', { name: 'No', exact: true }).check();
        await early.getByRole('button', { name: 'Resolve', exact: true }).click();
        const ask = page.getByRole('alertdialog', { name: 'This is unusual — go ahead?' });
        await expect(ask).toBeVisible();
        await shot('warning', false);
        await ask.getByRole('button', { name: 'Cancel' }).click();
        await expect(ask).toBeHidden();

        await call('undo', { token: corrected.undo });
        await call('unsnooze', { question_id: ids.checkin });
        await page.goto(`${server().url}#/settings`);
        const diary = await exportedDiary();
        await page.getByRole('region', { name: 'Your data' }).getByLabel('Import a diary file…').setInputFiles({ name: 'mine.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(diary)) });
        await expect(page.getByTestId('import-overlap')).toBeVisible();
        await page.getByTestId('import-overlap').scrollIntoViewIfNeeded();
        await shot('merge-offer', false);
        expect(app.problems).toEqual([]);
      } finally {
        await app.close();
      }
    });
  }
}
