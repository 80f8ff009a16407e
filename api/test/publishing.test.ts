// Publishing through the API: descriptions with versions, publish slots and their approval (embargo
// and disclosure checks, with time zones applied), the approval queue, marking live, the
// notification e-mails with opt-outs, the calendar and the private iCalendar feed.
import ical, { type VEvent } from 'node-ical';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { Activity, Channel, Description, Episode, EpisodeGear, Gear, Membership, PublishSlot, User } from '@midgray/db';
import {
  checkStageMove,
  composeDescription,
  descriptionInputFrom,
  zonedTimeToInstant,
  type EpisodeDescription,
  type EpisodeSchedule,
} from '@midgray/shared';
import { notifyFootageReady, type MailDeps } from '../src/mail/notifications.ts';
import { sendGearDueBackReminders } from '../src/jobs/gear-due-back.ts';
import { EpisodesService } from '../src/modules/episodes/episodes.service.ts';
import { publishingFacts } from '../src/modules/publishing/publishing.repository.ts';
import { approvalRequestOnEntry } from '../src/modules/publishing/slots.service.ts';
import { channelWithTeam, newUser, startTestApp, type Client, type TestContext } from './helpers.ts';
import { attachGear, daysFromNow, proposedSlot, publishingEpisode } from './publishing-fixtures.ts';

let ctx: TestContext;
let outsider: Client;
let mailDeps: MailDeps;

// Slots are proposed next year, in May (after every northern spring clock change, before autumn's).
const Y = new Date().getUTCFullYear() + 1;
const MAY2 = `${Y}-05-02`;

beforeAll(async () => {
  ctx = await startTestApp();
  outsider = await newUser(ctx, 'Olu Outsider');
  await outsider.post('/api/channels', { name: 'Elsewhere', timeZone: 'UTC' }).expect(201);
  mailDeps = { sequelize: ctx.sequelize, mailer: ctx.mailer, publicUrl: 'http://127.0.0.1:4999' };
});
afterAll(() => ctx?.close());

/** Messages to `email` captured so far (newest first). */
async function mailsTo(email: string) {
  return (await ctx.mails()).filter((m) => m.to.includes(email));
}

/** A channel with a team, the host and editor set on a new episode in `stage`. */
async function setup(stage: Episode['stage'] = 'approval', channelOpts: { defaultDisclosure?: string } = {}) {
  const t = await channelWithTeam(ctx);
  if (channelOpts.defaultDisclosure !== undefined) {
    await Channel.update({ settings: { defaultDisclosure: channelOpts.defaultDisclosure } }, { where: { id: t.channelId } });
  }
  const episode = await publishingEpisode(t.channelId, { stage, hostId: t.team.host.userId, editorId: t.team.editor.userId, title: `Korvala K9 noise ${Math.random().toString(36).slice(2, 7)}` });
  return { ...t, episode };
}

function propose(client: Client, episodeId: string, date: string, time: string, zone: string) {
  return client.post(`/api/episodes/${episodeId}/slots`, { date, time, zone });
}

/** A board move of `episodeId` to `toStage`, at the top unless given (the episode's current version unless given), answered with `status`. */
async function boardMove(client: Client, episodeId: string, toStage: Episode['stage'], status: number, opts: { version?: number; reason?: string; toIndex?: number } = {}) {
  const version = opts.version ?? (await Episode.findByPk(episodeId))!.version;
  return client.post(`/api/episodes/${episodeId}/move`, { toStage, toIndex: opts.toIndex ?? 0, version, ...(opts.reason ? { reason: opts.reason } : {}) }).expect(status);
}

/** A Grade episode that may go to Approval: a description draft and the host's slot, 2 May 18:30 in Berlin. */
async function readyInGrade() {
  const t = await setup('grade');
  await t.team.editor.put(`/api/episodes/${t.episode.id}/description`, { version: 0, summary: 'Noise at every ISO step.', chapters: [], gearLinks: [], disclosure: '' }).expect(200);
  await propose(t.team.host, t.episode.id, MAY2, '18:30', 'Europe/Berlin').expect(201);
  return t;
}

