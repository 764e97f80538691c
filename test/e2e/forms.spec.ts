/**
 * Forms say everything that is wrong at once, beside the field, in the user's words: an
 * empty New question flags the question and the close together; a bad tag left in the tag
 * box stops the save instead of vanishing; refusals never show request names such as
 * "opened_at". Percent boxes warn at 0% and 100% (saved as typed, clipped by the log score
 * to 0.1% and 99.9%, docs/scoring.md) and ask whether 50% was meant when 0.5 is typed (a
 * choice box too, unless its chances already add to 100%); a
 * decimal comma typed there is read as a point ("0,7" is 0.7), not dropped.
 * Dates are typed in the user's own order (en-GB here: day/month/year) and read back with
 * the zone's offset. Yes and No look different wherever they are actions. A toast's action
 * is reached with F6.
 */
import { expect, test, type Locator, type Page } from '@playwright/test';
import type { BinaryQuestion, QuestionSummary } from '../../shared/domain';
import { apiCall, expectNoSeriousViolations, openNewQuestion } from './helpers';
import { openApp, useDiaryServer, type AppPage } from './serve';

const server = useDiaryServer();
test.describe.configure({ mode: 'serial' });

let app: AppPage;
test.beforeAll(async ({ browser }) => {
  app = await openApp(browser, server(), {}, 'questions');
});
test.afterAll(async () => {
  expect(app.problems).toEqual([]);
  await app.close();
});

async function openQuickAdd(page: Page): Promise<Locator> {
  await page.getByRole('main').focus();
  await page.keyboard.press('n');
  const dialog = page.getByRole('dialog', { name: 'New question' });
  await expect(dialog).toBeVisible();
  return dialog;
}

/** Closes a dialog that holds typed text: Escape, then Discard. */
async function discard(page: Page, dialog: Locator): Promise<void> {
  await page.keyboard.press('Escape');
  await page.getByRole('alertdialog', { name: 'Discard your changes?' }).getByRole('button', { name: 'Discard' }).click();
  await expect(dialog).toBeHidden();
}

async function titles(): Promise<string[]> {
  const list = await apiCall<{ questions: QuestionSummary[] }>(server().url, 'listQuestions', {});
  return list.questions.map((q) => q.title);
}

const SNAKE_CASE = /\b[a-z]+(?:_[a-z]+)+\b/;

test('an empty New question says everything that is wrong at once, in plain words', async () => {
  const { page } = app;
  const dialog = await openQuickAdd(page);
  await dialog.getByRole('button', { name: 'Save question' }).click();

  const title = dialog.getByRole('textbox', { name: 'Question', exact: true });
  const closes = dialog.getByRole('textbox', { name: 'Closes', exact: true });
  await expect(title).toHaveAttribute('aria-invalid', 'true');
  await expect(title).toHaveAccessibleDescription(/Write the question you are forecasting/);
  await expect(closes).toHaveAttribute('aria-invalid', 'true');
  await expect(closes).toHaveAccessibleDescription(/Choose the date and time the window closes/);
  await expect(title).toBeFocused();
  for (const message of await dialog.getByTestId('field-error').allTextContents()) expect(message).not.toMatch(SNAKE_CASE);

  await expectNoSeriousViolations(page, 'the quick-add form with its errors');
  await page.screenshot({ path: 'test/e2e/artifacts/forms-all-errors.png' });
  await page.keyboard.press('Escape');
  await expect(dialog).toBeHidden();
});

test('a bad tag left in the tag box stops the save and says why', async () => {
  const { page } = app;
  const dialog = await openQuickAdd(page);
  await dialog.getByRole('textbox', { name: 'Question', exact: true }).fill('Harbour board approves the dredging plan');
  await dialog.getByRole('textbox', { name: 'Closes', exact: true }).fill('31/12/2030');
  await dialog.getByRole('textbox', { name: 'Closes: time' }).fill('17:00');
  const tags = dialog.getByLabel('Tags', { exact: true });
  await tags.fill('Client Harbour');
  await dialog.getByRole('button', { name: 'Save question' }).click();
  await expect(tags).toHaveAccessibleDescription(/“client harbour” is not a valid tag/);
  await expect(tags).toBeFocused();
  await expect(dialog).toBeVisible();
  expect(await titles()).not.toContain('Harbour board approves the dredging plan');

  await tags.fill('client:harbour');
  await dialog.getByRole('button', { name: 'Save question' }).click();
  await expect(dialog).toBeHidden();
  const list = await apiCall<{ questions: QuestionSummary[] }>(server().url, 'listQuestions', { text: 'dredging' });
  expect(list.questions.map((q) => q.tags)).toEqual([['client:harbour']]);
});

