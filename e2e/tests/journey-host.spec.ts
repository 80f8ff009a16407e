// Journey of a host, from a freshly seeded demo: a new episode on the loaned K9 Cine (which is
// under embargo), an ISO sweep and a latitude bracket, the spec sheets filled, the move to Shoot
// with the "Move to…" list, and steps marked shot with observations.
import type { Page } from '@playwright/test';
import { checkA11y, shoot } from '../fixtures/look.ts';
import { resetDemo } from '../fixtures/reset.ts';
import { DEMO, expect, signInAs, test } from '../fixtures/app.ts';

test.beforeAll(() => resetDemo());

const TITLE = 'K9 Cine on loan: noise and latitude before the embargo lifts';
const SWEEP = 'K9 loaner ISO sweep 800–6400';
const BRACKET = 'K9 loaner latitude ±3';

// Values for every line the spec sheet requires by default (invented demo values).
const LINES: [string, string][] = [
  ['Body', 'Korvala K9 Cine, firmware 0.9 (loaner)'],
  ['Lens', 'Brightwell Prime 50 T1.5'],
  ['Resolution', '4096×2160 (DCI 4K)'],
  ['Frame rate', '23.976 fps'],
  ['Shutter', '180° (1/48 s)'],
  ['Aperture', 'f/4'],
  ['ND', '0.6'],
  ['ISO', '800 base, sweep 800–6400'],
  ['White balance', '5600 K'],
  ['Gamma / log profile', 'Korvala Log 3'],
  ['Colour space', 'Korvala Wide Gamut'],
  ['Codec', 'Korvala RAW HQ in MXF'],
  ['Bit depth', '12-bit'],
  ['Chroma subsampling', '4:4:4'],
  ['Bitrate', '800 Mb/s'],
  ['Lighting', 'Two Lumetra Panel 600 at 5600 K, 60 % on one 16 A circuit'],
  ['Scene / chart', 'Grey-scale chart lit to 1000 lx'],
];
const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');

async function fillSpecSheet(page: Page, testName: string) {
  const sheet = page.getByRole('list', { name: `Spec sheet of ${testName}` });
  await expect(sheet).toBeVisible();
  for (const [label, value] of LINES) {
    const box = sheet.getByRole('textbox', { name: new RegExp(`^${escape(label)}(?![a-z])`) });
    await box.fill(value);
    await box.press('Enter');
    await expect(box).toHaveValue(value);
  }
}

