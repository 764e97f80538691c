/**
 * The Questions list and the question page, end to end against `forelog serve`: quick add,
 * revisions, a reference, resolution, the history chart's data, validation beside fields,
 * and deletion behind a confirmation.
 */
import { expect, test } from '@playwright/test';
import { daysFromNow, fillQuickAdd, quickAdd } from './helpers';
import { useAppPage, useDiaryServer } from './serve';

const server = useDiaryServer();

const app = useAppPage(server);

test('the launch token is taken out of the address bar and kept for API calls', async () => {
  const { page } = app;
  expect(page.url()).not.toContain('token=');
  await page.reload();
  // After a reload without ?token= the page still reaches the diary (token kept in sessionStorage).
  await expect(page.getByRole('heading', { level: 1, name: 'Questions' })).toBeVisible();
  await expect(page.getByRole('alert')).toHaveCount(0);
});

test('quick add, two revisions, a reference and a Yes resolution show up in the history chart and table', async () => {
  const { page } = app;
  await quickAdd(page, {
    title: 'Northgate signs the phase-2 statement of work',
    rule: 'Yes if a countersigned SOW is received by the close.',
    // 30 June 2030 is in British Summer Time (UTC+1): the Summer Time Order 2002 runs BST from the
    // last Sunday of March to the last Sunday of October, so 17:00 London = 16:00Z.
    closes: '2030-06-30T17:00',
    timeZone: 'Europe/London',
    baseRate: '30',
    probability: '40',
    tags: ['Client:Northgate', 'renewals'],
  });

  const row = page.getByTestId('question-table').getByRole('row').filter({ hasText: 'Northgate signs' });
  await expect(row.getByRole('cell').nth(3)).toHaveText('40%');
  await expect(row.getByRole('cell').nth(4)).toHaveText('30%');
  await expect(row).toContainText('client:northgate · renewals'); // tags are lower-cased
  // Every time shows its zone as the offset in force then (renderer/src/dates.ts).
  await expect(row).toContainText('30 Jun 2030, 17:00 GMT+1');
  await row.getByRole('link').click();

  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Northgate signs the phase-2 statement of work');

  for (const [p, note] of [
    ['55', 'Procurement asked for the final price'],
    ['70', 'Legal review booked'],
  ] as const) {
    await page.getByRole('button', { name: 'Revise' }).click();
    const dialog = page.getByRole('dialog', { name: 'Revise your forecast' });
    // The box opens on the last forecast, selected: typing the new number replaces it.
    const box = dialog.getByRole('spinbutton', { name: 'Your probability', exact: true });
    await expect(box).toBeFocused();
    await page.keyboard.type(p);
    await expect(box).toHaveValue(p);
    await dialog.getByLabel('What changed').fill(note);
    await dialog.getByRole('button', { name: 'Save revision' }).click();
    await expect(dialog).toBeHidden();
    const toast = page.getByTestId('toast').filter({ hasText: `Revised to ${p}%.` });
    await expect(toast).toBeVisible();
    if (p === '70') {
      // Undone, the revision's dialog opens again as typed; saving it again makes it once more.
      await toast.getByRole('button', { name: 'Undo' }).click();
      await expect(dialog).toBeVisible();
      await expect(box).toHaveValue('70');
      await expect(dialog.getByLabel('What changed')).toHaveValue(note);
      await dialog.getByRole('button', { name: 'Save revision' }).click();
      await expect(dialog).toBeHidden();
    }
  }

  await page.getByRole('button', { name: 'Add reference' }).click();
  const reference = page.getByRole('dialog', { name: 'Add a reference forecast' });
  await reference.getByRole('spinbutton', { name: 'Their probability', exact: true }).fill('60');
  await reference.getByRole('textbox', { name: 'Source' }).fill('client’s view');
  await reference.getByRole('button', { name: 'Add reference' }).click();
  await expect(reference).toBeHidden();
  // The same for a reference: Undo opens its dialog again with the number and the source.
  await page.getByTestId('toast').filter({ hasText: 'Added client’s view’s 60%.' }).getByRole('button', { name: 'Undo' }).click();
  await expect(reference.getByRole('spinbutton', { name: 'Their probability', exact: true })).toHaveValue('60');
  await expect(reference.getByRole('textbox', { name: 'Source' })).toHaveValue('client’s view');
  await reference.getByRole('button', { name: 'Add reference' }).click();
  await expect(reference).toBeHidden();

  await page.getByRole('button', { name: 'Resolve' }).click();
  const resolve = page.getByRole('dialog', { name: 'Resolve the question' });
  await resolve.getByRole('radio', { name: 'Yes', exact: true }).check();
  await resolve.getByLabel('Note').fill('Countersigned SOW arrived.');
  await resolve.getByRole('button', { name: 'Resolve', exact: true }).click();
  await expect(resolve).toBeHidden();
  await expect(page.getByText('Resolved · Yes')).toBeVisible();
  // The Resolve button went with the open question; the keyboard starts at the content, not lost on the page's body.
  await expect(page.getByRole('main')).toBeFocused();

  // The chart's data: the quick add's first probability plus two revisions, one reference.
  const raw = await page.getByTestId('history-chart').getAttribute('data-points');
  const data = JSON.parse(raw ?? 'null') as {
    own: { at: string; p: number }[];
    reference: { p: number; source: string }[];
    base_rate: number;
    closes_at: string;
    resolution: { outcome: string };
  };
  expect(data.own.map((point) => point.p)).toEqual([0.4, 0.55, 0.7]);
  expect(data.reference).toEqual([expect.objectContaining({ p: 0.6, source: 'client’s view' })]);
  expect(data.base_rate).toBe(0.3);
  expect(data.closes_at).toBe('2030-06-30T16:00:00.000Z');
  expect(data.resolution.outcome).toBe('yes');

  // The table beside the chart lists the same points.
  await expect(page.getByTestId('revision-p')).toHaveText(['40%', '55%', '70%']);
  await expect(page.getByTestId('revisions-table')).toContainText('Legal review booked');
  await expect(page.getByTestId('reference-p')).toHaveText(['60%']);
  await expect(page.getByTestId('reference-row')).toContainText('client’s view');

  // A resolution can be corrected and reopened.
  await page.getByRole('button', { name: 'Correct' }).click();
  const correct = page.getByRole('dialog', { name: 'Correct the resolution' });
  await expect(correct.getByRole('radio', { name: 'Yes', exact: true })).toBeChecked();
  await correct.getByRole('radio', { name: 'No', exact: true }).check();
  await correct.getByRole('button', { name: 'Save correction' }).click();
  await expect(page.getByText('Resolved · No')).toBeVisible();
  await page.getByRole('button', { name: 'Reopen' }).click();
  await page.getByRole('alertdialog', { name: 'Reopen this question?' }).getByRole('button', { name: 'Reopen' }).click();
  await expect(page.getByRole('button', { name: 'Revise' })).toBeVisible();
  await expect(page.locator('.status-pill')).toHaveText('Open');
});