test('a list of tags pasted with commas adds each tag, and keeps any bad one in the box with the reason', async () => {
  const { page } = app;
  const dialog = await openQuickAdd(page);
  await dialog.getByRole('textbox', { name: 'Question', exact: true }).fill('Quellmoor renews the cold-store lease');
  await dialog.getByRole('textbox', { name: 'Closes', exact: true }).fill('31/12/2030 17:00');
  const tags = dialog.getByLabel('Tags', { exact: true });
  await tags.fill('client:quellmoor, Renewals,, cold store');
  await tags.press('Enter');
  await expect(dialog.getByRole('list', { name: 'Tags: chosen' }).getByRole('listitem')).toHaveText(['client:quellmoor×', 'renewals×']);
  await expect(tags).toHaveValue('cold store');
  await expect(tags).toHaveAccessibleDescription(/“cold store” is not a valid tag/);

  await tags.fill('cold-store');
  await dialog.getByRole('button', { name: 'Save question' }).click();
  await expect(dialog).toBeHidden();
  const list = await apiCall<{ questions: QuestionSummary[] }>(server().url, 'listQuestions', { text: 'cold-store lease' });
  expect(list.questions.map((q) => q.tags)).toEqual([['client:quellmoor', 'renewals', 'cold-store']]);
});

test('0% and 100% are warned about and saved; 0.5 asks whether 50% was meant', async () => {
  const { page } = app;
  const dialog = await openQuickAdd(page);
  await dialog.getByRole('textbox', { name: 'Question', exact: true }).fill('Eastport ferry licence is renewed');
  await dialog.getByRole('textbox', { name: 'Closes', exact: true }).fill('01/07/2031');
  await dialog.getByRole('textbox', { name: 'Closes: time' }).fill('09:30');
  const base = dialog.getByRole('spinbutton', { name: 'Base rate', exact: true });
  const mine = dialog.getByRole('spinbutton', { name: 'Your probability', exact: true });

  await base.fill('100');
  await expect(base).toHaveAccessibleDescription(/A single miss at 100% dominates the log score; it is scored as 99\.9%\./);
  await mine.fill('0');
  await expect(mine).toHaveAccessibleDescription(/A single miss at 0% dominates the log score; it is scored as 0\.1%\./);

  await mine.fill('0.5');
  const question = dialog.getByTestId('percent-question');
  await expect(question).toContainText('Did you mean 50%?');
  await page.screenshot({ path: 'test/e2e/artifacts/forms-percent-question.png' });
  // Saving waits for an answer, and takes the keyboard to it.
  await dialog.getByRole('button', { name: 'Save question' }).click();
  await expect(dialog.getByRole('button', { name: 'Use 50%' })).toBeFocused();
  expect(await titles()).not.toContain('Eastport ferry licence is renewed');

  await dialog.getByRole('button', { name: 'Use 50%' }).click();
  await expect(mine).toHaveValue('50');
  await expect(mine).toBeFocused();
  await expect(question).toHaveCount(0);

  // Typed again and kept: saved as the 0.5% it says.
  await mine.fill('0.5');
  await dialog.getByRole('button', { name: 'Keep 0.5%' }).click();
  await expect(dialog.getByText('Keeping 0.5% as typed.')).toBeVisible();
  await dialog.getByRole('button', { name: 'Save question' }).click();
  await expect(dialog).toBeHidden();
  const list = await apiCall<{ questions: QuestionSummary[] }>(server().url, 'listQuestions', { text: 'ferry licence' });
  const saved = await apiCall<BinaryQuestion>(server().url, 'getQuestion', { id: list.questions[0]!.id });
  expect(saved.base_rate).toBe(1);
  expect(saved.forecasts.map((f) => f.p)).toEqual([0.005]);

  // The same question in a lens's box on Revise.
  await page.goto(`${server().url.split('?')[0]}#/questions/${encodeURIComponent(saved.id)}`);
  await page.getByRole('button', { name: 'Revise' }).click();
  const revise = page.getByRole('dialog', { name: 'Revise your forecast' });
  await revise.getByText('Lenses').click();
  await revise.getByRole('button', { name: 'Add lens' }).click();
  await revise.getByRole('spinbutton', { name: 'Lens 1 probability' }).fill('0.35');
  await expect(revise.getByTestId('percent-question')).toContainText('Did you mean 35%?');
  await revise.getByRole('button', { name: 'Use 35%' }).click();
  await expect(revise.getByRole('spinbutton', { name: 'Lens 1 probability' })).toHaveValue('35');
  await discard(page, revise);
});

