/**
 * The Scorecard screen in browser mode against a real diary: the empty state, then the example
 * diary. Every figure checked here is compared with the diary's own `score` answer for the
 * same filter (fetched over the same HTTP API with the launch token), so the screen must show
 * what the scoring engine computed — not a number worked out a second time in the page.
 * Also: the filters (tag, date range of window ends), the what-if costs, the saved default
 * costs, an axe-core scan and screenshots in both colour schemes.
 */
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Locator, type Page } from '@playwright/test';
import type { Responses } from '../../shared/contract';
import { recalibrate } from '../../shared/scoring/helpers';
import { addCalendarDays, parseLocalDateTime, toIso, toLocalInputValue, wallTimeToInstant } from '../../shared/time';
import { drawEveryChart } from './helpers';
import { openApp, useDiaryServer, type AppPage } from './serve';

const server = useDiaryServer();
test.describe.configure({ mode: 'serial' });

/** POST /api/<operation> with the launch token, as the page itself does (shared/bridge.ts). */
async function callApi<K extends keyof Responses>(operation: K, request: Record<string, unknown>): Promise<Responses[K]> {
  const url = new URL(server().url);
  const token = url.searchParams.get('token') ?? '';
  const response = await fetch(new URL(`/api/${operation}`, url.origin), {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Authorization: `Bearer ${token}` },
    body: JSON.stringify(request),
  });
  const envelope = (await response.json()) as { ok: boolean; value?: Responses[K]; error?: { message: string } };
  if (!envelope.ok) throw new Error(`${operation} was refused: ${envelope.error?.message}`);
  return envelope.value as Responses[K];
}

const score = (request: Record<string, unknown>) => callApi('score', request);

/** Waits until the screen says every figure shows the latest filter (the benchmark's hook). */
async function waitReady(page: Page, tag = ''): Promise<Locator> {
  const root = page.locator(`[data-scorecard-ready="true"][data-scorecard-tag="${tag}"]`);
  await expect(root).toHaveCount(1);
  return root;
}

async function openScorecard(app: AppPage): Promise<void> {
  await app.page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Scorecard' }).click();
  await expect(app.page.getByRole('heading', { level: 1, name: 'Scorecard' })).toBeVisible();
  await waitReady(app.page);
}

async function dataPoints(page: Page, testId: string): Promise<unknown> {
  return JSON.parse((await page.getByTestId(testId).getAttribute('data-points')) ?? 'null');
}

/** The four cells of the 2×2 table as the page shows them. */
async function contingency(page: Page): Promise<number[]> {
  const table = page.getByTestId('decision-table');
  const cells = ['hits', 'false-alarms', 'misses', 'correct-rejections'];
  return Promise.all(cells.map(async (id) => Number(await table.getByTestId(id).locator('.sc-count').textContent())));
}

async function expectNoSeriousViolations(page: Page, what: string): Promise<void> {
  const results = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa', 'best-practice'])
    .analyze();
  const serious = results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
  expect(serious, `axe found serious or critical problems on ${what}`).toEqual([]);
}

test('an empty diary says what is needed before anything can be scored', async ({ browser }) => {
  const app = await openApp(browser, server(), { colorScheme: 'light' });
  try {
    await openScorecard(app);
    await expect(app.page.getByTestId('nothing-scored')).toHaveText(
      'Resolve questions that have a forecast made before their window closed; their scores appear here.',
    );
    // The heading says it once; the body does not repeat it.
    await expect(app.page.getByRole('heading', { name: 'Nothing scored yet' })).toBeVisible();
    await expect(app.page.getByText('Nothing scored yet')).toHaveCount(1);
    await expect(app.page.getByTestId('caution')).toHaveText('Scores describe past calls; small samples mislead.');
    await expectNoSeriousViolations(app.page, 'the empty Scorecard');
    await app.page.screenshot({ path: 'test/e2e/artifacts/scorecard-empty-light.png', fullPage: true });
    expect(app.problems, 'the page logged errors').toEqual([]);
  } finally {
    await app.close();
  }
});

