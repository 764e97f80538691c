/**
 * Hindsight, end to end against `forelog serve` with the example diary: the confident misses
 * are the scorecard's own list (INTERFACES.md §2 `confident_misses`: final forecast ≥ 80 % on a
 * No or ≤ 20 % on a Yes, worst first), each with the notes written at the time; hits, the
 * threshold and the tag filter change the list exactly as the `hindsight` operation says; the
 * briefing previews styled in a script-less sandboxed frame, prints, and downloads as HTML.
 * Expected lists come from the diary's own API (the scoring rules have their own check-value
 * tests in test/unit); what is tested here is that the screen shows them faithfully.
 */
import fs from 'node:fs';
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import type { Hindsight, HindsightEntry, Scorecard } from '../../shared/contract';
import { openApp, useDiaryServer, type AppPage, type DiaryServer } from './serve';

const server = useDiaryServer();
test.describe.configure({ mode: 'serial' });

const DAY = 86_400_000;
/** The late revision this file adds to the first confident miss, after its window closed. */
const LATE_NOTE = 'Written after the window closed, once the answer was known.';

/** Calls the diary's HTTP API with the launch token, as the page does. */
async function call<T>(s: DiaryServer, operation: string, request: unknown): Promise<T> {
  const url = new URL(s.url);
  const response = await fetch(`${url.origin}/api/${operation}`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Authorization: `Bearer ${url.searchParams.get('token')}` },
    body: JSON.stringify(request),
  });
  const envelope = (await response.json()) as { ok: true; value: T } | { ok: false; error: { message: string } };
  if (!envelope.ok) throw new Error(`${operation} was refused: ${envelope.error.message}`);
  return envelope.value;
}

const hindsight = (request: Record<string, unknown>) => call<Hindsight>(server(), 'hindsight', request);

async function expectNoSeriousViolations(page: Page, what: string): Promise<void> {
  const results = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa', 'best-practice'])
    .analyze();
  const serious = results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
  expect(serious, `axe found serious or critical problems on ${what}`).toEqual([]);
}

/** Opens the app and goes to Hindsight through the navigation bar. */
async function openHindsight(page: Page): Promise<void> {
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Hindsight' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Hindsight' })).toBeVisible();
  await settled(page);
}

async function settled(page: Page): Promise<void> {
  await expect(page.locator('.hindsight')).toHaveAttribute('data-hindsight-ready', 'true');
}

/** The entries on screen, in order, as (id, verdict). */
async function shownEntries(page: Page): Promise<{ id: string; verdict: string }[]> {
  const entries = page.getByTestId('hindsight-entry');
  const out: { id: string; verdict: string }[] = [];
  for (const entry of await entries.all()) {
    out.push({ id: (await entry.getAttribute('data-id')) ?? '', verdict: (await entry.getAttribute('data-verdict')) ?? '' });
  }
  return out;
}

const asShown = (entries: HindsightEntry[]) => entries.map((e) => ({ id: e.id, verdict: e.verdict }));

let app: AppPage | undefined;
test.afterEach(async () => {
  if (!app) return;
  const problems = [...app.problems];
  await app.close();
  app = undefined;
  expect(problems, 'the page logged errors').toEqual([]);
});

test.beforeAll(async () => {
  await call(server(), 'loadDemo', {});
  // A revision after the window end of the worst miss: shown, marked, and never scored.
  const { entries } = await hindsight({});
  const first = entries[0]!;
  await call(server(), 'addForecast', {
    question_id: first.id,
    p: first.outcome === 'yes' ? 0.95 : 0.05,
    note: LATE_NOTE,
    at: new Date(Date.parse(first.window_end) + 2 * DAY).toISOString(),
  });
});

test('the navigation lists Hindsight between Scorecard and Settings', async ({ browser }) => {
  app = await openApp(browser, server());
  // A link may carry a count after its name (the Desk's "7 due"); the order is what counts here.
  const labels = await app.page.getByRole('navigation', { name: 'Main' }).getByRole('link').allInnerTexts();
  const order = ['Desk', 'Questions', 'Scorecard', 'Hindsight', 'Settings'];
  expect(labels.map((l, i) => (l.trim().startsWith(order[i] ?? '\u0000') ? order[i] : l))).toEqual(order);
});

