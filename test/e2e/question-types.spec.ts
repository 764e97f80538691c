/**
 * Choice and numeric questions end to end against `forelog serve` (issue 9): quick add with
 * the type, the first forecast entered as a percentage per option (with the live total and
 * "Spread the rest") or as P10/P50/P90, refusals in plain words (a total other than 100%, a
 * decreasing range), revising, a reference, resolving (pick the option; enter the value or
 * the date), the history charts' data, the Questions list's last-forecast cell and the Desk.
 * Axe scans and screenshots in light and dark at 1024 and 1920 wide go to test/e2e/artifacts.
 */
import { expect, test, type Page } from '@playwright/test';
import { apiCall, daysFromNow, expectNoSeriousViolations, fillQuickAdd, afterRedraw } from './helpers';
import { useAppPage, useDiaryServer } from './serve';

const server = useDiaryServer();
test.describe.configure({ mode: 'serial' });
// Each test takes axe scans and screenshots in two schemes at two widths.
test.setTimeout(120_000);

const app = useAppPage(server);

async function openNewQuestion(page: Page) {
  await page.getByRole('main').focus();
  await page.keyboard.press('n');
  return page.getByRole('dialog', { name: 'New question' });
}

async function historyData(page: Page): Promise<Record<string, unknown>> {
  return JSON.parse((await page.getByTestId('history-chart').getAttribute('data-points')) ?? 'null') as Record<string, unknown>;
}

/** Screenshots of the current page in both schemes at both widths; an axe scan in each scheme. */
async function shoot(page: Page, name: string) {
  for (const scheme of ['light', 'dark'] as const) {
    await page.emulateMedia({ colorScheme: scheme });
    await expectNoSeriousViolations(page, `${name} (${scheme})`);
    for (const width of [1024, 1920]) {
      await page.setViewportSize({ width, height: 900 });
      await afterRedraw(page);
      await page.screenshot({ path: `test/e2e/artifacts/types-${name}-${scheme}-${width}.png`, fullPage: true });
    }
  }
  await page.emulateMedia({ colorScheme: 'light' });
  await page.setViewportSize({ width: 1280, height: 860 });
}