describe('the description', () => {
  it('when nothing was saved yet, then it reads as version 0 with the channel sign-off composed in', async () => {
    const { team, episode, channelId } = await setup('grade');
    await Channel.update({ settings: { signOff: 'Filmed by the bench crew.' } }, { where: { id: channelId } });
    const res = await team.host.get(`/api/episodes/${episode.id}/description`).expect(200);
    const d = res.body as EpisodeDescription;
    expect(d.version).toBe(0);
    expect(d.composed.text).toBe('Filmed by the bench crew.');
    expect(d.canEdit).toBe(true);
  });

  it('when an editor saves, then the version goes up, a stale save gets 409, and every version is kept with its author', async () => {
    const { team, episode } = await setup('grade');
    const first = await team.editor.put(`/api/episodes/${episode.id}/description`, { version: 0, summary: 'First draft.', chapters: [], gearLinks: [], disclosure: '' }).expect(200);
    expect(first.body.version).toBe(1);
    const stale = await team.host.put(`/api/episodes/${episode.id}/description`, { version: 0, summary: 'Lost update', chapters: [], gearLinks: [], disclosure: '' }).expect(409);
    expect(stale.body.error.code).toBe('stale_version');
    expect(stale.body.error.message).toMatch(/saved this description meanwhile/);
    const chapters = [
      { label: 'Intro', startSeconds: 0 },
      { label: 'ISO sweep', startSeconds: 75 },
      { label: 'Verdict', startSeconds: 600 },
    ];
    const second = await team.host.put(`/api/episodes/${episode.id}/description`, { version: 1, summary: 'First draft.', chapters, gearLinks: [], disclosure: '' }).expect(200);
    expect(second.body.version).toBe(2);
    expect(second.body.composed.text).toContain('Chapters\n0:00 Intro\n1:15 ISO sweep\n10:00 Verdict');

    const versions = (await team.producer.get(`/api/episodes/${episode.id}/description/versions`).expect(200)).body;
    expect(versions.map((v: { version: number }) => v.version)).toEqual([2, 1]);
    expect(versions[0]).toMatchObject({ author: { name: 'Test host' }, changed: ['chapters'], restoredFrom: null });
    expect(versions[1]).toMatchObject({ author: { name: 'Test editor' }, changed: ['summary'], snapshot: { summary: 'First draft.', chapters: [] } });
    expect(await Activity.count({ where: { episodeId: episode.id, action: 'description.saved' } })).toBe(2);
  });

  it('when someone restores an old version, then it becomes a new version with the old parts; a stale restore gets 409', async () => {
    const { team, episode } = await setup('grade');
    await team.host.put(`/api/episodes/${episode.id}/description`, { version: 0, summary: 'Version one.', chapters: [], gearLinks: [], disclosure: '' }).expect(200);
    await team.host.put(`/api/episodes/${episode.id}/description`, { version: 1, summary: 'Version two.', chapters: [], gearLinks: [], disclosure: 'Loaned by the maker.' }).expect(200);
    const versions = (await team.host.get(`/api/episodes/${episode.id}/description/versions`).expect(200)).body;
    const v1 = versions.find((v: { version: number }) => v.version === 1);
    await team.editor.post(`/api/episodes/${episode.id}/description/versions/${v1.id}/restore`, { version: 1 }).expect(409);
    const restored = await team.editor.post(`/api/episodes/${episode.id}/description/versions/${v1.id}/restore`, { version: 2 }).expect(200);
    expect(restored.body.version).toBe(3);
    expect(restored.body.parts).toMatchObject({ summary: 'Version one.', disclosure: '' });
    const after = (await team.host.get(`/api/episodes/${episode.id}/description/versions`).expect(200)).body;
    expect(after[0]).toMatchObject({ version: 3, restoredFrom: 1, changed: ['summary', 'disclosure'], author: { name: 'Test editor' } });
    expect(await Activity.count({ where: { episodeId: episode.id, action: 'description.restored' } })).toBe(1);
  });

  it('the server preview is byte-identical to composing the same parts with the shared function, as the browser does', async () => {
    const { team, episode, channelId } = await setup('grade');
    await Channel.update({ settings: { signOff: 'Bench crew.', trackingParams: [{ key: 'ref', value: 'bench' }], defaultDisclosure: 'Loaned for the test.' } }, { where: { id: channelId } });
    await attachGear(channelId, episode.id, { source: 'loaner' });
    const loaded = (await team.host.get(`/api/episodes/${episode.id}/description`).expect(200)).body as EpisodeDescription;
    const parts = {
      summary: 'We tested the K9.\r\n\r\n\r\nAll of it.  ',
      chapters: [{ label: 'Intro', startSeconds: 0 }, { label: 'Sweep', startSeconds: 5 }],
      gearLinks: [{ url: 'https://shop.example/k9', label: 'K9 body', commission: true }, { url: 'ftp://files.example/x', label: 'Raw files', commission: false }],
      disclosure: '',
    };
    const preview = (await team.host.post(`/api/episodes/${episode.id}/description/preview`, parts).expect(200)).body;
    const local = composeDescription(descriptionInputFrom(loaded.context, parts));
    expect(preview).toEqual(local);
    expect(preview.text).toBe(
      'We tested the K9.\n\nAll of it.\n\nChapters\n0:00 Intro\n0:05 Sweep\n\nGear links\nK9 body: https://shop.example/k9?ref=bench\nRaw files: ftp://files.example/x\n\nLoaned for the test.\n\nBench crew.',
    );
    expect(preview.warnings.map((w: { code: string }) => w.code)).toEqual(['chapter_too_few', 'chapter_too_short', 'link_not_http']);
  });

  it('pasted chapter lines become chapters, and a line that is not one is named', async () => {
    const { team, episode } = await setup('grade');
    const res = await team.editor.post(`/api/episodes/${episode.id}/description/chapters/parse`, { text: 'Chapters\n0:00 Intro\n1:02:03 - Latitude\nno time here' }).expect(200);
    expect(res.body.chapters).toEqual([{ label: 'Intro', startSeconds: 0 }, { label: 'Latitude', startSeconds: 3723 }]);
    expect(res.body.errors).toEqual([{ line: 4, text: 'no time here', message: 'Line 4 does not start with a time: write it like 0:00 Intro' }]);
  });

  it('refuses a save with a chapter without label (400 naming the field) and answers 404 for another channel’s episode', async () => {
    const { team, episode } = await setup('grade');
    const bad = await team.host.put(`/api/episodes/${episode.id}/description`, { version: 0, summary: '', chapters: [{ label: ' ', startSeconds: 0 }], gearLinks: [], disclosure: '' }).expect(400);
    expect(bad.body.error.message).toMatch(/label/);
    await outsider.get(`/api/episodes/${episode.id}/description`).expect(404);
    await outsider.put(`/api/episodes/${episode.id}/description`, { version: 0, summary: 'x', chapters: [], gearLinks: [], disclosure: '' }).expect(404);
    expect(await Description.count({ where: { episodeId: episode.id } })).toBe(0);
  });
});

describe('proposing publish slots', () => {
  it('when a host proposes a date and time in a zone, then the instant is stored with the zone, and a new proposal supersedes it', async () => {
    const { team, episode } = await setup('grade');
    const res = await propose(team.host, episode.id, MAY2, '15:00', 'Europe/Berlin').expect(201);
    const s = res.body as EpisodeSchedule;
    // Berlin keeps summer time (UTC+2) in May: 15:00 there is 13:00 UTC.
    expect(s.current).toMatchObject({ startsAt: `${MAY2}T13:00:00.000Z`, zone: 'Europe/Berlin', status: 'proposed', proposedBy: { name: 'Test host' } });
    const again = await propose(team.editor, episode.id, MAY2, '09:00', 'America/New_York').expect(201);
    // New York is UTC−4 in May: 09:00 there is 13:00 UTC as well, proposed in another zone.
    expect(again.body.current).toMatchObject({ startsAt: `${MAY2}T13:00:00.000Z`, zone: 'America/New_York', proposedBy: { name: 'Test editor' } });
    expect(again.body.history.map((h: { status: string }) => h.status)).toEqual(['proposed', 'superseded']);
    expect(await Activity.count({ where: { episodeId: episode.id, action: 'slot.proposed' } })).toBe(2);
    expect(await Activity.count({ where: { episodeId: episode.id, action: 'slot.superseded' } })).toBe(1);
  });

  it('refuses a past slot, a time the clocks skip, and an unknown zone, each with a message a person can act on', async () => {
    const { team, episode } = await setup('grade');
    const past = await propose(team.host, episode.id, '2020-01-10', '10:00', 'UTC').expect(422);
    expect(past.body.error.message).toBe('2020-01-10 10:00 UTC is in the past: propose a future date and time');
    // EU summer time starts on the last Sunday of March at 01:00 UTC: 02:30 in Berlin does not exist.
    const lastSunday = new Date(Date.UTC(Y, 2, 31));
    lastSunday.setUTCDate(31 - lastSunday.getUTCDay());
    const day = lastSunday.toISOString().slice(0, 10);
    const skipped = await propose(team.host, episode.id, day, '02:30', 'Europe/Berlin').expect(422);
    expect(skipped.body.error.message).toBe(`${day} 02:30 does not exist in Europe/Berlin (the clocks go forward then): pick another time`);
    const zone = await propose(team.host, episode.id, MAY2, '10:00', 'Mars/Tharsis').expect(400);
    expect(zone.body.error.message).toMatch(/IANA/);
    expect(await PublishSlot.count({ where: { episodeId: episode.id } })).toBe(0);
  });

  it('when a slot is proposed for an episode in Approval, then the producers get the approval request with both parts', async () => {
    const { team, episode, channel } = await setup('approval');
    await propose(team.host, episode.id, MAY2, '18:30', 'Europe/Berlin').expect(201);
    const [mail] = await mailsTo(team.producer.email);
    expect(mail.subject).toBe(`Approval requested: ${episode.title}`);
    expect(mail.text).toContain(`Test host proposed ${MAY2} 18:30 Europe/Berlin for “${episode.title}”.`);
    expect(mail.text).toContain(channel.name);
    expect(mail.text).toContain(`http://127.0.0.1:4999/episodes/${episode.id}?tab=schedule`);
    expect(mail.text).toContain('http://127.0.0.1:4999/profile');
    expect(mail.html).toContain(channel.name);
    expect(mail.html).toContain(`href="http://127.0.0.1:4999/episodes/${episode.id}?tab=schedule"`);
    // Once, and not the host, who proposed it, nor the editor.
    expect(await mailsTo(team.producer.email)).toHaveLength(1);
    expect(await mailsTo(team.host.email)).toEqual([]);
    expect(await mailsTo(team.editor.email)).toEqual([]);
  });
});

