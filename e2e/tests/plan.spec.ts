// Journeys of the Plan tab: a host builds an ISO sweep and sees the steps follow the inputs,
// fills the spec sheet, and marks a step shot on a phone; an editor reads the plan, sees the
// lighting warning, prints the shot list and downloads it as CSV.
import type { Page } from '@playwright/test';
import { checkA11y, shoot } from '../fixtures/look.ts';
import { DEMO, episodeId, expect, signInAs, test } from '../fixtures/app.ts';

/** Opens the episode page and its Plan tab. */
async function openPlan(page: Page, id: string) {
  await page.goto(`/episodes/${id}`);
  const tab = page.getByRole('tab', { name: 'Plan' }).or(page.getByRole('link', { name: 'Plan', exact: true })).first();
  await tab.click();
  await expect(page.getByRole('heading', { name: 'Test plan' })).toBeVisible();
}

test('A host plans an ISO sweep, sees the steps follow the inputs, fills the spec sheet and marks a step shot on a phone', async ({ page }, info) => {
  // A long journey with screenshots at two sizes and an accessibility scan.
  test.slow();
  await signInAs(page, DEMO.host);
  const id = await episodeId(page, 'Field 7 recorder');
  await openPlan(page, id);
  await expect(page.getByText(/^No tests yet\./)).toBeVisible();

  await page.getByRole('button', { name: '+ ISO sweep' }).click();
  const editor = page.getByRole('form', { name: 'New ISO sweep' });
  const ladder = editor.getByRole('table').getByRole('rowheader');
  await expect(ladder).toHaveText(['100', '200', '400', '800', '1600', '3200', '6400', '12800']);
  await editor.getByLabel('Highest ISO').fill('1600');
  await expect(ladder).toHaveText(['100', '200', '400', '800', '1600']);
  // A reversed range: the generator's own message, and no way to save.
  await editor.getByLabel('Lowest ISO').fill('3200');
  await expect(editor.getByText('The ISO range is reversed: lowest ISO 3200 is above highest ISO 1600; swap them.').first()).toBeVisible();
  await expect(editor.getByRole('button', { name: 'Add test' })).toBeDisabled();
  await editor.getByLabel('Lowest ISO').fill('200');
  await editor.getByLabel('Highest ISO').fill('3200');
  await expect(ladder).toHaveText(['200', '400', '800', '1600', '3200']);
  await editor.getByLabel('Test name').fill('Recorder ISO sweep 200–3200');
  await shoot(page, info, 'editor');
  await editor.getByRole('button', { name: 'Add test' }).click();
  await expect(page.getByText('Added “Recorder ISO sweep 200–3200” with 5 steps')).toBeVisible();
  await expect(page.getByText('0 of 5 steps shot')).toBeVisible();

  // Spec sheet: a value saved on Enter, a tick, and the bitrate the storage estimate reads.
  const body = page.getByRole('textbox', { name: /^Body/ });
  await body.fill('Korvala K7 Mark II into the Datavault Field 7');
  await body.press('Enter');
  await page.getByRole('checkbox', { name: 'Checked: Body' }).check();
  const bitrate = page.getByRole('textbox', { name: /^Bitrate/ });
  await bitrate.fill('400 Mb/s');
  await bitrate.press('Enter');
  // 5 steps × 10 s × 400 Mb/s = 2.5 × 10⁹ bytes = 2.33 GiB (IEC 80000-13); 200 s at 100 Mb/s.
  await expect(page.getByTestId('storage-size')).toHaveText('2.50 GB (2.33 GiB)');
  await expect(page.getByText('Upload: 3 min 20 s')).toBeVisible();
  await page.reload();
  await expect(page.getByRole('textbox', { name: /^Body/ })).toHaveValue('Korvala K7 Mark II into the Datavault Field 7');
  await expect(page.getByRole('checkbox', { name: 'Checked: Body' })).toBeChecked();

  // On set, on a phone: ISO 800 was shot at 1000 instead.
  await page.setViewportSize({ width: 390, height: 844 });
  await page.getByRole('button', { name: 'Mark shot: ISO 800' }).click();
  const shot = page.getByRole('form', { name: 'Shot ISO 800' });
  await shot.getByLabel('ISO', { exact: true }).fill('1000');
  await expect(shot).toContainText('ISO 800 → 1000');
  await expect(shot).toContainText('+⅓ stop brighter');
  await shot.getByLabel('Observation').fill('Slight magenta in the blacks');
  await shot.locator('label').filter({ hasText: /^4$/ }).click();
  await expect(shot.getByRole('radio', { name: '4 of 5, good' })).toBeChecked();
  await shoot(page, info, 'mark-shot');
  await page.setViewportSize({ width: 390, height: 844 });
  await shot.getByRole('button', { name: 'Mark shot' }).click();
  await expect(page.getByText('ISO 800 marked shot')).toBeVisible();
  const card = page.getByRole('list', { name: /^Steps of/ }).getByRole('listitem').filter({ hasText: 'ISO 800' });
  await expect(card).toContainText('Slight magenta in the blacks');
  await expect(card.getByRole('img', { name: 'rated 4 of 5' })).toBeVisible();
  await page.reload();
  await expect(page.getByText('1 of 5 steps shot')).toBeVisible();
  await expect(card).toContainText('ISO 800 → 1000');
  await checkA11y(page, 'plan tab on a phone');
});

