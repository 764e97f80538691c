/**
 * Nothing overflows: with the example diary plus questions whose title, rule, tag, notes and
 * reference source are each one unbroken word as long as the diary allows (a 300-character
 * title, a 64-character tag, a 200-character source), no screen is wider than the window at
 * 1024×700 or 1920×1080, the tables that were cut (references, the decision table, the
 * decomposition, the numeric questions' scores, a choice question's history, a five-level numeric
 * question's history) fit their cards,
 * the question list's close times and figures fit their cells, and the base-rate card shows
 * its whole note. Screens are photographed at both sizes; the long question's page is scanned
 * by axe in light and dark. At 800×600 the question list leaves most of a row to the question
 * and the skill table room for its readings; a toast naming the 300-character title cuts the
 * quote short and stays a few lines tall.
 */
import { expect, test, type Page } from '@playwright/test';
import type { Question } from '../../shared/domain';
import { apiCall, drawEveryChart, expectNoSeriousViolations } from './helpers';
import { openApp, useDiaryServer } from './serve';

const server = useDiaryServer();
test.describe.configure({ mode: 'serial' });

const SIZES = [
  { width: 1024, height: 700 },
  { width: 1920, height: 1080 },
] as const;

/** One word of `length` characters: a capital and then `letter` repeated. */
const word = (length: number, letter: string) => `W${letter.repeat(length - 1)}`;
const DAY = 86_400_000;
const iso = (ms: number) => new Date(ms).toISOString();

let open: Question;
let resolved: Question;
let numeric: Question;
let numeric3: Question;

test('setup: the example diary and two questions made of long words', async () => {
  await apiCall(server().url, 'loadDemo');
  const now = Date.now();
  // Awaiting resolution (on the Desk), with two reference sources.
  open = await apiCall<Question>(server().url, 'createQuestion', {
    title: word(300, 'x'),
    rule: word(2000, 'r'),
    tags: [word(64, 't').toLowerCase()],
    opened_at: iso(now - 30 * DAY),
    closes_at: iso(now - 2 * DAY),
    time_zone: 'Europe/London',
    base_rate: 0.3,
    base_rate_note: word(300, 'b'),
    first_forecast: { p: 0.9, note: word(600, 'n'), at: iso(now - 20 * DAY) },
  });
  await apiCall(server().url, 'addReference', { question_id: open.id, p: 0.4, source: word(200, 's'), at: iso(now - 19 * DAY) });
  await apiCall(server().url, 'addReference', { question_id: open.id, p: 0.6, source: 'second source', at: iso(now - 18 * DAY) });
  // A confident miss (on Hindsight and the Scorecard), resolved with a long note.
  resolved = await apiCall<Question>(server().url, 'createQuestion', {
    title: word(300, 'y'),
    rule: word(300, 'r'),
    tags: [word(64, 'u').toLowerCase()],
    opened_at: iso(now - 40 * DAY),
    closes_at: iso(now - 5 * DAY),
    time_zone: 'Europe/London',
    base_rate: 0.3,
    base_rate_note: word(300, 'b'),
    first_forecast: { p: 0.95, note: word(300, 'n'), at: iso(now - 30 * DAY) },
  });
  await apiCall(server().url, 'addReference', { question_id: resolved.id, p: 0.4, source: word(200, 's'), at: iso(now - 29 * DAY) });
  await apiCall(server().url, 'resolveQuestion', { id: resolved.id, outcome: 'no', note: word(300, 'o'), at: iso(now - 4 * DAY) });
  // Five levels of six-figure values with a unit, forecast and reference.
  numeric = await apiCall<Question>(server().url, 'createQuestion', {
    title: 'Total pallet throughput at the Eastgate depot in Q1',
    closes_at: iso(now + 90 * DAY),
    time_zone: 'Europe/London',
    type: 'numeric',
    unit: 'pallets',
    value_kind: 'number',
    levels: [0.05, 0.25, 0.5, 0.75, 0.95],
    first_forecast: { quantiles: [118_000, 124_500, 131_000, 137_250, 145_000], note: 'Last year’s Q1 plus the new racking.' },
  });
  await apiCall(server().url, 'addReference', { question_id: numeric.id, quantiles: [120_000, 126_000, 132_500, 139_000, 148_000], source: 'depot budget' });
  // Three levels, one revision whose note is longer than its values.
  numeric3 = await apiCall<Question>(server().url, 'createQuestion', {
    title: 'Fee income for the half-year',
    closes_at: iso(now + 90 * DAY),
    time_zone: 'Europe/London',
    type: 'numeric',
    unit: '£k',
    value_kind: 'number',
    levels: [0.1, 0.5, 0.9],
    first_forecast: { quantiles: [1_400, 1_500, 1_600], note: 'Pellbridge extension signed; the low end moves up. Quellmoor is still undecided, so the high end stays where it was until their board meets in January.' },
  });
});

