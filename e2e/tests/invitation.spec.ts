import { DEMO, expect, signInAs, test } from '../fixtures/app.ts';
import { resetDemo } from '../fixtures/reset.ts';

// Starts from a freshly seeded demo: earlier specs may have invited the same address.
test.beforeAll(() => resetDemo());

test('An admin invites a freelancer, the mail arrives, and the invitee signs in with the invited role', async ({ page }) => {
  await signInAs(page, DEMO.admin);
  await page.getByRole('link', { name: 'Team' }).click();
  await page.getByLabel('E-mail address').fill(DEMO.outsider.email);
  await page.getByLabel('Role', { exact: true }).selectOption('editor');
  await page.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByText(`Invitation sent to ${DEMO.outsider.email}`)).toBeVisible();
  await expect(page.getByRole('region', { name: 'Open invitations' })).toContainText(DEMO.outsider.email);
  await page.getByRole('button', { name: 'Sign out' }).click();
  // Sign-out navigates by itself; wait for it so the next navigation is not aborted by it.
  await expect(page).toHaveURL(/\/sign-in$/);

  await page.goto('/mailbox');
  await page.getByRole('button', { name: /Invitation to Lumen Test Bench/ }).click();
  await expect(page.getByText('invited you to join Lumen Test Bench on Midgray as editor')).toBeVisible();

  await signInAs(page, DEMO.outsider);
  await page.getByRole('link', { name: 'Team' }).click();
  const me = page.getByRole('listitem').filter({ hasText: '(you)' });
  await expect(me).toContainText(DEMO.outsider.name);
  await expect(me).toContainText('editor');
});
