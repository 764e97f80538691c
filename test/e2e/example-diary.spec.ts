/**
 * The example diary as a newcomer uses it: loaded from the empty Questions screen to look
 * around, then taken out again in one step from Settings, with a question of their own
 * kept; the removal asks first, has an Undo, and leaves the keyboard in its section.
 */
import { expect, test } from '@playwright/test';
import { apiCall, expectNoSeriousViolations } from './helpers';
import { useAppPage, useDiaryServer } from './serve';

const server = useDiaryServer();
test.describe.configure({ mode: 'serial' });
const app = useAppPage(server);

test('the example diary is removed in one step from Settings, the user’s own question kept, and Undo brings it back', async () => {
  const { page } = app;
  await page.getByRole('button', { name: 'Load the example diary' }).click();
  const loaded = page.getByTestId('toast').filter({ hasText: /^Loaded the example diary: \d+ questions/ });
  await expect(loaded).toBeVisible();
  const count = Number(/: (\d+) questions/.exec(await loaded.innerText())![1]);
  // A call of the newcomer's own, written after looking around.
  await apiCall(server().url, 'createQuestion', { title: 'Quellmoor signs phase 2', closes_at: '2031-03-31T16:00:00Z', first_forecast: { p: 0.6 } });

  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Settings' }).click();
  const example = page.getByTestId('example-diary');
  await expect(example).toContainText(`${count} questions from the invented example.`);
  await example.getByRole('button', { name: 'Remove the example diary' }).click();
  const ask = page.getByRole('alertdialog', { name: 'Remove the example diary?' });
  await expect(ask).toContainText('the questions you wrote yourself stay as they are');
  await expectNoSeriousViolations(page, 'Settings asking before removing the example diary');
  await ask.getByRole('button', { name: 'Remove the example' }).click();
  await expect(ask).toBeHidden();
  const removed = page.getByTestId('toast').filter({ hasText: `Removed the example diary’s ${count} questions; your own questions are as they were.` });
  await expect(removed).toBeVisible();
  await expect(page.getByTestId('example-diary')).toHaveCount(0);
  await expect(page.getByRole('heading', { level: 2, name: 'Diary' })).toBeFocused();
  const left = await apiCall<{ questions: { title: string }[] }>(server().url, 'listQuestions', {});
  expect(left.questions.map((q) => q.title)).toEqual(['Quellmoor signs phase 2']);

  await removed.getByRole('button', { name: 'Undo' }).click();
  await expect(page.getByTestId('toast').filter({ hasText: `Undone: the example diary’s ${count} questions are back.` })).toBeVisible();
  await expect(page.getByTestId('example-diary')).toContainText(`${count} questions`);
  expect((await apiCall<{ question_count: number }>(server().url, 'diaryInfo', {})).question_count).toBe(count + 1);
});