test('at 80% the entries are the scorecard’s confident misses, each with its notes, rule and resolution', async ({ browser }) => {
  app = await openApp(browser, server());
  const { page } = app;
  await openHindsight(page);

  const { report, detail } = await call<Scorecard>(server(), 'score', {});
  expect(report.confident_misses.length, 'the example diary has confident misses to review').toBeGreaterThan(0);
  const entries = page.getByTestId('hindsight-entry');
  await expect(entries).toHaveCount(report.confident_misses.length);
  expect(await shownEntries(page)).toEqual(report.confident_misses.map((m) => ({ id: m.id, verdict: 'miss' })));
  const titles = await entries.getByRole('heading', { level: 3 }).allInnerTexts();
  expect(titles).toEqual(report.confident_misses.map((m) => m.title));

  const expected = (await hindsight({})).entries;
  for (const [i, e] of expected.entries()) {
    const card = entries.nth(i);
    await expect(card.getByRole('link', { name: e.title })).toHaveAttribute('href', `#/questions/${encodeURIComponent(e.id)}`);
    // Every note written at the time, in order, oldest first.
    await expect(card.getByTestId('revision-note')).toHaveText(e.forecasts.map((f) => f.note || 'No note written.'));
    await expect(card.getByTestId('resolution-note')).toHaveText(e.resolution.note);
    await expect(card).toContainText(e.rule);
    // "You said 85%; it did not happen." — the final counted forecast against the outcome.
    const said = `You said ${Math.round(e.final_p * 100)}%; ${e.outcome === 'yes' ? 'it happened' : 'it did not happen'}.`;
    await expect(card.getByTestId('verdict-sentence')).toHaveText(said);
    await expect(card.getByTestId('forecast-path')).toBeVisible();
  }

  // The late revision is listed, marked, and did not change the final forecast.
  const first = entries.first();
  const late = first.locator('tr[data-counted="false"]');
  await expect(late).toHaveCount(1);
  await expect(late).toContainText('late, not scored');
  await expect(late).toContainText(LATE_NOTE);
  await expect(first.locator('tr[data-counted="true"]')).toHaveCount(expected[0]!.forecasts.filter((f) => f.counted).length);

  // n everywhere: the count line and the calibration summary; the caution is always there.
  await expect(page.getByTestId('hindsight-count')).toContainText(`among n = ${report.scored} scored questions`);
  await expect(page.getByTestId('scored-n')).toHaveText(`n = ${report.scored}`);
  await expect(page.getByTestId('brier')).toHaveText(report.brier!.toFixed(3));
  // …with the Scorecard's own interval beside it, so a Brier of few questions reads as the rough guess it is.
  const [low, high] = detail.brier_interval!;
  await expect(page.getByTestId('brier-interval')).toHaveText(`95% interval ${low.toFixed(3)}–${high.toFixed(3)}`);
  // The 50% reference is written as the Scorecard writes it.
  await expect(page.getByText('Brier: mean squared distance from what happened')).toContainText('0 is perfect, always saying 50% scores 0.25.');
  await expect(page.getByTestId('calibration-bins').locator('tbody tr')).toHaveCount(report.bins.length);
  const { slope, intercept, reason } = report.calibration;
  if (slope === null || intercept === null) {
    await expect(page.getByTestId('slope-reading')).toContainText(`not reported: ${reason}`);
  } else {
    // Derived from SCORING.md's recalibration σ(a + b · logit(p)) at p = 0.9.
    const behaved = Math.round(100 / (1 + Math.exp(-(intercept + slope * Math.log(0.9 / 0.1)))));
    await expect(page.getByTestId('slope-reading')).toContainText(`Calibration slope ${slope.toFixed(2)}`);
    await expect(page.getByTestId('slope-reading')).toContainText(`a stated 90% behaved like ${behaved}%`);
  }
  await expect(page.getByTestId('caution')).toContainText('Scores describe past calls, not future ones');
});

test('“Show confident hits too” adds the confident hits after the misses', async ({ browser }) => {
  app = await openApp(browser, server());
  const { page } = app;
  await openHindsight(page);
  await page.getByLabel('Show confident hits too').check();
  await settled(page);
  const expected = (await hindsight({ include_hits: true })).entries;
  expect(expected.some((e) => e.verdict === 'hit'), 'the example diary has confident hits').toBe(true);
  await expect(page.getByTestId('hindsight-entry')).toHaveCount(expected.length);
  expect(await shownEntries(page)).toEqual(asShown(expected));
  await expect(page.getByTestId('hs-hits').getByTestId('hindsight-entry')).toHaveCount(expected.filter((e) => e.verdict === 'hit').length);
  await expect(page.getByTestId('hs-hits').getByText('Confident hit', { exact: true }).first()).toBeVisible();
});

