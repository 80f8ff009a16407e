// Journeys of the Readouts tab and the compare page, on the demo's synthetic readouts (invented
// data measured at seed time): an editor reads the K7 re-test's ceiling ISO beside its threshold
// and the charts, draws a region and re-runs a step; a producer compares the body before and
// after its firmware update.
import type { Page } from '@playwright/test';
import { checkA11y, shoot } from '../fixtures/look.ts';
import { DEMO, episodeId, expect, signInAs, test } from '../fixtures/app.ts';

// Each journey scans with axe and takes screenshots at two sizes: more than the default minute on a busy machine.
test.describe.configure({ timeout: 120_000 });

const K7 = 'K7 Mark II after firmware 3.1';
const BASELINE = 'Firmware 3.0 baseline';

async function openReadouts(page: Page, id: string) {
  await page.goto(`/episodes/${id}?tab=readouts`);
  await expect(page.getByRole('tab', { name: 'Readouts' })).toHaveAttribute('aria-selected', 'true');
}

test('An editor reads the ceiling ISO with its threshold beside the host’s ratings, sees the charts, and re-runs a step', async ({ page }, info) => {
  await signInAs(page, DEMO.editor);
  await openReadouts(page, await episodeId(page, K7));

  // The verdict with its threshold and where the default comes from (invented demo data: ceiling at ISO 1600).
  const verdict = page.getByRole('region', { name: 'Verdict' });
  await expect(verdict.getByTestId('verdict-headline')).toHaveText('Ceiling ISO 1600');
  await expect(verdict.getByText('Threshold: SNR 20 dB.')).toBeVisible();
  await expect(verdict.getByText(/ISO 12232:2019/)).toBeVisible();
  // The plan's demo rated 8 of the 10 steps when they were shot.
  await expect(verdict.getByText(/8 of 10 steps rated/)).toBeVisible();

  // The charts load lazily and draw the SNR curve on a log2 ISO axis with the threshold line.
  const snr = page.getByRole('img', { name: /^SNR against ISO/ });
  await expect(snr).toBeVisible();
  await expect(snr.locator('.recharts-line-curve')).toHaveCount(1);
  await expect(page.locator('figure', { has: snr }).getByText('threshold 20 dB')).toBeVisible();
  await expect(page.getByRole('img', { name: /^Chroma noise against ISO/ })).toBeVisible();

  // The table: every step with its figure, a pass/fail word, the host's rating and notes.
  const table = page.getByRole('table', { name: /Noise readouts per ISO step/ });
  const row1600 = table.getByRole('row', { name: /^ISO 1600\b/ });
  await expect(row1600.getByText('meets')).toBeVisible();
  await expect(row1600.getByText('Shadow noise visible, still tight.')).toBeVisible();
  await expect(table.getByRole('row', { name: /^ISO 2000\b/ }).getByText('below')).toBeVisible();
  await expect(table.getByRole('img', { name: 'Measured frame of ISO 800' })).toBeVisible();
  // ISO 800 kept its earlier run (a grid over the whole chart) in the history.
  await table.getByRole('row', { name: /^ISO 800\b/ }).getByText('History (2)').click();
  await expect(table.getByText(/grid 6 × 4/)).toBeVisible();

  await checkA11y(page, 'readouts tab');
  await shoot(page, info, 'readouts-tab');

  // Re-run one step: a new readout is queued and measured, the old one stays in the history.
  const row3200 = table.getByRole('row', { name: /^ISO 3200\b/ });
  const before = Number(/\((\d+)\)/.exec((await row3200.getByText(/^History \(\d+\)$/).textContent()) ?? '')![1]);
  await table.getByRole('button', { name: 'Run the readout of ISO 3200 again' }).click();
  await expect(row3200.getByText(`History (${before + 1})`)).toBeVisible({ timeout: 20_000 });
  await expect(row3200.getByText(/Queued|Measuring/)).toHaveCount(0, { timeout: 30_000 });
  await expect(row3200.getByText('below')).toBeVisible();
});

test('An editor sees the latitude window and wipes between the reference and a recovered frame', async ({ page }, info) => {
  await signInAs(page, DEMO.editor);
  await openReadouts(page, await episodeId(page, BASELINE));
  await page.getByRole('button', { name: /^Latitude bracket ±3/ }).click();
  await expect(page.getByTestId('verdict-headline')).toHaveText('Latitude window \u22121 to +2 stops');
  await expect(page.getByText('Threshold: ΔE00 2.5.')).toBeVisible();
  await expect(page.getByRole('img', { name: /^ΔE00 against stop offset/ })).toBeVisible();
  const frames = page.getByRole('region', { name: 'Reference and recovered frames' });
  await expect(frames.getByRole('img', { name: 'Reference frame (0 stops)' })).toBeVisible();
  await frames.getByLabel('Wipe position').fill('20');
  await frames.getByLabel('Step').selectOption({ label: '+3 stops' });
  await frames.getByRole('button', { name: 'Difference map' }).click();
  await expect(frames.getByRole('img', { name: /^Difference map of \+3 stops/ })).toBeVisible();
  await checkA11y(page, 'readouts tab, latitude bracket');
  await shoot(page, info, 'readouts-latitude');
});

test('A host reads readouts but cannot run them or move the region', async ({ page }) => {
  await signInAs(page, DEMO.host);
  await openReadouts(page, await episodeId(page, K7));
  await expect(page.getByTestId('verdict-headline')).toHaveText('Ceiling ISO 1600');
  await expect(page.getByRole('button', { name: /Run readouts/ })).toHaveCount(0);
  await expect(page.getByRole('button', { name: 'Save region' })).toHaveCount(0);
  await expect(page.getByText('Editors and admins set the region.')).toBeVisible();
});

test('A producer compares the body before and after its firmware update on the same axes', async ({ page }, info) => {
  await signInAs(page, DEMO.producer);
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Compare' }).click();
  await expect(page.getByRole('heading', { name: 'Compare readouts' })).toBeVisible();
  await page.getByRole('checkbox', { name: /ISO sweep 400–3200 in thirds ·.*K7 Mark II after firmware 3\.1/ }).check();
  await page.getByRole('checkbox', { name: /ISO sweep 400–3200 in thirds \(firmware 3\.0\)/ }).check();
  const verdicts = page.getByRole('region', { name: 'Verdicts' });
  await expect(verdicts.getByRole('article')).toHaveCount(2);
  await expect(verdicts.getByText('Ceiling ISO 1600')).toBeVisible();
  await expect(verdicts.getByText('Ceiling ISO 1250')).toBeVisible();
  const snr = page.getByRole('img', { name: /^SNR against ISO/ });
  await expect(snr.locator('.recharts-line-curve')).toHaveCount(2);
  await expect(page).toHaveURL(/tests=[0-9a-f-]{36}(,|%2C)[0-9a-f-]{36}/);
  await checkA11y(page, 'compare page');
  await shoot(page, info, 'compare');
});
