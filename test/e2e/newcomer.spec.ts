/**
 * Small things a newcomer meets in a first week with typed questions and the data screens:
 * each message names what is missing in the user's own terms, and the keyboard keeps its
 * place after an action that makes the page wait.
 */
import { expect, test } from '@playwright/test';
import { apiCall, openNewQuestion } from './helpers';
import { useAppPage, useDiaryServer } from './serve';

const server = useDiaryServer();
test.describe.configure({ mode: 'serial' });
const app = useAppPage(server);

test('on an empty diary the briefing button says why there is nothing to brief on, and works once a question is written', async () => {
  const { page } = app;
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Hindsight' }).click();
  const briefing = page.getByRole('button', { name: 'Briefing for the whole diary' });
  await expect(briefing).toBeDisabled();
  await expect(briefing).toHaveAccessibleDescription(/Nothing to brief on yet: a briefing lists your confident misses and open questions\. Write a question first\./);
  await page.screenshot({ path: 'test/e2e/artifacts/newcomer-empty-briefing.png' });

  await page.getByRole('main').focus();
  await page.keyboard.press('n');
  const dialog = page.getByRole('dialog', { name: 'New question' });
  await dialog.getByRole('textbox', { name: 'Question', exact: true }).fill('Eastgate depot opens its second shift');
  await dialog.getByRole('textbox', { name: 'Closes', exact: true }).fill('30/06/2031 17:00');
  await dialog.getByRole('button', { name: 'Save question' }).click();
  await expect(dialog).toBeHidden();
  await expect(page.getByTestId('briefing-unavailable')).toHaveCount(0);
  await briefing.click();
  await expect(page.getByRole('button', { name: 'Close preview' })).toBeVisible();
});

test('with nothing scored yet, Hindsight counts open choice questions as the Scorecard does, not only yes/no ones', async () => {
  const { page } = app;
  await apiCall(server().url, 'createQuestion', {
    title: 'Which yard takes the Eastgate overflow?',
    closes_at: new Date(Date.now() + 30 * 86_400_000).toISOString(),
    type: 'choice',
    options: ['North yard', 'South yard'],
    first_forecast: { probs: [0.6, 0.4] },
  });
  const here = 'Here: 2 open, 0 resolved without a forecast before the window ended, 0 void.';
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Scorecard' }).click();
  await expect(page.getByText(here)).toBeVisible();
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Hindsight' }).click();
  await expect(page.getByTestId('hindsight-here')).toHaveText(here);
});

