/**
 * Lists that grow with the diary come a page at a time: Hindsight's choice confident
 * misses and numeric surprises (20 at first, then "Show more", the heading counting the
 * whole selection), the Scorecard's per-question table of numeric scores (25 rows at first;
 * focus moves to the first row added), a question's history (its latest 100 revisions;
 * "Show earlier" adds older ones above) and a Hindsight card's revisions (its latest 10).
 * Axe scans each.
 */
import { expect, test } from '@playwright/test';
import { apiCall, daysAgo, expectNoSeriousViolations } from './helpers';
import { useAppPage, useDiaryServer } from './serve';

const server = useDiaryServer();
test.describe.configure({ mode: 'serial' });
test.setTimeout(120_000);

const iso = daysAgo;
const app = useAppPage(server);

const CHOICE_MISSES = 23;
const SURPRISES = 27;

/** Invented resolved questions: every choice call at 90 % went to another option, every numeric range missed the outcome. */
async function seed(): Promise<void> {
  const common = { opened_at: iso(60), closes_at: iso(10), rule: 'As the board minutes record it.' };
  const questions = [
    ...Array.from({ length: CHOICE_MISSES }, (_, i) => ({
      ...common,
      id: `pick-${i + 1}`,
      title: `Vendor pick ${i + 1}`,
      type: 'choice',
      options: ['Harrowgate', 'Lunsford', 'Neither'],
      forecasts: [{ at: iso(50), probs: [0.9, 0.05, 0.05], note: `Pick note ${i + 1}` }],
      resolution: { outcome: 'option', option: 1, at: iso(5) },
    })),
    ...Array.from({ length: SURPRISES }, (_, i) => ({
      ...common,
      id: `weeks-${i + 1}`,
      title: `Weeks to sign-off, workstream ${i + 1}`,
      type: 'numeric',
      unit: 'weeks',
      forecasts: [{ at: iso(50), quantiles: [10, 12, 14] }],
      resolution: { outcome: 'value', value: 20 + i, at: iso(5) },
    })),
  ];
  await apiCall(server().url, 'importDiary', { diary: { format: 'forelog-diary', version: 1, questions } });
}

test('Hindsight lists 10 choice misses and 10 surprises at first, and the rest with each list’s Show more', async () => {
  await seed();
  const { page } = app;
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Hindsight' }).click();
  await page.locator('[data-hindsight-ready="true"]').waitFor();
  const misses = page.getByTestId('hs-choice-misses');
  const surprises = page.getByTestId('hs-surprises');
  await expect(misses.getByRole('heading', { level: 2 })).toHaveText(`Multiple choice: confident misses (${CHOICE_MISSES})`);
  await expect(surprises.getByRole('heading', { level: 2 })).toHaveText(`Numbers and dates: surprises (outside your widest range) (${SURPRISES})`);
  await expect(page.getByTestId('hindsight-choice-entry')).toHaveCount(10);
  await expect(page.getByTestId('hindsight-numeric-entry')).toHaveCount(10);
  await expect(misses).toContainText(`10 of ${CHOICE_MISSES} shown`);

  await misses.getByRole('button', { name: `Show ${CHOICE_MISSES - 10} more` }).click();
  await page.locator('[data-hindsight-ready="true"]').waitFor();
  await expect(page.getByTestId('hindsight-choice-entry')).toHaveCount(CHOICE_MISSES);
  await expect(misses.getByRole('button', { name: /Show \d+ more/ })).toHaveCount(0);
  await expect(page.getByTestId('hindsight-numeric-entry')).toHaveCount(10, { timeout: 10_000 });

  await surprises.getByRole('button', { name: `Show ${SURPRISES - 10} more` }).click();
  await page.locator('[data-hindsight-ready="true"]').waitFor();
  await expect(page.getByTestId('hindsight-numeric-entry')).toHaveCount(SURPRISES);
  await expect(page.getByRole('button', { name: /Show \d+ more/ })).toHaveCount(0);
  await expectNoSeriousViolations(page, 'Hindsight with every choice and numeric call listed');
});

