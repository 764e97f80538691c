/**
 * Small things a user sees on the charts and pages: each legend entry is drawn as its line is
 * (solid, dashed or dotted, with the series' marker), two reference sources get different
 * markers and patterns, the value curve marks the values it clips at its edge instead of
 * dropping off the chart, the Brier identity writes each sign once, and the page opened
 * without its launch token says how to get in (no literal backticks). Photographed and
 * scanned by axe in light and dark.
 */
import { expect, test, type Page } from '@playwright/test';
import type { Question } from '../../shared/domain';
import { apiCall, expectNoSeriousViolations } from './helpers';
import { openApp, useDiaryServer } from './serve';

const server = useDiaryServer();
test.describe.configure({ mode: 'serial' });

const DAY = 86_400_000;
let question: Question;

test('setup: the example diary and an open question with two reference sources', async () => {
  await apiCall(server().url, 'loadDemo');
  const now = Date.now();
  question = await apiCall<Question>(server().url, 'createQuestion', {
    title: 'Wharfside tenant renews for five years',
    opened_at: new Date(now - 20 * DAY).toISOString(),
    closes_at: new Date(now + 20 * DAY).toISOString(),
    base_rate: 0.35,
    first_forecast: { p: 0.6, at: new Date(now - 15 * DAY).toISOString() },
  });
  await apiCall(server().url, 'addReference', { question_id: question.id, p: 0.5, source: 'client’s view', at: new Date(now - 14 * DAY).toISOString() });
  await apiCall(server().url, 'addReference', { question_id: question.id, p: 0.3, source: 'agent’s survey', at: new Date(now - 10 * DAY).toISOString() });
});

interface Entry {
  label: string;
  dash: string;
  marker: string;
}

async function legend(page: Page, figure: string): Promise<Entry[]> {
  return page
    .getByTestId(figure)
    .getByTestId('chart-legend')
    .locator('li')
    .evaluateAll((items) =>
      items.map((li) => ({ label: li.textContent?.trim() ?? '', dash: li.getAttribute('data-dash') ?? '', marker: li.getAttribute('data-marker') ?? '' })),
    );
}

for (const scheme of ['light', 'dark'] as const) {
  test(`the history chart's legend draws each line as it is, and sources differ (${scheme})`, async ({ browser }) => {
    const app = await openApp(browser, server(), { colorScheme: scheme }, `questions/${encodeURIComponent(question.id)}`);
    const { page } = app;
    try {
      await expect(page.getByTestId('history-chart')).toBeVisible();
      const entries = await legend(page, 'history-chart');
      expect(entries).toEqual([
        { label: 'Your forecasts', dash: 'solid', marker: 'circle' },
        { label: 'Reference: client’s view', dash: 'solid', marker: 'rectRot' },
        { label: 'Reference: agent’s survey', dash: '8,3,2,3', marker: 'triangle' },
        { label: 'Glide path', dash: '2,4', marker: 'none' },
        { label: 'Base rate', dash: '6,5', marker: 'none' },
      ]);
      // Each legend swatch draws the same dash pattern as its line (a dashed line, not a dot).
      const dashes = await page
        .getByTestId('history-chart')
        .locator('.chart-legend__swatch line')
        .evaluateAll((lines) => lines.map((line) => line.getAttribute('stroke-dasharray')));
      expect(dashes).toEqual([null, null, '8 3 2 3', '2 4', '6 5']);
      await expectNoSeriousViolations(page, `the question page's chart (${scheme})`);
      await page.getByTestId('history-chart').screenshot({ path: `test/e2e/artifacts/charts-history-${scheme}.png` });
      expect(app.problems).toEqual([]);
    } finally {
      await app.close();
    }
  });

  test(`the Scorecard marks what it clips and writes the Brier identity's signs once (${scheme})`, async ({ browser }) => {
    const app = await openApp(browser, server(), { colorScheme: scheme }, 'scorecard');
    const { page } = app;
    try {
      await expect(page.locator('[data-scorecard-ready="true"]')).toBeVisible();
      const curve = JSON.parse((await page.getByTestId('value-curve-chart').getAttribute('data-points')) ?? '[]') as { alpha: number; value: number | null }[];
      const clipped = curve.filter((p) => p.value !== null && p.value < -1).length;
      // The example diary's curve runs below −1 near the ends (checked here so the marks are tested).
      expect(clipped).toBeGreaterThan(0);
      expect(await legend(page, 'value-curve-chart')).toEqual([
        { label: 'Relative value', dash: 'solid', marker: 'none' },
        { label: 'Below −1: drawn on the bottom edge', dash: 'none', marker: 'triangleDown' },
      ]);
      await expect(page.getByTestId('value-curve-chart')).toContainText(`${clipped} cost ratios have values below −1, drawn on the bottom edge`);

      expect(await legend(page, 'calibration-chart')).toEqual([
        { label: 'Perfect calibration', dash: '6,5', marker: 'none' },
        { label: 'Your forecasts, by bin (bar: 95% interval)', dash: 'none', marker: 'circle' },
      ]);
      expect(await legend(page, 'roc-chart')).toEqual([
        { label: 'Your final forecasts', dash: 'solid', marker: 'circle' },
        { label: 'No discrimination (AUC 0.5)', dash: '6,5', marker: 'none' },
      ]);

      // One sign per term, typographic minus signs, never "− (−x)" or a hyphen.
      const identity = page.getByTestId('decomposition-identity');
      const text = (await identity.textContent()) ?? '';
      expect(text).not.toMatch(/\(\u2212|\u2212\s*\u2212|\+\s*\u2212|-\d/);
      const ops = await identity.locator('.sc-identity__op').allTextContents();
      expect(ops.slice(0, 6)).toEqual(['', expect.stringMatching(/^[+\u2212]$/), expect.stringMatching(/^[+\u2212]$/), expect.stringMatching(/^[+\u2212]$/), expect.stringMatching(/^[+\u2212]$/), '=']);
      const values = await identity.locator('.sc-identity__value').allTextContents();
      for (const value of values) expect(value).toMatch(/^\u2212?\d\.\d{3}$/);

      await expectNoSeriousViolations(page, `the Scorecard's charts (${scheme})`);
      await page.getByTestId('value-curve-chart').screenshot({ path: `test/e2e/artifacts/charts-value-curve-${scheme}.png` });
      await page.getByTestId('calibration-chart').screenshot({ path: `test/e2e/artifacts/charts-calibration-${scheme}.png` });
      await page.getByTestId('decomposition').screenshot({ path: `test/e2e/artifacts/charts-identity-${scheme}.png` });
      expect(app.problems).toEqual([]);
    } finally {
      await app.close();
    }
  });

  test(`opened without its token, the page says how to get in (${scheme})`, async ({ browser }) => {
    const context = await browser.newContext({ colorScheme: scheme });
    const page = await context.newPage();
    try {
      await page.goto(`${new URL(server().url).origin}/#/desk`);
      await expect(page.getByRole('heading', { level: 1 })).toHaveText('Open Forelog from the address it printed');
      const text = (await page.getByTestId('no-token').textContent()) ?? '';
      expect(text).not.toContain('`');
      expect(text).toContain('forelog serve');
      expect(text).toContain('npm run --silent forelog -- serve');
      await expect(page.getByRole('alert')).toHaveCount(0);
      await expectNoSeriousViolations(page, `the no-token page (${scheme})`);
      await page.screenshot({ path: `test/e2e/artifacts/no-token-${scheme}.png` });
    } finally {
      await context.close();
    }
  });
}