describe('sending an episode to Approval on the board', () => {
  it('when an editor moves it from Grade to Approval, then every producer who has not opted out gets the approval request once, with both parts', async () => {
    const { team, episode, channel, channelId } = await readyInGrade();
    const second = await newUser(ctx, 'Second Producer');
    await Membership.create({ channelId, userId: second.userId, role: 'producer' });
    const quiet = await newUser(ctx, 'Quiet Producer');
    await Membership.create({ channelId, userId: quiet.userId, role: 'producer' });
    await quiet.put('/api/me/email-preferences', { optOuts: ['approval_requested'] }).expect(200);
    // Proposing in Grade asks nobody yet: the episode is not in the approval queue.
    expect(await mailsTo(team.producer.email)).toEqual([]);

    const moved = await boardMove(team.editor, episode.id, 'approval', 200);
    expect(moved.body.stage).toBe('approval');
    for (const producer of [team.producer, second]) {
      const mails = await mailsTo(producer.email);
      expect(mails).toHaveLength(1);
      const [mail] = mails;
      expect(mail.subject).toBe(`Approval requested: ${episode.title}`);
      // Berlin is UTC+2 in May; the slot reads as the host entered it.
      expect(mail.text).toContain(`Test host proposed ${MAY2} 18:30 Europe/Berlin for “${episode.title}”.`);
      expect(mail.text).toContain('Test editor moved the episode to Approval on the board.');
      expect(mail.text).toContain(channel.name);
      expect(mail.text).toContain(`http://127.0.0.1:4999/episodes/${episode.id}?tab=schedule`);
      expect(mail.html).toContain(channel.name);
      expect(mail.html).toContain(`${MAY2} 18:30 Europe/Berlin`);
      expect(mail.html).toContain('moved the episode to Approval on the board.');
      expect(mail.html).toContain(`href="http://127.0.0.1:4999/episodes/${episode.id}?tab=schedule"`);
    }
    expect(await mailsTo(quiet.email)).toEqual([]);
    expect(await mailsTo(team.host.email)).toEqual([]);
    expect(await mailsTo(team.editor.email)).toEqual([]);

    // A reorder inside the Approval column is no new entry: nothing more.
    await publishingEpisode(channelId, { stage: 'approval', title: 'Another in Approval' });
    const reordered = await boardMove(team.producer, episode.id, 'approval', 200, { toIndex: 1 });
    expect(reordered.body).toMatchObject({ stage: 'approval', position: 1 });
    expect(await mailsTo(team.producer.email)).toHaveLength(1);
  });

  it('when the move is refused (a rule unmet, a stale version), then nothing is moved and nobody is mailed', async () => {
    const { team, episode } = await setup('grade');
    await propose(team.host, episode.id, MAY2, '18:30', 'Europe/Berlin').expect(201);
    const noDraft = await boardMove(team.editor, episode.id, 'approval', 422);
    expect(noDraft.body.error.details.missing).toEqual(['No description draft yet']);
    await team.editor.put(`/api/episodes/${episode.id}/description`, { version: 0, summary: 'Draft.', chapters: [], gearLinks: [], disclosure: '' }).expect(200);
    const current = (await Episode.findByPk(episode.id))!.version;
    const stale = await boardMove(team.editor, episode.id, 'approval', 409, { version: current + 1 });
    expect(stale.body.error.code).toBe('stale_version');
    expect((await Episode.findByPk(episode.id))!.stage).toBe('grade');
    expect(await Activity.count({ where: { episodeId: episode.id, action: 'episode.moved' } })).toBe(0);
    expect(await mailsTo(team.producer.email)).toEqual([]);
    expect(await mailsTo(team.admin.email)).toEqual([]);
    // The same move with the version the board shows goes through, and asks once.
    await boardMove(team.editor, episode.id, 'approval', 200);
    expect((await mailsTo(team.producer.email)).map((m) => m.subject)).toEqual([`Approval requested: ${episode.title}`]);
  });

  it('asks once per slot put before the producers: a proposal in Approval asks for itself, a late listener for an earlier entry sends nothing more, a new entry asks again', async () => {
    const { team, episode } = await readyInGrade();
    await boardMove(team.editor, episode.id, 'approval', 200);
    expect(await mailsTo(team.producer.email)).toHaveLength(1);
    // A new slot proposed while in Approval: its own request (the propose path), naming the new time.
    await propose(team.editor, episode.id, `${Y}-05-09`, '17:00', 'Europe/Berlin').expect(201);
    const afterPropose = await mailsTo(team.producer.email);
    expect(afterPropose).toHaveLength(2);
    expect(afterPropose[0].text).toContain(`Test editor proposed ${Y}-05-09 17:00 Europe/Berlin`);
    expect(afterPropose[0].text).not.toContain('moved the episode to Approval');
    // The first move's listener running only now (as when the proposal won the race) finds the new
    // slot younger than the entry and sends nothing: that slot was already asked for.
    await approvalRequestOnEntry(mailDeps)({ episodeId: episode.id, channelId: episode.channelId, actorId: team.editor.userId, from: 'grade', to: 'approval' });
    expect(await mailsTo(team.producer.email)).toHaveLength(2);
    // Back to Grade and into Approval again: a new entry, a new request for the slot it takes along.
    await boardMove(team.producer, episode.id, 'grade', 200, { reason: 'The grade needs another pass' });
    expect(await mailsTo(team.producer.email)).toHaveLength(2);
    await boardMove(team.editor, episode.id, 'approval', 200);
    const [latest, ...rest] = await mailsTo(team.producer.email);
    expect(rest).toHaveLength(2);
    expect(latest.text).toContain(`Test editor proposed ${Y}-05-09 17:00 Europe/Berlin`);
    expect(latest.text).toContain('Test editor moved the episode to Approval on the board.');
  });

  it('when a Scheduled episode is moved back to Approval, then nobody is asked: its slot is already approved', async () => {
    const { team, episode } = await setup('approval');
    const s = (await propose(team.host, episode.id, MAY2, '17:00', 'Europe/Berlin').expect(201)).body as EpisodeSchedule;
    await team.producer.post(`/api/slots/${s.current!.id}/approve`, {}).expect(200);
    expect((await Episode.findByPk(episode.id))!.stage).toBe('scheduled');
    await boardMove(team.producer, episode.id, 'approval', 200, { reason: 'Hold it for the description check' });
    expect((await mailsTo(team.producer.email)).map((m) => m.subject)).toEqual([`Approval requested: ${episode.title}`]);
  });

  it('when the after-move listener fails, then the failure is logged and the move stands', async () => {
    const { team, episode, channelId } = await readyInGrade();
    const episodes = new EpisodesService(ctx.sequelize, {
      afterMove: () => {
        throw new Error('mail relay refused the connection');
      },
    });
    const logged = vi.spyOn(console, 'error').mockImplementation(() => {});
    try {
      const version = (await Episode.findByPk(episode.id))!.version;
      const moved = await episodes.move({ userId: team.editor.userId, channelId, role: 'editor' }, episode.id, { toStage: 'approval', toIndex: 0, version });
      expect(moved).toMatchObject({ stage: 'approval', version: version + 1 });
      expect(logged).toHaveBeenCalledWith(`[episodes] after-move listener failed for ${episode.id}:`, 'mail relay refused the connection');
    } finally {
      logged.mockRestore();
    }
    expect((await Episode.findByPk(episode.id))!.stage).toBe('approval');
  });
});

