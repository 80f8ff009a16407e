// Journeys of the Footage tab: uploading through the dashboard (resumable, over tus), watching
// progress, and seeing the file verified (browser and server SHA-256 agree) and probed.
import { execFileSync } from 'node:child_process';
import { createHash, randomBytes } from 'node:crypto';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { DEMO, allowHttpError, episodeId, expect, signInAs, test } from '../fixtures/app.ts';
import { checkA11y, shoot } from '../fixtures/look.ts';
import { resetDemo } from '../fixtures/reset.ts';

// The journeys build on each other (upload, then pickup) on a freshly seeded demo.
test.beforeAll(() => resetDemo());

test('A host uploads a clip through the dashboard, watches its progress and sees it verified and probed', async ({ page }, info) => {
  test.slow(); // a throttled upload, then the checks in the background
  // A 2-second 1280×720 25 fps clip from ffmpeg’s test source (a few MB, so the throttled progress shows).
  const dir = info.outputPath('clips');
  mkdirSync(dir, { recursive: true });
  const clip = join(dir, 'A007_C003_recorder.mp4');
  execFileSync('ffmpeg', ['-v', 'error', '-y', '-f', 'lavfi', '-i', 'testsrc2=size=1280x720:rate=25', '-t', '2', '-c:v', 'libx264', '-preset', 'ultrafast', '-qp', '8', '-pix_fmt', 'yuv420p', clip]);
  const sha = createHash('sha256').update(readFileSync(clip)).digest('hex');

  await signInAs(page, DEMO.host);
  const id = await episodeId(page, 'Field 7 recorder');
  await page.goto(`/episodes/${id}?tab=footage`);
  await expect(page.getByRole('tab', { name: 'Footage' })).toHaveAttribute('aria-selected', 'true');
  await expect(page.getByRole('region', { name: 'Upload footage' })).toBeVisible();
  await page.getByLabel('What are these files?').selectOption('camera_original');

  // Slow the upload down so the progress, speed and time left can be seen and paused
  // (128 KiB/s, that is 131 kB/s: about twenty seconds).
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Network.enable');
  await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 20, downloadThroughput: -1, uploadThroughput: 128 * 1024 });

  await page.locator('.uppy-Dashboard-input').first().setInputFiles(clip);
  // The browser's checksum, computed in a worker, equals the file's.
  await expect(page.getByRole('region', { name: 'Upload footage' }).getByText(sha)).toBeVisible({ timeout: 20_000 });
  await page.getByRole('button', { name: /^Upload 1 file/ }).click();
  const status = page.locator('.uppy-StatusBar');
  await expect(status).toContainText(/Uploading/);
  await expect(status).toContainText(/%/);
  // The file's own speed (SI units, smoothed) and time left, listed under the dashboard.
  const upload = page.getByRole('region', { name: 'Upload footage' });
  const transfer = upload.getByRole('list', { name: 'Transfers' }).getByRole('listitem').filter({ hasText: 'A007_C003_recorder.mp4' });
  await expect(transfer).toContainText(/\d+(\.\d)? kB\/s/, { timeout: 15_000 });
  await expect(transfer).toContainText(/about \d+ (s|min)( \d+ s)? left/);
  // Near the throttle's 131 kB/s (bursts smoothed out), not bytes per second read as kilobytes nor KiB as kB.
  const kilobytesPerSecond = Number((await transfer.textContent())!.match(/(\d+(?:\.\d)?) kB\/s/)![1]);
  expect(kilobytesPerSecond).toBeGreaterThan(30);
  expect(kilobytesPerSecond).toBeLessThan(600);
  await shoot(page, info, 'uploading');
  await checkA11y(page, 'footage tab during an upload');
  // A screen reader hears the quarters, sparingly, from a polite live region.
  const live = upload.getByRole('status', { name: 'Upload announcements' });
  await expect(live).toHaveAttribute('aria-live', 'polite');
  // (At 131 kB/s 25 % comes about 5 s in and 50 % about 5 s later: the pause below falls in between.)
  await expect(live).toHaveText(/^A007_C003_recorder\.mp4: 25 % sent, about \d+ (s|min)( \d+ s)? left$/, { timeout: 20_000 });
  // Pause, then resume: tus continues from the server's offset.
  await page.getByRole('button', { name: 'Pause', exact: true }).click();
  await expect(status).toContainText(/Paused/);
  await expect(transfer).toContainText('paused');
  await expect(transfer).not.toContainText(/B\/s|left/);
  await expect(live).toHaveText('A007_C003_recorder.mp4 paused');
  await page.getByRole('button', { name: 'Resume', exact: true }).click();
  await expect(live).toHaveText('A007_C003_recorder.mp4 resumed');
  await expect(status).toContainText(/Complete/, { timeout: 45_000 });
  await expect(transfer).toContainText('done');
  await expect(live).toHaveText('A007_C003_recorder.mp4 uploaded');
  await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });

  // The table shows the file, then its checks: verified, probed, with both checksums.
  const table = page.getByRole('table', { name: 'Footage of this episode' });
  const row = table.getByRole('row', { name: /A007_C003_recorder\.mp4/ });
  await expect(row).toBeVisible();
  await expect(row.getByText('Verified')).toBeVisible({ timeout: 30_000 });
  await expect(row).toContainText('Camera original');
  await expect(row).toContainText('0:02');
  await row.getByRole('button', { name: 'A007_C003_recorder.mp4', exact: true }).click();
  const probe = page.getByRole('region', { name: 'Probe' });
  await expect(probe).toContainText('1280×720');
  await expect(probe).toContainText('25 fps (25/1)');
  await expect(probe).toContainText('H.264 / AVC');
  await expect(probe).toContainText('4:2:0');
  const checks = page.getByRole('region', { name: 'Checks' });
  await expect(checks).toContainText('Checksums (SHA-256): match');
  await expect(checks.getByText(sha)).toHaveCount(2);
  await expect(page.getByRole('img', { name: 'First frame of A007_C003_recorder.mp4' })).toBeVisible();
  await page.screenshot({ path: info.outputPath('footage-desktop.png'), fullPage: true });
});