test('lowering “Confident at” to 60% adds the calls between 60% and 80%', async ({ browser }) => {
  app = await openApp(browser, server());
  const { page } = app;
  await openHindsight(page);
  const at80 = (await hindsight({ threshold: 0.8 })).entries;
  const at60 = (await hindsight({ threshold: 0.6 })).entries;
  expect(at60.length, 'the example diary has a miss between 60% and 80%').toBeGreaterThan(at80.length);
  await page.getByRole('spinbutton', { name: 'Confident at', exact: true }).fill('60');
  await settled(page);
  await expect(page.getByTestId('hindsight-entry')).toHaveCount(at60.length);
  expect(await shownEntries(page)).toEqual(asShown(at60));
  await expect(page.getByTestId('hindsight-count')).toContainText('Confident at 60%: a final forecast 60% or more, or 40% or less');

  // Out of range: the field says why and the last good list stays.
  await page.getByRole('spinbutton', { name: 'Confident at', exact: true }).fill('40');
  await expect(page.getByTestId('field-error')).toHaveText('⚠ Must be from 50% to 99%');
  await expect(page.getByTestId('hindsight-entry')).toHaveCount(at60.length);
});

test('the tag filter narrows the list; a tag without confident misses says so and shows n', async ({ browser }) => {
  app = await openApp(browser, server());
  const { page } = app;
  await openHindsight(page);
  const delivery = await hindsight({ tag: 'delivery' });
  const all = await hindsight({});
  await page.getByLabel('Tag', { exact: true }).selectOption('delivery');
  await settled(page);
  expect(await shownEntries(page)).toEqual(asShown(delivery.entries));
  for (const e of delivery.entries) expect(e.tags).toContain('delivery');
  await expect(page.getByTestId('scored-n')).toHaveText(`n = ${delivery.report.scored}`);
  expect(delivery.report.scored).toBeLessThan(all.report.scored);

  const renewals = await hindsight({ tag: 'renewals' });
  expect(renewals.entries, 'renewals has no confident miss at 80% in the example diary').toEqual([]);
  await page.getByLabel('Tag', { exact: true }).selectOption('renewals');
  await settled(page);
  await expect(page.getByTestId('hindsight-entry')).toHaveCount(0);
  await expect(page.getByTestId('hindsight-empty')).toHaveText(
    `No confident misses at 80% in this selection — that is good news, or a small sample: n = ${renewals.report.scored}.`,
  );

  // A single scored question is counted in the singular.
  const halloway = await hindsight({ tag: 'client:halloway' });
  expect(halloway.report.scored, 'client:halloway has one scored question in the example diary').toBe(1);
  await page.getByLabel('Tag', { exact: true }).selectOption('client:halloway');
  await settled(page);
  await expect(page.getByTestId('hindsight-count')).toContainText('among n = 1 scored question. Confident at 80%');
});

