/**
 * The thinking tools end to end against `forelog serve`: the base-rate helper on the question
 * forms, lenses on the revise form, the glide path on the history chart and the stale notice,
 * the recalibration hint, and the reference lead on a resolved question. Expected numbers
 * are the published check values (/shared/CHECK-VALUES.md) or derived from the SCORING.md
 * formula named beside them. The tests run in order on one diary: the example diary first
 * (it only loads into an empty diary), then questions the tests add themselves.
 */
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Browser, type Page } from '@playwright/test';
import type { Question, QuestionSummary } from '../../shared/domain';
import type { Scorecard } from '../../shared/contract';
import { daysFromNow, fillQuickAdd } from './helpers';
import { openApp, useAppPage, useDiaryServer } from './serve';

const server = useDiaryServer();
test.describe.configure({ mode: 'serial' });

const DAY = 86_400_000;
const TITLE = 'Harbourline renews the maintenance contract';

/** Calls the diary's HTTP API directly, for setting a scene the forms cannot (back-dated windows). */
async function call<T>(operation: string, request: unknown): Promise<T> {
  const url = new URL(server().url);
  const response = await fetch(`${url.origin}/api/${operation}`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Authorization: `Bearer ${url.searchParams.get('token')}` },
    body: JSON.stringify(request),
  });
  const envelope = (await response.json()) as { ok: true; value: T } | { ok: false; error: { message: string } };
  if (!envelope.ok) throw new Error(`${operation} was refused: ${envelope.error.message}`);
  return envelope.value;
}

async function openQuestion(page: Page, id: string, title: string): Promise<void> {
  // Runs in the page; the test project has no DOM typings, hence the narrow cast.
  await page.evaluate((questionId) => {
    (globalThis as unknown as { location: { hash: string } }).location.hash = `/questions/${questionId}`;
  }, id);
  await expect(page.getByRole('heading', { level: 1 })).toHaveText(title);
}