test('the Scorecard’s numeric table shows 25 questions at first; Show more adds the rest and moves focus to the first added', async () => {
  const { page } = app;
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Scorecard' }).click();
  await page.locator('[data-scorecard-ready="true"]').waitFor();
  const table = page.getByTestId('numeric-questions');
  await expect(table.locator('tbody tr')).toHaveCount(25);
  await expect(page.getByTestId('numeric-section')).toContainText(`25 of ${SURPRISES} shown`);
  await page.getByTestId('numeric-section').getByRole('button', { name: `Show ${SURPRISES - 25} more` }).click();
  await expect(table.locator('tbody tr')).toHaveCount(SURPRISES);
  await expect(table.locator('tbody tr').nth(25).locator('th')).toBeFocused();
  await expect(page.getByTestId('numeric-section').getByRole('button', { name: /Show \d+ more/ })).toHaveCount(0);
  await expectNoSeriousViolations(page, 'Scorecard with every numeric question listed');
});

test('a long history shows its latest 100 revisions; Show earlier adds the older ones above and focus moves to the earliest shown', async () => {
  const { page } = app;
  const forecasts = Array.from({ length: 130 }, (_, i) => ({ at: iso(200 - i), p: 0.3 + (i % 5) / 10, note: `Daily read ${i + 1}` }));
  await apiCall(server().url, 'importDiary', {
    diary: { format: 'forelog-diary', version: 1, questions: [{ id: 'daily', title: 'Harrowgate renews the framework', opened_at: iso(210), closes_at: iso(-30), forecasts }] },
  });
  await page.goto(`${server().url.split('?')[0]}#/questions/daily`);
  const rows = page.getByTestId('revisions-table').getByTestId('revision-row');
  await expect(rows).toHaveCount(100);
  await expect(rows.first()).toContainText('Daily read 31');
  await expect(rows.last()).toContainText('Daily read 130');
  await expect(page.getByTestId('revisions-table')).toContainText('Your forecasts (130)');
  await expect(page.getByText('100 of 130 shown, the latest')).toBeVisible();
  await page.getByRole('button', { name: 'Show 30 earlier' }).click();
  await expect(rows).toHaveCount(130);
  await expect(rows.first()).toContainText('Daily read 1');
  await expect(rows.first().locator('td').first()).toBeFocused();
  await expect(page.getByRole('button', { name: /Show \d+ earlier/ })).toHaveCount(0);
  await expectNoSeriousViolations(page, 'a question with its whole long history shown');
});

test('a Hindsight card shows its latest 10 revisions; Show earlier adds older ones above, 50 at a time, focus on the earliest shown', async () => {
  const { page } = app;
  const forecasts = Array.from({ length: 64 }, (_, i) => ({ at: iso(200 - i), p: 0.9, note: `Weekly read ${i + 1}` }));
  await apiCall(server().url, 'importDiary', {
    diary: {
      format: 'forelog-diary',
      version: 1,
      questions: [{ id: 'weekly', title: 'Lunsford keeps the depot open', opened_at: iso(210), closes_at: iso(10), forecasts, resolution: { outcome: 'no', at: iso(5) } }],
    },
  });
  await page.goto(`${server().url.split('?')[0]}#/hindsight`);
  await page.locator('[data-hindsight-ready="true"]').waitFor();
  const card = page.locator('[data-testid="hindsight-entry"][data-id="weekly"]');
  const notes = card.getByTestId('revision-note');
  await expect(notes).toHaveCount(10);
  await expect(notes.first()).toHaveText('Weekly read 55');
  await expect(notes.last()).toHaveText('Weekly read 64');
  await expect(card.getByRole('table')).toContainText('The latest revisions, with what you wrote at the time');
  await expect(card.getByText('10 of 64 shown, the latest')).toBeVisible();
  await card.getByRole('button', { name: 'Show 50 earlier' }).click();
  await expect(notes).toHaveCount(60);
  await expect(notes.first()).toHaveText('Weekly read 5');
  await expect(card.locator('tbody tr').first().locator('td').first()).toBeFocused();
  await card.getByRole('button', { name: 'Show 4 earlier' }).click();
  await expect(notes).toHaveCount(64);
  await expect(card.getByRole('table')).toContainText('Every revision, with what you wrote at the time');
  await expect(card.getByRole('button', { name: /Show \d+ earlier/ })).toHaveCount(0);
  await expectNoSeriousViolations(page, 'a Hindsight card with its whole long history shown');
});