describe('approving a slot', () => {
  it('refuses a slot before a gear embargo once the time zones are applied, naming the gear and the embargo in both zones', async () => {
    const { team, episode, channelId } = await setup('approval');
    // Embargo 09:00 in Los Angeles (UTC−7 in May) = 16:00 UTC = 18:00 Berlin. The slot, 15:00 Berlin
    // (13:00 UTC), reads as "later" on the wall clocks (15:00 > 09:00) but is three hours too early.
    const embargoAt = zonedTimeToInstant(`${MAY2}T09:00`, 'America/Los_Angeles');
    expect(embargoAt).toBe(`${MAY2}T16:00:00.000Z`);
    await attachGear(channelId, episode.id, { model: 'K9 Cine', source: 'owned', embargoAt, embargoZone: 'America/Los_Angeles' });
    const s = (await propose(team.host, episode.id, MAY2, '15:00', 'Europe/Berlin').expect(201)).body as EpisodeSchedule;
    const res = await team.producer.post(`/api/slots/${s.current!.id}/approve`, { comment: 'Looks good' }).expect(422);
    expect(res.body.error.code).toBe('stage_rule_failed');
    expect(res.body.error.details.missing).toEqual([
      `The slot ${MAY2} 15:00 Europe/Berlin is before the embargo of Korvala K9 Cine, which lifts at ${MAY2} 09:00 America/Los_Angeles (${MAY2} 18:00 Europe/Berlin). Propose a slot at or after the embargo.`,
    ]);
    const after = await Episode.findByPk(episode.id);
    expect(after!.stage).toBe('approval');
    expect(after!.version).toBe(episode.version);
    expect((await PublishSlot.findByPk(s.current!.id))!.status).toBe('proposed');
    expect(await Activity.count({ where: { episodeId: episode.id, action: 'slot.approved' } })).toBe(0);
  });

  it('approves a slot exactly at the embargo instant, entered in another zone', async () => {
    const { team, episode, channelId } = await setup('approval');
    await attachGear(channelId, episode.id, { embargoAt: zonedTimeToInstant(`${MAY2}T09:00`, 'America/Los_Angeles'), embargoZone: 'America/Los_Angeles' });
    const s = (await propose(team.editor, episode.id, MAY2, '18:00', 'Europe/Berlin').expect(201)).body as EpisodeSchedule;
    const res = await team.producer.post(`/api/slots/${s.current!.id}/approve`, {}).expect(200);
    expect(res.body.episode.stage).toBe('scheduled');
  });

  it('refuses approval when the description lacks a required disclosure, and approves once it has one', async () => {
    const { team, episode, channelId } = await setup('approval', { defaultDisclosure: '' });
    await attachGear(channelId, episode.id, { model: 'K9 Loaner', source: 'loaner' });
    await team.host.put(`/api/episodes/${episode.id}/description`, { version: 0, summary: 'The test.', chapters: [], gearLinks: [], disclosure: '' }).expect(200);
    const s = (await propose(team.host, episode.id, MAY2, '12:00', 'UTC').expect(201)).body as EpisodeSchedule;
    const refused = await team.producer.post(`/api/slots/${s.current!.id}/approve`, {}).expect(422);
    expect(refused.body.error.details.missing).toEqual([
      'The description needs a disclosure (Korvala K9 Loaner is a loaner) and has none. Write one on the Description tab, or set a default disclosure in the channel settings.',
    ]);
    // The board's rule says the same from the same facts.
    const facts = await ctx.sequelize.transaction((transaction) => publishingFacts(episode.id, transaction));
    expect(facts).toMatchObject({ hasDescriptionDraft: true, hasProposedSlot: true, disclosureRequired: true, disclosurePresent: false, embargoes: [] });
    expect(facts.approvedSlotAt).toBeUndefined();

    await team.editor.put(`/api/episodes/${episode.id}/description`, { version: 1, summary: 'The test.', chapters: [], gearLinks: [], disclosure: 'The maker lent us this body.' }).expect(200);
    await team.producer.post(`/api/slots/${s.current!.id}/approve`, { comment: 'Go' }).expect(200);
  });

  it('when a producer approves, then the episode is Scheduled at the end of its column, versioned, logged, and the host and editor get the comment', async () => {
    const { team, episode, channelId } = await setup('approval');
    const already = await publishingEpisode(channelId, { stage: 'scheduled', title: 'Already scheduled' });
    const behind = await publishingEpisode(channelId, { stage: 'approval', title: 'Waiting behind' });
    const s = (await propose(team.host, episode.id, MAY2, '17:00', 'Europe/Berlin').expect(201)).body as EpisodeSchedule;
    const res = await team.producer.post(`/api/slots/${s.current!.id}/approve`, { comment: 'Fits the launch week.' }).expect(200);
    expect(res.body.current).toMatchObject({ status: 'approved', decidedBy: { name: 'Test producer' }, comment: 'Fits the launch week.' });
    const after = await Episode.findByPk(episode.id);
    expect(after).toMatchObject({ stage: 'scheduled', position: already.position + 1, version: episode.version + 1 });
    // The Approval column closes the gap the episode left.
    expect((await Episode.findByPk(behind.id))!.position).toBe(behind.position - 1);
    const moved = await Activity.findOne({ where: { episodeId: episode.id, action: 'episode.moved' } });
    expect(moved).toMatchObject({ fromValue: 'approval', toValue: 'scheduled', actorId: team.producer.userId });
    expect(await Activity.count({ where: { episodeId: episode.id, action: 'slot.approved' } })).toBe(1);
    for (const person of [team.host, team.editor]) {
      const [mail] = await mailsTo(person.email);
      expect(mail.subject).toBe(`Publish slot approved: ${episode.title}`);
      expect(mail.text).toContain(`Test producer approved ${MAY2} 17:00 Europe/Berlin. The episode moved to Scheduled.`);
      expect(mail.text).toContain('Comment: Fits the launch week.');
      expect(mail.html).toContain('Comment: Fits the launch week.');
      expect(mail.html).toContain(`/episodes/${episode.id}?tab=schedule`);
    }
    // Approving twice is a conflict, not a second move.
    const twice = await team.producer.post(`/api/slots/${s.current!.id}/approve`, {}).expect(409);
    expect(twice.body.error.message).toMatch(/already approved/);
  });

  it('when a producer rejects with a comment, then the slot is rejected, the episode stays, and the host and editor read why', async () => {
    const { team, episode } = await setup('approval');
    const s = (await propose(team.host, episode.id, MAY2, '17:00', 'Europe/Berlin').expect(201)).body as EpisodeSchedule;
    const noComment = await team.admin.post(`/api/slots/${s.current!.id}/reject`, { comment: '  ' }).expect(400);
    expect(noComment.body.error.message).toMatch(/Say why/);
    const res = await team.admin.post(`/api/slots/${s.current!.id}/reject`, { comment: 'Clashes with the lens episode.' }).expect(200);
    expect(res.body.current).toBeNull();
    expect(res.body.history[0]).toMatchObject({ status: 'rejected', comment: 'Clashes with the lens episode.', decidedBy: { name: 'Alex Admin' } });
    expect((await Episode.findByPk(episode.id))!.stage).toBe('approval');
    const [mail] = await mailsTo(team.editor.email);
    expect(mail.subject).toBe(`Publish slot rejected: ${episode.title}`);
    expect(mail.text).toContain('Comment: Clashes with the lens episode.');
    expect(mail.html).toContain('Comment: Clashes with the lens episode.');
  });

  it('when the slot changes after approval, then the episode goes back to Approval and needs a new approval', async () => {
    const { team, episode } = await setup('approval');
    const s = (await propose(team.host, episode.id, MAY2, '17:00', 'Europe/Berlin').expect(201)).body as EpisodeSchedule;
    await team.producer.post(`/api/slots/${s.current!.id}/approve`, {}).expect(200);
    const before = (await mailsTo(team.producer.email)).length;
    const changed = (await propose(team.editor, episode.id, `${Y}-05-09`, '17:00', 'Europe/Berlin').expect(201)).body as EpisodeSchedule;
    expect(changed.episode.stage).toBe('approval');
    expect(changed.current).toMatchObject({ status: 'proposed', startsAt: `${Y}-05-09T15:00:00.000Z` });
    expect(changed.history.map((h) => h.status)).toEqual(['proposed', 'superseded']);
    expect(changed.history[1].decidedBy).toMatchObject({ name: 'Test producer' });
    const back = await Activity.findOne({ where: { episodeId: episode.id, action: 'episode.moved', toValue: 'approval' } });
    expect(back!.reason).toBe('The publish slot changed after approval: it needs a new approval');
    const facts = await ctx.sequelize.transaction((transaction) => publishingFacts(episode.id, transaction));
    expect(facts.approvedSlotAt).toBeUndefined();
    // The board's approval → scheduled move is refused until the new slot is approved.
    const check = checkStageMove({ from: 'approval', to: 'scheduled', role: 'producer', facts: { testCount: 1, requiredSpecLinesEmpty: [], cameraOriginalsReceived: 1, now: new Date().toISOString(), ...facts } });
    expect(check.missing).toEqual(['No approved publish slot yet']);
    expect((await mailsTo(team.producer.email)).length).toBe(before + 1);
    await team.producer.post(`/api/slots/${changed.current!.id}/approve`, {}).expect(200);
    expect((await Episode.findByPk(episode.id))!.stage).toBe('scheduled');
  });

  it('refuses approval while the episode is not in Approval', async () => {
    const { team, episode } = await setup('grade');
    const s = (await propose(team.host, episode.id, MAY2, '17:00', 'UTC').expect(201)).body as EpisodeSchedule;
    const res = await team.producer.post(`/api/slots/${s.current!.id}/approve`, {}).expect(422);
    expect(res.body.error.details.missing[0]).toMatch(/^The episode is in grade, not in Approval/);
  });

  it('lets only producers and admins decide, lets hosts and editors propose, and answers 404 to other channels', async () => {
    const { team, episode } = await setup('approval');
    const s = (await propose(team.editor, episode.id, MAY2, '17:00', 'UTC').expect(201)).body as EpisodeSchedule;
    const slotId = s.current!.id;
    for (const who of [team.host, team.editor]) {
      const res = await who.post(`/api/slots/${slotId}/approve`, {}).expect(403);
      expect(res.body.error.message).toMatch(/needs producer or admin/);
      await who.post(`/api/slots/${slotId}/reject`, { comment: 'no' }).expect(403);
      await who.get(`/api/channels/${episode.channelId}/approvals`).expect(403);
    }
    await outsider.post(`/api/slots/${slotId}/approve`, {}).expect(404);
    await outsider.post(`/api/slots/${slotId}/reject`, { comment: 'no' }).expect(404);
    await outsider.get(`/api/episodes/${episode.id}/schedule`).expect(404);
    await outsider.post(`/api/episodes/${episode.id}/slots`, { date: MAY2, time: '10:00', zone: 'UTC' }).expect(404);
    // A producer of another channel is an outsider here too.
    const other = await channelWithTeam(ctx);
    await other.team.producer.post(`/api/slots/${slotId}/approve`, {}).expect(404);
    expect((await PublishSlot.findByPk(slotId))!.status).toBe('proposed');
    await team.admin.post(`/api/slots/${slotId}/approve`, {}).expect(200);
  });
});

