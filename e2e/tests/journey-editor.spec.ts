// Journey of an editor, from a freshly seeded demo. The host has planned a two-step ISO sweep on
// the recorder episode (in Shoot) and uploaded a camera original; the editor gets the "ready for
// pickup" mail, uploads a clip and a frame grab per step (made here with ffmpeg and sharp), sees
// them verified and probed, picks up footage, runs the readouts, writes chapters and moves the
// episode on to Approval (through Grade, with a proposed publish slot); the producer is mailed.
import { execFileSync } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from '@playwright/test';
import sharp from 'sharp';
import { checkA11y, shoot } from '../fixtures/look.ts';
import { resetDemo } from '../fixtures/reset.ts';
import { DEMO, episodeId, expect, signInAs, test } from '../fixtures/app.ts';

test.beforeAll(() => resetDemo());

const TITLE = 'Field 7 recorder: codecs and card speed';
const SWEEP = 'Recorder sweep 800–1600';
const STEPS = ['ISO 800', 'ISO 1600'];

/** A 1-second 320×180 clip from ffmpeg's test source at 23.976 fps (the demo sheet's frame rate). */
function clip(dir: string, name: string) {
  const path = join(dir, name);
  execFileSync('ffmpeg', ['-v', 'error', '-y', '-f', 'lavfi', '-i', 'testsrc2=size=320x180:rate=24000/1001', '-t', '1', '-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv420p', path]);
  return path;
}

/** A flat grey 480×270 frame with Gaussian noise (more noise for the higher ISO), as PNG. */
async function frame(dir: string, name: string, sigma: number) {
  const path = join(dir, name);
  await sharp({ create: { width: 480, height: 270, channels: 3, background: { r: 118, g: 118, b: 118 }, noise: { type: 'gaussian', mean: 118, sigma } } }).png().toFile(path);
  return path;
}

async function upload(page: Page, kind: 'camera_original' | 'frame_grab', step: string | null, file: string) {
  const panel = page.getByRole('region', { name: 'Upload footage' });
  await panel.getByLabel('What are these files?').selectOption(kind);
  await panel.getByLabel('Test step (optional)').selectOption(step ? { label: `${SWEEP} · ${step}` } : '');
  await page.locator('.uppy-Dashboard-input').first().setInputFiles(file);
  await page.getByRole('button', { name: /^Upload 1 file/ }).click();
  await expect(page.locator('.uppy-StatusBar')).toContainText(/Complete/, { timeout: 60_000 });
  // Clear the dashboard for the next file.
  const done = page.getByRole('button', { name: /^(Done|Close)$/ });
  if (await done.count()) await done.first().click();
}