test('the headline figures and the calibration diagram show what the diary scored', async ({ browser }) => {
  const { added } = await callApi('loadDemo', {});
  expect(added).toBeGreaterThan(20);
  const { report, detail } = await score({});
  expect(report.scored, 'the example diary has scored questions').toBeGreaterThan(0);

  const app = await openApp(browser, server());
  try {
    await openScorecard(app);
    const page = app.page;
    await expect(page.getByTestId('headline-brier-value')).toHaveText(report.brier!.toFixed(3));
    await expect(page.getByTestId('headline-brier-n')).toHaveText(`n = ${report.scored}`);
    await expect(page.getByTestId('headline-brier')).toContainText(
      `95% interval ${detail.brier_interval![0].toFixed(3)}–${detail.brier_interval![1].toFixed(3)}`,
    );
    await expect(page.getByTestId('headline-brier')).toContainText(
      `Brier ${report.brier!.toFixed(2)} over ${report.scored} questions — 0 is perfect, always saying 50% scores 0.25.`,
    );
    await expect(page.getByTestId('headline-log-value')).toHaveText(report.log_score!.toFixed(3));

    // The calibration figure plots exactly the engine's bins (SCORING.md: bins with Wilson intervals).
    expect(await dataPoints(page, 'calibration-chart')).toEqual(report.bins);

    // The most confident bin above 50%, read out with its n and Wilson interval.
    const top = report.bins.filter((b) => b.index > 5).at(-1)!;
    const asPct = (x: number) => Math.round(x * 100);
    await expect(page.getByTestId('headline-confident')).toContainText(
      `Your ${top.index * 10}% calls came true ${asPct(top.observed)}% of the time (n = ${top.n}, 95% interval ${asPct(top.wilson_low)}–${asPct(top.wilson_high)}%).`,
    );

    // Calibration slope: the recalibrated 90% is σ(a + b·logit 0.9) (SCORING.md, Cox 1958).
    const { intercept, slope } = report.calibration;
    if (intercept !== null && slope !== null) {
      await expect(page.getByTestId('headline-slope')).toContainText(`Your 90% behaves like ${asPct(recalibrate(0.9, intercept, slope))}%`);
    } else {
      await expect(page.getByTestId('headline-slope')).toContainText(report.calibration.reason!);
    }

    // The data table alternative lists the same bins once it is opened.
    const calibration = page.getByTestId('calibration-chart');
    await calibration.getByText('Show the data as a table').click();
    await expect(calibration.locator('tbody tr')).toHaveCount(report.bins.length);

    // The decomposition's terms add back up to the Brier score (SCORING.md identity).
    await expect(page.getByTestId('decomposition-identity').locator('strong')).toHaveText(report.brier!.toFixed(3));

    // Every other chart carries what it plots.
    expect(await dataPoints(page, 'value-curve-chart')).toEqual(report.value_curve);
    expect(await dataPoints(page, 'running-brier-chart')).toEqual(detail.running_brier);
    expect(await dataPoints(page, 'roc-chart')).toEqual(detail.roc);
    expect(await contingency(page)).toEqual([
      report.decisions.hits,
      report.decisions.false_alarms,
      report.decisions.misses,
      report.decisions.correct_rejections,
    ]);
    expect(app.problems, 'the page logged errors').toEqual([]);
  } finally {
    await app.close();
  }
});