describe('the approval queue', () => {
  it('lists each episode in Approval with its slot in the channel and viewer zones, gear dates, footage and description warnings', async () => {
    const { team, episode, channelId } = await setup('approval', { defaultDisclosure: '' });
    await publishingEpisode(channelId, { stage: 'grade', title: 'Not yet in approval' });
    await attachGear(channelId, episode.id, { model: 'K9 Cine', source: 'loaner', embargoAt: zonedTimeToInstant(`${MAY2}T09:00`, 'America/Los_Angeles'), embargoZone: 'America/Los_Angeles', dueBackOn: `${Y}-04-30` });
    await propose(team.host, episode.id, MAY2, '15:00', 'Europe/Berlin').expect(201);
    const res = await team.producer.get(`/api/channels/${channelId}/approvals?zone=America/New_York`).expect(200);
    expect(res.body.channelTimeZone).toBe('Europe/Berlin');
    expect(res.body.viewerTimeZone).toBe('America/New_York');
    expect(res.body.items).toHaveLength(1);
    const item = res.body.items[0];
    expect(item.episode).toMatchObject({ id: episode.id, host: { name: 'Test host' }, editor: { name: 'Test editor' } });
    expect(item.slotInChannelZone).toBe(`${MAY2} 15:00 Europe/Berlin`);
    expect(item.slotInViewerZone).toBe(`${MAY2} 09:00 America/New_York`);
    expect(item.gear[0]).toMatchObject({
      name: 'Korvala K9 Cine',
      embargoText: `${MAY2} 09:00 America/Los_Angeles`,
      embargoInChannelZone: `${MAY2} 18:00 Europe/Berlin`,
      slotBeforeEmbargo: true,
      dueBackOn: `${Y}-04-30`,
      dueBackBeforeSlot: true,
    });
    expect(item.blockers).toHaveLength(2);
    expect(item.blockers[0]).toMatch(/before the embargo of Korvala K9 Cine/);
    expect(item.blockers[1]).toMatch(/needs a disclosure/);
    expect(item.descriptionWarnings.map((w: { code: string }) => w.code)).toEqual(['disclosure_missing']);
    expect(item.hasDescription).toBe(false);
    // Footage counts come from the footage feature's table when it is installed; null otherwise.
    const installed = (await ctx.sequelize.query(`SELECT to_regclass('footage')::text AS t`, { plain: true })) as { t: string | null };
    if (installed.t) expect(item.footage).toMatchObject({ total: 0 });
    else expect(item.footage).toBeNull();
  });
});