test('An editor reads the plan, sees the lighting warning, prints the shot list and downloads the CSV', async ({ page }, info) => {
  test.slow();
  await signInAs(page, DEMO.editor);
  const id = await episodeId(page, 'K9 Cine: noise');
  await openPlan(page, id);
  await expect(page.getByRole('button', { name: '+ ISO sweep' })).toHaveCount(0);
  await expect(page.getByRole('textbox', { name: /^Body/ })).toBeDisabled();
  await expect(page.getByRole('button', { name: /^Mark shot/ })).toHaveCount(0);
  // 1950 W on 230 V is 8.5 A: above 80 % of a 10 A breaker (NFPA 70 continuous-load rule).
  await expect(page.getByRole('alert').filter({ hasText: 'Circuit "Kitchen circuit" draws 8.5 A (85 % of its 10 A breaker)' })).toBeVisible();
  await expect(page.getByText(/licensed electrician/).first()).toBeVisible();
  await checkA11y(page, 'plan tab');
  await shoot(page, info, 'plan-tab');

  await page.getByRole('link', { name: 'Shot list' }).click();
  await expect(page.getByRole('heading', { name: 'K9 Cine: noise across the whole ISO range' })).toBeVisible();
  await expect(page.getByRole('img', { name: 'to shoot' })).toHaveCount(9);
  await checkA11y(page, 'shot list');
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download CSV' }).click()]);
  expect(download.suggestedFilename()).toBe('shot-list-k9-cine-noise-across-the-whole-iso-range.csv');
  const csv = await page.request.get(`/api/episodes/${id}/shot-list.csv`);
  expect(csv.headers()['content-type']).toContain('text/csv');
  const records = (await csv.text()).replace(/^\uFEFF/, '').split('\r\n');
  expect(records[0]).toBe('Test,Kind,Step,Label,ISO,Offset (stops),ND,Aperture,Shutter angle,Shutter time,Light change (stops),Seconds,Grade correction,Warning,Shot,Actual ISO,Actual aperture,Actual shutter angle,Actual ND,Rating,Observation');
  expect(records).toHaveLength(1 + 9 + 1);
  expect(records[1]).toMatch(/^ISO sweep 100–25600,ISO sweep,1,ISO 100,100,,0\.0,f\/4,180°,1\/48 s,/);
  await shoot(page, info, 'shot-list');
  await page.emulateMedia({ media: 'print' });
  await expect(page.getByRole('button', { name: 'Print' })).toBeHidden();
  await expect(page.getByRole('navigation', { name: 'Main' })).toBeHidden();
});