test('the diary’s refusals and the form’s own checks appear beside the field', async () => {
  const { page } = app;
  await page.getByRole('main').focus();
  await page.keyboard.press('n');
  await fillQuickAdd(page, { title: 'Pilot reaches 500 weekly users', closes: daysFromNow(60), probability: '150' });
  const dialog = page.getByRole('dialog', { name: 'New question' });
  await dialog.getByRole('button', { name: 'Save question' }).click();
  const probability = dialog.getByRole('spinbutton', { name: 'Your probability', exact: true });
  await expect(probability).toHaveAttribute('aria-invalid', 'true');
  await expect(probability).toHaveAccessibleDescription(/between 0% and 100%/);
  await expect(probability).toBeFocused();

  // A close before the opening time (now) is refused by the diary, beside the close field.
  await probability.fill('40');
  await dialog.getByRole('textbox', { name: 'Closes', exact: true }).fill('2001-01-01T12:00');
  await dialog.getByRole('button', { name: 'Save question' }).click();
  const closes = dialog.getByRole('textbox', { name: 'Closes', exact: true });
  await expect(closes).toHaveAccessibleDescription(/must be after the opening time/i);
  await expect(probability).not.toHaveAttribute('aria-invalid', 'true');
  await expect(dialog).toBeVisible();

  // Escape asks before throwing the typed text away; Discard closes the dialog, changes
  // nothing, and returns focus to where it was.
  await page.keyboard.press('Escape');
  await page.getByRole('alertdialog', { name: 'Discard your changes?' }).getByRole('button', { name: 'Discard' }).click();
  await expect(dialog).toBeHidden();
  await expect(page.getByRole('main')).toBeFocused();
  await expect(page.getByTestId('question-table').getByText('Pilot reaches 500 weekly users')).toHaveCount(0);
});