test('An editor picks up a verified file and releases it; filters narrow the table', async ({ page }) => {
  await signInAs(page, DEMO.editor);
  const id = await episodeId(page, 'Field 7 recorder');
  await page.goto(`/episodes/${id}?tab=footage`);
  const table = page.getByRole('table', { name: 'Footage of this episode' });
  const row = table.getByRole('row', { name: /A007_C003_recorder\.mp4/ });
  await row.getByRole('button', { name: /^Pick up/ }).click();
  await expect(row).toContainText('Dario Fenwick');
  await expect(row).toContainText('since');
  await row.getByRole('button', { name: /^Release/ }).click();
  await expect(row).toContainText('Nobody');
  await page.getByLabel('Status').selectOption('flagged');
  await expect(row).toHaveCount(0);
  await page.getByLabel('Status').selectOption('');
  await page.getByLabel('Find').fill('A007');
  await expect(row).toBeVisible();
  // Sorting by size is announced on the column header.
  await table.getByRole('button', { name: /^Size/ }).click();
  await expect(table.getByRole('columnheader', { name: /Size/ })).toHaveAttribute('aria-sort', 'ascending');
  await row.getByRole('button', { name: 'A007_C003_recorder.mp4', exact: true }).click();
  await expect(page.getByRole('region', { name: 'Probe' })).toBeVisible();
  await checkA11y(page, 'footage tab');
  await page.setViewportSize({ width: 390, height: 844 });
  await page.screenshot({ path: test.info().outputPath('footage-phone.png'), fullPage: true });
});

test('A host sees a clear message in the dashboard when a file is refused', async ({ page }, info) => {
  test.slow();
  allowHttpError('/api/uploads/', 415);
  const dir = info.outputPath('refused');
  mkdirSync(dir, { recursive: true });
  // Bytes that are no video at all, named like a clip: the server reads the first bytes and refuses.
  const fake = join(dir, 'A009_C001.mov');
  writeFileSync(fake, Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46]), randomBytes(64 * 1024)]));
  await signInAs(page, DEMO.host);
  const id = await episodeId(page, 'Field 7 recorder');
  await page.goto(`/episodes/${id}?tab=footage`);
  // A text file is refused before it is sent, by its extension.
  const notes = join(dir, 'notes.txt');
  writeFileSync(notes, 'not footage');
  await page.locator('.uppy-Dashboard-input').first().setInputFiles(notes);
  await expect(page.getByText(/You can only upload: \.mp4/).first()).toBeVisible();
  await page.locator('.uppy-Dashboard-input').first().setInputFiles(fake);
  await page.getByRole('button', { name: /^Upload 1 file/ }).click();
  await expect(page.getByText(/first bytes are not a video container or still image/).first()).toBeVisible({ timeout: 20_000 });
  // Nothing was kept: the table has no row for it.
  await expect(page.getByRole('row', { name: /A009_C001\.mov/ })).toHaveCount(0);
});