test('resolving a numeric question with the value box empty marks only the value box', async () => {
  const { page } = app;
  await openNewQuestion(page, server().url, {
    title: 'Pallets through Eastgate in the quarter',
    opened_at: '2026-01-05T09:00:00Z',
    closes_at: '2026-03-31T16:00:00Z',
    time_zone: 'Europe/London',
    type: 'numeric',
    unit: 'pallets',
    value_kind: 'number',
    levels: [0.1, 0.5, 0.9],
  });
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

test('at 1024 and 800 wide the Questions list keeps each status inside its pill and wraps a favourite’s name between words', async () => {
  const { page } = app;
  const day = 86_400_000;
  await apiCall(server().url, 'createQuestion', {
    title: 'Harbour crane survey signed off',
    opened_at: new Date(Date.now() - 30 * day).toISOString(),
    closes_at: new Date(Date.now() - 2 * day).toISOString(),
  });
  await apiCall(server().url, 'createQuestion', {
    title: 'Which vendor will the fraud team pick?',
    closes_at: new Date(Date.now() + 30 * day).toISOString(),
    type: 'choice',
    options: ['Ferncastle Analytics', 'Tarnwell Data'],
    first_forecast: { probs: [0.5, 0.5] },
  });
  // The list was open before the questions were added over the API: load it afresh.
  await page.reload();
  const table = page.getByTestId('question-table');
  for (const width of [1024, 800]) {
    await page.setViewportSize({ width, height: 860 });
    await expect(table.getByText('Awaiting resolution')).toBeVisible();
    await expect(table.getByText('Ferncastle Analytics 50%')).toBeVisible();
    const fits = await page.evaluate(() => {
      const badge = [...document.querySelectorAll('[data-testid=question-table] .badge')].find((b) => b.textContent === 'Awaiting resolution')!;
      const cell = [...document.querySelectorAll('[data-testid=question-table] td')].find((td) => td.textContent === 'Ferncastle Analytics 50%')!;
      const style = getComputedStyle(cell);
      const context = document.createElement('canvas').getContext('2d')!;
      context.font = `${style.fontWeight} ${style.fontSize} ${style.fontFamily}`;
      const room = cell.clientWidth - parseFloat(style.paddingLeft) - parseFloat(style.paddingRight);
      const widest = Math.max(...(cell.textContent ?? '').split(' ').map((word) => context.measureText(word).width));
      return { statusInPill: badge.scrollWidth <= badge.clientWidth, wordFits: widest <= room };
    });
    expect(fits, `at ${width} wide`).toEqual({ statusInPill: true, wordFits: true });
  }
});

test('saving a choice forecast unchanged says it was kept and the check-in is done, as the yes/no Desk does', async () => {
  const { page } = app;
  await openNewQuestion(page, server().url, {
    title: 'Which depot closes first?',
    closes_at: new Date(Date.now() + 30 * 86_400_000).toISOString(),
    type: 'choice',
    options: ['Alder', 'Birch'],
    first_forecast: { probs: [0.6, 0.4] },
  });
  await page.getByRole('button', { name: 'Revise' }).click();
  const dialog = page.getByRole('dialog', { name: 'Revise your forecast' });
  await dialog.getByRole('button', { name: 'Save revision' }).click();
  await expect(dialog).toBeHidden();
  await expect(page.getByTestId('toast').filter({ hasText: 'Kept at Alder 60%; check-in done.' })).toBeVisible();
});

test('a value pasted with its unit or spaces goes into a number box as the number, and text that is no number is refused with a word', async () => {
  const { page } = app;
  await page.context().grantPermissions(['clipboard-read', 'clipboard-write']);
  const paste = async (box: ReturnType<typeof page.getByRole>, text: string) => {
    await page.evaluate((t) => navigator.clipboard.writeText(t), text);
    await box.focus();
    await page.keyboard.press('ControlOrMeta+V');
  };
  await openNewQuestion(page, server().url, {
    title: 'Pallets through Westgate in the quarter',
    closes_at: new Date(Date.now() + 30 * 86_400_000).toISOString(),
    type: 'numeric',
    unit: 'pallets',
    value_kind: 'number',
    levels: [0.1, 0.5, 0.9],
  });
  await page.getByRole('button', { name: 'Revise' }).click();
  const dialog = page.getByRole('dialog', { name: 'Revise your forecast' });
  const low = dialog.getByRole('spinbutton', { name: /^P10/ });
  const mid = dialog.getByRole('spinbutton', { name: /^P50/ });
  const high = dialog.getByRole('spinbutton', { name: /^P90/ });
  // Copied from a report: the unit the box already shows, a thousands comma, spaces.
  await paste(low, '1,500 pallets');
  await expect(low).toHaveValue('1500');
  await expect(dialog.getByTestId('comma-warning')).toContainText('so this reads as 1500');
  await paste(mid, ' 1800 ');
  await expect(mid).toHaveValue('1800');
  // Not a number: nothing goes in, and the box says why instead of "Enter a value" later.
  await paste(high, 'about 2100');
  await expect(high).toHaveValue('');
  await expect(dialog.getByTestId('paste-warning')).toHaveText('⚠ Not pasted: “about 2100” is not a number. Type or paste digits only, e.g. 2100 or 12.5.');
  await expect(high).toHaveAccessibleDescription(/Not pasted: “about 2100” is not a number/);
  await paste(high, '2,100 Pallets');
  await expect(high).toHaveValue('2100');
  await expect(dialog.getByTestId('paste-warning')).toHaveCount(0);
  await dialog.getByRole('button', { name: 'Save revision' }).click();
  await expect(dialog).toBeHidden();
  await expect(page.getByTestId('revision-row')).toHaveCount(1);
  await expect(page.getByTestId('revision-row').getByRole('cell')).toContainText(['1,500 pallets', '1,800 pallets', '2,100 pallets']);
});

test('a resolution dated before the question opened is refused in the window’s words: the opening as a date of the window, no internal names', async () => {
  const { page } = app;
  await openNewQuestion(page, server().url, {
    title: 'Depot lease renewed before the spring',
    // Opened from a form "now": the opening has seconds.
    opened_at: '2026-11-23T14:50:46.120Z',
    closes_at: '2027-03-31T16:00:00Z',
    time_zone: 'Europe/London',
    first_forecast: { p: 0.6, at: '2026-11-23T14:50:46.120Z' },
  });
  await page.getByRole('button', { name: 'Resolve' }).click();
  const dialog = page.getByRole('dialog', { name: 'Resolve the question' });
  await dialog.getByRole('radio', { name: 'No', exact: true }).check();
  await dialog.getByRole('textbox', { name: 'Resolved at', exact: true }).fill('01/11/2026');
  await dialog.getByRole('button', { name: 'Resolve', exact: true }).click();
  const message = dialog.getByTestId('field-error');
  await expect(message).toHaveText(
    "⚠ Must not be before the question opened (23 Nov 2026, 14:50 GMT); if it happened earlier, first move the question's opening time back",
  );
  await expect(dialog).not.toContainText('opened_at');
  await expect(dialog).not.toContainText('2026-11-23');
});

test('a date copied as the window writes it (“1 Nov 2026”, “Nov 1, 2026”) goes back into a date box', async () => {
  const { page } = app;
  await page.goto(`${server().url.split('?')[0]}#/scorecard`);
  const from = page.getByRole('textbox', { name: 'From', exact: true });
  await from.fill('1 Nov 2026');
  await from.press('Tab');
  await expect(page).toHaveURL(/[?&]from=2026-11-01(&|$)/);
  await expect(page.getByTestId('field-error')).toHaveCount(0);
  const to = page.getByRole('textbox', { name: 'To', exact: true });
  await to.fill('Fri, 20 Nov 2026');
  await to.press('Tab');
  await expect(page).toHaveURL(/[?&]to=2026-11-20(&|$)/);
  await expect(page.getByTestId('field-error')).toHaveCount(0);
});

test('the Questions list says how a choice or numeric question resolved, as it does Yes or No', async () => {
  const { page } = app;
  const url = server().url;
  const make = (request: object) => apiCall<{ id: string }>(url, 'createQuestion', { opened_at: '2026-10-01T09:00:00Z', closes_at: '2026-11-20T16:00:00Z', time_zone: 'Europe/London', ...request });
  const supplier = await make({ title: 'Which haulier wins the Eastgate lane?', type: 'choice', options: ['Kestrowe', 'Ambledene'], first_forecast: { probs: [0.7, 0.3], at: '2026-10-01T09:00:00Z' } });
  const long = 'Kestrowe Freight & Warehousing International Holdings Limited';
  const partner = await make({ title: 'Which partner takes the northern corridor?', type: 'choice', options: [long, 'Other'], first_forecast: { probs: [0.6, 0.4], at: '2026-10-01T09:00:00Z' } });
  await apiCall(url, 'resolveQuestion', { id: partner.id, outcome: 'option', option: 0, at: '2026-11-21T09:00:00Z' });
  await apiCall(url, 'resolveQuestion', { id: supplier.id, outcome: 'option', option: 1, at: '2026-11-21T09:00:00Z' });
  const pallets = await make({ title: 'Pallets through Eastgate in November', type: 'numeric', unit: 'pallets', value_kind: 'number', levels: [0.1, 0.5, 0.9], first_forecast: { quantiles: [1500, 1800, 2100], at: '2026-10-01T09:00:00Z' } });
  await apiCall(url, 'resolveQuestion', { id: pallets.id, outcome: 'value', value: 2940, at: '2026-11-21T09:00:00Z' });
  await page.goto(`${url.split('?')[0]}#/questions`);
  // Added over the API while the page was open: load it afresh.
  await page.reload();
  await page.setViewportSize({ width: 1024, height: 860 });
  const row = (title: string) => page.getByTestId('question-table').getByRole('row').filter({ has: page.getByRole('link', { name: title }) });
  await expect(row('Which haulier wins the Eastgate lane?')).toContainText('Resolved · Ambledene');
  await expect(row('Pallets through Eastgate in November')).toContainText('Resolved · 2,940 pallets');
  // A long option wraps inside its status cell instead of running over the next column.
  await expect(row('Which partner takes the northern corridor?')).toContainText(`Resolved · ${long}`);
  for (const width of [1440, 1024]) {
    await page.setViewportSize({ width, height: 860 });
    const inside = await row('Which partner takes the northern corridor?').locator('.status-pill .badge').evaluate((badge) => badge.scrollWidth <= badge.clientWidth);
    expect(inside, `at ${width} wide`).toBe(true);
  }
});

test('a range or words typed into a number box stop the save with a reason, instead of saving the box as empty', async () => {
  const { page } = app;
  await page.getByRole('main').focus();
  await page.keyboard.press('n');
  const dialog = page.getByRole('dialog', { name: 'New question' });
  await dialog.getByRole('textbox', { name: 'Question', exact: true }).fill('Northgate renews the yard lease');
  await dialog.getByRole('textbox', { name: 'Closes', exact: true }).fill('30/06/2031 17:00');
  // Typed key by key, as a person does: the browser keeps "60-70" on screen but reads it as no number.
  const base = dialog.getByRole('spinbutton', { name: 'Base rate', exact: true });
  const mine = dialog.getByRole('spinbutton', { name: 'Your probability', exact: true });
  await base.pressSequentially('20-30');
  await mine.pressSequentially('60-70');
  await dialog.getByRole('button', { name: 'Save question' }).click();
  await expect(dialog).toBeVisible();
  await expect(base).toBeFocused();
  await expect(base).toHaveAccessibleDescription(/This is not one number\. Type a single number such as 12\.5/);
  await expect(mine).toHaveAccessibleDescription(/This is not one number/);
  const list = await apiCall<{ questions: { title: string }[] }>(server().url, 'listQuestions', { text: 'yard lease' });
  expect(list.questions).toEqual([]);

  // The slider replaces the text with a number; a number typed over the other box clears its message.
  await dialog.getByRole('slider', { name: 'Base rate (slider)' }).fill('25');
  await expect(base).toHaveValue('25');
  await mine.fill('65');
  await expect(mine).not.toHaveAccessibleDescription(/not one number/);
  await dialog.getByRole('button', { name: 'Save question' }).click();
  await expect(dialog).toBeHidden();
  const saved = await apiCall<{ questions: { base_rate: number | null; last_p: number | null }[] }>(server().url, 'listQuestions', { text: 'yard lease' });
  expect(saved.questions.map((q) => [q.base_rate, q.last_p])).toEqual([[0.25, 0.65]]);
});

test('a numeric range typed with its unit says the box holds no number, not “Enter a value”', async () => {
  const { page } = app;
  await openNewQuestion(page, server().url, {
    title: 'Weeks from kickoff to go-live at Westgate',
    closes_at: new Date(Date.now() + 30 * 86_400_000).toISOString(),
    type: 'numeric',
    unit: 'weeks',
    value_kind: 'number',
    levels: [0.1, 0.5, 0.9],
  });
  await page.getByRole('button', { name: 'Revise' }).click();
  const dialog = page.getByRole('dialog', { name: 'Revise your forecast' });
  const low = dialog.getByRole('spinbutton', { name: /^P10/ });
  await low.pressSequentially('8 weeks');
  await dialog.getByRole('spinbutton', { name: /^P50/ }).fill('12');
  await dialog.getByRole('spinbutton', { name: /^P90/ }).fill('20');
  await dialog.getByRole('button', { name: 'Save revision' }).click();
  await expect(low).toHaveAccessibleDescription(/This is not one number/);
  await expect(low).not.toHaveAccessibleDescription(/Enter a value/);
  await low.fill('8');
  await dialog.getByRole('button', { name: 'Save revision' }).click();
  await expect(dialog).toBeHidden();
});

test('a range typed into a choice box says it is not one number, not that the box was left blank', async () => {
  const { page } = app;
  await openNewQuestion(page, server().url, {
    title: 'Which haulier wins the Eastgate tender?',
    closes_at: new Date(Date.now() + 30 * 86_400_000).toISOString(),
    type: 'choice',
    options: ['Alder', 'Birch', 'Cedar'],
    first_forecast: { probs: [0.5, 0.3, 0.2] },
  });
  await page.getByRole('button', { name: 'Revise' }).click();
  const dialog = page.getByRole('dialog', { name: 'Revise your forecast' });
  const birch = dialog.getByRole('spinbutton', { name: 'Birch' });
  await birch.fill('');
  await birch.pressSequentially('30-40');
  await dialog.getByRole('button', { name: 'Save revision' }).click();
  await expect(birch).toHaveAccessibleDescription(/This is not one number/);
  await expect(birch).not.toHaveAccessibleDescription(/give a chance/);
  await birch.fill('30');
  await dialog.getByRole('button', { name: 'Save revision' }).click();
  await expect(dialog).toBeHidden();
});

test('a range typed into a lens box says it is not one number, and the revision waits, instead of the lens being dropped', async () => {
  const { page } = app;
  const id = await openNewQuestion(page, server().url, {
    title: 'Southgate signs the cold-store lease',
    closes_at: new Date(Date.now() + 30 * 86_400_000).toISOString(),
    first_forecast: { p: 0.4 },
  });
  await page.getByRole('button', { name: 'Revise' }).click();
  const dialog = page.getByRole('dialog', { name: 'Revise your forecast' });
  await dialog.locator('summary', { hasText: 'Lenses' }).click();
  await dialog.getByRole('button', { name: 'Add lens' }).click();
  const p = dialog.getByRole('spinbutton', { name: 'Lens 1 probability' });
  const weight = dialog.getByRole('spinbutton', { name: 'Lens 1 weight' });
  await p.pressSequentially('60-70');
  await weight.fill('');
  await weight.pressSequentially('1-2');
  // A lens with its name cleared and an unreadable number was skipped as an empty row.
  await dialog.getByRole('combobox', { name: 'Lens 1 name' }).fill('');
  await dialog.getByRole('button', { name: 'Save revision' }).click();
  await expect(dialog).toBeVisible();
  await expect(p).toHaveAccessibleDescription(/This is not one number\. Type a single number such as 12\.5/);
  await expect(weight).toHaveAccessibleDescription(/This is not one number/);
  const unchanged = await apiCall<{ forecasts: unknown[] }>(server().url, 'getQuestion', { id });
  expect(unchanged.forecasts).toHaveLength(1);
  await dialog.getByRole('combobox', { name: 'Lens 1 name' }).fill('outside view');
  await p.fill('65');
  await weight.fill('1');
  await expect(p).not.toHaveAccessibleDescription(/not one number/);
  await dialog.getByRole('button', { name: 'Save revision' }).click();
  await expect(dialog).toBeHidden();
  const saved = await apiCall<{ forecasts: { lenses?: { p: number }[] }[] }>(server().url, 'getQuestion', { id });
  expect(saved.forecasts.at(-1)?.lenses?.map((l) => l.p)).toEqual([0.65]);
});

test('a range typed into Hindsight’s “Confident at” says it is not one number and what to type', async () => {
  const { page } = app;
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Hindsight' }).click();
  const box = page.getByRole('spinbutton', { name: 'Confident at', exact: true });
  // Emptied to type a new number, the box stays empty (80 came back into it) and says what it wants.
  await box.fill('');
  await expect(box).toHaveValue('');
  await expect(box).toHaveAccessibleDescription(/Must be a percentage from 50 to 99/);
  await box.pressSequentially('60-70');
  await box.blur();
  await expect(box).toHaveAccessibleDescription(/This is not one number\. Type a single number such as 12\.5/);
  await expect(box).not.toHaveAccessibleDescription(/must be a percentage/i);
  await box.fill('70');
  await expect(box).toHaveValue('70');
  await expect(box).not.toHaveAccessibleDescription(/not one number/);
  await expect(page).toHaveURL(/confident=70/);
});

test('a search longer than the diary takes searches for its start and says so, instead of an error over the unfiltered list', async () => {
  const { page } = app;
  await apiCall(server().url, 'createQuestion', { title: 'Marrow Quay crane contract is extended', closes_at: new Date(Date.now() + 30 * 86_400_000).toISOString() });
  await page.reload();
  const search = page.getByRole('searchbox', { name: 'Search' });
  const status = page.getByRole('combobox', { name: 'Status' });
  const before: Record<number, { x: number; y: number } | null> = {};
  for (const width of [1024, 1920]) {
    await page.setViewportSize({ width, height: 800 });
    before[width] = await status.boundingBox();
  }
  // A paragraph pasted from an e-mail: 389 characters, every word in the title.
  await search.fill('Marrow Quay crane contract is extended '.repeat(10).trim());
  await expect(search).toHaveAccessibleDescription('A search reads up to 200 characters: this searches for the first 200 of 389.');
  // The hint under the search box does not move the Status box beside it.
  for (const width of [1024, 1920]) {
    await page.setViewportSize({ width, height: 800 });
    const after = await status.boundingBox();
    expect({ x: after?.x, y: after?.y }, `the Status box at ${width} wide`).toEqual({ x: before[width]?.x, y: before[width]?.y });
    await page.screenshot({ path: `test/e2e/artifacts/newcomer-long-search-${width}.png`, clip: { x: 0, y: 0, width, height: 400 } });
  }
  await page.setViewportSize({ width: 1280, height: 860 });
  await expect(page.getByRole('alert')).toHaveCount(0);
  await expect(page.getByRole('link', { name: 'Marrow Quay crane contract is extended' })).toBeVisible();
  await expect(page.getByRole('link', { name: 'Eastgate depot opens its second shift' })).toHaveCount(0);
});

test('in a browser window narrower than the desktop app allows, the navigation fits and the page does not scroll sideways', async () => {
  const { page } = app;
  for (const width of [600, 480]) {
    await page.setViewportSize({ width, height: 700 });
    const links = page.getByRole('navigation', { name: 'Main' }).getByRole('link');
    await expect(links).toHaveCount(5);
    expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth), `at ${width} wide`).toBe(0);
    if (width === 600) {
      // Every link whole inside the window; the home link keeps its name for screen readers.
      for (const link of await links.all()) {
        const box = (await link.boundingBox())!;
        expect(box.x + box.width, `${await link.innerText()} at ${width} wide`).toBeLessThanOrEqual(width);
      }
      await expect(page.getByRole('link', { name: 'Forelog, home' })).toBeVisible();
    }
  }
  await page.screenshot({ path: 'test/e2e/artifacts/newcomer-narrow-bar.png', clip: { x: 0, y: 0, width: 480, height: 120 } });
});