test('filters narrow the list by status, tag and text', async () => {
  const { page } = app;
  const regulator = 'Regulator rules before the board meeting';
  const pilot = 'Eastport pilot reaches 500 weekly users';
  await quickAdd(page, { title: regulator, closes: daysFromNow(40), probability: '25', tags: ['regulation'] });
  await quickAdd(page, { title: pilot, closes: daysFromNow(50), probability: '60', tags: ['pilots'] });
  const table = page.getByTestId('question-table');
  const links = table.getByRole('link');
  await expect(links.filter({ hasText: regulator })).toHaveCount(1);
  await expect(links.filter({ hasText: pilot })).toHaveCount(1);

  await page.getByLabel('Search').fill('regulator');
  await expect(links).toHaveText([regulator]);
  await page.getByLabel('Search').fill('');

  await page.getByLabel('Tag', { exact: true }).selectOption('pilots');
  await expect(links).toHaveText([pilot]);
  await page.getByLabel('Tag', { exact: true }).selectOption('');

  // Both close weeks ahead: open, not yet awaiting resolution.
  await page.getByLabel('Status').selectOption('open');
  await expect(links.filter({ hasText: regulator })).toHaveCount(1);
  await page.getByLabel('Status').selectOption('awaiting');
  await expect(links.filter({ hasText: regulator })).toHaveCount(0);
  await page.getByLabel('Status').selectOption('all');

  await page.getByLabel('Search').fill('no question says this');
  await expect(page.getByText('No questions match')).toBeVisible();
  await page.getByRole('button', { name: 'Clear filters' }).click();
  await expect(page.getByLabel('Search')).toHaveValue('');
  await expect(links.filter({ hasText: pilot })).toHaveCount(1);
});

