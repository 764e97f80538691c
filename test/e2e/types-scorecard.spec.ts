/**
 * The Scorecard's sections for choice and numeric questions (issue 9) against a real diary:
 * each section appears only when the view holds questions of its type, its readings are the
 * diary's own `score` answer for the same filter (fetched over the same API), the tag filter
 * applies to every section; Hindsight lists the choice confident misses and the numeric
 * surprises with the notes of the time. Axe scans and screenshots in light and dark at 1024
 * and 1920.
 */
import { expect, test, type Page } from '@playwright/test';
import type { Hindsight, Scorecard } from '../../shared/contract';
import { apiCall, daysAgo, expectNoSeriousViolations, afterRedraw, drawEveryChart } from './helpers';
import { useAppPage, useDiaryServer } from './serve';

const server = useDiaryServer();
test.describe.configure({ mode: 'serial' });
test.setTimeout(120_000);

const iso = daysAgo;

const app = useAppPage(server);

/** Invented resolved questions: eight choice (two tagged "kestrowe") and ten numeric, most ranges too narrow. */
async function seed(): Promise<void> {
  const url = server().url;
  const options = ['Kestrowe', 'Ambledene', 'Neither'];
  for (let i = 0; i < 8; i++) {
    const q = await apiCall<{ id: string }>(url, 'createQuestion', {
      title: `Supplier pick ${i + 1}`,
      tags: i < 2 ? ['kestrowe'] : [],
      opened_at: iso(60),
      closes_at: iso(10),
      type: 'choice',
      options,
      ordered: i % 2 === 0,
      option_base_rates: [0.4, 0.4, 0.2],
      first_forecast: { at: iso(59), probs: i % 3 === 0 ? [0.85, 0.1, 0.05] : [0.5, 0.3, 0.2], note: `First read ${i + 1}` },
    });
    // Supplier pick 7 was called at 85% for Kestrowe and went to Ambledene: a confident miss.
    await apiCall(url, 'resolveQuestion', { id: q.id, outcome: 'option', option: i === 6 ? 1 : i % 3, at: iso(5), note: `Decision letter ${i + 1}` });
  }
  for (let i = 0; i < 10; i++) {
    const q = await apiCall<{ id: string }>(url, 'createQuestion', {
      title: `Weeks to go-live, project ${i + 1}`,
      opened_at: iso(60),
      closes_at: iso(10),
      type: 'numeric',
      unit: 'weeks',
      first_forecast: { at: iso(59), quantiles: [10, 12, 14] },
    });
    await apiCall(url, 'addForecast', { question_id: q.id, at: iso(30), quantiles: [10, 13, 16] });
    await apiCall(url, 'resolveQuestion', { id: q.id, outcome: 'value', value: 8 + i * 2, at: iso(5) });
  }
}

async function waitReady(page: Page, tag = '') {
  await expect(page.locator(`[data-scorecard-ready="true"][data-scorecard-tag="${tag}"]`)).toHaveCount(1);
}