test('A host plans an episode on a loaned body under embargo, fills the spec sheets, moves it to Shoot and marks steps shot', async ({ page }, info) => {
  test.setTimeout(600_000); // many saves, two-size screenshots and axe scans on a busy machine
  await signInAs(page, DEMO.host);
  await page.goto('/board');
  await checkA11y(page, 'board (host)');
  await shoot(page, info, 'board');

  // A new episode with the loaned body (producers keep the gear list; the demo's loaner has an embargo).
  await page.getByRole('button', { name: 'New episode' }).click();
  const dialog = page.getByRole('dialog', { name: 'New episode' });
  await dialog.getByLabel('Title').fill(TITLE);
  await dialog.getByRole('checkbox', { name: /Korvala K9 Cine/ }).check();
  await dialog.getByRole('checkbox', { name: /Brightwell Prime 50 T1\.5/ }).check();
  await expect(dialog.getByText('2 chosen')).toBeVisible();
  await dialog.getByLabel('Host').selectOption({ label: `${DEMO.host.name} (host)` });
  await dialog.getByLabel('Editor').selectOption({ label: `${DEMO.editor.name} (editor)` });
  await checkA11y(page, 'new episode dialog');
  await shoot(page, info, 'new-episode');
  await dialog.getByRole('button', { name: 'Create episode' }).click();
  await expect(page.getByText(`“${TITLE}” is on the board in Plan`)).toBeVisible();
  const plan = page.getByRole('region', { name: 'Plan', exact: true });
  await plan.getByRole('link', { name: TITLE, exact: true }).click();
  await expect(page.getByRole('heading', { level: 1, name: TITLE })).toBeVisible();
  // The loaner's embargo is shown with the episode.
  await expect(page.getByText(/embargo/i).first()).toBeVisible();
  await checkA11y(page, 'episode page (new)');
  await shoot(page, info, 'episode');

  // Plan: an ISO sweep and a latitude bracket.
  await page.getByRole('tab', { name: 'Plan' }).click();
  await expect(page.getByRole('heading', { name: 'Test plan' })).toBeVisible();
  await page.getByRole('button', { name: '+ ISO sweep' }).click();
  const sweep = page.getByRole('form', { name: 'New ISO sweep' });
  await sweep.getByLabel('Lowest ISO').fill('800');
  await sweep.getByLabel('Highest ISO').fill('6400');
  await expect(sweep.getByRole('table').getByRole('rowheader')).toHaveText(['800', '1600', '3200', '6400']);
  await sweep.getByLabel('Test name').fill(SWEEP);
  await sweep.getByRole('button', { name: 'Add test' }).click();
  await expect(page.getByText(`Added “${SWEEP}” with 4 steps`)).toBeVisible();

  await page.getByRole('button', { name: '+ Latitude bracket' }).click();
  const bracket = page.getByRole('form', { name: 'New Latitude bracket' });
  await bracket.getByLabel('Test name').fill(BRACKET);
  await checkA11y(page, 'plan tab, latitude bracket editor');
  await shoot(page, info, 'latitude-editor');
  await bracket.getByRole('button', { name: 'Add test' }).click();
  await expect(page.getByText(new RegExp(`Added “${escape(BRACKET)}” with \\d+ steps`))).toBeVisible();

  // The spec sheets of both tests, every required line.
  await fillSpecSheet(page, BRACKET);
  await page.getByRole('group', { name: 'Tests of this episode' }).getByRole('button', { name: new RegExp(escape(SWEEP)) }).click();
  await fillSpecSheet(page, SWEEP);
  await page.reload();
  await expect(page.getByText(/required empty/)).toHaveCount(0);
  await checkA11y(page, 'plan tab, spec sheet filled');
  await shoot(page, info, 'plan-filled');

  // To Shoot with the "Move to…" list: the server checks the plan and the spec sheets.
  await page.getByRole('combobox', { name: 'Move this episode to' }).selectOption('shoot');
  await expect(page.getByText('Moved to Shoot')).toBeVisible();
  await page.reload();
  // In Shoot now: the list offers Grade next, and the board shows the card in Shoot.
  await expect(page.getByRole('combobox', { name: 'Move this episode to' }).locator('option[value="grade"]')).toHaveCount(1);
  await expect(page.getByRole('region', { name: 'Activity' }).getByText(/moved it from Plan to Shoot/)).toBeVisible();

  // On set: steps marked shot with observations.
  await page.getByRole('tab', { name: 'Plan' }).click();
  await page.getByRole('group', { name: 'Tests of this episode' }).getByRole('button', { name: new RegExp(escape(SWEEP)) }).click();
  await page.getByRole('button', { name: 'Mark shot: ISO 1600' }).click();
  const shot = page.getByRole('form', { name: 'Shot ISO 1600' });
  await shot.getByLabel('Observation').fill('Clean mid-tones, fine grain in the shadows');
  await shot.locator('label').filter({ hasText: /^4$/ }).click();
  await checkA11y(page, 'mark shot form');
  await shoot(page, info, 'mark-shot');
  await shot.getByRole('button', { name: 'Mark shot' }).click();
  await expect(page.getByText('ISO 1600 marked shot')).toBeVisible();

  await page.getByRole('group', { name: 'Tests of this episode' }).getByRole('button', { name: new RegExp(escape(BRACKET)) }).click();
  const first = page.getByRole('button', { name: /^Mark shot: / }).first();
  const stepLabel = ((await first.getAttribute('aria-label')) ?? (await first.innerText())).replace(/^Mark shot: /, '');
  await first.click();
  const shot2 = page.getByRole('form', { name: `Shot ${stepLabel}` });
  await shot2.getByLabel('Observation').fill('Highlights come back cleanly in the grade');
  await shot2.getByRole('button', { name: 'Mark shot' }).click();
  await expect(page.getByText(`${stepLabel} marked shot`)).toBeVisible();

  await page.reload();
  await page.getByRole('group', { name: 'Tests of this episode' }).getByRole('button', { name: new RegExp(escape(BRACKET)) }).click();
  await expect(page.getByText('Highlights come back cleanly in the grade').filter({ visible: true })).toBeVisible();
  await page.getByRole('group', { name: 'Tests of this episode' }).getByRole('button', { name: new RegExp(escape(SWEEP)) }).click();
  await expect(page.getByText('Clean mid-tones, fine grain in the shadows').filter({ visible: true })).toBeVisible();
  await expect(page.getByText('1 of 4 steps shot')).toBeVisible(); // counted per test
  await checkA11y(page, 'plan tab, steps shot');
  await shoot(page, info, 'steps-shot');
});
