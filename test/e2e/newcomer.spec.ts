/**
 * Small things a newcomer meets in a first week with typed questions and the data screens:
 * each message names what is missing in the user's own terms, and the keyboard keeps its
 * place after an action that makes the page wait.
 */
import { expect, test } from '@playwright/test';
import { apiCall } from './helpers';
import { useAppPage, useDiaryServer } from './serve';

const server = useDiaryServer();
test.describe.configure({ mode: 'serial' });
const app = useAppPage(server);

test('resolving a numeric question with the value box empty marks only the value box', async () => {
  const { page } = app;
  const q = await apiCall<{ id: string }>(server().url, 'createQuestion', {
    title: 'Pallets through Eastgate in the quarter',
    opened_at: '2026-01-05T09:00:00Z',
    closes_at: '2026-03-31T16:00:00Z',
    time_zone: 'Europe/London',
    type: 'numeric',
    unit: 'pallets',
    value_kind: 'number',
    levels: [0.1, 0.5, 0.9],
  });
  await page.goto(`${server().url.split('?')[0]}#/questions/${encodeURIComponent(q.id)}`);
  await page.getByRole('button', { name: 'Resolve' }).click();
  const dialog = page.getByRole('dialog', { name: 'Resolve the question' });
  await expect(dialog.getByRole('radio', { name: 'The value is known' })).toBeChecked();
  await dialog.getByRole('button', { name: 'Resolve', exact: true }).click();
  await expect(dialog.getByRole('spinbutton', { name: 'Value' })).toHaveAccessibleDescription(/Enter the value it took/);
  // The outcome was chosen: no list of every outcome kind the diary knows.
  await expect(dialog.getByText(/must be yes, no, void/i)).toHaveCount(0);
  await dialog.getByRole('spinbutton', { name: 'Value' }).fill('1840');
  await dialog.getByRole('button', { name: 'Resolve', exact: true }).click();
  await expect(dialog).toBeHidden();
  await expect(page.getByTestId('toast').filter({ hasText: 'Resolved: 1,840 pallets.' })).toBeVisible();
});

test('after an import is refused or an export saved, the keyboard is still on the control it used', async () => {
  const { page } = app;
  await page.goto(`${server().url.split('?')[0]}#/settings`);
  // A spreadsheet without its closes_at column.
  const csv = 'question_id,title,rule,kind,tags,opened_at,time_zone,forecast_at,p\nq1,Depot lease renewed,,event_by_deadline,,2026-01-05T09:00:00Z,Europe/London,2026-01-05T09:10:00Z,0.6\n';
  const picker = page.getByLabel('Import a diary file…');
  await picker.focus();
  await picker.setInputFiles({ name: 'leases.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
  await expect(page.getByText(/leases\.csv: .*"closes_at" is missing/)).toBeVisible();
  await expect(picker).toBeFocused();

  const exportCsv = page.getByRole('button', { name: 'Export spreadsheet (CSV)' });
  const download = page.waitForEvent('download');
  await exportCsv.focus();
  await page.keyboard.press('Enter');
  await download;
  await expect(page.getByTestId('toast').filter({ hasText: /^Exported / })).toBeVisible();
  await expect(exportCsv).toBeFocused();
});