test('An editor gets the pickup mail, uploads a clip and a frame per step, picks up, runs readouts, writes chapters and sends the episode to approval', async ({ page }, info) => {
  test.setTimeout(480_000);
  const dir = info.outputPath('media');
  mkdirSync(dir, { recursive: true });

  // The host's part: a two-step sweep and the first camera original.
  await signInAs(page, DEMO.host);
  const id = await episodeId(page, TITLE, { exact: true });
  await page.goto(`/episodes/${id}?tab=plan`);
  await page.getByRole('button', { name: '+ ISO sweep' }).click();
  const editor = page.getByRole('form', { name: 'New ISO sweep' });
  await editor.getByLabel('Lowest ISO').fill('800');
  await editor.getByLabel('Highest ISO').fill('1600');
  await editor.getByLabel('Test name').fill(SWEEP);
  await editor.getByRole('button', { name: 'Add test' }).click();
  await expect(page.getByText(`Added “${SWEEP}” with 2 steps`)).toBeVisible();
  await page.goto(`/episodes/${id}?tab=footage`);
  await upload(page, 'camera_original', null, clip(dir, 'A001_C001_wide.mp4'));
  const table = page.getByRole('table', { name: 'Footage of this episode' });
  await expect(table.getByRole('row', { name: /A001_C001_wide\.mp4/ }).getByText('Verified')).toBeVisible({ timeout: 60_000 });
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL('**/sign-in');

  // The mail to the editor.
  await page.goto('/mailbox');
  await page.getByRole('button', { name: new RegExp(`Footage ready for pickup: ${TITLE}.*to ${DEMO.editor.email}`) }).click();
  await expect(page.getByText('One file is ready for pickup')).toBeVisible();
  await expect(page.getByText(/A001_C001_wide\.mp4 \(camera original\)/)).toBeVisible();
  await checkA11y(page, 'mailbox (pickup mail)');
  await shoot(page, info, 'pickup-mail');

  // The editor uploads a clip and a frame grab for each step.
  await signInAs(page, DEMO.editor);
  await page.goto(`/episodes/${id}?tab=footage`);
  await expect(page.getByRole('region', { name: 'Upload footage' })).toBeVisible();
  await checkA11y(page, 'footage tab (editor)');
  for (const [i, step] of STEPS.entries()) {
    const iso = step.replace(/\D/g, '');
    await upload(page, 'camera_original', step, clip(dir, `A002_C00${i + 1}_iso${iso}.mp4`));
    await upload(page, 'frame_grab', step, await frame(dir, `grab_iso${iso}.png`, 3 + 3 * i));
  }
  for (const [i, step] of STEPS.entries()) {
    const iso = step.replace(/\D/g, '');
    await expect(table.getByRole('row', { name: new RegExp(`A002_C00${i + 1}_iso${iso}\\.mp4`) }).getByText('Verified')).toBeVisible({ timeout: 60_000 });
    await expect(table.getByRole('row', { name: new RegExp(`grab_iso${iso}\\.png`) }).getByText('Verified')).toBeVisible({ timeout: 60_000 });
  }
  // Probed: the clip's format, from the server's probe.
  await table.getByRole('button', { name: 'A002_C001_iso800.mp4' }).click();
  const probe = page.getByRole('region', { name: 'Probe' });
  await expect(probe).toContainText('320×180');
  await expect(probe).toContainText('24000/1001');
  await expect(probe).toContainText('H.264 / AVC');
  await checkA11y(page, 'footage tab with probe');
  await shoot(page, info, 'footage');

  // Pick up the host's camera original.
  const original = table.getByRole('row', { name: /A001_C001_wide\.mp4/ });
  await original.getByRole('button', { name: /^Pick up/ }).click();
  await expect(original).toContainText(DEMO.editor.name);

  // Readouts of the sweep, from the two frame grabs.
  await page.getByRole('tab', { name: 'Readouts' }).click();
  await page.getByRole('button', { name: 'Run readouts' }).click();
  const verdict = page.getByRole('region', { name: 'Verdict' });
  await expect(verdict).toContainText('2 of 2 steps measured', { timeout: 120_000 });
  const steps = page.getByRole('table', { name: /readouts per ISO step/ });
  await expect(steps.getByRole('row', { name: /^ISO 800\b/ })).toContainText(/ dB.*(meets|below)/);
  await expect(steps.getByRole('row', { name: /^ISO 1600\b/ })).toContainText(/ dB.*(meets|below)/);
  await checkA11y(page, 'readouts tab (editor)');
  await shoot(page, info, 'readouts');

  // Chapters in the description, saved.
  await page.getByRole('tab', { name: 'Description' }).click();
  const chapters: [string, string][] = [['0:00', 'What we test'], ['1:15', 'ISO 800'], ['3:40', 'ISO 1600'], ['6:05', 'Verdict']];
  for (const [i, [time, label]] of chapters.entries()) {
    if (i > 0 || (await page.getByLabel('Start of chapter 1').count()) === 0) await page.getByRole('button', { name: 'Add chapter' }).click();
    await page.getByLabel(`Start of chapter ${i + 1}`).fill(time);
    await page.getByLabel(`Label of chapter ${i + 1}`).fill(label);
  }
  await page.getByLabel(/What the video is about/).fill('How the Field 7 recorder handles a two-step ISO sweep, with measured noise.');
  await page.getByRole('button', { name: 'Save description' }).click();
  await expect(page.getByRole('button', { name: 'Save description' })).toBeDisabled({ timeout: 20_000 });
  await page.reload();
  await expect(page.getByLabel('Label of chapter 4')).toHaveValue('Verdict');
  await checkA11y(page, 'description tab with chapters');
  await shoot(page, info, 'chapters');

  // Shoot → Grade (a camera original is in), a proposed slot, then Grade → Approval.
  const move = page.getByRole('combobox', { name: 'Move this episode to' });
  await move.selectOption('grade');
  await expect(move.locator('option[value="approval"]')).toHaveCount(1, { timeout: 20_000 });
  await page.getByRole('tab', { name: 'Schedule' }).click();
  const schedule = page.getByRole('tabpanel', { name: 'Schedule' });
  const inTwoWeeks = new Date(Date.now() + 14 * 86_400_000).toISOString().slice(0, 10);
  await schedule.getByLabel('Date').fill(inTwoWeeks);
  await schedule.getByLabel('Time', { exact: true }).fill('17:00');
  await schedule.getByRole('button', { name: 'Propose this slot' }).click();
  await expect(schedule.getByRole('region', { name: 'Publish slot' })).toContainText(/Proposed/, { timeout: 20_000 });
  await move.selectOption('approval');
  await expect(page.getByText('Moved to Approval')).toBeVisible({ timeout: 20_000 });
  await page.reload();
  await expect(page.getByRole('region', { name: 'Activity' }).getByText(/moved it from Grade to Approval/)).toBeVisible();
  await checkA11y(page, 'episode in approval (editor)');
  await shoot(page, info, 'in-approval');
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL('**/sign-in');

  // The producer's "approval requested" mail: one, naming the proposed slot and the move.
  const mails = (await (await page.request.get('/api/dev/mailbox')).json()) as { subject: string; to: string[] }[];
  expect(mails.filter((m) => m.subject === `Approval requested: ${TITLE}` && m.to.includes(DEMO.producer.email))).toHaveLength(1);
  await page.goto('/mailbox');
  await page.getByRole('button', { name: new RegExp(`Approval requested: ${TITLE}.*to ${DEMO.producer.email}`) }).click();
  await expect(page.getByText(new RegExp(`${DEMO.editor.name} proposed ${inTwoWeeks} 17:00 \\S+ for “${TITLE}”\\.`))).toBeVisible();
  await expect(page.getByText(`${DEMO.editor.name} moved the episode to Approval on the board.`)).toBeVisible();
  await checkA11y(page, 'mailbox (approval request)');
  await shoot(page, info, 'approval-request-mail');
});
