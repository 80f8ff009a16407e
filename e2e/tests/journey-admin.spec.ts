// Journey of an admin: invites a member, changes a role, removes a member; the removed member,
// signed in elsewhere, loses access on their next navigation. Starts from a freshly seeded demo.
import { checkA11y, shoot } from '../fixtures/look.ts';
import { resetDemo } from '../fixtures/reset.ts';
import { DEMO, expect, signInAs, test } from '../fixtures/app.ts';

test.beforeAll(() => resetDemo());

test('An admin invites a freelancer, makes the editor a producer, then removes him, and he loses access at once', async ({ page, browser }, info) => {
  test.slow();
  // The editor is signed in on another machine and working on the board.
  const other = await browser.newContext();
  const editorPage = await other.newPage();
  await signInAs(editorPage, DEMO.editor);
  await editorPage.goto('/board');
  await expect(editorPage.getByRole('heading', { level: 1, name: 'Board' })).toBeVisible();

  await signInAs(page, DEMO.admin);
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Team' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Team' })).toBeVisible();
  await checkA11y(page, 'team page (admin)');
  await shoot(page, info, 'team');

  // Invite.
  await page.getByLabel('E-mail address').fill(DEMO.outsider.email);
  await page.getByLabel('Role', { exact: true }).selectOption('editor');
  await page.getByRole('button', { name: 'Send invitation' }).click();
  // (Toasts last six seconds; on a busy machine the lasting state is the surer check.)
  await expect(page.getByRole('region', { name: 'Open invitations' })).toContainText(DEMO.outsider.email, { timeout: 20_000 });

  // Change a role: the editor becomes a producer, and the change survives a reload.
  await page.getByLabel(`Role of ${DEMO.editor.name}`).selectOption('producer');
  await expect(page.getByRole('listitem').filter({ hasText: DEMO.editor.email }).getByRole('combobox')).toHaveValue('producer', { timeout: 20_000 });
  await page.reload();
  await expect(page.getByLabel(`Role of ${DEMO.editor.name}`)).toHaveValue('producer');
  // The editor's next navigation shows the producer's menu (Approvals).
  await editorPage.goto('/board');
  await expect(editorPage.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Approvals' })).toBeVisible();

  // Remove, with a confirmation step.
  await page.getByRole('button', { name: `Remove ${DEMO.editor.name}` }).click();
  await shoot(page, info, 'confirm-removal');
  await checkA11y(page, 'team page, confirming a removal');
  await page.getByRole('button', { name: 'Confirm removal' }).click();
  await expect(page.getByRole('listitem').filter({ hasText: DEMO.editor.email })).toHaveCount(0, { timeout: 20_000 });
  await page.reload();
  await expect(page.getByRole('listitem').filter({ hasText: DEMO.editor.email })).toHaveCount(0);
  await expect(page.getByRole('listitem').filter({ hasText: DEMO.producer.email })).toHaveCount(1);

  // The removed member: the channel's data is gone for him at once (404, not another channel's
  // 403), and his next navigation lands on "Start a channel".
  const me = await (await editorPage.request.get('/api/auth/me')).json();
  expect(me.channels).toEqual([]);
  const boardApi = await editorPage.request.get(`/api/channels/${(await (await page.request.get('/api/auth/me')).json()).channels[0].id}/board`);
  expect(boardApi.status()).toBe(404);
  await editorPage.goto('/board');
  await expect(editorPage.getByRole('heading', { level: 1, name: 'Start a channel' })).toBeVisible();
  await expect(editorPage.getByText('Lumen Test Bench')).toHaveCount(0);
  await checkA11y(editorPage, 'start a channel (removed member)');
  await shoot(editorPage, info, 'removed-member');
  await other.close();
});