test('a decimal comma typed or pasted in a percent box is read as a point, and a pasted percent sign is dropped', async () => {
  const { page } = app;
  const dialog = await openQuickAdd(page);
  const mine = dialog.getByRole('spinbutton', { name: 'Your probability', exact: true });
  // Typed key by key, as a person does: the number box would drop the comma and read "07".
  await mine.pressSequentially('0,7');
  await expect(mine).toHaveValue('0.7');
  await expect(dialog.getByTestId('percent-question')).toContainText('Did you mean 70%?');
  await mine.fill('');
  await mine.pressSequentially('12,5');
  await expect(mine).toHaveValue('12.5');
  // Pasted, "0,7" once went in as "07": 7% saved without a word.
  await mine.fill('');
  await mine.evaluate((box) => {
    const data = new DataTransfer();
    data.setData('text/plain', '0,7');
    box.dispatchEvent(new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }));
  });
  await expect(mine).toHaveValue('0.7');
  await expect(dialog.getByTestId('percent-question')).toContainText('Did you mean 70%?');
  // A percent copied with its sign: the number box alone refuses the whole paste.
  for (const [pasted, kept] of [
    ['35%', '35'],
    [' 12,5 % ', '12.5'],
  ]) {
    await mine.fill('');
    await mine.evaluate((box, text) => {
      const data = new DataTransfer();
      data.setData('text/plain', text);
      box.dispatchEvent(new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }));
    }, pasted!);
    await expect(mine).toHaveValue(kept!);
  }
  await discard(page, dialog);
});

test('the click that leaves a half-typed close lands where it was aimed, and the close says what is missing', async () => {
  const { page } = app;
  const dialog = await openQuickAdd(page);
  await dialog.getByRole('textbox', { name: 'Question', exact: true }).fill('Harbour board meets in July');
  // A date without its time, then straight to the type of answer with the mouse: the message
  // "Add the time" pushes the radio down, but only after the click has landed on it.
  await dialog.getByRole('textbox', { name: 'Closes', exact: true }).fill('01/07/2031');
  await dialog.getByRole('radio', { name: 'Multiple choice' }).click();
  await expect(dialog.getByRole('radio', { name: 'Multiple choice' })).toBeChecked();
  await expect(dialog.getByRole('textbox', { name: 'Closes', exact: true })).toHaveAccessibleDescription(/Add the time/);
  // The date box is marked; the time zone beside it, which is not wrong, is not.
  const border = (box: Locator) => box.evaluate((el) => getComputedStyle(el).borderTopColor);
  const dateBorder = await border(dialog.getByRole('textbox', { name: 'Closes', exact: true }));
  expect(await border(dialog.getByRole('combobox', { name: 'Time zone for closes' }))).not.toBe(dateBorder);
  await discard(page, dialog);
});

