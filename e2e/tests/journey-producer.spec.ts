// Journey of a producer, from a freshly seeded demo: the panel episode (waiting for approval)
// also uses the loaned K9 Cine, whose embargo lifts after the proposed slot. Approving is refused;
// a later slot is proposed and approved; it shows on the calendar and in the calendar feed; when
// its hour has come, the producer marks the episode live.
import pg from 'pg';
import { checkA11y, shoot } from '../fixtures/look.ts';
import { resetDemo } from '../fixtures/reset.ts';
import { allowHttpError, DEMO, expect, signInAs, test } from '../fixtures/app.ts';

const EPISODE = 'Panel 600 on location: colour and flicker';

async function sql<T extends pg.QueryResultRow>(text: string, values: unknown[] = []): Promise<T[]> {
  const client = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await client.connect();
  try {
    return (await client.query<T>(text, values)).rows;
  } finally {
    await client.end();
  }
}

let embargo: { at: Date; zone: string };

test.beforeAll(async () => {
  resetDemo();
  // The demo's panel episode is in Approval with a slot in five days; the K9 loaner's embargo lifts in nine.
  await sql(
    `INSERT INTO episode_gear (episode_id, gear_id)
     SELECT e.id, g.id FROM episodes e, gear g WHERE e.title = $1 AND g.model = 'K9 Cine'`,
    [EPISODE],
  );
  const [g] = await sql<{ embargo_at: Date; embargo_zone: string }>(`SELECT embargo_at, embargo_zone FROM gear WHERE model = 'K9 Cine'`);
  embargo = { at: g.embargo_at, zone: g.embargo_zone };
});