interface Screen {
  name: string;
  hash: () => string;
  ready: (page: Page) => Promise<unknown>;
}

const heading = (page: Page) => expect(page.getByRole('heading', { level: 1 })).toBeVisible();

const SCREENS: Screen[] = [
  { name: 'desk', hash: () => 'desk', ready: (page) => expect(page.getByTestId('desk-item').first()).toBeVisible() },
  { name: 'questions', hash: () => 'questions', ready: (page) => expect(page.getByText(word(300, 'x')).first()).toBeVisible() },
  { name: 'question-open', hash: () => `questions/${encodeURIComponent(open.id)}`, ready: (page) => expect(page.getByTestId('references-table')).toBeVisible() },
  { name: 'question-resolved', hash: () => `questions/${encodeURIComponent(resolved.id)}`, ready: (page) => expect(page.getByTestId('references-table')).toBeVisible() },
  // A choice question whose four options are long headings ("More than 6 weeks late").
  { name: 'question-choice', hash: () => 'questions/demo-tollmere-booking-slip', ready: (page) => expect(page.getByTestId('references-table')).toBeVisible() },
  // Five levels of values with a unit ("118,000 pallets") head to head with the Note column.
  { name: 'question-numeric', hash: () => `questions/${encodeURIComponent(numeric.id)}`, ready: (page) => expect(page.getByTestId('references-table')).toBeVisible() },
  // Three levels and a long note: the values stay whole ("1,400 £k"), the note wraps.
  { name: 'question-numeric3', hash: () => `questions/${encodeURIComponent(numeric3.id)}`, ready: (page) => expect(page.getByTestId('references-table')).toBeVisible() },
  { name: 'scorecard', hash: () => 'scorecard', ready: (page) => expect(page.locator('[data-scorecard-ready="true"]')).toBeVisible() },
  { name: 'hindsight', hash: () => 'hindsight', ready: (page) => expect(page.locator('[data-hindsight-ready="true"]')).toBeVisible() },
  { name: 'settings', hash: () => 'settings', ready: heading },
];

/** How far the page is wider than the window (0 when it fits). */
async function overflow(page: Page): Promise<number> {
  return page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
}

/** Elements wider inside than the box that shows them (content cut off or scrolled away). */
async function cut(page: Page, selector: string): Promise<string[]> {
  return page.locator(selector).evaluateAll((elements) =>
    elements.filter((el) => el.scrollWidth > el.clientWidth + 1).map((el) => `${el.className} (${el.scrollWidth} > ${el.clientWidth})`),
  );
}

for (const size of SIZES) {
  test(`no screen is wider than a ${size.width}×${size.height} window, and the cut tables fit`, async ({ browser }) => {
    const app = await openApp(browser, server(), { viewport: size }, 'desk');
    const { page } = app;
    try {
      for (const screen of SCREENS) {
        await page.goto(`${server().url.split('?')[0]}#/${screen.hash()}`);
        await screen.ready(page);
        expect(await overflow(page), `${screen.name} at ${size.width}×${size.height}`).toBeLessThanOrEqual(0);
        if (screen.name === 'scorecard') await drawEveryChart(page);
        await page.screenshot({ path: `test/e2e/artifacts/overflow-${screen.name}-${size.width}.png`, fullPage: true });

        if (screen.name.startsWith('question-')) {
          // The title and every fact can be read: nothing is cut at the side.
          expect(await cut(page, 'h1, .facts dd, .figure-tile__detail, .history-tables .table-card'), screen.name).toEqual([]);
          // The reference table's Delete buttons are inside its card.
          const card = await page.getByTestId('references-table').locator('xpath=..').boundingBox();
          for (const button of await page.getByTestId('references-table').getByRole('button', { name: /^Delete / }).all()) {
            const box = await button.boundingBox();
            expect(box!.x + box!.width, `a Delete button on ${screen.name}`).toBeLessThanOrEqual(card!.x + card!.width);
          }
        }
        if (screen.name === 'question-numeric3') {
          // One line box per value: "1,400 £k" was once broken before its unit.
          const lines = await page.getByTestId('revisions-table').locator('tbody td.num').evaluateAll((cells) =>
            cells.map((cell) => {
              const range = document.createRange();
              range.selectNodeContents(cell);
              return new Set([...range.getClientRects()].map((r) => Math.round(r.top))).size;
            }),
          );
          expect(lines.length).toBeGreaterThan(0);
          expect(lines, 'lines per value').toEqual(lines.map(() => 1));
        }
        if (screen.name === 'questions') {
          // A close time such as "Oct 19, 2026, 05:00 PM GMT+1" once ran under the Last forecast column at 1920.
          expect(await cut(page, '.question-table tbody td:not(:first-child)'), 'the question list’s cells').toEqual([]);
        }
        if (screen.name === 'scorecard') {
          expect(await cut(page, '.sc-decisions .table-card, .sc-decomposition, [data-testid="numeric-questions"]'), 'scorecard tables').toEqual([]);
        }
        if (screen.name === 'hindsight') {
          expect(await cut(page, '.hs-entry'), 'hindsight entries').toEqual([]);
          // The calibration table keeps inside its card's padding, clear of the edge.
          const spill = await page.locator('.hs-summary').evaluate((card) => {
            const table = card.querySelector('table')!;
            const inner = card.getBoundingClientRect().right - parseFloat(getComputedStyle(card).paddingRight);
            return table.getBoundingClientRect().right - inner;
          });
          expect(spill, 'the calibration table past its card’s padding (px)').toBeLessThanOrEqual(0.5);
        }
      }

      // A dialog holding the long words is no wider than the window either.
      await page.goto(`${server().url.split('?')[0]}#/questions/${encodeURIComponent(open.id)}`);
      await page.getByRole('button', { name: 'Edit' }).click();
      const dialog = page.getByRole('dialog', { name: 'Edit question' });
      await expect(dialog).toBeVisible();
      expect(await cut(page, 'dialog[open]'), 'the Edit dialog').toEqual([]);
      expect(await overflow(page)).toBeLessThanOrEqual(0);
      expect(app.problems).toEqual([]);
    } finally {
      await app.close();
    }
  });
}

