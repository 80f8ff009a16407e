// The board: cards move by mouse and by keyboard, the server's stage rules decide, a refused move
// snaps back with what is missing, and a back move asks for a reason that the activity keeps.
// The two episodes are the demo seed's board episodes (db/seeders/demo-board.ts).
import type { Locator, Page } from '@playwright/test';
import { allowHttpError, DEMO, expect, signInAs, test } from '../fixtures/app.ts';

const READY = 'Prime 50 T1.5: sharpness from centre to corner';
const BLOCKED = 'Panel 600 at high frame rates: any flicker?';

const column = (page: Page, stage: string) => page.getByRole('region', { name: stage, exact: true });
const cardIn = (page: Page, stage: string, title: string) => column(page, stage).getByRole('listitem', { name: title, exact: true });

/** Drags `card` with the mouse to the empty space just below the last card of column `stage`. */
async function dragTo(page: Page, card: Locator, target: Locator, stage: string) {
  await card.scrollIntoViewIfNeeded();
  const from = (await card.boundingBox())!;
  const list = (await target.getByRole('list', { name: `${stage} cards` }).boundingBox())!;
  const cards = target.getByRole('listitem').filter({ has: page.getByRole('button', { name: /^Drag / }) });
  const last = (await cards.count()) ? await cards.last().boundingBox() : null;
  const viewport = page.viewportSize()!;
  const x = list.x + list.width / 2;
  const y = Math.min(last ? last.y + last.height + 30 : list.y + 40, viewport.height - 10);
  await page.mouse.move(from.x + from.width / 2, from.y + 12);
  await page.mouse.down();
  await page.mouse.move(from.x + from.width / 2 + 10, from.y + 20, { steps: 4 });
  await page.mouse.move(x, y, { steps: 20 });
  await page.mouse.up();
}

test.describe.serial('the board', () => {
  test('A host drags an episode that is ready from Plan to Shoot with the mouse, and it stays there after a reload', async ({ page }) => {
    await signInAs(page, DEMO.host);
    await page.goto('/board');
    await expect(cardIn(page, 'Plan', READY)).toBeVisible();
    await dragTo(page, cardIn(page, 'Plan', READY), column(page, 'Shoot'), 'Shoot');
    await expect(cardIn(page, 'Shoot', READY)).toBeVisible();
    await expect(page.getByText(`“${READY}” moved to Shoot`)).toBeVisible();
    await page.reload();
    await expect(cardIn(page, 'Shoot', READY)).toBeVisible();
    await expect(cardIn(page, 'Plan', READY)).toHaveCount(0);
  });

  test('A host moves it back to Plan with the keyboard, gives the reason, and the episode page shows it', async ({ page }) => {
    await signInAs(page, DEMO.host);
    await page.goto('/board');
    const handle = cardIn(page, 'Shoot', READY).getByRole('button', { name: `Drag "${READY}"` });
    await handle.focus();
    await page.keyboard.press('Space');
    await expect(page.getByText(`Picked up “${READY}” from Shoot`, { exact: false })).toBeAttached();
    await page.keyboard.press('ArrowLeft');
    await expect(page.getByText(new RegExp(`“${READY.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}” is now (in Plan|at the end of Plan)`))).toBeAttached();
    await page.keyboard.press('Space');
    const dialog = page.getByRole('dialog', { name: 'Move back to Plan?' });
    await expect(dialog).toBeVisible();
    await dialog.getByRole('textbox', { name: 'Reason' }).fill('Chart wall was not lit evenly: re-plan the lighting');
    await dialog.getByRole('button', { name: 'Move back' }).click();
    await expect(cardIn(page, 'Plan', READY)).toBeVisible();
    await expect(page.getByText(`“${READY}” moved to Plan`)).toBeVisible();

    await cardIn(page, 'Plan', READY).getByRole('link', { name: READY }).click();
    await expect(page.getByRole('heading', { level: 1, name: READY })).toBeVisible();
    const activity = page.getByRole('region', { name: 'Activity' });
    await expect(activity.getByText('Ilse Marrow moved it back from Shoot to Plan')).toBeVisible();
    await expect(activity.getByText('Reason: Chart wall was not lit evenly: re-plan the lighting')).toBeVisible();
  });

  test('A refused move snaps back and the message lists what is missing', async ({ page }) => {
    allowHttpError('/move', 422);
    await signInAs(page, DEMO.host);
    await page.goto('/board');
    await dragTo(page, cardIn(page, 'Plan', BLOCKED), column(page, 'Shoot'), 'Shoot');
    const alert = page.getByRole('alert').filter({ hasText: `“${BLOCKED}” stays in Plan: it cannot move to Shoot yet` });
    await expect(alert).toBeVisible();
    await expect(alert.getByRole('listitem')).toHaveText(['2 spec-sheet lines empty: Frame rate, Codec']);
    await expect(cardIn(page, 'Plan', BLOCKED)).toBeVisible();
    await expect(cardIn(page, 'Shoot', BLOCKED)).toHaveCount(0);

    // The "Move to…" list asks the same server and gets the same answer.
    await cardIn(page, 'Plan', BLOCKED).getByRole('combobox', { name: `Move "${BLOCKED}" to` }).selectOption('shoot');
    await expect(page.getByRole('alert').filter({ hasText: 'it cannot move to Shoot yet' })).toHaveCount(2);
    await expect(cardIn(page, 'Plan', BLOCKED)).toBeVisible();
  });
});
