import { DEMO, expect, signInAs, test } from '../fixtures/app.ts';
import { resetDemo } from '../fixtures/reset.ts';

const EPISODE = 'Panel 600 on location: colour and flicker';

// The demo's panel episode waits in Approval on a freshly seeded demo, whatever ran before.
test.beforeAll(() => resetDemo());

test('A producer approves a publish slot from the queue; the host sees the episode scheduled and the mail arrives', async ({ page }) => {
  await signInAs(page, DEMO.producer);
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Approvals' }).click();
  const item = page.getByRole('article', { name: EPISODE });
  await expect(item).toContainText('Ilse Marrow');
  await expect(item).toContainText('Europe/Berlin');
  // The demo's panel is sponsored and the channel has a default disclosure: nothing blocks approval.
  await expect(item.getByRole('note', { name: 'What stops approval' })).toHaveCount(0);
  await item.getByLabel(/Comment for the host and editor/).fill('Good evening slot, go ahead.');
  await item.getByRole('button', { name: 'Approve slot' }).click();
  await expect(page.getByText(`Approved: “${EPISODE}” is scheduled`)).toBeVisible();
  await expect(page.getByText('Nothing waits for approval.')).toBeVisible();
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL('**/sign-in');

  // The host finds the approved slot on the calendar, told apart by its words, not its colour.
  await signInAs(page, DEMO.host);
  await expect(page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Approvals' })).toHaveCount(0);
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Calendar' }).click();
  await page.getByRole('button', { name: 'Agenda' }).click();
  const entry = page.getByRole('link', { name: new RegExp(`Approved publish slot.*${EPISODE}`) });
  await expect(entry).toBeVisible();
  await expect(page.getByRole('link', { name: new RegExp(`Proposed publish slot.*${EPISODE}`) })).toHaveCount(0);
  // Through to the episode's Schedule tab: scheduled, with the producer's approval and comment.
  await entry.click();
  const schedule = page.getByRole('tabpanel', { name: 'Schedule' });
  await expect(schedule.getByText('The episode is in Scheduled.')).toBeVisible();
  await expect(schedule.getByRole('region', { name: 'Publish slot' })).toContainText('Approved');
  await expect(schedule.getByRole('region', { name: 'Publish slot' })).toContainText('by Noor Halvard');
  await expect(schedule.getByText('Comment: Good evening slot, go ahead.').first()).toBeVisible();
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL('**/sign-in');

  // The mail to the host, with the producer's comment.
  await page.goto('/mailbox');
  await page.getByRole('button', { name: new RegExp(`Publish slot approved: ${EPISODE}.*to ${DEMO.host.email}`) }).click();
  await expect(page.getByText('Noor Halvard approved')).toBeVisible();
  await expect(page.getByText('The episode moved to Scheduled.')).toBeVisible();
  await expect(page.getByText('Comment: Good evening slot, go ahead.')).toBeVisible();
});