test('a choice question: spread the rest, a total other than 100% refused, revise, reference, resolve by picking the option', async () => {
  const { page } = app;
  const dialog = await openNewQuestion(page);
  await fillQuickAdd(page, { title: 'Which supplier will Quellmoor pick?', closes: daysFromNow(30) });
  await dialog.getByRole('radio', { name: 'Multiple choice' }).check();
  // The rule's hint speaks of the options, not of a Yes this question does not have.
  await expect(dialog.getByRole('textbox', { name: 'Resolution rule' })).toHaveAccessibleDescription(/^What decides which option came true/);
  // Empty options: each box says so beside it, once, as a sentence.
  await dialog.getByRole('button', { name: 'Save question' }).click();
  await expect(dialog.getByRole('textbox', { name: 'Option 1', exact: true })).toHaveAccessibleDescription('Write the option, or remove it');
  await expect(dialog.getByText(/write the option, or remove it/i)).toHaveCount(3);
  for (const [k, label] of ['Kestrowe', 'Ambledene', 'Neither'].entries()) {
    await dialog.getByRole('textbox', { name: `Option ${k + 1}`, exact: true }).fill(label);
  }
  const chances = dialog.getByRole('group', { name: 'Your chances' });
  await chances.getByRole('spinbutton', { name: 'Kestrowe' }).fill('50');
  await expect(chances.getByTestId('choice-total')).toHaveText('Total 50% · 2 blank');
  await chances.getByRole('button', { name: 'Spread the rest' }).click();
  await expect(chances.getByRole('spinbutton', { name: 'Ambledene' })).toHaveValue('25');
  await expect(chances.getByRole('spinbutton', { name: 'Neither' })).toHaveValue('25');
  await expect(chances.getByTestId('choice-total')).toHaveText('Total 100% ✓');
  await shoot(page, 'quick-add-choice');
  await dialog.getByRole('button', { name: 'Save question' }).click();
  await expect(dialog).toBeHidden();

  const row = page.getByTestId('question-table').getByRole('row').filter({ hasText: 'Which supplier' });
  await expect(row.getByRole('cell').nth(3)).toHaveText('Kestrowe 50%');
  await row.getByRole('link').click();
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Which supplier will Quellmoor pick?');

  await page.getByRole('button', { name: 'Revise' }).click();
  const revise = page.getByRole('dialog', { name: 'Revise your forecast' });
  const mine = revise.getByRole('group', { name: 'Your chances' });
  await mine.getByRole('spinbutton', { name: 'Kestrowe' }).fill('30');
  await mine.getByRole('spinbutton', { name: 'Ambledene' }).fill('60');
  await mine.getByRole('spinbutton', { name: 'Neither' }).fill('0');
  await revise.getByRole('button', { name: 'Save revision' }).click();
  await expect(revise.getByText('The chances must add to 100%; they add to 90% (10% short).')).toBeVisible();
  await mine.getByRole('spinbutton', { name: 'Neither' }).fill('10');
  await revise.getByLabel('What changed').fill('Ambledene cut its price');
  await revise.getByRole('button', { name: 'Save revision' }).click();
  await expect(revise).toBeHidden();
  await expect(page.getByTestId('toast').filter({ hasText: 'Revised to Ambledene 60%.' })).toBeVisible();

  await page.getByRole('button', { name: 'Add reference' }).click();
  const reference = page.getByRole('dialog', { name: 'Add a reference forecast' });
  await reference.getByRole('textbox', { name: 'Source' }).fill('client lead');
  const theirs = reference.getByRole('group', { name: 'Their chances' });
  await theirs.getByRole('spinbutton', { name: 'Kestrowe' }).fill('70');
  await theirs.getByRole('button', { name: 'Spread the rest' }).click();
  await reference.getByRole('button', { name: 'Add reference' }).click();
  await expect(reference).toBeHidden();
  await expect(page.getByTestId('revisions-table').getByTestId('revision-row')).toHaveCount(2);
  await expect(page.getByTestId('references-table').getByTestId('reference-row')).toHaveCount(1);

  await page.getByRole('button', { name: 'Resolve' }).click();
  const resolve = page.getByRole('dialog', { name: 'Resolve the question' });
  await resolve.getByRole('button', { name: 'Resolve', exact: true }).click();
  await expect(resolve.getByText('Choose the option that came true, or Void')).toBeVisible();
  await resolve.getByRole('radio', { name: 'Ambledene' }).check();
  await resolve.getByRole('button', { name: 'Resolve', exact: true }).click();
  await expect(resolve).toBeHidden();
  await expect(page.getByRole('heading', { level: 2, name: /Resolved: Ambledene/ })).toBeVisible();

  const data = await historyData(page);
  expect(data.options).toEqual(['Kestrowe', 'Ambledene', 'Neither']);
  expect((data.forecasts as { probs: number[] }[]).map((f) => f.probs)).toEqual([
    [0.5, 0.25, 0.25],
    [0.3, 0.6, 0.1],
  ]);
  expect((data.references as { probs: number[] }[])[0]!.probs).toEqual([0.7, 0.15, 0.15]);
  expect(data.outcome_option).toBe(1);
  await expect(page.getByTestId('history-chart').getByTestId('chart-legend')).toContainText('Ambledene (came true)');

  // Edit: the type and the number of options are fixed; a label can be reworded.
  await page.getByRole('button', { name: 'Edit' }).click();
  const edit = page.getByRole('dialog', { name: 'Edit question' });
  await expect(edit.getByTestId('type-fixed')).toContainText('the number of options are fixed');
  await expect(edit.getByRole('button', { name: 'Add an option' })).toHaveCount(0);
  await edit.getByRole('textbox', { name: 'Option 3', exact: true }).fill('Neither of them');
  await edit.getByRole('button', { name: 'Save changes' }).click();
  await expect(edit).toBeHidden();
  await expect(page.getByTestId('options-list')).toContainText('Neither of them');
  await shoot(page, 'choice-page');
});