test('the date range filters by window end', async ({ browser }) => {
  app = await openApp(browser, server());
  const { page } = app;
  await openHindsight(page);
  const all = (await hindsight({})).entries;
  // The day after the earliest miss's window end, in the diary's zone as the screen reads it.
  const zone = (await call<{ time_zone: string }>(server(), 'diaryInfo', {})).time_zone;
  const ends = all.map((e) => Date.parse(e.window_end)).sort((a, b) => a - b);
  const day = new Intl.DateTimeFormat('en-CA', { timeZone: zone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(ends[0]! + DAY);
  const later = all.filter((e) => Date.parse(e.window_end) >= ends[0]! + DAY);
  expect(later.length).toBeLessThan(all.length);
  await page.getByLabel('From', { exact: true }).fill(day);
  await settled(page);
  expect((await shownEntries(page)).map((e) => e.id).sort()).toEqual(later.map((e) => e.id).sort());
});

test('the briefing for a tag previews styled, prints and downloads as HTML', async ({ browser }) => {
  app = await openApp(browser, server());
  const { page } = app;
  await openHindsight(page);
  await page.getByLabel('Tag', { exact: true }).selectOption('delivery');
  await settled(page);
  const firstMiss = (await hindsight({ tag: 'delivery' })).entries[0]!;
  await page.getByRole('button', { name: 'Briefing for this tag' }).click();

  const preview = page.getByTestId('briefing');
  await expect(preview).toHaveAttribute('data-briefing-ready', 'true');
  const frameElement = page.locator('iframe[title="Briefing preview"]');
  // No allow-scripts: nothing in the briefing can run.
  await expect(frameElement).toHaveAttribute('sandbox', 'allow-same-origin allow-modals');
  const frame = page.frameLocator('iframe[title="Briefing preview"]');
  await expect(frame.locator('h1')).toContainText('delivery');
  await expect(frame.locator('body')).toContainText(firstMiss.title);

  // The briefing's own stylesheet applied (admitted by its hash in the app's policy): its body
  // font and ink colour, written in main/service/briefing.ts, are what the frame computes.
  const style = await page.evaluate(() => {
    const doc = document.querySelector<HTMLIFrameElement>('iframe[title="Briefing preview"]')!.contentDocument!;
    const body = getComputedStyle(doc.body);
    return { font: body.fontFamily, color: body.color, background: body.backgroundColor };
  });
  expect(style.font).toContain('Helvetica Neue');
  expect(style.color).toBe('rgb(27, 30, 35)');
  expect(style.background).toBe('rgb(255, 255, 255)');
  await page.screenshot({ path: 'test/e2e/artifacts/briefing-preview.png', fullPage: false });

  // Print: the button reaches the frame's print(); Chromium neither refuses the call across
  // origins (it would throw, and the page would show an error toast) nor ignores it as a
  // sandboxed modal (it would log "Ignored call to 'print()'", caught by app.problems).
  await page.evaluate(() => {
    const win = document.querySelector<HTMLIFrameElement>('iframe[title="Briefing preview"]')!.contentWindow!;
    const original = win.print.bind(win);
    (window as unknown as { prints: number }).prints = 0;
    win.print = () => {
      (window as unknown as { prints: number }).prints++;
      original();
    };
  });
  await page.getByRole('button', { name: 'Print / Save as PDF' }).click();
  await expect.poll(() => page.evaluate(() => (window as unknown as { prints: number }).prints)).toBe(1);
  await expect(page.getByTestId('toast')).toHaveCount(0);

  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download HTML' }).click()]);
  expect(download.suggestedFilename()).toBe('forelog-briefing-delivery.html');
  const text = fs.readFileSync((await download.path())!, 'utf8');
  expect(text.startsWith('<!doctype html>')).toBe(true);
  expect(text).toContain('<title>Forelog briefing — delivery</title>');

  await page.getByRole('button', { name: 'Close preview' }).click();
  await expect(preview).toHaveCount(0);
  await expect(page.getByRole('button', { name: 'Briefing for this tag' })).toBeFocused();
});

for (const scheme of ['light', 'dark'] as const) {
  test(`no serious accessibility problems, with hits and the briefing open (${scheme})`, async ({ browser }) => {
    // Two full axe scans of a long page (every confident call with its notes, then the
    // briefing frame) take 20–30 s on a two-core machine, beyond the default 30 s budget.
    test.setTimeout(90_000);
    app = await openApp(browser, server(), { colorScheme: scheme });
    const { page } = app;
    await openHindsight(page);
    await page.getByLabel('Show confident hits too').check();
    await settled(page);
    await expectNoSeriousViolations(page, `Hindsight (${scheme})`);
    await page.screenshot({ path: `test/e2e/artifacts/hindsight-${scheme}.png`, fullPage: true });
    await page.getByRole('button', { name: 'Briefing for the whole diary' }).click();
    await expect(page.getByTestId('briefing')).toHaveAttribute('data-briefing-ready', 'true');
    await expectNoSeriousViolations(page, `Hindsight with the briefing preview (${scheme})`);
    // axe tries to run its script inside every frame; the preview's sandbox refuses, as it
    // must. That refusal is the one console error expected here.
    const refused = /^console: Blocked script execution in 'about:srcdoc' because the document's frame is sandboxed/;
    const others = app.problems.filter((problem) => !refused.test(problem));
    app.problems.splice(0, app.problems.length, ...others);
  });
}
