import { checkA11y, shoot } from '../fixtures/look.ts';
import { DEMO, signInAs, test } from '../fixtures/app.ts';

test('The sign-in page, team page and mailbox have no serious accessibility problems', async ({ page }, info) => {
  await page.goto('/sign-in');
  await checkA11y(page, 'sign-in');
  await shoot(page, info, 'sign-in');
  await signInAs(page, DEMO.admin);
  await page.goto('/team');
  await page.getByRole('heading', { name: 'Team' }).waitFor();
  await checkA11y(page, 'team');
  await shoot(page, info, 'team');
  await page.goto('/mailbox');
  await page.getByRole('heading', { name: 'Development mailbox' }).waitFor();
  await checkA11y(page, 'mailbox');
});