test('a revision and a question are deleted only after confirmation', async () => {
  const { page } = app;
  await quickAdd(page, { title: 'Budget approved in Q3', closes: daysFromNow(90), probability: '35' });
  await page.getByRole('link', { name: 'Budget approved in Q3' }).click();
  await page.getByRole('button', { name: 'Revise' }).click();
  await page.getByRole('dialog', { name: 'Revise your forecast' }).getByRole('spinbutton', { name: 'Your probability', exact: true }).fill('45');
  await page.getByRole('button', { name: 'Save revision' }).click();
  await expect(page.getByTestId('revision-p')).toHaveText(['35%', '45%']);

  await page.getByRole('button', { name: /^Delete the 45% forecast/ }).click();
  const confirmRevision = page.getByRole('alertdialog', { name: 'Delete this revision?' });
  await expect(confirmRevision.getByRole('button', { name: 'Cancel' })).toBeFocused();
  await confirmRevision.getByRole('button', { name: 'Delete' }).click();
  await expect(page.getByTestId('revision-p')).toHaveText(['35%']);
  await expect(page.getByTestId('toast').filter({ hasText: 'Revision deleted.' })).toBeVisible();
  // The deleted row's Delete went with it: the keyboard is at the Delete of the row left, not thrown to the page.
  await expect(page.getByRole('button', { name: /^Delete the 35% forecast/ })).toBeFocused();
  // Undone from the question's own page: the toast does not offer to open the page already open.
  await page.getByTestId('toast').filter({ hasText: 'Revision deleted.' }).getByRole('button', { name: 'Undo' }).click();
  const undone = page.getByTestId('toast').filter({ hasText: 'Undone: “Budget approved in Q3” is back as it was.' });
  await expect(undone).toBeVisible();
  await expect(undone.getByRole('link', { name: 'Open question' })).toHaveCount(0);
  await expect(page.getByTestId('revision-p')).toHaveText(['35%', '45%']);

  await page.getByRole('button', { name: 'Delete', exact: true }).click();
  const confirm = page.getByRole('alertdialog', { name: 'Delete this question?' });
  await expect(confirm).toContainText('“Budget approved in Q3” will be removed');
  await confirm.getByRole('button', { name: 'Cancel' }).click();
  await expect(confirm).toBeHidden();
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Budget approved in Q3');

  await page.getByRole('button', { name: 'Delete', exact: true }).click();
  await confirm.getByRole('button', { name: 'Delete question' }).click();
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Questions');
  await expect(page.getByTestId('toast').filter({ hasText: 'Deleted “Budget approved in Q3”.' })).toBeVisible();
  await expect(page.getByRole('link', { name: 'Budget approved in Q3' })).toHaveCount(0);
});

test('Edit saves every kind of field and leaves untouched times exact', async () => {
  const { page } = app;
  await quickAdd(page, { title: 'Westhaven renews the support contract', closes: daysFromNow(30), probability: '50' });
  await page.getByRole('link', { name: 'Westhaven renews the support contract' }).click();
  const chart = page.getByTestId('history-chart');
  const before = JSON.parse((await chart.getAttribute('data-points')) ?? 'null') as { opened_at: string; closes_at: string };

  await page.getByRole('button', { name: 'Edit' }).click();
  const dialog = page.getByRole('dialog', { name: 'Edit question' });
  await dialog.getByRole('textbox', { name: 'Question', exact: true }).fill('Westhaven renews the support contract for two years');
  await dialog.getByLabel('Kind').selectOption('state_at_deadline');
  await dialog.getByLabel('Tags', { exact: true }).fill('Client:Westhaven,');
  await dialog.getByRole('spinbutton', { name: 'Miss cost' }).fill('4');
  await dialog.getByRole('button', { name: 'Save changes' }).click();
  // Only one of the two costs: the form asks for both before sending anything.
  await expect(dialog.getByRole('spinbutton', { name: 'False-alarm cost' })).toHaveAccessibleDescription(/give both costs/i);

  await dialog.getByRole('spinbutton', { name: 'False-alarm cost' }).fill('1');
  await dialog.getByRole('spinbutton', { name: 'Check in every' }).fill('14');
  await dialog.getByRole('button', { name: 'Save changes' }).click();
  await expect(dialog).toBeHidden();
  await expect(page.getByTestId('toast').filter({ hasText: 'Question saved.' })).toBeVisible();

  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Westhaven renews the support contract for two years');
  const facts = page.locator('.facts');
  await expect(facts).toContainText('State at deadline');
  await expect(facts).toContainText('client:westhaven');
  await expect(facts).toContainText('False-alarm cost 1 · Miss cost 4');
  await expect(facts).toContainText('Every 14 days');
  // The times were not edited, so they were not sent: still exact to the millisecond.
  const after = JSON.parse((await chart.getAttribute('data-points')) ?? 'null') as { opened_at: string; closes_at: string };
  expect(after.opened_at).toBe(before.opened_at);
  expect(after.closes_at).toBe(before.closes_at);
});
