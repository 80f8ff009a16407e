import { DEMO, expect, signInAs, test } from '../fixtures/app.ts';

test('A host signs in through the sign-in provider, sees the board shell and signs out', async ({ page }) => {
  await page.goto('/');
  await expect(page).toHaveURL(/\/sign-in$/);
  await signInAs(page, DEMO.host);
  await expect(page).toHaveURL(/\/board$/);
  await expect(page.getByRole('heading', { name: 'Board' })).toBeVisible();
  await expect(page.getByLabel('Channel')).toHaveValue(/.+/);
  await expect(page.getByRole('combobox', { name: 'Channel' })).toContainText('Lumen Test Bench');
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page).toHaveURL(/\/sign-in$/);
  await page.goto('/team');
  await expect(page).toHaveURL(/\/sign-in$/);
});