/** YYYY-MM-DD of `d` in `zone`. */
const dateIn = (d: Date, zone: string) => new Intl.DateTimeFormat('en-CA', { timeZone: zone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(d);

test('A producer is refused a slot before the embargo, approves a later one, finds it on the calendar and in the feed, and marks the episode live', async ({ page }, info) => {
  test.setTimeout(300_000);
  await signInAs(page, DEMO.producer);
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Approvals' }).click();
  const item = page.getByRole('article', { name: EPISODE });
  await expect(item).toBeVisible();
  // The queue already says what stops approval: the slot is before the loaner's embargo.
  await expect(item.getByRole('note', { name: 'What stops approval' })).toContainText(/embargo/i);
  await checkA11y(page, 'approvals queue (blocked)');
  await shoot(page, info, 'approvals-blocked');

  // Trying anyway: the server refuses (422) and says why.
  allowHttpError('/approve', 422);
  await item.getByRole('button', { name: 'Approve slot' }).click();
  const refusal = page.getByRole('alert').filter({ hasText: 'This slot cannot be approved' });
  await expect(refusal).toBeVisible({ timeout: 20_000 });
  await expect(refusal).toContainText(/embargo of Korvala K9 Cine/);
  await shoot(page, info, 'approval-refused');
  const [slotRow] = await sql<{ status: string }>(`SELECT s.status FROM publish_slots s JOIN episodes e ON e.id = s.episode_id WHERE e.title = $1 ORDER BY s.created_at DESC LIMIT 1`, [EPISODE]);
  expect(slotRow.status).toBe('proposed');

  // A slot the day after the embargo lifts, 18:00 in the embargo's zone.
  const after = new Date(+embargo.at + 86_400_000);
  await item.getByRole('link', { name: EPISODE }).first().click();
  await page.getByRole('tab', { name: 'Schedule' }).click();
  const schedule = page.getByRole('tabpanel', { name: 'Schedule' });
  await schedule.getByLabel('Date').fill(dateIn(after, embargo.zone));
  await schedule.getByLabel('Time', { exact: true }).fill('18:00');
  await schedule.getByRole('button', { name: 'Propose this slot' }).click();
  await expect(schedule.getByRole('region', { name: 'Publish slot' })).toContainText(/Proposed/, { timeout: 20_000 });
  await checkA11y(page, 'schedule tab (new slot proposed)');
  await shoot(page, info, 'schedule-proposed');

  // Back to the queue: nothing stops approval now.
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Approvals' }).click();
  await expect(item.getByRole('note', { name: 'What stops approval' })).toHaveCount(0);
  await item.getByLabel(/Comment for the host and editor/).fill('After the embargo: go ahead.');
  await item.getByRole('button', { name: 'Approve slot' }).click();
  await expect(page.getByText('Nothing waits for approval.')).toBeVisible({ timeout: 20_000 });
  await checkA11y(page, 'approvals queue (empty)');

  // On the calendar, in words.
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Calendar' }).click();
  await page.getByRole('button', { name: 'Agenda' }).click();
  const monthOfSlot = dateIn(after, 'Europe/Berlin').slice(0, 7);
  if (monthOfSlot !== dateIn(new Date(), 'Europe/Berlin').slice(0, 7)) await page.getByRole('button', { name: 'Next month' }).click();
  const entry = page.getByRole('link', { name: new RegExp(`Approved publish slot.*${EPISODE}`) });
  await expect(entry).toBeVisible();
  await checkA11y(page, 'calendar agenda');
  await shoot(page, info, 'calendar');

  // In the private calendar feed, from the profile page.
  await page.getByRole('link', { name: /Your profile/ }).click();
  await page.getByRole('button', { name: 'Create my feed address' }).click();
  const feedUrl = await page.locator('#feed-url').inputValue();
  expect(feedUrl).toMatch(/\/calendar\/[^/]+\.ics$/);
  await checkA11y(page, 'profile with feed address');
  await shoot(page, info, 'profile-feed');
  const feed = await page.request.get(feedUrl);
  expect(feed.status()).toBe(200);
  expect(feed.headers()['content-type']).toContain('text/calendar');
  const ics = (await feed.text()).replace(/\r\n[ \t]/g, ''); // unfold lines (RFC 5545 §3.1)
  expect(ics).toMatch(/^BEGIN:VCALENDAR/);
  const events = ics.split('BEGIN:VEVENT').slice(1);
  const [approved] = await sql<{ starts_at: Date }>(`SELECT s.starts_at FROM publish_slots s JOIN episodes e ON e.id = s.episode_id WHERE e.title = $1 AND s.status = 'approved'`, [EPISODE]);
  const stamp = approved.starts_at.toISOString().replace(/[-:]/g, '').replace(/\.\d{3}/, '');
  // The feed also has the episode's shoot day; the publish slot is the event at the approved instant (UTC).
  const ours = events.find((e) => e.includes(EPISODE) && e.includes(`DTSTART:${stamp}`));
  expect(ours, `the feed has an event for the approved slot at ${stamp}`).toBeTruthy();

  // Time passes: the embargo lifts and the slot's hour comes (the test moves both into the past
  // in the database, as the clock would). Then the producer marks the episode live.
  await sql(`UPDATE gear SET embargo_at = now() - interval '2 hours' WHERE model = 'K9 Cine'`);
  await sql(`UPDATE publish_slots s SET starts_at = now() - interval '1 hour' FROM episodes e WHERE e.id = s.episode_id AND e.title = $1 AND s.status = 'approved'`, [EPISODE]);
  await page.goto('/board');
  await page.getByRole('region', { name: 'Scheduled', exact: true }).getByRole('link', { name: EPISODE, exact: true }).click();
  await page.getByRole('tab', { name: 'Schedule' }).click();
  const tab = page.getByRole('tabpanel', { name: 'Schedule' });
  await tab.getByLabel('Public URL of the video').fill('https://video.example/watch/panel-600-location');
  await tab.getByRole('button', { name: 'Mark live' }).click();
  await expect.poll(async () => (await sql<{ stage: string }>(`SELECT stage FROM episodes WHERE title = $1`, [EPISODE]))[0].stage, { timeout: 20_000 }).toBe('live');
  await page.reload();
  await expect(page.getByText('https://video.example/watch/panel-600-location').first()).toBeVisible();
  await checkA11y(page, 'episode page (live)');
  await shoot(page, info, 'live');
});