test('a choice box asks whether 50% was meant when 0.5 is typed, unless the chances already add to 100%', async () => {
  const { page } = app;
  const dialog = await openQuickAdd(page);
  await dialog.getByRole('textbox', { name: 'Question', exact: true }).fill('Which bidder wins the Harbour tender?');
  await dialog.getByRole('textbox', { name: 'Closes', exact: true }).fill('01/07/2031');
  await dialog.getByRole('textbox', { name: 'Closes: time' }).fill('09:30');
  await dialog.getByRole('radio', { name: 'Multiple choice' }).check();
  const options = dialog.getByRole('textbox', { name: /^Option \d$/ });
  await options.nth(0).fill('Maersk');
  await options.nth(1).fill('DSV');
  await options.nth(2).fill('Other');
  const chances = dialog.getByRole('group', { name: 'Your chances' });
  const maersk = chances.getByRole('spinbutton', { name: 'Maersk' });
  await maersk.fill('0.5');
  await chances.getByRole('spinbutton', { name: 'DSV' }).fill('30');
  await chances.getByRole('spinbutton', { name: 'Other' }).fill('20');
  const question = chances.getByTestId('percent-question');
  await expect(question).toContainText('Did you mean 50%?');
  await expect(maersk).toHaveAccessibleDescription(/Did you mean 50%\?/);
  // Saving waits for the answer and takes the keyboard to it.
  await dialog.getByRole('button', { name: 'Save question' }).click();
  await expect(chances.getByRole('button', { name: 'Use 50%' })).toBeFocused();
  await chances.getByRole('button', { name: 'Use 50%' }).click();
  await expect(maersk).toHaveValue('50');
  await expect(maersk).toBeFocused();
  await expect(question).toHaveCount(0);
  await expect(chances.getByTestId('choice-total')).toContainText('Total 100%');

  // A long shot at 0.5% in boxes that add to 100% was meant: nothing to ask, and 0% is no warning here.
  await maersk.fill('0.5');
  await chances.getByRole('spinbutton', { name: 'DSV' }).fill('79.5');
  await chances.getByRole('spinbutton', { name: 'Other' }).fill('20');
  await expect(chances.getByTestId('choice-total')).toContainText('Total 100%');
  await expect(question).toHaveCount(0);
  await chances.getByRole('spinbutton', { name: 'Other' }).fill('0');
  await chances.getByRole('spinbutton', { name: 'DSV' }).fill('99.5');
  await expect(chances.getByTestId('percent-warning')).toHaveCount(0);
  await discard(page, dialog);
});

test('dates are typed day/month/year and read back with the zone’s offset', async () => {
  const { page } = app;
  await page.goto(`${server().url.split('?')[0]}#/questions`);
  const dialog = await openQuickAdd(page);
  await dialog.getByRole('textbox', { name: 'Question', exact: true }).fill('Northgate signs phase 3 by New Year’s Eve');
  const date = dialog.getByRole('textbox', { name: 'Closes', exact: true });
  await expect(date).toHaveAttribute('placeholder', 'dd/mm/yyyy');

  // Month and day the wrong way round: said plainly once the field is left, and not saved.
  await date.fill('12/31/2030');
  await dialog.getByRole('textbox', { name: 'Closes: time' }).fill('17:00');
  await dialog.getByRole('textbox', { name: 'Resolution rule' }).focus();
  await expect(date).toHaveAccessibleDescription(/31 is not a month; write the date as dd\/mm\/yyyy/);
  await dialog.getByRole('button', { name: 'Save question' }).click();
  await expect(date).toBeFocused();

  await date.fill('31/12/2030');
  await dialog.getByLabel('Time zone for closes').selectOption('Europe/London');
  await expect(dialog.getByTestId('datetime-readback')).toHaveText('Tue, 31 Dec 2030, 17:00 GMT');
  await dialog.getByLabel('Time zone for closes').selectOption('America/New_York');
  await expect(dialog.getByTestId('datetime-readback')).toHaveText('Tue, 31 Dec 2030, 17:00 GMT\u22125');
  await dialog.getByRole('button', { name: 'Save question' }).click();
  await expect(dialog).toBeHidden();
  const list = await apiCall<{ questions: QuestionSummary[] }>(server().url, 'listQuestions', { text: 'phase 3' });
  // 17:00 in New York in winter (UTC−5) is 22:00Z.
  expect(list.questions.map((q) => q.closes_at)).toEqual(['2030-12-31T22:00:00.000Z']);
});