describe('marking an episode live', () => {
  it('refuses before the approved slot, and with a stale version; then records the public URL and moves to Live', async () => {
    const { team, episode } = await setup('approval');
    const s = (await propose(team.host, episode.id, MAY2, '17:00', 'UTC').expect(201)).body as EpisodeSchedule;
    const approved = (await team.producer.post(`/api/slots/${s.current!.id}/approve`, {}).expect(200)).body as EpisodeSchedule;
    const early = await team.producer.post(`/api/episodes/${episode.id}/live`, { publicUrl: 'https://video.example/watch/k9', version: approved.episode.version }).expect(422);
    expect(early.body.error.message).toMatch(new RegExp(`The approved slot ${MAY2} 17:00 UTC has not come yet`));
    await team.host.post(`/api/episodes/${episode.id}/live`, { publicUrl: 'https://video.example/watch/k9', version: approved.episode.version }).expect(403);
    // The slot time passes (moved into the past in the database, as time would).
    await PublishSlot.update({ startsAt: new Date(Date.now() - 60_000) }, { where: { id: s.current!.id } });
    await team.producer.post(`/api/episodes/${episode.id}/live`, { publicUrl: 'https://video.example/watch/k9', version: approved.episode.version - 1 }).expect(409);
    const bad = await team.producer.post(`/api/episodes/${episode.id}/live`, { publicUrl: 'video.example/k9', version: approved.episode.version }).expect(400);
    expect(bad.body.error.message).toMatch(/https:\/\//);
    const live = await team.producer.post(`/api/episodes/${episode.id}/live`, { publicUrl: 'https://video.example/watch/k9', version: approved.episode.version }).expect(200);
    expect(live.body.episode).toMatchObject({ stage: 'live', publicUrl: 'https://video.example/watch/k9' });
    expect(await Activity.count({ where: { episodeId: episode.id, action: 'episode.moved', toValue: 'live' } })).toBe(1);
    // A live episode's slot can no longer change.
    await propose(team.host, episode.id, `${Y}-06-01`, '10:00', 'UTC').expect(422);
  });
});

describe('e-mail kinds and opt-outs', () => {
  it('when a producer opts out of approval requests, then they get none while another producer still does', async () => {
    const { team, episode, channelId } = await setup('approval');
    const second = await newUser(ctx, 'Second Producer');
    await Membership.create({ channelId, userId: second.userId, role: 'producer' });
    const prefs = await team.producer.put('/api/me/email-preferences', { optOuts: ['approval_requested'] }).expect(200);
    expect(prefs.body.email.find((k: { kind: string }) => k.kind === 'approval_requested').enabled).toBe(false);
    await propose(team.host, episode.id, MAY2, '11:00', 'UTC').expect(201);
    expect(await mailsTo(team.producer.email)).toEqual([]);
    expect((await mailsTo(second.email)).map((m) => m.subject)).toEqual([`Approval requested: ${episode.title}`]);
  });

  it('when the only producer opted out of approval requests, then a board move into Approval mails nobody (not the admins either)', async () => {
    const { team, episode } = await readyInGrade();
    await team.producer.put('/api/me/email-preferences', { optOuts: ['approval_requested'] }).expect(200);
    await boardMove(team.editor, episode.id, 'approval', 200);
    expect((await Episode.findByPk(episode.id))!.stage).toBe('approval');
    expect(await mailsTo(team.producer.email)).toEqual([]);
    expect(await mailsTo(team.admin.email)).toEqual([]);
  });

  it('when a host opts out of decisions, then the editor is told and the host is not', async () => {
    const { team, episode } = await setup('approval');
    await team.host.put('/api/me/email-preferences', { optOuts: ['slot_decided', 'gear_due_back'] }).expect(200);
    const s = (await propose(team.editor, episode.id, MAY2, '11:00', 'UTC').expect(201)).body as EpisodeSchedule;
    await team.producer.post(`/api/slots/${s.current!.id}/reject`, { comment: 'Too early in the week.' }).expect(200);
    expect(await mailsTo(team.host.email)).toEqual([]);
    expect(await mailsTo(team.editor.email)).toHaveLength(1);
  });

  it('footage ready: the editors get both parts with the files and the link; an editor who opted out gets none', async () => {
    const { team, episode, channel } = await setup('grade');
    const quiet = await newUser(ctx, 'Quiet Editor');
    await Membership.create({ channelId: channel.id, userId: quiet.userId, role: 'editor' });
    await quiet.put('/api/me/email-preferences', { optOuts: ['footage_ready'] }).expect(200);
    const sent = await notifyFootageReady(mailDeps, { episodeId: episode.id, footage: [{ name: 'A001_C003.mov', kind: 'camera original' }] });
    expect(sent).toBe(1);
    const [mail] = await mailsTo(team.editor.email);
    expect(mail.subject).toBe(`Footage ready for pickup: ${episode.title}`);
    expect(mail.text).toContain('A001_C003.mov (camera original)');
    expect(mail.text).toContain(`/episodes/${episode.id}?tab=footage`);
    expect(mail.html).toContain(channel.name);
    expect(mail.html).toContain('A001_C003.mov (camera original)');
    expect(await mailsTo(quiet.email)).toEqual([]);
    expect(await mailsTo(team.host.email)).toEqual([]);
    // Wired in the app: when the footage feature reports a verified file, the editors hear of it.
    await ctx.built.footage.events.emitReady({ footageId: episode.id, channelId: channel.id, episodeId: episode.id, kind: 'graded_render', originalName: 'K9_grade_v2.mov', uploaderId: null });
    const [second] = await mailsTo(team.editor.email);
    expect(second.text).toContain('K9_grade_v2.mov (graded render)');
  });

  it('gear due back: producers get one reminder per item and due date within 3 days in the channel’s zone; opted-out producers none', async () => {
    const { team, episode, channelId, channel } = await setup('shoot');
    const quiet = await newUser(ctx, 'Quiet Producer');
    await Membership.create({ channelId, userId: quiet.userId, role: 'producer' });
    await quiet.put('/api/me/email-preferences', { optOuts: ['gear_due_back'] }).expect(200);
    // 23:30 UTC on 1 June is already 2 June in Berlin: "in 3 days" counts from the channel's date.
    const now = new Date(Date.UTC(Y, 5, 1, 23, 30));
    const due = await attachGear(channelId, episode.id, { model: 'K9 Due', source: 'loaner', dueBackOn: `${Y}-06-05` });
    const notYet = await attachGear(channelId, episode.id, { model: 'K9 Later', source: 'rental', dueBackOn: `${Y}-06-06` });
    const done = await sendGearDueBackReminders(mailDeps, now);
    const mine = done.filter((d) => [due.id, notYet.id].includes(d.gearId));
    expect(mine).toEqual([{ gearId: due.id, dueBackOn: `${Y}-06-05`, sent: 1 }]);
    const [mail] = await mailsTo(team.producer.email);
    expect(mail.subject).toBe('Gear due back in 3 days: Korvala K9 Due');
    expect(mail.text).toContain(`must go back on ${Y}-06-05`);
    expect(mail.text).toContain(`“${episode.title}”`);
    expect(mail.text).toContain(`/episodes/${episode.id}`);
    expect(mail.html).toContain(channel.name);
    expect(await mailsTo(quiet.email)).toEqual([]);
    // Running again sends nothing new for the same date.
    expect((await sendGearDueBackReminders(mailDeps, now)).filter((d) => d.gearId === due.id)).toEqual([]);
    expect(await mailsTo(team.producer.email)).toHaveLength(1);
  });

  it('runs the reminder as a scheduled pg-boss job that a worker picks up', async () => {
    const { Jobs } = await import('../src/jobs/jobs.ts');
    const { registerGearDueBackJob, GEAR_DUE_BACK_QUEUE, GEAR_DUE_BACK_CRON } = await import('../src/jobs/gear-due-back.ts');
    const { team, episode, channelId } = await setup('shoot');
    const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
    await attachGear(channelId, episode.id, { model: 'K9 Job', source: 'loaner', dueBackOn: tomorrow });
    const jobs = new Jobs(process.env.DATABASE_URL!, { schema: 'pgboss_publishing_test', pollingIntervalSeconds: 0.5 });
    try {
      registerGearDueBackJob(jobs, mailDeps);
      await jobs.startWorkers();
      const schedules = await jobs.boss.getSchedules();
      expect(schedules.find((s) => s.name === GEAR_DUE_BACK_QUEUE)).toMatchObject({ cron: GEAR_DUE_BACK_CRON });
      await jobs.send(GEAR_DUE_BACK_QUEUE, {});
      const deadline = Date.now() + 20_000;
      while ((await mailsTo(team.producer.email)).length === 0 && Date.now() < deadline) await new Promise((r) => setTimeout(r, 200));
      const [mail] = await mailsTo(team.producer.email);
      expect(mail?.subject).toMatch(/^Gear due back (tomorrow|today|in \d days): Korvala K9 Job$/);
    } finally {
      await jobs.stop(5000);
    }
  });

  it('an invitation is not sent to an address whose Midgray user switched invitations off', async () => {
    const { team, channelId } = await setup('plan');
    const quiet = await newUser(ctx, 'No Invites');
    await quiet.put('/api/me/email-preferences', { optOuts: ['invitation'] }).expect(200);
    const res = await team.admin.post(`/api/channels/${channelId}/invitations`, { email: quiet.email, role: 'editor' }).expect(201);
    expect(res.body.mailSent).toBe(false);
    expect(await mailsTo(quiet.email)).toEqual([]);
    const open = await newUser(ctx, 'Wants Invites');
    await team.admin.post(`/api/channels/${channelId}/invitations`, { email: open.email, role: 'editor' }).expect(201);
    const [mail] = await mailsTo(open.email);
    expect(mail.text).toContain('http://127.0.0.1:4999/profile');
    expect(mail.html).toContain('invited you to join');
  });

  it('refuses an unknown e-mail kind with the list of kinds', async () => {
    const c = await newUser(ctx);
    const res = await c.put('/api/me/email-preferences', { optOuts: ['newsletter'] }).expect(400);
    expect(res.body.error.message).toMatch(/approval_requested, slot_decided, footage_ready, gear_due_back, invitation/);
  });
});

describe('the calendar and its feed', () => {
  async function calendarChannel() {
    const t = await setup('approval');
    const { channelId, episode, team } = t;
    await Episode.update({ shootDate: `${Y}-04-20` }, { where: { id: episode.id } });
    await attachGear(channelId, episode.id, { model: 'K9 Cal', source: 'loaner', dueBackOn: `${Y}-05-06`, embargoAt: zonedTimeToInstant(`${MAY2}T09:00`, 'America/Los_Angeles'), embargoZone: 'America/Los_Angeles' });
    const s = (await propose(team.host, episode.id, `${Y}-05-03`, '18:00', 'Europe/Berlin').expect(201)).body as EpisodeSchedule;
    const approvedEpisode = await publishingEpisode(channelId, { stage: 'approval', title: 'Approved one' });
    const approved = await PublishSlot.create({ episodeId: approvedEpisode.id, startsAt: new Date(`${Y}-05-10T08:00:00Z`), zone: 'Asia/Tokyo', status: 'approved', decidedAt: new Date() });
    return { ...t, proposedSlotId: s.current!.id, approvedSlotId: approved.id, approvedEpisode };
  }

  it('lists publish slots (proposed and approved apart), embargo lifts, due-back days and shoot days of the channel', async () => {
    const { team, channelId, episode, proposedSlotId, approvedSlotId, approvedEpisode } = await calendarChannel();
    const res = await team.editor.get(`/api/channels/${channelId}/calendar?from=${Y}-04-01&to=${Y}-05-31`).expect(200);
    const byId = Object.fromEntries(res.body.map((e: { id: string }) => [e.id, e]));
    expect(byId[`slot-${proposedSlotId}`]).toMatchObject({ kind: 'slot_proposed', at: `${Y}-05-03T16:00:00.000Z`, zone: 'Europe/Berlin', episodeId: episode.id });
    expect(byId[`slot-${approvedSlotId}`]).toMatchObject({ kind: 'slot_approved', at: `${Y}-05-10T08:00:00.000Z`, episodeId: approvedEpisode.id });
    expect(Object.values(byId).find((e: any) => e.kind === 'embargo_lift')).toMatchObject({ at: `${MAY2}T16:00:00.000Z`, zone: 'America/Los_Angeles', title: 'Korvala K9 Cal', episodeId: episode.id });
    expect(Object.values(byId).find((e: any) => e.kind === 'gear_due_back')).toMatchObject({ date: `${Y}-05-06`, at: null });
    expect(byId[`shoot-${episode.id}`]).toMatchObject({ kind: 'shoot_day', date: `${Y}-04-20` });
    const bad = await team.editor.get(`/api/channels/${channelId}/calendar?from=${Y}-05-31&to=${Y}-04-01`).expect(400);
    expect(bad.body.error.message).toMatch(/must not be after/);
    await outsider.get(`/api/channels/${channelId}/calendar?from=${Y}-04-01&to=${Y}-05-31`).expect(404);
  });

  it('serves a private feed that an independent iCalendar parser reads with the same events and instants; reset kills the old URL', async () => {
    const { team, episode, proposedSlotId, approvedSlotId } = await calendarChannel();
    const made = await team.host.post('/api/me/calendar-feed').expect(201);
    const url = new URL(made.body.url);
    expect(url.pathname).toMatch(/^\/api\/calendar\/[A-Za-z0-9_-]{43}\.ics$/);
    const stored = await User.findByPk(team.host.userId);
    expect(stored!.calendarToken).toMatch(/^[0-9a-f]{64}$/);
    expect(url.pathname).not.toContain(stored!.calendarToken!);

    const feed = await outsider.agent.get(url.pathname).expect(200);
    expect(feed.headers['content-type']).toMatch(/^text\/calendar/);
    expect(feed.text).toContain('BEGIN:VCALENDAR');
    const parsed = ical.sync.parseICS(feed.text);
    const events = Object.values(parsed).filter((c): c is VEvent => c?.type === 'VEVENT');
    const byUid = Object.fromEntries(events.map((e) => [e.uid, e]));
    const proposed = byUid[`slot-${proposedSlotId}@midgray`];
    expect(proposed.start.toISOString()).toBe(`${Y}-05-03T16:00:00.000Z`);
    expect(proposed.end!.toISOString()).toBe(`${Y}-05-03T16:30:00.000Z`);
    expect(proposed.summary).toBe(`Proposed publish slot: ${episode.title}`);
    expect(proposed.status).toBe('TENTATIVE');
    const approved = byUid[`slot-${approvedSlotId}@midgray`];
    expect(approved.start.toISOString()).toBe(`${Y}-05-10T08:00:00.000Z`);
    expect(approved.status).toBe('CONFIRMED');
    const embargo = events.find((e) => String(e.summary).startsWith('Embargo lifts: Korvala K9 Cal'))!;
    expect(embargo.start.toISOString()).toBe(`${MAY2}T16:00:00.000Z`);
    const dueBack = events.find((e) => String(e.summary) === 'Gear due back: Korvala K9 Cal')!;
    expect(dueBack.datetype).toBe('date');
    expect((dueBack.start as Date & { dateOnly?: boolean }).dateOnly).toBe(true);
    expect(dueBack.start.getFullYear()).toBe(Y);
    expect([dueBack.start.getMonth(), dueBack.start.getDate()]).toEqual([4, 6]);
    const shoot = byUid[`shoot-${episode.id}@midgray`];
    expect([shoot.start.getMonth(), shoot.start.getDate()]).toEqual([3, 20]);
    // Only the user's channels: nothing from the outsider's channel, and the outsider's own feed lacks these.
    const other = await outsider.post('/api/me/calendar-feed').expect(201);
    const otherFeed = await outsider.agent.get(new URL(other.body.url).pathname).expect(200);
    expect(otherFeed.text).not.toContain(proposedSlotId);

    const reset = await team.host.post('/api/me/calendar-feed').expect(201);
    expect(reset.body.url).not.toBe(made.body.url);
    await outsider.agent.get(url.pathname).expect(404);
    await outsider.agent.get(new URL(reset.body.url).pathname).expect(200);
    const profile = await team.host.get('/api/me/profile').expect(200);
    expect(profile.body.calendarFeed.active).toBe(true);
    await team.host.delete('/api/me/calendar-feed').expect(204);
    await outsider.agent.get(new URL(reset.body.url).pathname).expect(404);
    expect((await team.host.get('/api/me/profile').expect(200)).body.calendarFeed).toEqual({ active: false, createdAt: null });
  });
});

// Keep the fixtures honest: the helper builds what the tests assume.
describe('fixtures', () => {
  it('a proposed slot helper stores a proposed slot, and attachGear links gear to the episode', async () => {
    const { episode, channelId } = await setup('approval');
    const slot = await proposedSlot(episode.id, daysFromNow(3));
    expect(slot.status).toBe('proposed');
    const gear = await attachGear(channelId, episode.id, {});
    expect(await EpisodeGear.count({ where: { episodeId: episode.id, gearId: gear.id } })).toBe(1);
    expect((await Gear.findByPk(gear.id))!.make).toBe('Korvala');
  });
});