for (const scheme of ['light', 'dark'] as const) {
  for (const size of SIZES) {
    test(`the long-word question passes an axe scan and is photographed (${scheme}, ${size.width})`, async ({ browser }) => {
      const app = await openApp(browser, server(), { viewport: size, colorScheme: scheme }, `questions/${encodeURIComponent(open.id)}`);
      const { page } = app;
      try {
        await expect(page.getByTestId('references-table')).toBeVisible();
        await expectNoSeriousViolations(page, `the long-word question (${scheme}, ${size.width})`);
        await page.screenshot({ path: `test/e2e/artifacts/overflow-question-${scheme}-${size.width}.png`, fullPage: true });
        expect(app.problems).toEqual([]);
      } finally {
        await app.close();
      }
    });
  }
}

test('in an 800×600 window the question list gives most of each row to the question', async ({ browser }) => {
  const app = await openApp(browser, server(), { viewport: { width: 800, height: 600 } }, 'questions');
  const { page } = app;
  try {
    const table = page.getByTestId('question-table');
    await expect(table.getByText(word(300, 'x')).first()).toBeVisible();
    const tableWidth = (await table.boundingBox())!.width;
    const questionWidth = (await table.getByRole('columnheader', { name: /^Question/ }).boundingBox())!.width;
    // The fixed columns once left the question a ninth of the row: one word to a line.
    expect(questionWidth / tableWidth, 'the Question column’s share of the table').toBeGreaterThan(1 / 3);
    // Headings wrap rather than run into the next column.
    expect(await cut(page, '.question-table th')).toEqual([]);
    await page.screenshot({ path: 'test/e2e/artifacts/overflow-questions-800.png' });
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('in an 800×600 window the skill table leaves room for its readings', async ({ browser }) => {
  const app = await openApp(browser, server(), { viewport: { width: 800, height: 600 } }, 'scorecard');
  const { page } = app;
  try {
    const table = page.getByTestId('skill-chart').locator('table');
    await expect(table).toBeVisible();
    const width = async (name: string) => (await table.getByRole('columnheader', { name, exact: true }).boundingBox())!.width;
    // The baselines' names once stood on one line and took the row, the reading a word a line.
    expect(await width('Reading'), 'the Reading column against the Baseline column').toBeGreaterThan(await width('Baseline'));
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('a toast about a question with a 300-character title stays a few lines tall', async ({ browser }) => {
  const app = await openApp(browser, server(), { viewport: { width: 800, height: 600 } }, 'questions');
  const { page } = app;
  try {
    await page.getByRole('main').focus();
    await page.keyboard.press('n');
    const dialog = page.getByRole('dialog', { name: 'New question' });
    await dialog.getByRole('textbox', { name: 'Question', exact: true }).fill(word(300, 'z'));
    await dialog.getByRole('textbox', { name: 'Closes', exact: true }).fill('01/07/2031');
    await dialog.getByRole('textbox', { name: 'Closes: time' }).fill('09:30');
    await dialog.getByRole('button', { name: 'Save question' }).click();
    await expect(dialog).toBeHidden();
    const toast = page.getByTestId('toast').filter({ hasText: 'Added “Wzzz' });
    // The title is cut short; what happened and the way to the question stay.
    await expect(toast).toContainText('…”.');
    await expect(toast.getByRole('link', { name: 'Open the question' })).toBeVisible();
    const box = await toast.boundingBox();
    // Unshortened it stood taller than the whole window.
    expect(box!.height, 'the toast’s height at 800×600').toBeLessThan(600 * 0.4);
    await page.screenshot({ path: 'test/e2e/artifacts/overflow-long-title-toast.png' });
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});