test('a date and time typed or pasted into the date box fill both boxes, the read-back line included', async () => {
  const { page } = app;
  const dialog = await openQuickAdd(page);
  const date = dialog.getByRole('textbox', { name: 'Closes', exact: true });
  const time = dialog.getByRole('textbox', { name: 'Closes: time' });
  await dialog.getByLabel('Time zone for closes').selectOption('Europe/London');
  await date.fill('30/12/2030 09:15');
  await expect(date).toHaveValue('30/12/2030');
  await expect(time).toHaveValue('09:15');
  const readback = dialog.getByTestId('datetime-readback');
  await expect(readback).toHaveText('Mon, 30 Dec 2030, 09:15 GMT');

  // The read-back line, copied into the Opened box, is taken whole.
  const opened = dialog.getByRole('textbox', { name: 'Opened', exact: true });
  await opened.fill('Mon, 30 Dec 2030, 09:15 GMT');
  await expect(opened).toHaveValue('30/12/2030');
  await expect(dialog.getByRole('textbox', { name: 'Opened: time' })).toHaveValue('09:15');
  await discard(page, dialog);
});

test('an optional date that is not a date is not taken as “now”: the save stops at it', async () => {
  const { page } = app;
  await page.getByRole('link', { name: 'Northgate signs phase 3 by New Year’s Eve' }).click();
  await page.getByRole('button', { name: 'Revise' }).click();
  const dialog = page.getByRole('dialog', { name: 'Revise your forecast' });
  const asOf = dialog.getByRole('textbox', { name: 'As of', exact: true });
  await asOf.fill('32/01/2026');
  await dialog.getByRole('textbox', { name: 'As of: time' }).fill('10:00');
  await dialog.getByRole('spinbutton', { name: 'Your probability', exact: true }).fill('45');
  await page.keyboard.press('Enter');
  await expect(asOf).toBeFocused();
  await expect(asOf).toHaveAccessibleDescription(/That month has no day 32; write the date as dd\/mm\/yyyy/);
  await expect(dialog).toBeVisible();
  await discard(page, dialog);
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Questions' }).click();
});

test('Edit says a close before the opening beside Closes, without internal names', async () => {
  const { page } = app;
  await page.getByRole('link', { name: 'Northgate signs phase 3 by New Year’s Eve' }).click();
  await page.getByRole('button', { name: 'Edit' }).click();
  const dialog = page.getByRole('dialog', { name: 'Edit question' });
  const closes = dialog.getByRole('textbox', { name: 'Closes', exact: true });
  await closes.fill('01/01/2020');
  await dialog.getByRole('textbox', { name: 'Question', exact: true }).fill('');
  await dialog.getByRole('button', { name: 'Save changes' }).click();
  // Both problems at once; the window's order in words, not "(opened_at)".
  await expect(dialog.getByRole('textbox', { name: 'Question', exact: true })).toHaveAccessibleDescription(/Write the question/);
  await expect(closes).toHaveAccessibleDescription(/Must be after the opening time: choose a later close, or move “Opened” earlier/);
  for (const message of await dialog.getByTestId('field-error').allTextContents()) expect(message).not.toMatch(SNAKE_CASE);
  await discard(page, dialog);
});

test('Edit of a numeric question says when it opened beside a close before it, and what to do', async () => {
  const { page } = app;
  await openNewQuestion(page, server().url, {
    title: 'Eastgate pallets in Q1',
    opened_at: '2026-10-24T08:03:00Z',
    closes_at: '2031-03-31T16:00:00Z',
    time_zone: 'Europe/London',
    type: 'numeric',
    unit: 'pallets',
    value_kind: 'number',
    levels: [0.1, 0.5, 0.9],
  });
  await page.getByRole('button', { name: 'Edit' }).click();
  const dialog = page.getByRole('dialog', { name: 'Edit question' });
  const closes = dialog.getByRole('textbox', { name: 'Closes', exact: true });
  await closes.fill('01/01/2026');
  await dialog.getByRole('button', { name: 'Save changes' }).click();
  // The opening is not in this dialog: the message says when it was.
  await expect(closes).toHaveAccessibleDescription(/Must be after the question opened \(24 Oct 2026, 09:03 GMT\+1\): choose a later close/);
  await discard(page, dialog);
});