test('choice and numeric sections show the diary’s own figures, with sample sizes; the tag filter applies to them', async () => {
  await seed();
  const { page } = app;
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Scorecard' }).click();
  await waitReady(page);
  const card = await apiCall<Scorecard>(server().url, 'score', {});

  // Only choice and numeric questions are in the diary: no yes/no sections, one note.
  await expect(page.getByRole('heading', { level: 2, name: 'Headline figures' })).toHaveCount(0);
  const choice = page.getByTestId('choice-section');
  const numeric = page.getByTestId('numeric-section');
  await expect(choice.getByTestId('headline-choice-brier-value')).toHaveText(card.report.choice.brier!.toFixed(3));
  await expect(choice.getByTestId('headline-choice-brier-n')).toHaveText(`n = ${card.report.choice.scored}`);
  await expect(choice.getByTestId('headline-choice-rps-n')).toHaveText(`n = ${card.report.choice.rps_n} ordered`);
  const top = card.report.choice.top_choice;
  await expect(choice.getByTestId('headline-choice-top')).toContainText(`came true ${Math.round(top.hit_rate! * top.n)} times in ${top.n}`);
  expect(JSON.parse((await page.getByTestId('choice-calibration-chart').getAttribute('data-points')) ?? 'null')).toEqual(card.report.choice.bins);

  const coverage = card.report.numeric.coverage.find((c) => c.level === 0.8)!;
  await expect(numeric.getByTestId('coverage-reading').first()).toContainText(`Your 80% ranges caught the outcome ${coverage.inside} times in ${coverage.n}`);
  await expect(numeric.getByTestId('headline-numeric-coverage-n')).toHaveText(`n = ${coverage.n}`);
  await expect(numeric.getByTestId('numeric-questions').getByRole('row')).toHaveCount(card.report.numeric.scored + 1);
  // Each question's WIS and interval score are written one way: two decimals, in the question's unit.
  for (const row of card.numeric_detail.per_question) {
    const cells = numeric.getByTestId('numeric-questions').getByRole('row').filter({ has: page.getByRole('rowheader', { name: row.title, exact: true }) }).getByRole('cell');
    await expect(cells.nth(2)).toHaveText(`${row.wis.toFixed(2)} weeks`);
    await expect(cells.nth(3)).toHaveText(`${row.interval_score!.toFixed(2)} weeks (80%)`);
  }
  await expect(numeric.getByTestId('landed-table')).toContainText('below P10');
  for (const scheme of ['light', 'dark'] as const) {
    await page.emulateMedia({ colorScheme: scheme });
    await expectNoSeriousViolations(page, `the Scorecard with choice and numeric sections (${scheme})`);
    for (const width of [1024, 1920]) {
      await page.setViewportSize({ width, height: 900 });
      await drawEveryChart(page);
      await page.screenshot({ path: `test/e2e/artifacts/types-scorecard-${scheme}-${width}.png`, fullPage: true });
    }
  }
  await page.emulateMedia({ colorScheme: 'light' });

  // The tag holds two choice questions and no numeric one: the numeric section leaves.
  await page.getByLabel('Tag', { exact: true }).selectOption('kestrowe');
  await waitReady(page, 'kestrowe');
  const tagged = await apiCall<Scorecard>(server().url, 'score', { tag: 'kestrowe' });
  expect(tagged.report.choice.scored).toBe(2);
  await expect(choice.getByTestId('headline-choice-brier-n')).toHaveText('n = 2');
  await expect(choice.getByTestId('headline-choice-brier-value')).toHaveText(tagged.report.choice.brier!.toFixed(3));
  await expect(page.getByTestId('numeric-section')).toHaveCount(0);
  await expect(page.getByRole('heading', { level: 2, name: 'Numeric questions' })).toHaveCount(0);
});

test('Hindsight lists the choice confident miss and the numeric surprises with the notes written at the time', async () => {
  const { page } = app;
  const answer = await apiCall<Hindsight>(server().url, 'hindsight', {});
  const misses = answer.choice_entries.filter((e) => e.verdict === 'miss');
  expect(misses.map((e) => e.title)).toEqual(['Supplier pick 7']);
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Hindsight' }).click();
  const choice = page.getByTestId('hs-choice-misses');
  await expect(choice.getByRole('heading', { level: 2 })).toHaveText('Multiple choice: confident misses (1)');
  const card = choice.getByTestId('hindsight-choice-entry');
  await expect(card.getByTestId('verdict-sentence')).toHaveText('You gave Kestrowe 85%; Ambledene came true, at 10%.');
  // Every option's base rate, so the one that came true (Ambledene) is read against its own.
  await expect(card).toContainText('Kestrowe 40%, Ambledene 40%, Neither 20%');
  await expect(card.getByTestId('revision-note')).toHaveText('First read 7');
  await expect(card.getByTestId('resolution-note')).toHaveText('Decision letter 7');

  const surprises = page.getByTestId('hs-surprises').getByTestId('hindsight-numeric-entry');
  await expect(surprises).toHaveCount(answer.numeric_surprises.length);
  // The largest surprise first: 26 weeks against a final P10–P90 (an 80% range) of 10 to 16 weeks.
  await expect(surprises.first().getByTestId('verdict-sentence')).toHaveText(
    '26 weeks: 10 weeks above your 80% range (10 weeks – 16 weeks); 1.7 times its width outside.',
  );
  await expect(surprises.first()).toContainText('13 weeks (10 – 16)');
  for (const scheme of ['light', 'dark'] as const) {
    await page.emulateMedia({ colorScheme: scheme });
    await expectNoSeriousViolations(page, `Hindsight with choice and numeric entries (${scheme})`);
    for (const width of [1024, 1920]) {
      await page.setViewportSize({ width, height: 900 });
      await afterRedraw(page);
      await page.screenshot({ path: `test/e2e/artifacts/types-hindsight-${scheme}-${width}.png`, fullPage: true });
    }
  }
});