test('A still added among camera originals goes in as a frame grab, and one file’s kind is changed on the file itself', async ({ page }, info) => {
  test.slow();
  const dir = info.outputPath('kinds');
  mkdirSync(dir, { recursive: true });
  const grab = join(dir, 'grab_iso800.png');
  const clip = join(dir, 'B002_C001_graded.mp4');
  execFileSync('ffmpeg', ['-v', 'error', '-y', '-f', 'lavfi', '-i', 'testsrc2=size=320x180', '-frames:v', '1', grab]);
  execFileSync('ffmpeg', ['-v', 'error', '-y', '-f', 'lavfi', '-i', 'testsrc2=size=320x180:rate=25', '-t', '1', '-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv420p', clip]);
  await signInAs(page, DEMO.host);
  const id = await episodeId(page, 'Field 7 recorder');
  await page.goto(`/episodes/${id}?tab=footage`);
  await page.getByLabel('What are these files?').selectOption('camera_original');
  await page.locator('.uppy-Dashboard-input').first().setInputFiles([grab, clip]);
  // The clip was a graded render all along: set it on the file.
  await page.getByRole('button', { name: 'Edit file B002_C001_graded.mp4' }).click();
  await page.getByLabel('What the file is').selectOption('graded_render');
  await page.getByRole('button', { name: 'Save changes' }).click();
  await page.getByRole('button', { name: /^Upload 2 files/ }).click();
  const table = page.getByRole('region', { name: 'Footage' }).or(page.getByRole('table')).first();
  await expect(page.getByRole('row', { name: /grab_iso800\.png/ })).toContainText('Frame grab', { timeout: 30_000 });
  await expect(page.getByRole('row', { name: /B002_C001_graded\.mp4/ })).toContainText('Graded render', { timeout: 30_000 });
  await expect(table).toBeVisible();
});

test('A host reloads the page in the middle of an upload, adds the file again and it continues where it stopped', async ({ page }, info) => {
  test.slow();
  const dir = info.outputPath('clips');
  mkdirSync(dir, { recursive: true });
  const clip = join(dir, 'A011_C002_reload.mp4');
  execFileSync('ffmpeg', ['-v', 'error', '-y', '-f', 'lavfi', '-i', 'testsrc2=size=1280x720:rate=25', '-t', '2', '-c:v', 'libx264', '-preset', 'ultrafast', '-qp', '8', '-pix_fmt', 'yuv420p', clip]);
  await signInAs(page, DEMO.host);
  const id = await episodeId(page, 'Field 7 recorder');
  await page.goto(`/episodes/${id}?tab=footage`);
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Network.enable');
  await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 20, downloadThroughput: -1, uploadThroughput: 256 * 1024 });
  await page.locator('.uppy-Dashboard-input').first().setInputFiles(clip);
  await page.getByRole('button', { name: /^Upload 1 file/ }).click();
  const table = page.getByRole('table', { name: 'Footage of this episode' });
  const row = table.getByRole('row', { name: /A011_C002_reload\.mp4/ });
  // The table shows the file receiving; wait until a good part has arrived, then reload.
  await expect(row.getByText(/Receiving ([1-9]\d) %/)).toBeVisible({ timeout: 40_000 });
  const before = Number((await row.getByText(/Receiving \d+ %/).textContent())!.match(/(\d+) %/)![1]);
  await page.reload();
  await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
  await page.locator('.uppy-Dashboard-input').first().setInputFiles(clip);
  await page.getByRole('button', { name: /^Upload 1 file/ }).click();
  await expect(page.locator('.uppy-StatusBar')).toContainText(/Complete/, { timeout: 30_000 });
  // One file, not two: the same upload was continued, and it checks out.
  await expect(row).toHaveCount(1);
  await expect(row.getByText('Verified')).toBeVisible({ timeout: 30_000 });
  const list = await (await page.request.get(`/api/episodes/${id}/footage`)).json();
  const files = (list.footage as { originalName: string; sizeBytes: number }[]).filter((f) => f.originalName === 'A011_C002_reload.mp4');
  expect(files).toHaveLength(1);
  expect(before).toBeGreaterThanOrEqual(10);
});