test('a numeric question: a decreasing range refused by name, revise, resolve with the value', async () => {
  const { page } = app;
  const dialog = await openNewQuestion(page);
  await fillQuickAdd(page, { title: 'Weeks from kickoff to go-live at Harrowby', closes: daysFromNow(60) });
  await dialog.getByRole('radio', { name: 'Number or date' }).check();
  // The rule's hint speaks of the value, not of a Yes this question does not have.
  await expect(dialog.getByRole('textbox', { name: 'Resolution rule' })).toHaveAccessibleDescription(/^Where the number or date will be read off/);
  await dialog.getByRole('textbox', { name: 'Unit' }).fill('weeks');
  const range = dialog.getByRole('group', { name: /Your range/ });
  // A decimal comma typed key by key: the browser drops it ("9,5" reads 95), so the box says so.
  const low = range.getByRole('spinbutton', { name: 'P10 (low)' });
  await low.pressSequentially('9,5');
  await expect(low).toHaveAccessibleDescription(/Commas are dropped here, so this reads as 95\. For a decimal, type a point/);
  await low.blur();
  await low.focus();
  await expect(dialog.getByTestId('comma-warning')).toHaveCount(0);
  await low.fill('9');
  await range.getByRole('spinbutton', { name: 'P50 (median)' }).fill('13');
  await range.getByRole('spinbutton', { name: 'P90 (high)' }).fill('12');
  await dialog.getByRole('button', { name: 'Save question' }).click();
  await expect(dialog.getByText('P90 (12 weeks) is below P50 (13 weeks); each value must be at least the one before it.')).toBeVisible();
  await range.getByRole('spinbutton', { name: 'P90 (high)' }).fill('20');
  await expect(dialog.getByText('is below P50'), 'the reason goes once the box is changed').toHaveCount(0);
  await shoot(page, 'quick-add-numeric');
  await dialog.getByRole('button', { name: 'Save question' }).click();
  await expect(dialog).toBeHidden();

  const row = page.getByTestId('question-table').getByRole('row').filter({ hasText: 'Harrowby' });
  await expect(row.getByRole('cell').nth(3)).toHaveText('13 weeks (9 – 20)');
  await row.getByRole('link').click();

  // Revised, undone, saved again: the Undo in the toast takes the revision back and opens the
  // dialog again with what was typed, so the revision is one click from being made again.
  await page.getByRole('button', { name: 'Revise' }).click();
  const revise = page.getByRole('dialog', { name: 'Revise your forecast' });
  await expect(revise.getByRole('spinbutton', { name: 'P50 (median)' })).toHaveValue('13');
  await revise.getByRole('spinbutton', { name: 'P10 (low)' }).fill('11');
  await revise.getByRole('spinbutton', { name: 'P90 (high)' }).fill('17');
  await revise.getByRole('textbox', { name: 'What changed' }).fill('The vendor confirmed the test slot.');
  await revise.getByRole('button', { name: 'Save revision' }).click();
  await expect(revise).toBeHidden();
  const revised = page.getByTestId('toast').filter({ hasText: 'Revised to median 13 weeks.' });
  await expect(revised).toBeVisible();
  await expect(page.getByTestId('revisions-table').getByTestId('revision-row')).toHaveCount(2);
  await revised.getByRole('button', { name: 'Undo' }).click();
  await expect(page.getByTestId('revisions-table').getByTestId('revision-row')).toHaveCount(1);
  await expect(revise).toBeVisible();
  await expect(revise.getByRole('spinbutton', { name: 'P10 (low)' })).toHaveValue('11');
  await expect(revise.getByRole('spinbutton', { name: 'P90 (high)' })).toHaveValue('17');
  await expect(revise.getByRole('textbox', { name: 'What changed' })).toHaveValue('The vendor confirmed the test slot.');
  await revise.getByRole('button', { name: 'Save revision' }).click();
  await expect(revise).toBeHidden();
  await expect(page.getByTestId('revisions-table').getByTestId('revision-row')).toHaveCount(2);

  // Resolved, undone, resolved again: the value and the note come back in the dialog.
  await page.getByRole('button', { name: 'Resolve' }).click();
  const resolve = page.getByRole('dialog', { name: 'Resolve the question' });
  await resolve.getByRole('spinbutton', { name: 'Value' }).fill('16.5');
  await resolve.getByRole('textbox', { name: 'Note' }).fill('Go-live announced on the intranet.');
  await resolve.getByRole('button', { name: 'Resolve', exact: true }).click();
  await expect(resolve).toBeHidden();
  await expect(page.getByRole('heading', { level: 2, name: /Resolved: 16.5 weeks/ })).toBeVisible();
  await page.getByTestId('toast').filter({ hasText: 'Resolved: 16.5 weeks.' }).getByRole('button', { name: 'Undo' }).click();
  await expect(resolve).toBeVisible();
  await expect(resolve.getByRole('spinbutton', { name: 'Value' })).toHaveValue('16.5');
  await expect(resolve.getByRole('textbox', { name: 'Note' })).toHaveValue('Go-live announced on the intranet.');
  await expect(page.getByRole('heading', { level: 2, name: /Resolved/ })).toHaveCount(0);
  await resolve.getByRole('button', { name: 'Resolve', exact: true }).click();
  await expect(resolve).toBeHidden();
  await expect(page.getByRole('heading', { level: 2, name: /Resolved: 16.5 weeks/ })).toBeVisible();
  const data = await historyData(page);
  expect((data.forecasts as { quantiles: number[] }[]).map((f) => f.quantiles)).toEqual([
    [9, 13, 20],
    [11, 13, 17],
  ]);
  expect(data.value).toBe(16.5);
  await shoot(page, 'numeric-page');
});