test('the tag and date filters change every figure to the filtered scorecard', async ({ browser }) => {
  const all = await score({});
  const { tags } = await callApi('listQuestions', {});
  // A tag whose scored subset is smaller than the whole, so the change is visible.
  let tag = '';
  let tagged: Responses['score'] | undefined;
  for (const t of tags) {
    const s = await score({ tag: t.tag });
    if (s.report.scored > 0 && s.report.scored < all.report.scored) {
      tag = t.tag;
      tagged = s;
      break;
    }
  }
  expect(tagged, 'the example diary has a tag with part of the scored questions').toBeDefined();

  const app = await openApp(browser, server());
  try {
    await openScorecard(app);
    const page = app.page;
    await expect(page.getByTestId('headline-brier-n')).toHaveText(`n = ${all.report.scored}`);

    await page.getByLabel('Tag', { exact: true }).selectOption(tag);
    await waitReady(page, tag);
    await expect(page.getByTestId('headline-brier-n')).toHaveText(`n = ${tagged!.report.scored}`);
    await expect(page.getByTestId('headline-brier-value')).toHaveText(tagged!.report.brier!.toFixed(3));
    expect(await dataPoints(page, 'calibration-chart')).toEqual(tagged!.report.bins);
    expect(await dataPoints(page, 'running-brier-chart')).toEqual(tagged!.detail.running_brier);
    // Small samples say what is missing instead of showing a number (SCORING.md: no slope below 20).
    if (tagged!.report.scored < 20) {
      await expect(page.getByTestId('headline-slope')).toContainText('Resolve 20 questions to see your calibration slope');
    }
    for (const [baseline, value] of Object.entries(tagged!.report.skill)) {
      const row = page.getByTestId('skill-chart').locator(`tr[data-baseline="${baseline}"]`);
      if (value === null) await expect(row).toContainText('not enough data');
      else {
        await expect(row.locator('td').first()).toHaveText(value.toFixed(2).replace(/^-0\.00$/, '0.00').replace('-', '−'));
        // A skill score has no interval: on few questions its reading says how few.
        if (tagged!.report.scored < 20) await expect(row).toContainText(`Only ${tagged!.report.scored} question`);
      }
    }

    // Two quick changes: only the last one's answer may end up on screen.
    const other = tags.find((t) => t.tag !== tag)!.tag;
    await page.getByLabel('Tag', { exact: true }).selectOption(other);
    await page.getByLabel('Tag', { exact: true }).selectOption('');
    await waitReady(page, '');
    await expect(page.getByTestId('headline-brier-n')).toHaveText(`n = ${all.report.scored}`);
    expect(await dataPoints(page, 'calibration-chart')).toEqual(all.report.bins);
    if (all.report.scored >= 20) await expect(page.getByTestId('skill-chart')).not.toContainText('so far');

    // Date range of window ends, as whole days on the diary's clocks: from the day of the
    // middle window end to the day of the last one.
    const { time_zone: zone } = await callApi('diaryInfo', {});
    const ends = all.detail.running_brier.map((p) => p.T);
    const fromDay = toLocalInputValue(ends[Math.floor(ends.length / 2)]!, zone).slice(0, 10);
    const toDay = toLocalInputValue(ends.at(-1)!, zone).slice(0, 10);
    const dayStart = (day: string) => wallTimeToInstant(parseLocalDateTime(`${day}T00:00`)!, zone);
    const dayEnd = (day: string) => wallTimeToInstant(addCalendarDays(parseLocalDateTime(`${day}T00:00`)!, 1), zone) - 1;
    const ranged = await score({ from: toIso(dayStart(fromDay)), to: toIso(dayEnd(toDay)) });
    expect(ranged.report.scored).toBeGreaterThan(0);
    expect(ranged.report.scored).toBeLessThan(all.report.scored);

    await page.getByLabel('From', { exact: true }).fill(fromDay);
    await page.getByLabel('To', { exact: true }).fill(toDay);
    await waitReady(page, '');
    await expect(page.getByTestId('headline-brier-n')).toHaveText(`n = ${ranged.report.scored}`);
    await expect(page.getByTestId('headline-brier-value')).toHaveText(ranged.report.brier!.toFixed(3));
    expect(await dataPoints(page, 'calibration-chart')).toEqual(ranged.report.bins);

    // A range that ends before it starts is refused beside the field, not sent.
    await page.getByLabel('To', { exact: true }).fill(fromDay.replace(/^(\d{4})/, (y) => String(Number(y) - 1)));
    await expect(page.getByTestId('field-error')).toHaveText('⚠ Must not be before From');
    // The figures left on screen are the last usable filters', and the page says so.
    await expect(page.getByTestId('figures-held')).toHaveText(/still those of your last usable filters; correct the marked field/);
    await page.getByRole('button', { name: 'Clear filters' }).click();
    await waitReady(page, '');
    await expect(page.getByTestId('figures-held')).toHaveCount(0);
    await expect(page.getByTestId('headline-brier-n')).toHaveText(`n = ${all.report.scored}`);
    expect(app.problems, 'the page logged errors').toEqual([]);
  } finally {
    await app.close();
  }
});

test('one scored question is counted in the singular', async ({ browser }) => {
  const { tags } = await callApi('listQuestions', {});
  let tag = '';
  for (const t of tags) {
    if ((await score({ tag: t.tag })).report.scored === 1) {
      tag = t.tag;
      break;
    }
  }
  expect(tag, 'the example diary has a tag with one scored question').not.toBe('');
  const app = await openApp(browser, server());
  try {
    await openScorecard(app);
    await app.page.getByLabel('Tag', { exact: true }).selectOption(tag);
    await waitReady(app.page, tag);
    await expect(app.page.getByTestId('decision-table').locator('caption')).toHaveText('What acting on your forecasts would have meant (1 scored question)');
    expect(app.problems, 'the page logged errors').toEqual([]);
  } finally {
    await app.close();
  }
});

