// Stored HTML is shown as text, never rendered: an episode titled with an image tag whose error
// handler would run script appears literally on the board and on its page, with no such image.
import { resetDemo } from '../fixtures/reset.ts';
import { DEMO, expect, signInAs, test } from '../fixtures/app.ts';

test.beforeAll(() => resetDemo());

const HOSTILE = '<img src=x onerror=alert(1)>';

test('An episode titled with an HTML tag shows the tag as text on the board and on its page', async ({ page }) => {
  const dialogs: string[] = [];
  page.on('dialog', (d) => {
    dialogs.push(d.message());
    void d.dismiss();
  });
  await signInAs(page, DEMO.host);
  await page.goto('/board');
  await page.getByRole('button', { name: 'New episode' }).click();
  const dialog = page.getByRole('dialog', { name: 'New episode' });
  await dialog.getByLabel('Title').fill(HOSTILE);
  await dialog.getByRole('button', { name: 'Create episode' }).click();
  await expect(page.getByText(`“${HOSTILE}” is on the board in Plan`)).toBeVisible();

  const plan = page.getByRole('region', { name: 'Plan', exact: true });
  await expect(plan.getByRole('link', { name: HOSTILE, exact: true })).toBeVisible();
  await expect(page.locator('img[src="x"]')).toHaveCount(0);
  await page.reload();
  await expect(plan.getByRole('link', { name: HOSTILE, exact: true })).toBeVisible();
  await expect(page.locator('img[src="x"]')).toHaveCount(0);

  await plan.getByRole('link', { name: HOSTILE, exact: true }).click();
  await expect(page.getByRole('heading', { level: 1, name: HOSTILE })).toHaveText(HOSTILE);
  await expect(page.locator('img[src="x"]')).toHaveCount(0);
  // The activity names the new episode, also as text.
  await expect(page.locator('img[src="x"]')).toHaveCount(0);
  expect(dialogs).toEqual([]);
});