test('a date question is drawn on a date axis and resolved with a date; the Desk offers its own dialogs', async () => {
  const { page } = app;
  const closes = new Date(Date.now() - 86_400_000).toISOString();
  const opened = new Date(Date.now() - 40 * 86_400_000).toISOString();
  const created = await apiCall<{ id: string }>(server().url, 'createQuestion', {
    title: 'When will the Fenwick board sign?',
    opened_at: opened,
    closes_at: closes,
    type: 'numeric',
    value_kind: 'date',
    levels: [0.05, 0.25, 0.5, 0.75, 0.95],
    first_forecast: { at: new Date(Date.now() - 39 * 86_400_000).toISOString(), quantiles: ['2026-11-20', '2026-11-25', '2026-11-28', '2026-12-03', '2026-12-15'] },
  });
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Desk' }).click();
  const card = page.locator(`[data-desk-item="${created.id}"]`);
  // The same line as a yes/no card's, under the title with how old the forecast is.
  await expect(card.locator('.desk-item__facts').getByTestId('desk-typed-last')).toHaveText('Last forecast 28 Nov 2026 (20 Nov 2026 – 15 Dec 2026), 39 days ago');
  await card.getByRole('button', { name: 'Resolve…' }).click();
  const resolve = page.getByRole('dialog', { name: 'Resolve the question' });
  await resolve.getByRole('textbox', { name: 'Date it happened' }).fill('2026-12-01');
  await resolve.getByRole('textbox', { name: 'Note' }).fill('Board minutes, item 4.');
  await resolve.getByRole('button', { name: 'Resolve', exact: true }).click();
  await expect(resolve).toBeHidden();
  await expect(card).toHaveCount(0);
  // Undo brings the card back with its dialog open as it was typed; resolving again saves it.
  await page.getByTestId('toast').filter({ hasText: 'Resolved: 1 Dec 2026.' }).getByRole('button', { name: 'Undo' }).click();
  await expect(card).toHaveCount(1);
  await expect(resolve).toBeVisible();
  await expect(resolve.getByRole('textbox', { name: 'Date it happened' })).toHaveValue(/1 Dec 2026|2026-12-01|01\/12\/2026|12\/01\/2026/);
  await expect(resolve.getByRole('textbox', { name: 'Note' })).toHaveValue('Board minutes, item 4.');
  await resolve.getByRole('button', { name: 'Resolve', exact: true }).click();
  await expect(resolve).toBeHidden();
  await expect(card).toHaveCount(0);
  expect((await apiCall<{ resolution: { note: string } }>(server().url, 'getQuestion', { id: created.id })).resolution.note).toBe('Board minutes, item 4.');

  await page.goto(`${new URL(server().url).origin}/#/questions/${created.id}`);
  await expect(page.getByRole('heading', { level: 2, name: /Resolved: 1 Dec 2026/ })).toBeVisible();
  const data = await historyData(page);
  expect(data.value_kind).toBe('date');
  // Days since 1970-01-01 (shared/numeric-value.ts): 2026-12-01 is day 20788.
  expect(data.value).toBe(20788);
  await shoot(page, 'date-page');
});
