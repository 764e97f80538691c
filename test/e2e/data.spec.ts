/**
 * Your data, from the Settings screen in browser mode: the diary goes out as JSON v1
 * (INTERFACES.md §1), CSV and iCalendar (RFC 5545) downloads, and comes back in from a
 * file; a bad file is refused whole with the record named, and nothing changes.
 */
import AxeBuilder from '@axe-core/playwright';
import { expect, test } from '@playwright/test';
import { openApp, useDiaryServer } from './serve';

const server = useDiaryServer();

test('export in three formats, import a file back, refuse a bad one', async ({ browser }) => {
  const app = await openApp(browser, server(), {}, 'questions');
  const { page } = app;
  try {
    await page.getByRole('button', { name: /load the example diary/i }).click();
    // The toast, not the list's count: both say "35 questions", and which shows first varies.
    await expect(page.getByTestId('toast').filter({ hasText: /35 questions/ })).toBeVisible();
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
    expect(diary.questions).toHaveLength(35);
    const csv = await download(/spreadsheet \(CSV\)/i);
    expect(csv.text.startsWith('question_id,title,rule,kind,tags,')).toBe(true);
    const ics = await download(/calendar/i);
    expect(ics.text.startsWith('BEGIN:VCALENDAR\r\nVERSION:2.0\r\n')).toBe(true);

    // A file with a bad record in the middle: refused whole, the record and field named.
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
    await expect(section.getByText(/bad\.json: Question record 1 is not valid: field forecasts\[0\]\.p/)).toBeVisible();

    // A good CSV adds its questions.
    const one = 'title,closes_at,forecast_at,p\r\nImported from a spreadsheet,2031-01-01T00:00:00Z,2030-01-01T00:00:00Z,0.4\r\n';
    await input.setInputFiles({ name: 'one.csv', mimeType: 'text/csv', buffer: Buffer.from(one) });
    await expect(page.getByText('Imported 1 question from one.csv.')).toBeVisible();
    await expect(page.getByTestId('diary-location').locator('xpath=following::dd[1]')).toHaveText('36');

    const scan = await new AxeBuilder({ page }).include('[aria-labelledby="settings-data"]').analyze();
    expect(scan.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical')).toEqual([]);
    expect(app.problems).toEqual([]);
  } finally {
    await app.close();
  }
});
