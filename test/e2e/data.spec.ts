/**
 * Your data, from the Settings screen in browser mode: the diary goes out as JSON v1
 * (INTERFACES.md §1), CSV and iCalendar (RFC 5545) downloads, and comes back in from a
 * file; a bad file is refused whole with the record named, and nothing changes. Counts of a
 * thousand and more are grouped as the locale writes them ("1,046 questions").
 */
import AxeBuilder from '@axe-core/playwright';
import { expect, test } from '@playwright/test';
import { apiCall } from './helpers';
import { openApp, useDiaryServer } from './serve';

const server = useDiaryServer();

test('export in three formats, import a file back, refuse a bad one', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, 'questions');
  const { page } = app;
  try {
    await page.getByRole('button', { name: /load the example diary/i }).click();
    // The toast, not the list's count: both say "N questions", and which shows first varies.
    const toast = page.getByTestId('toast').filter({ hasText: /\d+ (invented )?questions/ });
    await expect(toast).toBeVisible();
    const count = Number(/(\d+) (invented )?questions/.exec((await toast.textContent()) ?? '')![1]);
    const info = await apiCall<{ question_count: number }>(server().url, 'diaryInfo');
    expect(count).toBe(info.question_count);
    await page.goto(`${server().url}#/settings`);
    const section = page.getByRole('region', { name: 'Your data' });

    const download = async (name: RegExp) => {
      const [file] = await Promise.all([page.waitForEvent('download'), section.getByRole('button', { name }).click()]);
      const path = await file.path();
      const fs = await import('node:fs');
      return { name: file.suggestedFilename(), text: fs.readFileSync(path, 'utf8') };
    };
    const json = await download(/diary file \(JSON\)/i);
    expect(json.name).toMatch(/^forelog-diary-\d{4}-\d{2}-\d{2}\.json$/);
    const diary = JSON.parse(json.text);
    expect(diary.format).toBe('forelog-diary');
    expect(diary.version).toBe(1);
    expect(diary.questions).toHaveLength(count);
    const csv = await download(/spreadsheet \(CSV\)/i);
    expect(csv.text.startsWith('question_id,title,rule,kind,tags,')).toBe(true);
    const ics = await download(/calendar/i);
    expect(ics.text.startsWith('BEGIN:VCALENDAR\r\nVERSION:2.0\r\n')).toBe(true);

    // A file with a bad record in the middle: refused whole, the record (by its title too, to find it in the file) and field named.
    const input = section.getByLabel('Import a diary file…');
    const bad = {
      format: 'forelog-diary',
      version: 1,
      questions: [
        { title: 'Fine', closes_at: '2031-01-01T00:00:00Z', forecasts: [] },
        { title: 'Broken', closes_at: '2031-01-01T00:00:00Z', forecasts: [{ at: '2030-01-01T00:00:00Z', p: 7 }] },
      ],
    };
    await input.setInputFiles({ name: 'bad.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(bad)) });
    await expect(section.getByText(/bad\.json: Question 2 \(questions\[1\], “Broken”\) is not valid: field forecasts\[0\]\.p/)).toBeVisible();

    // A good CSV adds its questions.
    const one = 'title,closes_at,forecast_at,p\r\nImported from a spreadsheet,2031-01-01T00:00:00Z,2030-01-01T00:00:00Z,0.4\r\n';
    await input.setInputFiles({ name: 'one.csv', mimeType: 'text/csv', buffer: Buffer.from(one) });
    await expect(page.getByText('Imported 1 question from one.csv.')).toBeVisible();
    await expect(page.getByTestId('diary-location').locator('xpath=following::dd[1]')).toHaveText(String(count + 1));

    const scan = await new AxeBuilder({ page }).include('[aria-labelledby="settings-data"]').analyze();
    expect(scan.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical')).toEqual([]);
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('a picked file is decoded as the command line decodes it: BOM and UTF-16 read, Latin-1 refused where it breaks', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, 'settings');
  const { page } = app;
  try {
    const section = page.getByRole('region', { name: 'Your data' });
    const input = section.getByLabel('Import a diary file…');
    const csv = 'title,closes_at,forecast_at,p,note\r\nCafé opens in Zürich,2031-01-01T00:00:00Z,2030-01-01T00:00:00Z,0.4,naïve\r\n';
    const json = (title: string) =>
      JSON.stringify({ format: 'forelog-diary', version: 1, questions: [{ title, closes_at: '2031-01-01T00:00:00Z', forecasts: [] }] });

    await input.setInputFiles({ name: 'bom.json', mimeType: 'application/json', buffer: Buffer.concat([Buffer.of(0xef, 0xbb, 0xbf), Buffer.from(json('With a byte order mark'))]) });
    await expect(page.getByText('Imported 1 question from bom.json.')).toBeVisible();
    await input.setInputFiles({ name: 'wide.csv', mimeType: 'text/csv', buffer: Buffer.from(`\ufeff${csv}`, 'utf16le') });
    await expect(page.getByText('Imported 1 question from wide.csv.')).toBeVisible();

    // The same CSV saved in Latin-1 (é is the single byte 0xE9): refused, not imported with U+FFFD.
    await input.setInputFiles({ name: 'latin1.csv', mimeType: 'text/csv', buffer: Buffer.from(csv.replace('Café', 'Bistro'), 'latin1') });
    await expect(
      section.getByText(
        'latin1.csv: This file is not UTF-8 text: at line 2, column 18 (byte offset 53) it holds the byte 0xFC, which UTF-8 does not allow there. It was probably saved in another encoding (such as Windows-1252 or Latin-1). Save the file as UTF-8 (in a spreadsheet: "CSV UTF-8") and try again.',
      ),
    ).toBeVisible();

    // Larger than the app's cap: sent to the command line before a byte is read.
    const fs = await import('node:fs');
    const huge = `${server().dir}/huge.json`;
    fs.writeFileSync(huge, '');
    fs.truncateSync(huge, 64 * 1_048_576 + 1);
    await input.setInputFiles(huge);
    await expect(section.getByText(/^huge\.json: This file is larger than 64 MB, the most the app imports at once; .*: forelog import FILE\.$/)).toBeVisible();

    await page.goto(`${server().url}#/questions`);
    await expect(page.getByText('Café opens in Zürich')).toBeVisible();
    await expect(page.getByText('Bistro opens in Zürich')).toHaveCount(0);
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});

test('counts of a thousand and more are written with the locale’s digit grouping', async ({ browser }) => {
  // A thousand copies of one question from the diary, imported as one file.
  const before = await apiCall<{ question_count: number }>(server().url, 'diaryInfo');
  if (before.question_count === 0) await apiCall(server().url, 'loadDemo');
  const diary = await apiCall<{ questions: { id: string; title: string }[] }>(server().url, 'exportDiary');
  const model = diary.questions[0]!;
  const copies = Array.from({ length: 1000 }, (_, i) => ({ ...model, id: `grouping-${i}`, title: `Grouping copy ${i}` }));
  await apiCall(server().url, 'importDiary', { diary: { ...diary, questions: copies }, merge: true });
  const { question_count: total } = await apiCall<{ question_count: number }>(server().url, 'diaryInfo');
  expect(total).toBeGreaterThan(1000);
  // The e2e browser runs in en-GB: a comma between thousands ("1,046"), never "1046".
  const grouped = total.toLocaleString('en-GB');
  expect(grouped).toMatch(/^\d{1,3}(,\d{3})+$/);

  const app = await openApp(browser, server(), {}, 'questions');
  const { page } = app;
  try {
    await expect(page.getByTestId('question-table').locator('caption')).toContainText(`${grouped} questions`);
    await page.getByLabel('Search').fill('Grouping copy');
    await expect(page.getByTestId('question-table').locator('caption')).toContainText(`1,000 of ${grouped} questions`);
    await page.goto(`${server().url}#/settings`);
    await expect(page.getByRole('definition').filter({ hasText: grouped })).toBeVisible();
    await page.goto(`${server().url}#/scorecard`);
    // The yes/no questions only (the copies and more): over a thousand, grouped.
    await expect(page.getByTestId('headline-counts-n')).toHaveText(/^n = \d{1,3}(,\d{3})+ in view$/);
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});