test('what-if costs move the threshold and the 2×2 table; default costs are saved to the diary', async ({ browser }) => {
  const settings = await callApi('getSettings', {});
  const base = await score({});
  const whatIf = await score({ costs: { false_alarm: 1, miss: 4 } });

  const app = await openApp(browser, server());
  try {
    await openScorecard(app);
    const page = app.page;
    const defaultAlpha = settings.default_false_alarm_cost / (settings.default_false_alarm_cost + settings.default_miss_cost);
    await expect(page.getByTestId('threshold-value')).toHaveText(defaultAlpha.toFixed(2));
    const before = await contingency(page);
    expect(before).toEqual([base.report.decisions.hits, base.report.decisions.false_alarms, base.report.decisions.misses, base.report.decisions.correct_rejections]);

    // α = FA / (FA + M) = 1 / 5 (SCORING.md, Thompson 1952).
    await page.getByLabel('What-if false-alarm cost').fill('1');
    await page.getByLabel('What-if miss cost').fill('4');
    await waitReady(page, '');
    await expect(page.getByTestId('threshold-value')).toHaveText('0.20');
    await expect(page.getByTestId('whatif-status')).toHaveText('In use: false-alarm cost 1, miss cost 4 for every question in this view.');
    await expect.poll(() => contingency(page)).toEqual([
      whatIf.report.decisions.hits,
      whatIf.report.decisions.false_alarms,
      whatIf.report.decisions.misses,
      whatIf.report.decisions.correct_rejections,
    ]);
    expect(await contingency(page), 'the 2×2 table changed with the threshold').not.toEqual(before);
    const costs = (await dataPoints(page, 'policy-costs-chart')) as { policy: string; cost: number }[];
    expect(costs.find((c) => c.policy === 'yours')?.cost).toBe(whatIf.report.decisions.cost);

    await page.getByRole('button', { name: 'Clear what-if' }).click();
    await waitReady(page, '');
    await expect.poll(() => contingency(page)).toEqual(before);

    // The diary-wide defaults are saved through updateSettings and used from then on.
    await page.getByLabel('False-alarm cost', { exact: true }).fill('2');
    await page.getByLabel('Miss cost', { exact: true }).fill('3');
    await page.getByRole('button', { name: 'Save defaults' }).click();
    await expect(page.getByTestId('toast').filter({ hasText: 'Saved the default costs' })).toBeVisible();
    const saved = await callApi('getSettings', {});
    expect([saved.default_false_alarm_cost, saved.default_miss_cost]).toEqual([2, 3]);
    await waitReady(page, '');
    await expect(page.getByTestId('threshold-value')).toHaveText('0.40');
    expect(app.problems, 'the page logged errors').toEqual([]);
  } finally {
    await app.close();
  }
});

test('a chart screens below the top is drawn just after the page, without scrolling to it', async ({ browser }) => {
  const app = await openApp(browser, server());
  try {
    await openScorecard(app);
    const page = app.page;
    // The first chart is drawn with the page; the last (numeric calibration, screens below) after it.
    await expect(page.getByTestId('calibration-chart').locator('canvas')).toHaveAttribute('data-drawn', 'true');
    const far = page.getByTestId('quantile-calibration-chart').locator('canvas');
    await expect(far).toHaveAttribute('data-drawn', 'true');
    expect(await page.evaluate(() => window.scrollY), 'the page was not scrolled').toBe(0);
    const inked = await far.evaluate((canvas: HTMLCanvasElement) => {
      const pixels = canvas.getContext('2d')!.getImageData(0, 0, canvas.width, canvas.height).data;
      let n = 0;
      for (let i = 3; i < pixels.length; i += 4) if (pixels[i] !== 0) n++;
      return n;
    });
    expect(inked, 'pixels drawn on the canvas').toBeGreaterThan(1000);
    expect(app.problems, 'the page logged errors').toEqual([]);
  } finally {
    await app.close();
  }
});

for (const scheme of ['light', 'dark'] as const) {
  test(`the Scorecard passes an axe scan and is photographed (${scheme})`, async ({ browser }) => {
    // The example diary fills the yes/no, choice and numeric sections: a long page to scan.
    test.setTimeout(90_000);
    const app = await openApp(browser, server(), { colorScheme: scheme });
    try {
      await openScorecard(app);
      await expect(app.page.getByTestId('calibration-chart')).toBeVisible();
      await expectNoSeriousViolations(app.page, `the Scorecard (${scheme})`);
      await drawEveryChart(app.page);
      await app.page.screenshot({ path: `test/e2e/artifacts/scorecard-${scheme}.png`, fullPage: true });
      expect(app.problems, 'the page logged errors').toEqual([]);
    } finally {
      await app.close();
    }
  });
}