async function chartData(page: Page): Promise<{ own: { at: string; p: number }[]; glide: { at: string; p: number }[]; base_rate: number | null; closes_at: string }> {
  return JSON.parse((await page.getByTestId('history-chart').getAttribute('data-points')) ?? 'null');
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

/** The 0–1 number a tool's result carries in `data-p`. */
async function dataP(page: Page, testId: string): Promise<number> {
  return Number(await page.getByTestId(testId).getAttribute('data-p'));
}

test.describe('what the tools do', () => {
  const app = useAppPage(server);

  test('the example diary loads (the later tests read it)', async () => {
    const loaded = await call<{ added: number }>('loadDemo', {});
    expect(loaded.added).toBeGreaterThan(20);
  });

  test('the base-rate helper on quick add: rule of succession with its interval, rate to window, and "Use this"', async () => {
    const { page } = app;
    await page.getByRole('main').focus();
    await page.keyboard.press('n');
    await fillQuickAdd(page, { title: TITLE, closes: daysFromNow(90), probability: '40' });
    const dialog = page.getByRole('dialog', { name: 'New question' });
    await dialog.locator('summary', { hasText: 'Work out a base rate' }).click();
    const result = dialog.getByTestId('base-rate-result');

    // A rate per period: 0.1 per year over 1 year → 1 − e^(−0.1) = 0.095163 (CHECK-VALUES.md "Time and hazard").
    await dialog.getByRole('radio', { name: 'a rate per period' }).check();
    await dialog.getByRole('spinbutton', { name: 'Events per period' }).fill('0.1');
    await expect(dialog.getByLabel('Period', { exact: true })).toHaveValue('year');
    await dialog.getByRole('spinbutton', { name: 'Window length' }).fill('1');
    await expect(result).toContainText('0.1 per year over 1 year → 9.5%');
    expect(await dataP(page, 'base-rate-result')).toBeCloseTo(0.095163, 6);
    // The question's own window (90 days ≈ 0.25 years) is offered as the window length.
    await dialog.getByRole('button', { name: /Use this question’s window \(0\.25 years\)/ }).click();
    await expect(dialog.getByRole('spinbutton', { name: 'Window length' })).toHaveValue('0.25');

    // k of n: 0 of 0 → 0.5 with the interval [0, 1] (CHECK-VALUES.md "Rule of succession").
    await dialog.getByRole('radio', { name: 'k of n comparable cases' }).check();
    await dialog.getByRole('spinbutton', { name: 'Cases where it happened' }).fill('0');
    await dialog.getByRole('spinbutton', { name: 'Comparable cases' }).fill('0');
    await expect(result).toContainText('0 of 0 comparable cases → 50% (95% interval 0–100%)');
    expect(await dataP(page, 'base-rate-result')).toBe(0.5);

    // More cases than comparable cases is refused beside the field, with no result.
    await dialog.getByRole('spinbutton', { name: 'Cases where it happened' }).fill('4');
    await dialog.getByRole('spinbutton', { name: 'Comparable cases' }).fill('3');
    await expect(dialog.getByRole('spinbutton', { name: 'Cases where it happened' })).toHaveAccessibleDescription(/more than the comparable cases/);
    await expect(result).toHaveCount(0);
    // Counts group their digits as the rest of Forelog does (6 of 2000 → (6 + 1) / 2002 = 0.35%).
    await dialog.getByRole('spinbutton', { name: 'Cases where it happened' }).fill('6');
    await dialog.getByRole('spinbutton', { name: 'Comparable cases' }).fill('2000');
    await expect(result).toContainText('6 of 2,000 comparable cases → 0.3%');

    // 3 of 3 → 0.8 (CHECK-VALUES.md "Rule of succession"); Jeffreys lower limit = Beta(3.5, 0.5)
    // quantile 0.025 = 0.4644, upper 1 since k = n (derived; scipy.stats.beta.ppf(0.025, 3.5, 0.5)).
    await dialog.getByRole('spinbutton', { name: 'Cases where it happened' }).fill('3');
    await dialog.getByRole('spinbutton', { name: 'Comparable cases' }).fill('3');
    await expect(result).toContainText('3 of 3 comparable cases → 80% (95% interval 46–100%)');
    expect(await dataP(page, 'base-rate-result')).toBeCloseTo(0.8, 12);
    // Enter in a helper box works the helper, not the question form.
    await dialog.getByRole('spinbutton', { name: 'Comparable cases' }).press('Enter');
    await expect(dialog).toBeVisible();

    await dialog.getByRole('button', { name: 'Use this' }).click();
    await expect(dialog.getByRole('spinbutton', { name: 'Base rate', exact: true })).toHaveValue('80');
    await expect(dialog.getByRole('textbox', { name: 'Reference class' })).toHaveValue('3 of 3 comparable cases; rule of succession, 95% interval 46–100%');
    await expect(dialog.getByRole('status').filter({ hasText: 'Base rate set to 80%' })).toBeVisible();

    await expectNoSeriousViolations(page, 'the quick-add form with the base-rate helper open');

    await dialog.getByRole('button', { name: 'Save question' }).click();
    await expect(dialog).toBeHidden();
    await page.getByRole('link', { name: TITLE }).click();
    // The page reloads the question after the save: wait for the redrawn chart.
    await expect.poll(async () => (await chartData(page)).base_rate).toBe(0.8);
    await expect(page.locator('.facts')).toContainText('3 of 3 comparable cases; rule of succession, 95% interval 46–100%');
  });

  test('the base-rate helper on Edit fills the base rate and its note', async () => {
    const { page } = app;
    await page.getByRole('link', { name: TITLE }).click();
    await page.getByRole('button', { name: 'Edit' }).click();
    const dialog = page.getByRole('dialog', { name: 'Edit question' });
    await dialog.locator('summary', { hasText: 'Work out a base rate' }).click();
    // 7 of 20 → 8/22 = 0.3636; Jeffreys Beta(7.5, 13.5) quantiles 0.025 and 0.975 = 0.1723 and
    // 0.5678 (derived; scipy.stats.beta.ppf).
    await dialog.getByRole('spinbutton', { name: 'Cases where it happened' }).fill('7');
    await dialog.getByRole('spinbutton', { name: 'Comparable cases' }).fill('20');
    await dialog.getByRole('textbox', { name: 'What the cases were' }).fill('renewals slipped');
    await expect(dialog.getByTestId('base-rate-result')).toContainText('7 of 20 comparable renewals slipped → 36.4% (95% interval 17–57%)');
    await dialog.getByRole('button', { name: 'Use this' }).click();
    await dialog.getByRole('button', { name: 'Save changes' }).click();
    await expect(dialog).toBeHidden();
    // The form fills the figure it showed (one decimal), so the diary keeps 36.4%.
    await expect.poll(async () => (await chartData(page)).base_rate).toBe(0.364);
    await expect(page.locator('.facts')).toContainText('7 of 20 comparable renewals slipped; rule of succession, 95% interval 17–57%');
  });

  test('lenses: a pooled suggestion with extremizing, "Use suggestion", and the lenses kept with the revision', async () => {
    const { page } = app;
    await page.getByRole('link', { name: TITLE }).click();
    await page.getByRole('button', { name: 'Revise' }).click();
    const dialog = page.getByRole('dialog', { name: 'Revise your forecast' });
    await dialog.locator('summary', { hasText: 'Lenses' }).click();

    // "Add lens" offers the next suggested name and takes the keyboard to the new probability.
    await dialog.getByRole('button', { name: 'Add lens' }).click();
    await expect(dialog.getByRole('combobox', { name: 'Lens 1 name' })).toHaveValue('outside view');
    await expect(dialog.getByRole('spinbutton', { name: 'Lens 1 probability' })).toBeFocused();
    await page.keyboard.type('60');
    await dialog.getByRole('button', { name: 'Add lens' }).click();
    await expect(dialog.getByRole('combobox', { name: 'Lens 2 name' })).toHaveValue('inside view');
    await page.keyboard.type('70');

    // Log-odds average of 0.6 and 0.7 → 0.651669; extremizing factor 2 → 7/9 (CHECK-VALUES.md "Pooling").
    const suggestion = dialog.getByTestId('lens-suggestion');
    await expect(suggestion).toHaveText('65.2%');
    expect(await dataP(page, 'lens-suggestion')).toBeCloseTo(0.651669, 6);
    await dialog.getByRole('spinbutton', { name: 'Extremizing factor' }).fill('2');
    await expect(suggestion).toHaveText('77.8%');
    expect(await dataP(page, 'lens-suggestion')).toBeCloseTo(7 / 9, 12);

    // A third lens left without a probability is refused beside it, and removing it changes nothing.
    await dialog.getByRole('button', { name: 'Add lens' }).click();
    await expect(dialog.getByRole('combobox', { name: 'Lens 3 name' })).toHaveValue("devil's advocate");
    await dialog.getByRole('button', { name: 'Save revision' }).click();
    const third = dialog.getByRole('spinbutton', { name: 'Lens 3 probability' });
    await expect(third).toHaveAttribute('aria-invalid', 'true');
    await expect(third).toHaveAccessibleDescription(/Enter this lens’s probability, or remove the lens/);
    await expect(third).toBeFocused();
    await dialog.getByRole('button', { name: "Remove lens 3 (devil's advocate)" }).click();
    await expect(dialog.getByRole('button', { name: 'Add lens' })).toBeFocused();
    await expect(suggestion).toHaveText('77.8%');

    // The suggestion goes into the user's own number only when asked.
    await expect(dialog.getByRole('spinbutton', { name: 'Your probability', exact: true })).toHaveValue('40');
    await dialog.getByRole('button', { name: 'Use suggestion' }).click();
    await expect(dialog.getByRole('spinbutton', { name: 'Your probability', exact: true })).toHaveValue('77.8');
    await dialog.getByLabel('What changed').fill('Two lenses pooled');
    await dialog.getByRole('button', { name: 'Save revision' }).click();
    await expect(dialog).toBeHidden();

    const latest = page.getByTestId('revision-row').last();
    await expect(latest.getByTestId('revision-p')).toHaveText('77.8%');
    await expect(latest.getByRole('list', { name: 'Lenses' }).getByRole('listitem')).toHaveText(['outside view: 60%', 'inside view: 70%']);
  });

  test('the glide path: in the chart data from the latest forecast to 0 at the close, only for event-by-deadline questions', async () => {
    const { page } = app;
    await page.getByRole('link', { name: TITLE }).click();
    const data = await chartData(page);
    const latest = data.own[data.own.length - 1]!;
    // SCORING.md "Glide path": g(t0) = p and g(T) = 0.
    expect(data.glide[0]).toEqual({ at: latest.at, p: 0.778 });
    expect(data.glide[data.glide.length - 1]).toEqual({ at: data.closes_at, p: 0 });
    // Constant hazard falls monotonically; halfway through the remaining window it is
    // 1 − (1 − p)^(1/2) (derived from the glide path formula; CHECK-VALUES.md "Time and hazard"
    // gives 0.292893 for p = 0.5).
    const ps = data.glide.map((g) => g.p);
    expect(ps.every((p, i) => i === 0 || p <= ps[i - 1]!)).toBe(true);
    const mid = data.glide[(data.glide.length - 1) / 2]!;
    expect(mid.p).toBeCloseTo(1 - Math.sqrt(1 - 0.778), 9);
    await expect(page.getByTestId('history-chart')).toContainText('the glide path');

    // A state-at-deadline question has no glide path (it is read off at the close).
    await openQuestion(page, 'demo-quillmere-utilisation', (await call<Question>('getQuestion', { id: 'demo-quillmere-utilisation' })).title);
    expect((await chartData(page)).glide).toEqual([]);
  });

  test('a stale forecast is flagged on its page with what the glide path says now, as in the list', async () => {
    const { page } = app;
    const now = Date.now();
    const title = 'Eastmoor opens the second depot';
    const created = await call<Question>('createQuestion', {
      title,
      kind: 'event_by_deadline',
      opened_at: new Date(now - 30 * DAY).toISOString(),
      closes_at: new Date(now + 30 * DAY).toISOString(),
      first_forecast: { p: 0.7, at: new Date(now - 30 * DAY).toISOString(), note: 'Landlord keen, planning pending' },
    });
    const listed = await call<{ questions: QuestionSummary[] }>('listQuestions', { text: 'Eastmoor' });
    expect(listed.questions.find((q) => q.id === created.id)?.stale).toBe(true);

    await openQuestion(page, created.id, title);
    // Half the window has run: 1 − (1 − 0.7)^(1/2) = 0.4523 (derived from SCORING.md "Glide path").
    const notice = page.getByTestId('stale-notice');
    await expect(notice).toContainText('Nothing has happened for 30 days; by a constant hazard your 70% would now be 45.2%.');
    await notice.getByRole('button', { name: 'Update your forecast' }).click();
    await expect(page.getByRole('dialog', { name: 'Revise your forecast' })).toBeVisible();
    await page.keyboard.press('Escape');

    // A fresh question is not stale.
    await page.getByRole('link', { name: 'Questions' }).first().click();
    await page.getByRole('link', { name: TITLE }).click();
    await expect(page.getByTestId('stale-notice')).toHaveCount(0);
  });

  test('the recalibration hint says what the stated number has meant, and why not when it cannot', async () => {
    const { page } = app;
    const { report } = await call<Scorecard>('score', {});
    expect(report.scored).toBeGreaterThanOrEqual(20);
    const { intercept, slope } = report.calibration;
    expect(intercept).not.toBeNull();
    // SCORING.md "Bins": 0.9 lies in bin 9 (edges 0.05 … 0.85 are ≤ 0.9); recalibrated value
    // σ(a + b·logit p) (SCORING.md "Calibration intercept and slope").
    const bin = report.bins.find((b) => b.index === 9)!;
    const recalibrated = 1 / (1 + Math.exp(-(intercept! + slope! * Math.log(0.9 / 0.1))));
    const pct = (x: number) => `${Number((x * 100).toFixed(1))}%`;

    await page.getByRole('link', { name: TITLE }).click();
    await page.getByRole('button', { name: 'Revise' }).click();
    const dialog = page.getByRole('dialog', { name: 'Revise your forecast' });
    await dialog.getByRole('spinbutton', { name: 'Your probability', exact: true }).fill('90');
    const hint = dialog.getByTestId('recalibration-hint');
    await expect(hint).toContainText(`You say 90% — your ~90% calls came true ${pct(bin.observed)} of the time (n = ${bin.n}, 95% interval `, {
      timeout: 15_000,
    });
    await expect(hint).toContainText(`recalibrated: ${pct(recalibrated)}.`);

    // Without a fitted line the hint says why (the diary's own reason).
    await page.route('**/api/score', async (route) => {
      const response = await route.fetch();
      const envelope = (await response.json()) as { ok: true; value: Scorecard };
      envelope.value.report.scored = 3;
      envelope.value.report.calibration = { intercept: null, slope: null, reason: 'needs at least 20 scored questions; there are 3' };
      await route.fulfill({ response, json: envelope });
    });
    // The typed 90 is not thrown away without asking (renderer/src/components/Dialog.tsx).
    await page.keyboard.press('Escape');
    await page.getByRole('alertdialog', { name: 'Discard your changes?' }).getByRole('button', { name: 'Discard' }).click();
    await page.getByRole('button', { name: 'Revise' }).click();
    await dialog.getByRole('spinbutton', { name: 'Your probability', exact: true }).fill('90');
    await expect(hint).toContainText('No recalibrated value yet: needs at least 20 scored questions; there are 3 — resolve 17 more to see it.', {
      timeout: 15_000,
    });
    await expect(hint).not.toContainText('recalibrated:');
  });

  test('the reference lead on resolved questions with references', async () => {
    const { page } = app;
    const day = (iso: string, zone: string) => new Intl.DateTimeFormat('en-GB', { timeZone: zone, day: 'numeric', month: 'short', year: 'numeric' }).format(Date.parse(iso));

    // Yes: every own forecast was above 50% from the first (day −545 of the example); the
    // client's view first said 90% on day −538, so the user was 7 days earlier
    // (derived from referenceLead's definition, SCORING.md "Which forecasts count").
    const signed = await call<Question>('getQuestion', { id: 'demo-norrowby-phase2-sow' });
    const firstOwn = [...signed.forecasts].sort((a, b) => Date.parse(a.at) - Date.parse(b.at))[0]!;
    const firstRef = [...signed.references].sort((a, b) => Date.parse(a.at) - Date.parse(b.at))[0]!;
    await openQuestion(page, signed.id, signed.title);
    await expect(page.getByTestId('reference-lead')).toContainText(
      `Your forecast settled on the right side of 50% on ${day(firstOwn.at, signed.time_zone)}; the reference (client's view) on ${day(firstRef.at, signed.time_zone)} — you were 7 days earlier.`,
    );

    // No: the user stayed below 50% throughout; the vendor's plan (80%) never came round.
    const slipped = await call<Question>('getQuestion', { id: 'demo-norrowby-wms-golive' });
    await openQuestion(page, slipped.id, slipped.title);
    await expect(page.getByTestId('reference-lead')).toContainText("the reference (vendor's plan) never did before the window ended.");

    // An open question shows no lead.
    await page.getByRole('link', { name: 'Questions' }).first().click();
    await page.getByRole('link', { name: TITLE }).click();
    await expect(page.getByTestId('reference-lead')).toHaveCount(0);
  });
});

/**
 * Opens the app in `scheme`, lets `prepare` set the scene, then runs an axe scan (WCAG 2.0–2.2
 * A/AA and best practices: no serious or critical finding) and saves a screenshot for a person
 * to look at in test/e2e/artifacts/tools-<name>-<scheme>.png.
 */
async function look(browser: Browser, scheme: 'light' | 'dark', name: string, prepare: (page: Page) => Promise<void>, fullPage = false): Promise<void> {
  const themed = await openApp(browser, server(), { colorScheme: scheme });
  try {
    await prepare(themed.page);
    await expectNoSeriousViolations(themed.page, `${name} (${scheme})`);
    await themed.page.screenshot({ path: `test/e2e/artifacts/tools-${name}-${scheme}.png`, fullPage });
    expect(themed.problems, 'the page logged errors').toEqual([]);
  } finally {
    await themed.close();
  }
}

test.describe('how the tools look', () => {
  for (const scheme of ['light', 'dark'] as const) {
    test(`a stale question's page with its glide path (${scheme})`, async ({ browser }) => {
      await look(
        browser,
        scheme,
        'stale',
        async (page) => {
          const stale = (await call<{ questions: QuestionSummary[] }>('listQuestions', { text: 'Eastmoor' })).questions[0]!;
          await openQuestion(page, stale.id, stale.title);
          await expect(page.getByTestId('stale-notice')).toBeVisible();
        },
        true,
      );
    });

    test(`the revise form with lenses and the recalibration hint (${scheme})`, async ({ browser }) => {
      await look(browser, scheme, 'revise', async (page) => {
        const stale = (await call<{ questions: QuestionSummary[] }>('listQuestions', { text: 'Eastmoor' })).questions[0]!;
        await openQuestion(page, stale.id, stale.title);
        await page.getByRole('button', { name: 'Revise' }).click();
        const dialog = page.getByRole('dialog', { name: 'Revise your forecast' });
        await dialog.locator('summary', { hasText: 'Lenses' }).click();
        for (const p of ['35', '60']) {
          await dialog.getByRole('button', { name: 'Add lens' }).click();
          await page.keyboard.type(p);
        }
        // The hint waits for the scorecard; allow for a busy machine.
        await expect(dialog.getByTestId('recalibration-hint')).toBeVisible({ timeout: 15_000 });
        await dialog.getByRole('button', { name: 'Use suggestion' }).scrollIntoViewIfNeeded();
      });
    });

    test(`a resolved question with its reference lead (${scheme})`, async ({ browser }) => {
      await look(
        browser,
        scheme,
        'lead',
        async (page) => {
          await openQuestion(page, 'demo-norrowby-phase2-sow', (await call<Question>('getQuestion', { id: 'demo-norrowby-phase2-sow' })).title);
          await expect(page.getByTestId('reference-lead')).toBeVisible();
        },
        true,
      );
    });

    test(`the quick-add form with the base-rate helper (${scheme})`, async ({ browser }) => {
      await look(browser, scheme, 'base-rate', async (page) => {
        await page.getByRole('main').focus();
        await page.keyboard.press('n');
        const quick = page.getByRole('dialog', { name: 'New question' });
        await quick.locator('summary', { hasText: 'Work out a base rate' }).click();
        await quick.getByRole('spinbutton', { name: 'Cases where it happened' }).fill('6');
        await quick.getByRole('spinbutton', { name: 'Comparable cases' }).fill('20');
        await quick.getByRole('button', { name: 'Use this' }).scrollIntoViewIfNeeded();
      });
    });
  }
});