test('Settings says every problem at once: an empty box and a value the diary’s rules refuse', async () => {
  const { page } = app;
  await page.goto(`${server().url.split('?')[0]}#/settings`);
  const field = (label: string) => page.getByRole('spinbutton', { name: label, exact: true });
  await field('Check in every').fill('');
  await field('Closing-soon warning').fill('0');
  await field('Overdue after').fill('91');
  await page.getByRole('button', { name: 'Save settings' }).click();
  await expect(field('Check in every')).toHaveAccessibleDescription(/Enter a number of days/);
  await expect(field('Closing-soon warning')).toHaveAccessibleDescription(/Must be at least 1 hour/);
  await expect(field('Overdue after')).toHaveAccessibleDescription(/Must be at most 90 days/);
  await page.getByRole('button', { name: 'Discard changes' }).click();
});

test('Yes and No differ in look, icon and words wherever they are actions', async () => {
  const { page } = app;
  const now = Date.now();
  await apiCall(server().url, 'createQuestion', {
    title: 'Quayside lease is signed',
    opened_at: new Date(now - 20 * 86_400_000).toISOString(),
    closes_at: new Date(now - 86_400_000).toISOString(),
    first_forecast: { p: 0.7, at: new Date(now - 10 * 86_400_000).toISOString() },
  });
  for (const scheme of ['light', 'dark'] as const) {
    await page.emulateMedia({ colorScheme: scheme });
    await page.goto(`${server().url.split('?')[0]}#/desk`);
    const item = page.getByTestId('desk-item').filter({ hasText: 'Quayside lease is signed' });
    const group = item.getByRole('group', { name: 'Resolve' });
    const yes = group.getByRole('button', { name: 'Yes', exact: true });
    const no = group.getByRole('button', { name: 'No', exact: true });
    const look = (button: Locator) =>
      button.evaluate((el) => {
        const style = getComputedStyle(el);
        return { background: style.backgroundColor, border: `${style.borderTopWidth} ${style.borderTopStyle}`, icon: el.querySelector('svg path')?.getAttribute('d') ?? '' };
      });
    const [y, n] = [await look(yes), await look(no)];
    expect(y.background, 'Yes is filled, No is not').not.toBe(n.background);
    expect(y.border).not.toBe(n.border);
    expect(y.icon).not.toBe('');
    expect(n.icon).not.toBe('');
    expect(y.icon, 'a tick and a cross, not only colour').not.toBe(n.icon);
    await expectNoSeriousViolations(page, `the Desk's resolve buttons (${scheme})`);
    await item.screenshot({ path: `test/e2e/artifacts/forms-yes-no-desk-${scheme}.png` });

    await item.getByRole('link', { name: 'Quayside lease is signed' }).click();
    await page.getByRole('button', { name: 'Resolve', exact: true }).click();
    const dialog = page.getByRole('dialog', { name: 'Resolve the question' });
    for (const outcome of ['Yes', 'No']) {
      await expect(dialog.locator(`label.choice--${outcome.toLowerCase()}`).filter({ has: page.getByRole('radio', { name: outcome, exact: true }) }).locator('svg')).toHaveCount(1);
    }
    await dialog.getByRole('radio', { name: 'No', exact: true }).check();
    await expect(dialog.getByText('It did not happen.')).toBeVisible();
    await dialog.screenshot({ path: `test/e2e/artifacts/forms-yes-no-dialog-${scheme}.png` });
    await discard(page, dialog);
  }
  await page.emulateMedia({ colorScheme: 'light' });
});

test('a toast’s action is reached with F6, and F6 goes back', async () => {
  const { page } = app;
  await page.goto(`${server().url.split('?')[0]}#/questions`);
  const dialog = await openQuickAdd(page);
  await dialog.getByRole('textbox', { name: 'Question', exact: true }).fill('Pilot extended to a second depot');
  await dialog.getByRole('textbox', { name: 'Closes', exact: true }).fill('2031-03-31T17:00');
  await dialog.getByRole('button', { name: 'Save question' }).click();
  await expect(dialog).toBeHidden();
  const action = page.getByTestId('toast').filter({ hasText: 'Pilot extended to a second depot' }).getByRole('link', { name: 'Open the question' });
  await expect(action).toBeVisible();
  await page.getByLabel('Search').focus();
  // The newest toast's action, whatever older toasts are still showing.
  await page.keyboard.press('F6');
  await expect(action).toBeFocused();
  await page.keyboard.press('F6');
  await expect(page.getByLabel('Search')).toBeFocused();
});
